//! The real ground under a survey: relief (ground higher or lower than the take-off point), wind
//! along the flight lines, and the edges of the block.
//!
//! Architecture invariant: like the survey, every function takes any inputs and answers with
//! finite figures in SI, or a typed reason (`Err`) with the figures that explain it; nothing
//! here writes a sentence, and nothing panics.

/// The most photos a plan counts (per line and in total); beyond it the counts are withheld.
pub const MAX_PHOTOS: u64 = 10_000_000;

/// Which overlap a figure or a note is about.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum OverlapSide {
    Front,
    Side,
}

/// Whether flight line `number` (counted from 1) is flown along the heading: the lines are flown
/// in a serpentine, line 1 along the heading, line 2 back, and so on.
pub fn flies_forward(number: u64) -> bool {
    number % 2 == 1
}

/// The front overlap a mapping orthomosaic needs at least, percent: the lower bound of the
/// mapping class in `survey::overlap_guidance` (common practice for drone mapping: 75–80 %).
pub const MAPPING_FRONT_PCT: f64 = 75.0;

/// The side overlap a mapping orthomosaic needs at least, percent (common practice: 60–70 %).
pub const MAPPING_SIDE_PCT: f64 = 60.0;

/// The least front overlap of any survey, percent: below it neighbouring photos no longer make a
/// stereo pair over the whole base (classic film surveys planned 60 %; common practice).
pub const MINIMUM_FRONT_PCT: f64 = 60.0;

/// The least side overlap of any survey, percent (classic film surveys: 30 %; common practice).
pub const MINIMUM_SIDE_PCT: f64 = 30.0;

/// The extra photos at each end of every line in the cited worked example (NPTEL course
/// 105104100, Photogrammetry, "Flight planning", Example 1: two at each end).
pub const WORKED_EXAMPLE_EXTRA_PHOTOS_PER_END: u64 = 2;

/// A finite, strictly positive number, or `None` (the survey's and the boundary's too).
pub(crate) fn positive(x: f64) -> Option<f64> {
    (x.is_finite() && x > 0.0).then_some(x)
}

/// ceil(x) for a non-negative x, forgiving rounding noise: an area that is an exact multiple of the
/// spacing (400 m at 40 m, say) must not gain a line because 400/40 came out as 10.000000000000002.
/// Every count of the survey, its edges and the boundary's plan rounds so.
pub(crate) fn ceil_forgiving(x: f64) -> f64 {
    (x - 1e-9 * x.max(1.0)).ceil().max(0.0)
}

/// [`ceil_forgiving`] of x ≥ 0 as a count, or `None` when x is not a usable count below `cap`.
fn ceil_count(x: f64, cap: u64) -> Option<u64> {
    if !(x.is_finite() && x >= 0.0) {
        return None;
    }
    let c = ceil_forgiving(x);
    (c <= cap as f64).then_some(c as u64)
}

// ---------------------------------------------------------------------------------------------
// Relief

/// A survey planned at take-off level, and the ground under it.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct ReliefInputs {
    /// The planned height above the take-off point.
    pub height_m: f64,
    /// The lowest and highest ground under the block, relative to the take-off point (either
    /// order; below take-off is negative).
    pub lowest_ground_m: f64,
    pub highest_ground_m: f64,
    /// The GSD at take-off level (at `height_m` above the ground).
    pub gsd_m: f64,
    /// One photo's ground footprint at take-off level, across and along the lines.
    pub footprint_across_m: f64,
    pub footprint_along_m: f64,
    /// The distance flown between photos and between lines, as planned.
    pub base_m: f64,
    pub line_spacing_m: f64,
}

/// Which input of the relief cannot be used, or why the plan cannot be flown over it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ReliefUnusable {
    /// The height above take-off is not a positive number.
    Height { height_m: f64 },
    /// A ground height is not a number.
    Ground,
    /// The GSD, a footprint, the base or the spacing is not a positive number.
    Layout,
    /// The planned base or spacing is as long as the footprint or longer: no overlap to keep.
    NoOverlapPlanned,
    /// The highest ground reaches the flight height: the aircraft would meet it.
    GroundReachesFlight { highest_ground_m: f64, height_m: f64 },
}

