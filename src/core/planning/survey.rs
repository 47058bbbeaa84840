//! Survey layout for a camera looking straight down (resolution-model §7): footprint, photo base,
//! line spacing, counts, path, flight time, batteries and storage; the ground speeds that motion
//! blur and the camera's shortest interval allow; overlap guidance; and a plain-data diagram of
//! the first lines for the page to draw.
//!
//! Architecture invariant: the survey takes any inputs, validated or not, and answers with
//! finite numbers, or `None` beside a typed note that says why (the words layer words it).
//! Counts are capped before anything uses them, nothing is looped over or allocated per photo,
//! and no division can meet a zero.

use serde::Serialize;

use crate::core::planning::ground::{
    ceil_forgiving, photos_to_margin, plan_over_relief, positive, wind_on_lines, EdgeInputs, ReliefInputs, ReliefPlan,
    ReliefUnusable, WindInputs, WindLimit, WindOnLines,
};
pub use crate::core::planning::ground::{flies_forward, OverlapSide, MAX_PHOTOS};

/// The most flight lines a plan counts; beyond it the counts are withheld with a note, since such
/// a plan is a mistake in the inputs rather than a survey anyone will fly.
pub const MAX_LINES: u64 = 100_000;

/// The most flight lines the layout diagram carries; the rest are counted as omitted.
pub const MAX_DRAWN_LINES: u64 = 60;

/// How many photos of line 1 the diagram outlines, so that the front overlap shows.
const DRAWN_PHOTOS_LINE_1: u64 = 3;

/// The survey's own settings: the contract's survey keys, in its units (%, m, s, min, MB,
/// pixels, degrees). The scenario holds them as they are.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct SurveySettings {
    pub front_overlap_pct: f64,
    pub side_overlap_pct: f64,
    /// Width across the lines and length along them.
    pub area_width_m: Option<f64>,
    pub area_length_m: Option<f64>,
    /// The camera's shortest interval between photos.
    pub trigger_s: f64,
    pub endurance_min: f64,
    pub turn_s: f64,
    pub photo_mb: f64,
    pub blur_budget_px: f64,
    /// The area's first corner (WGS 84) and the heading of the lines, for the map export.
    pub latitude_deg: Option<f64>,
    pub longitude_deg: Option<f64>,
    pub heading_deg: f64,
    /// The lowest and highest ground under the block relative to the take-off point (`relief`);
    /// `None` for level ground at take-off height.
    pub relief_m: Option<(f64, f64)>,
    /// The wind speed and the direction it blows from, degrees from north (`wind`, `wdir`); with
    /// a wind, the planned speed is the speed through the air.
    pub wind_mps: f64,
    pub wind_from_deg: f64,
}

impl SurveySettings {
    /// The wind triangle of the lines flown at `airspeed_mps` through the air in this wind;
    /// `None` in still air. The survey's figures and the engine's smear both take it from here.
    pub fn wind_on_lines(&self, airspeed_mps: f64) -> Option<Result<WindOnLines, WindLimit>> {
        (self.wind_mps != 0.0).then(|| {
            wind_on_lines(&WindInputs {
                airspeed_mps,
                wind_mps: self.wind_mps,
                wind_from_deg: self.wind_from_deg,
                heading_deg: self.heading_deg,
            })
        })
    }
}

/// What the survey needs: its settings, and what it takes from the camera, the lens and the view.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct SurveyInputs {
    pub sensor_width_mm: f64,
    pub sensor_height_mm: f64,
    pub focal_mm: f64,
    pub height_m: f64,
    /// False when the scenario looks at a tilt or at a ground distance: the layout still assumes
    /// straight down, and a note says so.
    pub looks_down: bool,
    /// The GSD at the target, for the blur limit.
    pub gsd_m: f64,
    pub speed_mps: f64,
    pub shutter_s: f64,
    pub settings: SurveySettings,
}

/// Which side of the area a note is about.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum AreaSide {
    /// Across the lines (`aw`).
    Width,
    /// Along the lines (`al`).
    Length,
}

