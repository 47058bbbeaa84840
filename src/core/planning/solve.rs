//! Backward solves: from a required resolution back to the greatest height or range, the focal
//! length needed, and the heights where one limit overtakes another.
//!
//! No limit is assumed to be monotonic: each solve scans a log-spaced table over the whole domain
//! and refines the last crossing by bisection, so a profile that makes turbulence shrink with
//! height is handled as well as the plain cases.

use crate::core::physics::engine::{evaluate, evaluate_through, Evaluation, Limit, Setup};
use crate::core::physics::geometry::Geometry;
use crate::core::physics::roots;
use crate::core::physics::target::{ratio_for, CdModel, Task};
use serde::Serialize;

/// What the backward solve varies.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Axis {
    /// Camera height, keeping the look angle (a drone looking down or tilted).
    Height,
    /// Horizontal distance to the target, keeping the height (a camera on a mast or vehicle).
    GroundDistance,
}

impl Axis {
    /// The smallest and largest value the solves consider (m).
    pub fn domain(self) -> (f64, f64) {
        match self {
            Axis::Height => (0.1, 20_000.0),
            Axis::GroundDistance => (1.0, 100_000.0),
        }
    }
}

/// Points in the scan table.
const TABLE_POINTS: usize = 200;
const BISECTIONS: usize = 60;

/// A family of setups along one axis, with the limits tabulated on a log grid.
#[derive(Clone, Debug, PartialEq)]
pub struct Sweep {
    pub axis: Axis,
    base: Setup,
    look_angle_rad: f64,
    table: Vec<(f64, Evaluation)>,
}

impl Sweep {
    /// A sweep through `base` along `axis`: heights keep the look angle of `base`, ground
    /// distances keep its height.
    pub fn new(base: Setup, axis: Axis) -> Sweep {
        let look_angle_rad = base.geometry.look_angle_rad();
        let mut sweep = Sweep {
            axis,
            base,
            look_angle_rad: if look_angle_rad.is_finite() {
                look_angle_rad
            } else {
                0.0
            },
            table: Vec::new(),
        };
        let (lo, hi) = axis.domain();
        let ratio = (hi / lo).ln();
        sweep.table = (0..TABLE_POINTS)
            .map(|i| {
                // exp(ln(hi/lo)) can round above hi/lo; clamp so the table stays in the domain.
                let x = (lo * (ratio * i as f64 / (TABLE_POINTS - 1) as f64).exp()).clamp(lo, hi);
                (x, evaluate(&sweep.setup_at(x)))
            })
            .collect();
        sweep
    }

    /// Whether a sweep through `base` along `axis` would have this sweep's table: the table
    /// depends on everything but the position along the axis, so a change of the height (looking
    /// at the same angle) or of the ground distance (from the same height) keeps it, over the
    /// same Earth and for the same target height.
    pub fn keeps_table_for(&self, base: &Setup, axis: Axis) -> bool {
        let (g, mine) = (base.geometry, self.base.geometry);
        let same_earth = g.target_height_m.to_bits() == mine.target_height_m.to_bits()
            && g.earth_k.to_bits() == mine.earth_k.to_bits();
        let same_path = same_earth
            && match axis {
                Axis::Height => g.look_angle_rad().to_bits() == self.look_angle_rad.to_bits(),
                Axis::GroundDistance => g.height_m.to_bits() == mine.height_m.to_bits(),
            };
        let rest_same = Setup {
            geometry: self.base.geometry,
            ..*base
        } == self.base;
        axis == self.axis && same_path && rest_same
    }

    /// This sweep moved to `base`, when its table would come out the same (`None` otherwise; see
    /// [`Sweep::keeps_table_for`]).
    pub fn moved_to(&self, base: Setup, axis: Axis) -> Option<Sweep> {
        let look = base.geometry.look_angle_rad();
        self.keeps_table_for(&base, axis).then(|| Sweep {
            base,
            look_angle_rad: if look.is_finite() { look } else { 0.0 },
            ..self.clone()
        })
    }