/// The overlap that a warning measures against.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum OverlapNeed {
    /// What a mapping orthomosaic needs: [`MAPPING_FRONT_PCT`] / [`MAPPING_SIDE_PCT`].
    Mapping,
    /// The least of any survey: [`MINIMUM_FRONT_PCT`] / [`MINIMUM_SIDE_PCT`].
    Minimum,
}

impl OverlapNeed {
    /// The overlap this need asks for on `side`, percent.
    pub fn pct(self, side: OverlapSide) -> f64 {
        match (self, side) {
            (OverlapNeed::Mapping, OverlapSide::Front) => MAPPING_FRONT_PCT,
            (OverlapNeed::Mapping, OverlapSide::Side) => MAPPING_SIDE_PCT,
            (OverlapNeed::Minimum, OverlapSide::Front) => MINIMUM_FRONT_PCT,
            (OverlapNeed::Minimum, OverlapSide::Side) => MINIMUM_SIDE_PCT,
        }
    }
}

/// What the relief does to a survey, with the figures in SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ReliefNote {
    /// The relief takes an overlap below a need: `least_pct` at the highest ground, below the
    /// `planned_pct` at take-off level and below `need` (the strictest need it fails).
    OverlapShort {
        side: OverlapSide,
        least_pct: f64,
        planned_pct: f64,
        need: OverlapNeed,
    },
    /// The lowest and highest ground were given the other way round and were swapped.
    GroundSwapped,
}

/// A survey's figures over the relief. GSD and footprint scale with the height above the ground
/// below (h − z)/h of their take-off values (plain geometry, straight down), so the finest GSD and
/// the least overlaps are at the highest ground, the coarsest GSD at the lowest.
#[derive(Clone, Debug, PartialEq)]
pub struct ReliefPlan {
    /// The GSD at the highest ground (report field `gsd_min_m`).
    pub gsd_min_m: f64,
    /// The GSD at the lowest ground (`gsd_max_m`).
    pub gsd_max_m: f64,
    /// The planned overlaps at take-off level, percent: 100·(1 − base/footprint).
    pub front_planned_pct: f64,
    pub side_planned_pct: f64,
    /// The least overlaps over the block, at the highest ground, percent (`front_min_pct`,
    /// `side_min_pct`); 0 where photos no longer touch.
    pub front_min_pct: f64,
    pub side_min_pct: f64,
    /// The greatest overlaps, at the lowest ground, percent.
    pub front_max_pct: f64,
    pub side_max_pct: f64,
    /// The height above take-off that gives the planned overlaps at the highest ground with the
    /// base and spacing unchanged: h + highest ground. `None` when no ground is above take-off.
    pub restoring_height_m: Option<f64>,
    /// The base and line spacing that give the planned overlaps at the highest ground at the
    /// planned height: base·(h − z_max)/h and spacing·(h − z_max)/h. `None` as above.
    pub restoring_base_m: Option<f64>,
    pub restoring_line_spacing_m: Option<f64>,
    /// Warnings, and what was assumed.
    pub notes: Vec<ReliefNote>,
}

/// Overlap in percent of photos `step` apart with footprint `footprint`, never below 0.
fn overlap_pct(step: f64, footprint: f64) -> f64 {
    let pct = 100.0 * (1.0 - step / footprint);
    if pct.is_finite() {
        pct.max(0.0)
    } else {
        0.0
    }
}