/// What the survey assumed, left out or capped, with the figures in SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SurveyNote {
    /// The layout assumes straight down although the scenario looks at a tilt or a distance.
    AssumesStraightDown,
    /// The photo footprint is zero.
    NoFootprint,
    /// An overlap outside [0, 100) %.
    OverlapUnusable { side: OverlapSide, pct: f64 },
    /// Neither side of the area is given.
    NoArea,
    /// One side of the area is missing.
    AreaSideMissing { side: AreaSide },
    /// One side of the area is not a usable length.
    AreaSideUnusable { side: AreaSide, value: f64 },
    /// More than [`MAX_LINES`] lines.
    TooManyLines { width_m: f64, spacing_m: f64 },
    /// More than [`MAX_PHOTOS`] photos on a line.
    TooManyPhotosPerLine { length_m: f64, base_m: f64 },
    /// More than [`MAX_PHOTOS`] photos in all.
    TooManyPhotos { lines: u64, photos_per_line: u64 },
    /// No usable ground speed.
    NoSpeed,
    /// The flight time overflows.
    FlightTimeUncountable,
    /// No usable flight time per battery.
    NoEndurance,
    /// What the flight time leaves out (take-off, transit, landing).
    FlightTimeCovers,
    /// The lines cannot be flown in the wind, or the wind cannot be used.
    Wind(WindLimit),
    /// The relief cannot be used, or the ground reaches the flight height.
    Relief(ReliefUnusable),
}

/// A speed that the plan exceeds, with what the words need to say why and what to change.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SpeedFlag {
    /// The smear in one exposure exceeds the blur budget.
    Blur {
        speed_mps: f64,
        limit_mps: f64,
        budget_px: f64,
        exposure_s: f64,
    },
    /// Photos would be due faster than the camera can take them.
    Trigger {
        speed_mps: f64,
        limit_mps: f64,
        /// The interval the plan asks for at this speed.
        due_s: Option<f64>,
        camera_interval_s: f64,
    },
}

impl SpeedFlag {
    /// `blur` or `trigger`, for tests, styling and the report.
    pub fn code(&self) -> &'static str {
        match self {
            SpeedFlag::Blur { .. } => "blur",
            SpeedFlag::Trigger { .. } => "trigger",
        }
    }

    /// The largest ground speed this limit allows, m/s.
    pub fn limit_mps(&self) -> f64 {
        match *self {
            SpeedFlag::Blur { limit_mps, .. } | SpeedFlag::Trigger { limit_mps, .. } => limit_mps,
        }
    }
}

/// Where the chosen overlaps sit against common practice.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum OverlapClass {
    /// Not numbers the layout can use.
    NotNumbers,
    /// Below even classic film surveys (60 % / 30 %).
    Low,
    /// Beyond what 3D models need.
    Heavy,
    /// Suits 3D models of buildings and trees (80–90 % / 70–80 %).
    ThreeD,
    /// Suits a mapping orthomosaic (75–80 % / 60–70 %).
    Mapping,
    /// Between film surveys and drone mapping.
    Light,
}

impl OverlapClass {
    /// `low`, `light`, `mapping`, `3d` or `heavy`, for tests, styling and the report.
    pub fn code(self) -> &'static str {
        match self {
            OverlapClass::NotNumbers | OverlapClass::Low => "low",
            OverlapClass::Heavy => "heavy",
            OverlapClass::ThreeD => "3d",
            OverlapClass::Mapping => "mapping",
            OverlapClass::Light => "light",
        }
    }
}

/// The chosen overlaps and where they sit.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OverlapAdvice {
    pub class: OverlapClass,
    pub front_pct: f64,
    pub side_pct: f64,
}