    /// The setup at position `x` along the axis.
    pub fn setup_at(&self, x: f64) -> Setup {
        let geometry = match self.axis {
            Axis::Height => {
                let g = self.base.geometry;
                Geometry::tilted_over(x, self.look_angle_rad, g.target_height_m, g.earth_k)
            }
            Axis::GroundDistance => Geometry {
                ground_distance_m: x,
                ..self.base.geometry
            },
        };
        self.base.with_geometry(geometry)
    }

    /// The setup the sweep passes through.
    pub fn base(&self) -> Setup {
        self.base
    }

    /// Where the base setup sits on the axis.
    pub fn current(&self) -> f64 {
        match self.axis {
            Axis::Height => self.base.geometry.height_m,
            Axis::GroundDistance => self.base.geometry.ground_distance_m,
        }
    }

    /// The tabulated (position, evaluation) pairs.
    pub fn table(&self) -> &[(f64, Evaluation)] {
        &self.table
    }

    /// Bisects between `lo` (where `inside` holds) and `hi` (where it does not).
    fn bisect(&self, lo: f64, hi: f64, inside: impl Fn(&Evaluation) -> bool) -> f64 {
        self.bracket(lo, hi, inside).0
    }

    /// Narrows [`lo`, `hi`] (`inside` holding at `lo`, not at `hi`) to a relative width of 1e−9.
    fn bracket(&self, mut lo: f64, mut hi: f64, inside: impl Fn(&Evaluation) -> bool) -> (f64, f64) {
        for _ in 0..BISECTIONS {
            let mid = 0.5 * (lo + hi);
            if inside(&evaluate(&self.setup_at(mid))) {
                lo = mid;
            } else {
                hi = mid;
            }
            if hi - lo <= 1e-9 * hi {
                break;
            }
        }
        (lo, hi)
    }

    /// The last position in [`lo`, `hi`] where `value` is not negative (it is at `lo`, not at
    /// `hi`), to a relative width of 1e−9, by regula falsi ([`roots::last_not_negative`]).
    fn refine(&self, lo: f64, hi: f64, value: impl Fn(&Evaluation) -> f64) -> f64 {
        roots::last_not_negative(lo, hi, |x| value(&evaluate(&self.setup_at(x))), 1e-9)
    }

    /// The greatest position along the axis at which `need` is met.
    pub fn reach(&self, need: &Need) -> Reach {
        let meets = |e: &Evaluation| need.meets(e);
        let first = match self.table.first() {
            Some((_, evaluation)) => *evaluation,
            None => {
                return Reach::Nowhere {
                    forbidden_by: Limit::Sampling,
                    best_m: 0.0,
                }
            }
        };
        match self.table.iter().rposition(|(_, e)| meets(e)) {
            None => {
                let forbidden_by = need.failing_limit(&first, true);
                Reach::Nowhere {
                    forbidden_by,
                    best_m: need.best_figure(&first),
                }
            }
            Some(i) if i + 1 == self.table.len() => Reach::Everywhere {
                up_to_m: self.table[i].0,
            },
            Some(i) => {
                let x = self.refine(self.table[i].0, self.table[i + 1].0, |e| need.slack(e));
                let beyond = evaluate(&self.setup_at(x * (1.0 + 1e-6)));
                if beyond.visible {
                    Reach::UpTo {
                        position_m: x,
                        bound_by: need.failing_limit(&beyond, false),
                    }
                } else {
                    Reach::Horizon { position_m: x }
                }
            }
        }
    }

    /// Where limit `a` and limit `b` are equal along the axis, first crossing from the low end.
    pub fn crossing(&self, a: Limit, b: Limit) -> Crossing {
        let above = |e: &Evaluation| e.limits.get(a) > e.limits.get(b);
        let Some((_, first)) = self.table.first() else {
            return Crossing::Never { larger: b };
        };
        let start = above(first);
        match self.table.iter().position(|(_, e)| above(e) != start) {
            None => Crossing::Never {
                larger: if start { a } else { b },
            },
            Some(i) => {
                let x = self.bisect(self.table[i - 1].0, self.table[i].0, |e| above(e) == start);
                Crossing::At {
                    position_m: x,
                    larger_below: if start { a } else { b },
                    larger_above: if start { b } else { a },
                }
            }
        }
    }