/// A survey's GSD and overlaps over ground from the lowest to the highest relative to take-off,
/// with a warning for each side whose least overlap the relief takes below what mapping needs
/// (or below the least of any survey), and the height or the base and spacing that would
/// restore the planned overlaps at the highest ground.
pub fn plan_over_relief(inputs: &ReliefInputs) -> Result<ReliefPlan, ReliefUnusable> {
    let h = inputs.height_m;
    let h = positive(h).ok_or(ReliefUnusable::Height { height_m: h })?;
    let (lo, hi) = (inputs.lowest_ground_m, inputs.highest_ground_m);
    if !(lo.is_finite() && hi.is_finite()) {
        return Err(ReliefUnusable::Ground);
    }
    let mut notes = Vec::new();
    let (lo, hi) = if lo > hi {
        notes.push(ReliefNote::GroundSwapped);
        (hi, lo)
    } else {
        (lo, hi)
    };
    let layout = [
        inputs.gsd_m,
        inputs.footprint_across_m,
        inputs.footprint_along_m,
        inputs.base_m,
        inputs.line_spacing_m,
    ];
    if !layout.iter().all(|x| positive(*x).is_some()) {
        return Err(ReliefUnusable::Layout);
    }
    if inputs.base_m >= inputs.footprint_along_m || inputs.line_spacing_m >= inputs.footprint_across_m {
        return Err(ReliefUnusable::NoOverlapPlanned);
    }
    let clearance_high = h - hi;
    // A tenth of a millimetre of clearance is no clearance.
    if clearance_high <= 1e-4 {
        return Err(ReliefUnusable::GroundReachesFlight {
            highest_ground_m: hi,
            height_m: h,
        });
    }
    let scale_high = clearance_high / h;
    let scale_low = (h - lo) / h;
    let (gsd_min_m, gsd_max_m) = (inputs.gsd_m * scale_high, inputs.gsd_m * scale_low);
    if !(gsd_min_m.is_finite() && gsd_max_m.is_finite()) {
        return Err(ReliefUnusable::Ground);
    }

    let front_planned_pct = overlap_pct(inputs.base_m, inputs.footprint_along_m);
    let side_planned_pct = overlap_pct(inputs.line_spacing_m, inputs.footprint_across_m);
    let front_min_pct = overlap_pct(inputs.base_m, inputs.footprint_along_m * scale_high);
    let side_min_pct = overlap_pct(inputs.line_spacing_m, inputs.footprint_across_m * scale_high);
    for (side, least_pct, planned_pct) in [
        (OverlapSide::Front, front_min_pct, front_planned_pct),
        (OverlapSide::Side, side_min_pct, side_planned_pct),
    ] {
        // Only what the relief takes away is warned of here: a plan below the need on level
        // ground is the survey's overlap advice to give.
        let dropped = least_pct < planned_pct - 1e-9;
        let need = [OverlapNeed::Minimum, OverlapNeed::Mapping]
            .into_iter()
            .find(|need| least_pct < need.pct(side));
        if let (true, Some(need)) = (dropped, need) {
            notes.push(ReliefNote::OverlapShort {
                side,
                least_pct,
                planned_pct,
                need,
            });
        }
    }
    let raised = hi > 0.0;
    let finite = |x: f64| Some(x).filter(|x| raised && x.is_finite());
    Ok(ReliefPlan {
        gsd_min_m,
        gsd_max_m,
        front_planned_pct,
        side_planned_pct,
        front_min_pct,
        side_min_pct,
        front_max_pct: overlap_pct(inputs.base_m, inputs.footprint_along_m * scale_low),
        side_max_pct: overlap_pct(inputs.line_spacing_m, inputs.footprint_across_m * scale_low),
        restoring_height_m: finite(h + hi),
        restoring_base_m: finite(inputs.base_m * scale_high),
        restoring_line_spacing_m: finite(inputs.line_spacing_m * scale_high),
        notes,
    })
}

// ---------------------------------------------------------------------------------------------
// Wind

/// A leg of the serpentine: along the line heading, or back.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Leg {
    /// Along the line heading (odd lines, counted from 1).
    Out,
    /// Against it (even lines).
    Back,
}

impl Leg {
    /// The leg that flight line `number` (counted from 1) flies, as the survey lays them out.
    pub fn of_line(number: u64) -> Leg {
        if flies_forward(number) {
            Leg::Out
        } else {
            Leg::Back
        }
    }
}

/// The air and the line: `airspeed_mps` through the air, wind `wind_mps` blowing from
/// `wind_from_deg` (degrees clockwise from north, as weather reports give it), lines flown out
/// along `heading_deg` (degrees clockwise from north) and back.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct WindInputs {
    pub airspeed_mps: f64,
    pub wind_mps: f64,
    pub wind_from_deg: f64,
    pub heading_deg: f64,
}

/// How one leg is flown in the wind.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LegInWind {
    /// Speed over the ground along the line.
    pub ground_speed_mps: f64,
    /// The angle between the aircraft's nose and the line, radians; positive when the nose
    /// points to the right of the line (clockwise, seen from above).
    pub crab_rad: f64,
}

/// Wind on the flight lines: the wind triangle solved for both legs.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WindOnLines {
    pub out: LegInWind,
    pub back: LegInWind,
    /// The wind along the line heading (positive: a tailwind on the out leg), m/s.
    pub along_mps: f64,
    /// The wind across the line (positive: from the left of the out leg towards its right), m/s.
    pub across_mps: f64,
}