/// The survey figures of a plan, in SI units; field names are the report's
/// (`url-and-report.md`). Fields that need the area, a speed or a camera interval are `None`
/// when that input is missing, and a note says so. The typed flags and notes are not serialised:
/// the report carries them in words.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SurveyPlan {
    /// Ground width of one photo across the flight direction: sensor width·h/f (plain geometry;
    /// the sensor's columns lie across the flight direction).
    pub footprint_across_m: f64,
    /// Ground length of one photo along the flight direction: sensor height·h/f.
    pub footprint_along_m: f64,
    /// Distance flown between photos, B = (1 − front overlap)·footprint along (resolution-model §7).
    pub base_m: f64,
    /// Distance between flight lines, S = (1 − side overlap)·footprint across (resolution-model §7).
    pub line_spacing_m: f64,
    /// Time between photos at the planned speed, B/speed; `None` when the speed is 0.
    pub trigger_s: Option<f64>,
    /// Flight lines, ceil(area width/S) + 1 (resolution-model §7).
    pub lines: Option<u64>,
    /// Photos taken beyond each end of every line, ceil(footprint along/(2·B)), so that the
    /// area's ends lie in as many photos as its middle (two with 60 % front overlap, as the worked
    /// example in resolution-model §7 adds).
    pub extra_photos_per_end: Option<u64>,
    /// Photos on each line, ceil(area length/B) + 1 + the extras at both ends (resolution-model §7).
    pub photos_per_line: Option<u64>,
    /// Photos in the whole survey, lines × photos per line.
    pub photos: Option<u64>,
    /// The margin beyond the area's ends and sides that full overlap needs: half a footprint
    /// along and across. A point lies in every photo whose centre is within half a footprint.
    pub margin_along_m: f64,
    pub margin_across_m: f64,
    /// Distance flown: lines·(length + 2·extras·B) + (lines − 1)·S, each line reaching its extra
    /// photos, the turns counted as straight hops between neighbouring lines.
    pub path_length_m: Option<f64>,
    /// Time over the area: path/speed + (lines − 1)·time per turn; in a wind, the speed is the
    /// mean over an out-and-back pair of legs, 2/(1/v_out + 1/v_back).
    pub flight_time_s: Option<f64>,
    /// Batteries (or flights) the flight time needs: ceil(flight time / usable time per battery).
    pub batteries: Option<u64>,
    /// Storage for the photos: photos × size of one photo, MB.
    pub storage_mb: Option<f64>,
    /// The ground speed that keeps motion smear within the blur budget: budget·GSD/exposure
    /// (resolution-model §4, common practice).
    pub max_speed_blur_mps: Option<f64>,
    /// The ground speed at which photos are due as fast as the camera can take them: B/shortest
    /// interval; `None` when the camera's interval is 0 (not limiting).
    pub max_speed_trigger_mps: Option<f64>,
    /// In a wind: the ground speed on the legs flown along the heading (odd lines) and back, and
    /// the crab angle that holds the line, degrees, positive with the nose right of the line on
    /// the out leg (the wind triangle; common practice). `None` without wind.
    pub ground_speed_out_mps: Option<f64>,
    pub ground_speed_back_mps: Option<f64>,
    pub crab_deg: Option<f64>,
    /// Over the relief: the finest and coarsest GSD (at the highest and lowest ground) and the
    /// least front and side overlaps (at the highest ground), percent. `None` without relief.
    pub gsd_min_m: Option<f64>,
    pub gsd_max_m: Option<f64>,
    pub front_min_pct: Option<f64>,
    pub side_min_pct: Option<f64>,
    /// The height above take-off that keeps the planned overlaps over the highest ground (h +
    /// highest ground); `None` when no ground is above take-off.
    pub relief_height_m: Option<f64>,
    /// The relief's figures and warnings, when a relief is given.
    #[serde(skip)]
    pub relief: Option<ReliefPlan>,
    /// The wind on the lines, when a wind is given and the lines can be flown in it.
    #[serde(skip)]
    pub wind: Option<WindOnLines>,
    /// The speed the flight time is counted at: the planned speed in still air, the mean over a
    /// pair of legs in a wind; `None` when there is none.
    #[serde(skip)]
    pub time_speed_mps: Option<f64>,
    /// The limits that the planned speed exceeds (in a wind, on the fastest leg).
    #[serde(skip)]
    pub speed_flags: Vec<SpeedFlag>,
    /// Where the overlaps sit against common practice.
    #[serde(skip)]
    pub overlap: OverlapAdvice,
    /// What the survey assumed, left out or capped.
    #[serde(skip)]
    pub notes: Vec<SurveyNote>,
}

/// a/b when both are usable (a ≥ 0, b > 0) and the quotient is finite.
fn ratio(a: f64, b: f64) -> Option<f64> {
    if !(a.is_finite() && a >= 0.0) {
        return None;
    }
    let q = a / positive(b)?;
    q.is_finite().then_some(q)
}

/// Stations on a line of `extent` at `step` apart, ceil(extent/step) + 1 (resolution-model §7),
/// or `None` when that is more than `cap` or the inputs are unusable. The cap is checked on the
/// floating-point quotient first, so an absurd count is never formed as an integer.
fn stations(extent: f64, step: f64, cap: u64) -> Option<u64> {
    if !(extent.is_finite() && extent >= 0.0) {
        return None;
    }
    let spaces = ceil_forgiving(ratio(extent, step)?);
    // Every whole number up to 2^53 is exact in f64, far above any cap used here.
    if spaces + 1.0 > cap as f64 {
        return None;
    }
    Some(spaces as u64 + 1)
}