    /// Every position where the governing limit changes, from the low end up.
    pub fn envelope_changes(&self) -> Vec<EnvelopeChange> {
        let mut changes = Vec::new();
        for pair in self.table.windows(2) {
            let (mut x0, e0) = pair[0];
            let (x1, e1) = pair[1];
            // Between two table points the governing limit can change more than once (motion to
            // sampling to turbulence, say, where sampling leads only briefly): find each change
            // in turn, naming the limit that governs just past it, until the far point's is reached.
            let mut from = e0.governing;
            let mut found = 0;
            while from != e1.governing && found < 2 * Limit::ALL.len() {
                let (lo, hi) = self.bracket(x0, x1, |e| e.governing == from);
                let to = evaluate(&self.setup_at(hi)).governing;
                changes.push(EnvelopeChange {
                    position_m: lo,
                    from,
                    to,
                });
                from = to;
                x0 = hi;
                found += 1;
            }
        }
        changes
    }
}

/// The plane the target's detail lies in (resolution-model §5).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum TargetPlane {
    /// Flat features on the ground (cracks, seedlings): an oblique look stretches the along-view
    /// figure by 1/cos θ.
    #[default]
    Ground,
    /// People, vehicles and posts standing upright and facing the camera: the vertical figure is
    /// stretched by 1/cos ε = 1/sin θ.
    Upright,
}

impl TargetPlane {
    /// How much longer a figure in the plane normal to the view is on this plane, for a look angle
    /// θ from straight down (plain geometry); at most 1e6 where the plane is seen edge-on.
    pub fn stretch(self, look_angle_deg: f64) -> f64 {
        let theta = if look_angle_deg.is_finite() {
            look_angle_deg.to_radians()
        } else {
            0.0
        };
        let cosine = match self {
            TargetPlane::Ground => theta.cos(),
            TargetPlane::Upright => theta.sin(),
        };
        1.0 / cosine.abs().max(1e-6)
    }
}

/// What the images must show, on the target's plane: the smallest detail to resolve (a period,
/// compared with the ground resolved distance in its coarser direction, all the blurs together)
/// and a required GSD; each optional, both met when both are given.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Need {
    pub detail_m: Option<f64>,
    pub gsd_m: Option<f64>,
    pub plane: TargetPlane,
}

impl Need {
    /// Whether an evaluation meets every part of the need.
    pub fn meets(&self, e: &Evaluation) -> bool {
        let k = self.plane.stretch(e.incidence_deg);
        // A target below the horizon is not in view, whatever the optics could resolve.
        e.visible && self.detail_m.is_none_or(|d| e.resolved_m * k <= d) && self.gsd_m.is_none_or(|g| e.gsd_m * k <= g)
    }

    /// How far inside the need an evaluation lies, as the least relative margin of its parts:
    /// not negative exactly when [`Need::meets`] holds, and continuous along a sweep.
    fn slack(&self, e: &Evaluation) -> f64 {
        let k = self.plane.stretch(e.incidence_deg);
        let part = |want: Option<f64>, have: f64| want.map_or(f64::INFINITY, |w| (w - have * k) / w);
        let slack = part(self.detail_m, e.resolved_m).min(part(self.gsd_m, e.gsd_m));
        if slack.is_nan() || !e.visible {
            -1.0
        } else {
            slack
        }
    }

    /// The limit that keeps an evaluation from the need: for the detail, the governing limit (the
    /// largest part of the GRD), or at the near end of a sweep (`nearest`) motion when it alone is
    /// too large, as it does not shrink close in; for the GSD, sampling.
    fn failing_limit(&self, e: &Evaluation, nearest: bool) -> Limit {
        let k = self.plane.stretch(e.incidence_deg);
        match self.detail_m {
            Some(d) if nearest && e.limits.motion * k > d => Limit::Motion,
            Some(d) if e.resolved_m * k > d => e.governing,
            _ => Limit::Sampling,
        }
    }