impl WindOnLines {
    /// The leg with the greater ground speed; `None` when both are equal (no wind along, to a
    /// part in 10⁹, so that a wind straight across is not split by rounding).
    pub fn fastest(&self) -> Option<Leg> {
        let (o, b) = (self.out.ground_speed_mps, self.back.ground_speed_mps);
        if (o - b).abs() <= 1e-9 * o.max(b) {
            None
        } else if o > b {
            Some(Leg::Out)
        } else if b > o {
            Some(Leg::Back)
        } else {
            None
        }
    }

    /// The greater ground speed of the two legs, for the smear and the trigger interval.
    pub fn fastest_ground_speed_mps(&self) -> f64 {
        self.out.ground_speed_mps.max(self.back.ground_speed_mps)
    }

    /// How `leg` is flown.
    pub fn leg(&self, leg: Leg) -> LegInWind {
        match leg {
            Leg::Out => self.out,
            Leg::Back => self.back,
        }
    }

    /// The mean ground speed over an out-and-back pair of equal lines, 2/(1/v_out + 1/v_back)
    /// (the harmonic mean: equal distances, unequal times), for the flight time.
    pub fn pair_ground_speed_mps(&self) -> f64 {
        let (o, b) = (self.out.ground_speed_mps, self.back.ground_speed_mps);
        2.0 * o * b / (o + b)
    }
}

/// Why the lines cannot be flown in this wind, or which input cannot be used.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum WindLimit {
    /// The airspeed is not a positive number.
    NoAirspeed,
    /// The wind speed is not a number ≥ 0, or a direction is not a number.
    WindUnusable,
    /// The wind across the line is as fast as the airspeed or faster: no heading holds the line.
    CannotHoldLine { across_mps: f64, airspeed_mps: f64 },
    /// The line can be held, but the headwind on `leg` leaves no ground speed.
    NoHeadway { leg: Leg, wind_mps: f64, airspeed_mps: f64 },
}

/// The wind triangle for the out and back legs. With δ the angle from the line heading to the
/// direction the wind blows towards (wind from + 180°), the wind along the line is w·cos δ and
/// across it c = w·sin δ; holding the line takes a crab angle asin(c/V) into the wind, and the
/// ground speed is √(V² − c²) ± the wind along (the navigation wind triangle; common practice).
pub fn wind_on_lines(inputs: &WindInputs) -> Result<WindOnLines, WindLimit> {
    let v = positive(inputs.airspeed_mps).ok_or(WindLimit::NoAirspeed)?;
    let w = inputs.wind_mps;
    let usable = w.is_finite() && w >= 0.0 && inputs.wind_from_deg.is_finite() && inputs.heading_deg.is_finite();
    if !usable {
        return Err(WindLimit::WindUnusable);
    }
    let towards = (inputs.wind_from_deg + 180.0 - inputs.heading_deg).rem_euclid(360.0);
    let (sin, cos) = towards.to_radians().sin_cos();
    let (along, across) = (w * cos, w * sin);
    if across.abs() >= v {
        return Err(WindLimit::CannotHoldLine {
            across_mps: across.abs(),
            airspeed_mps: v,
        });
    }
    // The part of the airspeed left along the line once the crab cancels the crosswind.
    let held = ((v - across.abs()) * (v + across.abs())).sqrt();
    let crab = (across / v).asin();
    let out = LegInWind {
        ground_speed_mps: held + along,
        // A wind towards the right pushes the aircraft right: the nose turns left, into it.
        crab_rad: -crab,
    };
    let back = LegInWind {
        ground_speed_mps: held - along,
        crab_rad: crab,
    };
    for (leg, speed) in [(Leg::Out, out.ground_speed_mps), (Leg::Back, back.ground_speed_mps)] {
        if speed <= 0.0 {
            return Err(WindLimit::NoHeadway {
                leg,
                wind_mps: w,
                airspeed_mps: v,
            });
        }
    }
    let result = WindOnLines {
        out,
        back,
        along_mps: along,
        across_mps: across,
    };
    let all_finite = [held, along, across, crab].iter().all(|x| x.is_finite());
    if all_finite {
        Ok(result)
    } else {
        Err(WindLimit::WindUnusable)
    }
}

// ---------------------------------------------------------------------------------------------
// The edges of the block