/// The photo footprint on flat ground below a camera looking straight down: sensor size·h/f.
fn footprint_m(sensor_mm: f64, height_m: f64, focal_mm: f64) -> f64 {
    // The millimetres cancel: sensor size and focal length are both in mm.
    match ratio(sensor_mm * height_m, focal_mm) {
        Some(x) if x.is_finite() => x,
        _ => 0.0,
    }
}

/// An overlap percentage as a fraction in [0, 1), or `None` (with a note) when it cannot be used.
fn overlap_fraction(pct: f64, side: OverlapSide, notes: &mut Vec<SurveyNote>) -> Option<f64> {
    if pct.is_finite() && (0.0..100.0).contains(&pct) {
        Some(pct / 100.0)
    } else {
        notes.push(SurveyNote::OverlapUnusable { side, pct });
        None
    }
}

/// One photo's footprint and the distances between photos and between lines.
struct Spacing {
    across_m: f64,
    along_m: f64,
    base_m: f64,
    line_spacing_m: f64,
}

/// The footprint, base and line spacing, with notes on what makes them zero.
fn spacing(inputs: &SurveyInputs, notes: &mut Vec<SurveyNote>) -> Spacing {
    if !inputs.looks_down {
        notes.push(SurveyNote::AssumesStraightDown);
    }
    let h = inputs.height_m;
    let across_m = footprint_m(inputs.sensor_width_mm, h, inputs.focal_mm);
    let along_m = footprint_m(inputs.sensor_height_mm, h, inputs.focal_mm);
    if across_m <= 0.0 || along_m <= 0.0 {
        notes.push(SurveyNote::NoFootprint);
    }
    let front = overlap_fraction(inputs.settings.front_overlap_pct, OverlapSide::Front, notes);
    let side = overlap_fraction(inputs.settings.side_overlap_pct, OverlapSide::Side, notes);
    Spacing {
        across_m,
        along_m,
        base_m: front.map_or(0.0, |fo| (1.0 - fo) * along_m),
        line_spacing_m: side.map_or(0.0, |so| (1.0 - so) * across_m),
    }
}

/// The area's sides when usable, with notes on what is missing or unusable.
fn area(inputs: &SurveyInputs, notes: &mut Vec<SurveyNote>) -> (Option<f64>, Option<f64>) {
    match (inputs.settings.area_width_m, inputs.settings.area_length_m) {
        (None, None) => notes.push(SurveyNote::NoArea),
        (None, Some(_)) => notes.push(SurveyNote::AreaSideMissing { side: AreaSide::Width }),
        (Some(_), None) => notes.push(SurveyNote::AreaSideMissing { side: AreaSide::Length }),
        (Some(_), Some(_)) => {}
    }
    let mut usable = |x: Option<f64>, side: AreaSide| match x {
        Some(v) if v.is_finite() && v >= 0.0 => Some(v),
        Some(value) => {
            notes.push(SurveyNote::AreaSideUnusable { side, value });
            None
        }
        None => None,
    };
    (
        usable(inputs.settings.area_width_m, AreaSide::Width),
        usable(inputs.settings.area_length_m, AreaSide::Length),
    )
}

/// Lines, photos per line (with `extras` beyond each end) and photos in all, each withheld (with
/// a note) above its cap.
fn counts(
    width: Option<f64>,
    length: Option<f64>,
    sp: &Spacing,
    extras: u64,
    notes: &mut Vec<SurveyNote>,
) -> (Option<u64>, Option<u64>, Option<u64>) {
    // Stations along `extent` at `step`, or a note (`too_many`) when there are more than `cap`.
    let mut capped = |extent: Option<f64>, step: f64, cap: u64, too_many: fn(f64, f64) -> SurveyNote| {
        let extent = extent.filter(|_| step > 0.0)?;
        let n = stations(extent, step, cap);
        if n.is_none() {
            notes.push(too_many(extent, step));
        }
        n
    };
    let lines = capped(width, sp.line_spacing_m, MAX_LINES, |width_m, spacing_m| {
        SurveyNote::TooManyLines { width_m, spacing_m }
    });
    // The extras are at most MAX_PHOTOS each (photos_to_margin's cap), so the sum cannot overflow.
    let cap = MAX_PHOTOS.saturating_sub(2 * extras);
    let photos_per_line = capped(length, sp.base_m, cap, |length_m, base_m| {
        SurveyNote::TooManyPhotosPerLine { length_m, base_m }
    })
    .map(|inner| inner + 2 * extras);
    let photos = match (lines, photos_per_line) {
        (Some(lines), Some(photos_per_line)) => {
            let total = lines.checked_mul(photos_per_line).filter(|&t| t <= MAX_PHOTOS);
            if total.is_none() {
                notes.push(SurveyNote::TooManyPhotos { lines, photos_per_line });
            }
            total
        }
        _ => None,
    };
    (lines, photos_per_line, photos)
}