    /// The finest figure on the target's plane that an evaluation gives for the failing part of
    /// the need: the GRD for a detail, the GSD for a GSD.
    fn best_figure(&self, e: &Evaluation) -> f64 {
        let k = self.plane.stretch(e.incidence_deg);
        match self.detail_m {
            Some(d) if e.resolved_m * k > d || self.gsd_m.is_none() => e.resolved_m * k,
            _ => e.gsd_m * k,
        }
    }

    /// Whether anything is asked for.
    pub fn is_given(&self) -> bool {
        self.detail_m.is_some() || self.gsd_m.is_some()
    }
}

/// The result of the reach solve.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Reach {
    /// The need is met up to `position_m`; beyond it `bound_by` exceeds the need.
    UpTo { position_m: f64, bound_by: Limit },
    /// The need is met up to `position_m`, where the target sinks below the horizon.
    Horizon { position_m: f64 },
    /// The need is met over the whole domain.
    Everywhere { up_to_m: f64 },
    /// No position meets the need; `forbidden_by` is what stands in the way even close in.
    Nowhere { forbidden_by: Limit, best_m: f64 },
}

impl Reach {
    /// The bounded position, if any.
    pub fn position_m(&self) -> Option<f64> {
        match self {
            Reach::UpTo { position_m, .. } | Reach::Horizon { position_m } => Some(*position_m),
            _ => None,
        }
    }
}

/// Where two limits cross along the axis.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Crossing {
    /// They are equal at `position_m`.
    At {
        position_m: f64,
        larger_below: Limit,
        larger_above: Limit,
    },
    /// They never cross in the domain; `larger` is the larger one throughout.
    Never { larger: Limit },
}

impl Crossing {
    /// The crossing position, if any.
    pub fn position_m(&self) -> Option<f64> {
        match self {
            Crossing::At { position_m, .. } => Some(*position_m),
            Crossing::Never { .. } => None,
        }
    }
}

/// A change of the governing limit along the axis.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct EnvelopeChange {
    pub position_m: f64,
    pub from: Limit,
    pub to: Limit,
}

/// The focal length needed at the current geometry to meet `need_m`, at the same f-number.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum FocalNeed {
    /// Any focal length from `focal_m` up meets the need; `bound_by` sets it.
    AtLeast { focal_m: f64, bound_by: Limit },
    /// No focal length helps: `forbidden_by` (turbulence or motion) does not depend on the lens.
    Impossible { forbidden_by: Limit },
}

/// The shortest and longest focal lengths the focal solve considers (m), and its scan.
const FOCAL_DOMAIN: (f64, f64) = (1e-4, 100.0);
const FOCAL_POINTS: usize = 16;

/// The focal length needed at the current geometry and f-number. For the GSD, a closed form (GSD
/// scales as 1/f, resolution-model §1). For the detail, the GRD: it shrinks with f through the
/// pixels and the aperture while turbulence and motion do not depend on the lens, so a log scan
/// of focal lengths and bisection find the shortest that meets it, and a lens long enough to
/// leave only the air and the motion tells when none does. The longest of the two is needed.
pub fn focal_needed(evaluation: &Evaluation, setup: &Setup, need: &Need) -> FocalNeed {
    let k = need.plane.stretch(evaluation.incidence_deg);
    let range = evaluation.slant_range_m * k;
    let mut best: Option<(f64, Limit)> = None;
    if let Some(d) = need.detail_m {
        if d.is_nan() || d <= 0.0 {
            return FocalNeed::Impossible {
                forbidden_by: evaluation.governing,
            };
        }
        match focal_for_detail(setup, evaluation.r0_m, d, k) {
            Ok(found) => best = Some(found),
            Err(forbidden_by) => return FocalNeed::Impossible { forbidden_by },
        }
    }
    if let Some(g) = need.gsd_m {
        if g.is_nan() || g <= 0.0 {
            return FocalNeed::Impossible {
                forbidden_by: Limit::Sampling,
            };
        }
        let focal_m = setup.pixel_pitch_m() * range / g;
        if best.is_none_or(|(f, _)| focal_m > f) {
            best = Some((focal_m, Limit::Sampling));
        }
    }
    match best {
        Some((focal_m, bound_by)) if focal_m.is_finite() => FocalNeed::AtLeast { focal_m, bound_by },
        _ => FocalNeed::Impossible {
            forbidden_by: evaluation.governing,
        },
    }
}