/// A survey's layout as the edges need it.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct EdgeInputs {
    pub footprint_across_m: f64,
    pub footprint_along_m: f64,
    pub base_m: f64,
    pub line_spacing_m: f64,
    /// Lines, and photos on each line between the area's ends (ceil(length/B) + 1).
    pub lines: u64,
    pub photos_per_line: u64,
    /// The extra photos taken beyond each end of every line; the worked example takes
    /// [`WORKED_EXAMPLE_EXTRA_PHOTOS_PER_END`].
    pub extra_photos_per_end: u64,
}

/// The edges of the block: the photos beyond the ends of the lines, and how far beyond the area
/// the photos must reach for its edge to have the same overlap as its middle.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BlockEdges {
    /// Photos on every line with the extras at both ends.
    pub photos_per_line: u64,
    /// Photos in all with the extras.
    pub photos: u64,
    /// How far beyond each end of the area the extra photos' centres reach: extras × base.
    pub extension_m: f64,
    /// The margin beyond each end of the lines that full overlap needs: half a footprint along.
    /// A point lies in every photo whose centre is within half a footprint of it, so the area's
    /// edge is in as many photos as its middle only when centres reach that far beyond it.
    pub full_overlap_margin_along_m: f64,
    /// The same beyond each side edge: half a footprint across.
    pub full_overlap_margin_across_m: f64,
    /// The photos beyond each end that reach the margin along: ceil(footprint/(2·base)).
    pub photos_for_margin: u64,
    /// The lines beyond each side that reach the margin across: ceil(footprint/(2·spacing)).
    pub lines_for_margin: u64,
}

/// Why the edges cannot be counted.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum EdgeUnusable {
    /// A footprint, the base or the spacing is not a positive number.
    Layout,
    /// The counts with the extras pass the survey's cap ([`MAX_PHOTOS`]).
    TooManyPhotos,
}

/// The photos `base_m` apart beyond an end of a line that reach half a footprint `footprint_m`
/// beyond it, ceil(footprint/(2·base)): then the area's end lies in as many photos as its middle
/// (with 60 % front overlap, 2, as the worked example adds at each end). `None` when the inputs
/// are not positive or the count passes [`MAX_PHOTOS`].
pub fn photos_to_margin(footprint_m: f64, base_m: f64) -> Option<u64> {
    ceil_count(0.5 * positive(footprint_m)? / positive(base_m)?, MAX_PHOTOS)
}

/// The block's edges: the lines' photo counts with the extras at each end (as the worked example
/// adds them) and the margins that full overlap at the area's edge needs.
pub fn block_edges(inputs: &EdgeInputs) -> Result<BlockEdges, EdgeUnusable> {
    let steps = [
        inputs.footprint_across_m,
        inputs.footprint_along_m,
        inputs.base_m,
        inputs.line_spacing_m,
    ];
    if !steps.iter().all(|x| positive(*x).is_some()) {
        return Err(EdgeUnusable::Layout);
    }
    let photos_per_line = inputs
        .extra_photos_per_end
        .checked_mul(2)
        .and_then(|e| e.checked_add(inputs.photos_per_line))
        .filter(|&p| p <= MAX_PHOTOS)
        .ok_or(EdgeUnusable::TooManyPhotos)?;
    let photos = photos_per_line
        .checked_mul(inputs.lines)
        .filter(|&p| p <= MAX_PHOTOS)
        .ok_or(EdgeUnusable::TooManyPhotos)?;
    let margin_along = 0.5 * inputs.footprint_along_m;
    let margin_across = 0.5 * inputs.footprint_across_m;
    let photos_for_margin =
        photos_to_margin(inputs.footprint_along_m, inputs.base_m).ok_or(EdgeUnusable::TooManyPhotos)?;
    let lines_for_margin =
        ceil_count(margin_across / inputs.line_spacing_m, MAX_PHOTOS).ok_or(EdgeUnusable::TooManyPhotos)?;
    let extension_m = inputs.extra_photos_per_end as f64 * inputs.base_m;
    if !extension_m.is_finite() {
        return Err(EdgeUnusable::TooManyPhotos);
    }
    Ok(BlockEdges {
        photos_per_line,
        photos,
        extension_m,
        full_overlap_margin_along_m: margin_along,
        full_overlap_margin_across_m: margin_across,
        photos_for_margin,
        lines_for_margin,
    })
}