/// The flight time over the area and the batteries it needs, with notes on what is left out.
fn timing(
    inputs: &SurveyInputs,
    speed: Option<f64>,
    path_length_m: Option<f64>,
    lines: Option<u64>,
    notes: &mut Vec<SurveyNote>,
) -> (Option<f64>, Option<u64>) {
    if positive(inputs.speed_mps).is_none() {
        notes.push(SurveyNote::NoSpeed);
    }
    let turn_s = if inputs.settings.turn_s.is_finite() {
        inputs.settings.turn_s.max(0.0)
    } else {
        0.0
    };
    let flight_time_s = match (path_length_m, speed, lines) {
        (Some(p), Some(v), Some(n)) => {
            let t = ratio(p, v)
                .map(|t| t + (n as f64 - 1.0) * turn_s)
                .filter(|t| t.is_finite());
            if t.is_none() {
                notes.push(SurveyNote::FlightTimeUncountable);
            }
            t
        }
        _ => None,
    };
    let endurance_s = positive(inputs.settings.endurance_min * 60.0);
    let batteries = match (flight_time_s, endurance_s) {
        // The bound only guards the conversion to an integer; the line cap keeps real counts far
        // below it.
        (Some(t), Some(e)) => ratio(t, e)
            .map(|b| ceil_forgiving(b).max(1.0))
            .filter(|b| *b < 1e15)
            .map(|b| b as u64),
        (Some(_), None) => {
            notes.push(SurveyNote::NoEndurance);
            None
        }
        _ => None,
    };
    if flight_time_s.is_some() {
        notes.push(SurveyNote::FlightTimeCovers);
    }
    (flight_time_s, batteries)
}

/// The speeds that blur and the camera's interval allow, and the flags the planned speed raises.
/// Blur: smear = speed × exposure within the budget (resolution-model §4). Trigger: a photo every
/// B metres cannot come faster than the camera's shortest interval.
fn speed_limits(
    inputs: &SurveyInputs,
    ground_speed: Option<f64>,
    base_m: f64,
    due_s: Option<f64>,
) -> (Option<f64>, Option<f64>, Vec<SpeedFlag>) {
    let budget_m = inputs.settings.blur_budget_px * inputs.gsd_m;
    let max_blur = positive(budget_m).and_then(|b| ratio(b, inputs.shutter_s));
    let max_trigger = positive(base_m).and_then(|b| ratio(b, inputs.settings.trigger_s));
    let mut flags = Vec::new();
    // A speed a hair above its limit through rounding is at the limit, not above it.
    let exceeds = |v: f64, limit: f64| v > limit * (1.0 + 1e-9);
    if let Some(speed_mps) = ground_speed {
        if let Some(limit_mps) = max_blur.filter(|l| exceeds(speed_mps, *l)) {
            flags.push(SpeedFlag::Blur {
                speed_mps,
                limit_mps,
                budget_px: inputs.settings.blur_budget_px,
                exposure_s: inputs.shutter_s,
            });
        }
        if let Some(limit_mps) = max_trigger.filter(|l| exceeds(speed_mps, *l)) {
            flags.push(SpeedFlag::Trigger {
                speed_mps,
                limit_mps,
                due_s,
                camera_interval_s: inputs.settings.trigger_s,
            });
        }
    }
    (max_blur, max_trigger, flags)
}

/// The wind on the lines when a wind is given (`None` in still air), with a note when the lines
/// cannot be flown in it.
fn wind(inputs: &SurveyInputs, notes: &mut Vec<SurveyNote>) -> Option<Result<WindOnLines, WindLimit>> {
    let result = inputs.settings.wind_on_lines(inputs.speed_mps)?;
    if let Err(limit) = result {
        notes.push(SurveyNote::Wind(limit));
    }
    Some(result)
}

