//! Backward solves: from a required resolution back to the greatest height or range, the focal
//! length needed, and the heights where one limit overtakes another.
//!
//! No limit is assumed to be monotonic: each solve scans a log-spaced table over the whole domain
//! and refines the last crossing by bisection, so a profile that makes turbulence shrink with
//! height is handled as well as the plain cases.

use crate::core::physics::engine::{evaluate, Evaluation, Limit, Setup};
use crate::core::physics::geometry::Geometry;
use crate::core::physics::optics::RAYLEIGH_FACTOR;
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

    /// The setup at position `x` along the axis.
    pub fn setup_at(&self, x: f64) -> Setup {
        let geometry = match self.axis {
            Axis::Height => Geometry::tilted(x, self.look_angle_rad),
            Axis::GroundDistance => Geometry {
                height_m: self.base.geometry.height_m,
                ground_distance_m: x,
            },
        };
        self.base.with_geometry(geometry)
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

    /// The greatest position along the axis at which the governing limit is at most `need_m`.
    pub fn reach(&self, need_m: f64) -> Reach {
        let meets = |e: &Evaluation| e.limit_m <= need_m;
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
                // Motion does not depend on the geometry, so name it first when it alone is too large.
                let forbidden_by = if first.limits.motion > need_m {
                    Limit::Motion
                } else {
                    first.governing
                };
                Reach::Nowhere {
                    forbidden_by,
                    best_m: first.limit_m,
                }
            }
            Some(i) if i + 1 == self.table.len() => Reach::Everywhere {
                up_to_m: self.table[i].0,
            },
            Some(i) => {
                let x = self.bisect(self.table[i].0, self.table[i + 1].0, meets);
                let beyond = evaluate(&self.setup_at(x * (1.0 + 1e-6)));
                Reach::UpTo {
                    position_m: x,
                    bound_by: beyond.governing,
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

/// The result of the reach solve.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Reach {
    /// The need is met up to `position_m`; beyond it `bound_by` exceeds the need.
    UpTo { position_m: f64, bound_by: Limit },
    /// The need is met over the whole domain.
    Everywhere { up_to_m: f64 },
    /// No position meets the need; `forbidden_by` is what stands in the way even close in.
    Nowhere { forbidden_by: Limit, best_m: f64 },
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

/// Closed form: GSD and the Rayleigh distance both scale as 1/f at a fixed f-number
/// (resolution-model §1–§2), while seeing and motion do not depend on the lens.
pub fn focal_needed(evaluation: &Evaluation, setup: &Setup, need_m: f64) -> FocalNeed {
    if need_m.is_nan() || need_m <= 0.0 {
        return FocalNeed::Impossible {
            forbidden_by: evaluation.governing,
        };
    }
    let lens_free = [
        (Limit::Turbulence, evaluation.limits.turbulence),
        (Limit::Motion, evaluation.limits.motion),
    ];
    if let Some((limit, _)) = lens_free
        .iter()
        .filter(|(_, v)| *v > need_m)
        .max_by(|a, b| a.1.total_cmp(&b.1))
    {
        return FocalNeed::Impossible { forbidden_by: *limit };
    }
    let range = evaluation.slant_range_m;
    // The sampling limit is 2·GSD = 2·p·R/f (resolution-model §5).
    let for_sampling = 2.0 * setup.pixel_pitch_m() * range / need_m;
    let for_diffraction = RAYLEIGH_FACTOR * setup.wavelength_m * setup.f_number * range / need_m;
    if for_sampling >= for_diffraction {
        FocalNeed::AtLeast {
            focal_m: for_sampling,
            bound_by: Limit::Sampling,
        }
    } else {
        FocalNeed::AtLeast {
            focal_m: for_diffraction,
            bound_by: Limit::Diffraction,
        }
    }
}