/// The shortest focal length whose GRD on the plane (stretch `k`) is at most `detail_m`, with the
/// limit that governs there; or the lens-free limit (turbulence or motion) that forbids it.
fn focal_for_detail(setup: &Setup, r0_m: Option<f64>, detail_m: f64, k: f64) -> Result<(f64, Limit), Limit> {
    // The lens leaves the air path as it is: the evaluation's r0 serves every focal length.
    let at = |focal_m: f64| evaluate_through(&Setup { focal_m, ..*setup }, r0_m);
    let meets = |e: &Evaluation| e.resolved_m * k <= detail_m;
    let (lo, hi) = FOCAL_DOMAIN;
    let ratio = (hi / lo).ln();
    let grid: Vec<f64> = (0..FOCAL_POINTS)
        .map(|i| (lo * (ratio * i as f64 / (FOCAL_POINTS - 1) as f64).exp()).clamp(lo, hi))
        .collect();
    let longest = at(hi);
    if !meets(&longest) {
        let lens_free = if longest.limits.motion >= longest.limits.turbulence {
            Limit::Motion
        } else {
            Limit::Turbulence
        };
        return Err(lens_free);
    }
    // The longest focal length of the scan that fails: the answer lies just above it.
    let Some(i) = grid.iter().rposition(|&f| !meets(&at(f))) else {
        return Ok((lo, at(lo).governing));
    };
    let (mut a, mut b) = (grid[i], grid.get(i + 1).copied().unwrap_or(hi));
    // To 1e−8 relative: the figure is shown to three digits.
    for _ in 0..BISECTIONS {
        let mid = 0.5 * (a + b);
        if meets(&at(mid)) {
            b = mid;
        } else {
            a = mid;
        }
        if b - a <= 1e-8 * b {
            break;
        }
    }
    Ok((b, at(b).governing))
}

/// The greatest height or ground distance at which one task reaches 50 % and 80 %.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct TaskRange {
    pub task: Task,
    /// Cycles for 50 % under the chosen critical-dimension model.
    pub cycles_needed: f64,
    pub p50: Reach,
    pub p80: Reach,
    /// The positions of `p50` and `p80` when bounded (null when met everywhere or nowhere).
    pub p50_m: Option<f64>,
    pub p80_m: Option<f64>,
}

/// The greatest position for detection, recognition and identification of a target of
/// `critical_dimension_m` on `plane`, at 50 % and 80 %: the chance reaches p where the cycles
/// across it, dimension ÷ period on the plane, reach N50·r(p), r(p) the TTPF's inverse
/// (resolution-model §6); so each is a reach for a detail of dimension ÷ (N50·r(p)).
pub fn task_ranges(sweep: &Sweep, critical_dimension_m: f64, plane: TargetPlane, model: CdModel) -> Vec<TaskRange> {
    let r80 = ratio_for(0.8);
    [Task::Detection, Task::Recognition, Task::Identification]
        .into_iter()
        .filter_map(|task| {
            let n50 = model.n50(task)?;
            let reach_for = |ratio: f64| {
                sweep.reach(&Need {
                    detail_m: Some(critical_dimension_m / (n50 * ratio)),
                    gsd_m: None,
                    plane,
                })
            };
            let (p50, p80) = (reach_for(1.0), reach_for(r80));
            Some(TaskRange {
                task,
                cycles_needed: n50,
                p50,
                p80,
                p50_m: p50.position_m(),
                p80_m: p80.position_m(),
            })
        })
        .collect()
}