/// The survey over the relief when one is given, with a note when it cannot be used.
fn relief(inputs: &SurveyInputs, sp: &Spacing, notes: &mut Vec<SurveyNote>) -> Option<ReliefPlan> {
    let (lowest_ground_m, highest_ground_m) = inputs.settings.relief_m?;
    let result = plan_over_relief(&ReliefInputs {
        height_m: inputs.height_m,
        lowest_ground_m,
        highest_ground_m,
        gsd_m: inputs.gsd_m,
        footprint_across_m: sp.across_m,
        footprint_along_m: sp.along_m,
        base_m: sp.base_m,
        line_spacing_m: sp.line_spacing_m,
    });
    result.map_err(|reason| notes.push(SurveyNote::Relief(reason))).ok()
}

/// Lays out the survey for any inputs: see [`SurveyPlan`] for each figure.
pub fn plan_survey(inputs: &SurveyInputs) -> SurveyPlan {
    let mut notes: Vec<SurveyNote> = Vec::new();
    let sp = spacing(inputs, &mut notes);
    let wind = wind(inputs, &mut notes);
    // The ground speed on the fastest leg (for the smear and the trigger interval) and the mean
    // over a pair of legs (for the time): the planned speed in still air, none when the lines
    // cannot be flown in the wind.
    let (fastest, mean) = match wind {
        Some(Ok(w)) => (Some(w.fastest_ground_speed_mps()), Some(w.pair_ground_speed_mps())),
        Some(Err(_)) => (None, None),
        None => (positive(inputs.speed_mps), positive(inputs.speed_mps)),
    };
    let wind = wind.and_then(Result::ok);
    let trigger_s = fastest.and_then(|v| ratio(sp.base_m, v)).filter(|_| sp.base_m > 0.0);
    let (width, length) = area(inputs, &mut notes);
    let extras = photos_to_margin(sp.along_m, sp.base_m);
    let (lines, photos_per_line, photos) = counts(width, length, &sp, extras.unwrap_or(0), &mut notes);
    // Lines·(length + 2·extras·B) + (lines − 1)·S: every line reaches its extra photos, the turns
    // counted as straight hops between neighbouring lines.
    let path_length_m = match (lines, length, extras) {
        (Some(n), Some(l), Some(e)) => {
            let n = n as f64;
            let line = l + 2.0 * e as f64 * sp.base_m;
            Some(n * line + (n - 1.0) * sp.line_spacing_m).filter(|p| p.is_finite())
        }
        _ => None,
    };
    let (flight_time_s, batteries) = timing(inputs, mean, path_length_m, lines, &mut notes);
    let relief = relief(inputs, &sp, &mut notes);
    let storage_mb = match photos {
        Some(p) if inputs.settings.photo_mb.is_finite() && inputs.settings.photo_mb >= 0.0 => {
            Some(p as f64 * inputs.settings.photo_mb).filter(|s| s.is_finite())
        }
        _ => None,
    };
    let (max_speed_blur_mps, max_speed_trigger_mps, speed_flags) = speed_limits(inputs, fastest, sp.base_m, trigger_s);
    SurveyPlan {
        footprint_across_m: sp.across_m,
        footprint_along_m: sp.along_m,
        base_m: sp.base_m,
        line_spacing_m: sp.line_spacing_m,
        trigger_s,
        lines,
        extra_photos_per_end: extras.filter(|_| photos_per_line.is_some()),
        photos_per_line,
        photos,
        margin_along_m: 0.5 * sp.along_m,
        margin_across_m: 0.5 * sp.across_m,
        path_length_m,
        flight_time_s,
        batteries,
        storage_mb,
        max_speed_blur_mps,
        max_speed_trigger_mps,
        ground_speed_out_mps: wind.map(|w| w.out.ground_speed_mps),
        ground_speed_back_mps: wind.map(|w| w.back.ground_speed_mps),
        crab_deg: wind.map(|w| w.out.crab_rad.to_degrees()),
        gsd_min_m: relief.as_ref().map(|r| r.gsd_min_m),
        gsd_max_m: relief.as_ref().map(|r| r.gsd_max_m),
        front_min_pct: relief.as_ref().map(|r| r.front_min_pct),
        side_min_pct: relief.as_ref().map(|r| r.side_min_pct),
        relief_height_m: relief.as_ref().and_then(|r| r.restoring_height_m),
        relief,
        wind,
        time_speed_mps: mean,
        speed_flags,
        overlap: overlap_guidance(inputs.settings.front_overlap_pct, inputs.settings.side_overlap_pct),
        notes,
    }
}

/// Where the chosen front and side overlaps (percent) sit against common practice: about
/// 75–80 % / 60–70 % for mapping orthomosaics, 80–90 % / 70–80 % for 3D models of buildings and
/// trees, and 60 % / 30 % for classic film surveys and simple inspection.
pub fn overlap_guidance(front_pct: f64, side_pct: f64) -> OverlapAdvice {
    let class = if !(front_pct.is_finite() && side_pct.is_finite()) {
        OverlapClass::NotNumbers
    } else if front_pct < 60.0 || side_pct < 30.0 {
        OverlapClass::Low
    } else if front_pct > 90.0 || side_pct > 80.0 {
        OverlapClass::Heavy
    } else if front_pct >= 80.0 && side_pct >= 70.0 {
        OverlapClass::ThreeD
    } else if front_pct >= 75.0 && side_pct >= 60.0 {
        OverlapClass::Mapping
    } else {
        OverlapClass::Light
    };
    OverlapAdvice {
        class,
        front_pct,
        side_pct,
    }
}

/// A point in the layout's local metres: x across the lines, y along them, origin at the area's
/// first corner (where line 1 starts).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Point {
    /// Across the lines, metres.
    pub x: f64,
    /// Along the lines, metres.
    pub y: f64,
}

/// An axis-aligned rectangle in local metres: its corner of least x and y, and its size.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Rect {
    /// Least x, metres.
    pub x: f64,
    /// Least y, metres.
    pub y: f64,
    /// Extent in x (across the lines), metres.
    pub width: f64,
    /// Extent in y (along the lines), metres.
    pub height: f64,
}

impl Rect {
    /// The rectangle of `width` × `height` centred on `centre`.
    fn centred(centre: Point, width: f64, height: f64) -> Rect {
        Rect {
            x: centre.x - width / 2.0,
            y: centre.y - height / 2.0,
            width,
            height,
        }
    }

    /// The smallest rectangle holding both.
    fn union(self, other: Rect) -> Rect {
        let x0 = self.x.min(other.x);
        let y0 = self.y.min(other.y);
        let x1 = (self.x + self.width).max(other.x + other.width);
        let y1 = (self.y + self.height).max(other.y + other.height);
        Rect {
            x: x0,
            y: y0,
            width: x1 - x0,
            height: y1 - y0,
        }
    }
}

/// One flight line of the diagram, from where it is entered to where it is left.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LayoutLine {
    /// Counted from 1 in flying order.
    pub number: u64,
    /// Where the line is entered.
    pub start: Point,
    /// Where the line is left.
    pub end: Point,
    /// True when flown along the heading (+y), false when flown back.
    pub forward: bool,
}

/// The ground outline of one photo in the diagram.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LayoutFootprint {
    /// The flight line it is taken on, counted from 1.
    pub line: u64,
    /// Its place in that line's flying order, counted from 1.
    pub photo: u64,
    /// The point below the camera.
    pub centre: Point,
    /// The ground the photo covers: footprint across × footprint along, centred on `centre`.
    pub rect: Rect,
}

/// A plan of the survey for the page to draw, in local metres (x across the lines, y along
/// them, origin at the area's first corner); the page only scales it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Layout {
    /// The survey area, from (0, 0) to (width, length).
    pub area: Rect,
    /// The area grown by the margin that full overlap needs: half a footprint beyond each end
    /// and each side.
    pub margin: Rect,
    /// The first flight lines in flying order, at most [`MAX_DRAWN_LINES`].
    pub lines: Vec<LayoutLine>,
    /// All the plan's lines.
    pub lines_total: u64,
    /// Lines left out of the drawing.
    pub lines_omitted: u64,
    /// The first photos of line 1, and the photo of line 2 beside line 1's first, so that the
    /// front and side overlaps show.
    pub footprints: Vec<LayoutFootprint>,
    /// Everything drawn: the area, the drawn lines and the footprints, for the drawing's view box.
    pub bounds: Rect,
}

/// The layout diagram of a plan, or `None` when the plan has no counts (no area, or counts
/// withheld). Line k lies at x = (k − 1)·S: line 1 runs along the area's first edge and the last
/// line lies on the far edge or less than one spacing beyond it, as the count ceil(W/S) + 1
/// implies. Every line spans y = −e·B to the area length + e·B with e extra photos at each end,
/// as the path length counts it; photos are taken at y = −e·B, (1 − e)·B, … on every line, so
/// neighbouring lines' photos sit side by side.
pub fn layout(plan: &SurveyPlan, inputs: &SurveyInputs) -> Option<Layout> {
    let width = inputs.settings.area_width_m.filter(|w| w.is_finite() && *w >= 0.0)?;
    let length = inputs.settings.area_length_m.filter(|l| l.is_finite() && *l >= 0.0)?;
    let lines_total = plan.lines?;
    let photos_per_line = plan.photos_per_line?;
    let spacing = positive(plan.line_spacing_m)?;
    let base = positive(plan.base_m)?;
    let across = positive(plan.footprint_across_m)?;
    let along = positive(plan.footprint_along_m)?;
    let extension = plan.extra_photos_per_end? as f64 * base;

    let drawn = lines_total.min(MAX_DRAWN_LINES);
    let lines: Vec<LayoutLine> = (1..=drawn)
        .map(|number| {
            let x = (number - 1) as f64 * spacing;
            let (near, far) = (
                Point { x, y: -extension },
                Point {
                    x,
                    y: length + extension,
                },
            );
            let forward = flies_forward(number);
            let (start, end) = if forward { (near, far) } else { (far, near) };
            LayoutLine {
                number,
                start,
                end,
                forward,
            }
        })
        .collect();

    let mut footprints: Vec<LayoutFootprint> = (1..=photos_per_line.min(DRAWN_PHOTOS_LINE_1))
        .map(|photo| {
            let centre = Point {
                x: 0.0,
                y: (photo - 1) as f64 * base - extension,
            };
            LayoutFootprint {
                line: 1,
                photo,
                centre,
                rect: Rect::centred(centre, across, along),
            }
        })
        .collect();
    if lines_total >= 2 {
        // Line 2 flies back, so its photo nearest y = 0 is the last it takes.
        let centre = Point {
            x: spacing,
            y: -extension,
        };
        footprints.push(LayoutFootprint {
            line: 2,
            photo: if flies_forward(2) { 1 } else { photos_per_line },
            centre,
            rect: Rect::centred(centre, across, along),
        });
    }

    let area = Rect {
        x: 0.0,
        y: 0.0,
        width,
        height: length,
    };
    let lines_extent = Rect {
        x: 0.0,
        y: -extension,
        width: (drawn.max(1) - 1) as f64 * spacing,
        height: length + 2.0 * extension,
    };
    let margin = Rect {
        x: -plan.margin_across_m,
        y: -plan.margin_along_m,
        width: width + 2.0 * plan.margin_across_m,
        height: length + 2.0 * plan.margin_along_m,
    };
    let bounds = footprints
        .iter()
        .fold(margin.union(lines_extent), |b, f| b.union(f.rect));
    let finite = [bounds.x, bounds.y, bounds.width, bounds.height]
        .iter()
        .all(|v| v.is_finite());
    finite.then_some(Layout {
        area,
        margin,
        lines,
        lines_total,
        lines_omitted: lines_total - drawn,
        footprints,
        bounds,
    })
}

impl ReliefInputs {
    /// The inputs for a survey plan flown at `height_m` above take-off with GSD `gsd_m` there,
    /// over ground from `lowest_ground_m` to `highest_ground_m` relative to take-off.
    pub fn from_plan(
        plan: &SurveyPlan,
        height_m: f64,
        gsd_m: f64,
        lowest_ground_m: f64,
        highest_ground_m: f64,
    ) -> Self {
        ReliefInputs {
            height_m,
            lowest_ground_m,
            highest_ground_m,
            gsd_m,
            footprint_across_m: plan.footprint_across_m,
            footprint_along_m: plan.footprint_along_m,
            base_m: plan.base_m,
            line_spacing_m: plan.line_spacing_m,
        }
    }
}

impl EdgeInputs {
    /// The inputs from a survey plan with counts, and `extra_photos_per_end`; `None` when the
    /// plan has no counts.
    pub fn from_plan(plan: &SurveyPlan, extra_photos_per_end: u64) -> Option<EdgeInputs> {
        Some(EdgeInputs {
            footprint_across_m: plan.footprint_across_m,
            footprint_along_m: plan.footprint_along_m,
            base_m: plan.base_m,
            line_spacing_m: plan.line_spacing_m,
            lines: plan.lines?,
            // The plan's photos per line hold its own extras; these are the photos between the ends.
            photos_per_line: plan
                .photos_per_line?
                .saturating_sub(2 * plan.extra_photos_per_end.unwrap_or(0)),
            extra_photos_per_end,
        })
    }
}
