//! Survey layout for a camera looking straight down (resolution-model §7): footprint, photo base,
//! line spacing, counts, path, flight time, batteries and storage; the ground speeds that motion
//! blur and the camera's shortest interval allow; overlap guidance; and a plain-data diagram of
//! the first lines for the page to draw.
//!
//! Architecture invariant: the survey takes any scenario, validated or not, and answers with
//! finite numbers, or `None` beside a note that says why. Counts are capped before anything uses
//! them, nothing is looped over or allocated per photo, and no division can meet a zero.

use crate::core::contract::scenario::{Offset, Scenario};
use crate::core::physics::engine::Evaluation;
use crate::core::words::format::significant;
use serde::Serialize;

/// The most flight lines a plan counts; beyond it the counts are withheld with a note, since such
/// a plan is a mistake in the inputs rather than a survey anyone will fly.
pub const MAX_LINES: u64 = 100_000;

/// The most photos a plan counts (per line and in total); beyond it the counts are withheld.
pub const MAX_PHOTOS: u64 = 10_000_000;

/// The most flight lines the layout diagram carries; the rest are counted as omitted.
pub const MAX_DRAWN_LINES: u64 = 60;

/// How many photos of line 1 the diagram outlines, so that the front overlap shows.
pub const DRAWN_PHOTOS_LINE_1: u64 = 3;

/// A speed that the plan exceeds, why it matters, and what to change.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SpeedFlag {
    /// `blur` (smear beyond the budget) or `trigger` (photos due faster than the camera can take them).
    pub code: &'static str,
    /// The largest ground speed that this limit allows, m/s.
    pub limit_mps: f64,
    /// Why the planned speed is a problem, in plain words.
    pub reason: String,
    /// What a person can change.
    pub change: String,
}

/// Which common practice the chosen overlaps match, in words.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OverlapGuidance {
    /// `low`, `light`, `mapping`, `3d` or `heavy`, for tests and styling.
    pub code: &'static str,
    /// The guidance for people.
    pub text: String,
}

/// The survey figures of a plan, in SI units; field names are the report's
/// (`url-and-report.md`). Fields that need the area, a speed or a camera interval are `None`
/// when that input is missing, and `survey_notes` says so.
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
    /// Photos on each line, ceil(area length/B) + 1 (resolution-model §7).
    pub photos_per_line: Option<u64>,
    /// Photos in the whole survey, lines × photos per line.
    pub photos: Option<u64>,
    /// Distance flown over the area: lines·length + (lines − 1)·S, the turns counted as straight
    /// hops between neighbouring lines.
    pub path_length_m: Option<f64>,
    /// Time over the area: path/speed + (lines − 1)·time per turn.
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
    /// The limits that the planned speed exceeds.
    pub speed_flags: Vec<SpeedFlag>,
    /// Which common practice the overlaps match.
    pub overlap_guidance: OverlapGuidance,
    /// Plain messages about what the survey assumed, left out or capped. Named `survey_notes`
    /// rather than `notes` because the report flattens this struct into its own fields.
    pub survey_notes: Vec<String>,
}

/// A finite, strictly positive number, or `None`.
fn positive(x: f64) -> Option<f64> {
    (x.is_finite() && x > 0.0).then_some(x)
}

/// a/b when both are usable (a ≥ 0, b > 0) and the quotient is finite.
fn ratio(a: f64, b: f64) -> Option<f64> {
    if !(a.is_finite() && a >= 0.0) {
        return None;
    }
    let q = a / positive(b)?;
    q.is_finite().then_some(q)
}

/// ceil(x) for a non-negative x, forgiving rounding noise: an area that is an exact multiple of the
/// spacing (400 m at 40 m, say) must not gain a line because 400/40 came out as 10.000000000000002.
fn ceil_forgiving(x: f64) -> f64 {
    (x - 1e-9 * x.max(1.0)).ceil().max(0.0)
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
fn overlap_fraction(pct: f64, which: &str, notes: &mut Vec<String>) -> Option<f64> {
    if pct.is_finite() && (0.0..100.0).contains(&pct) {
        Some(pct / 100.0)
    } else {
        notes.push(format!(
            "The {which} overlap must be at least 0 % and below 100 %; with {} % there is no layout.",
            significant(pct)
        ));
        None
    }
}

/// A length for notes, in metres with three significant figures.
fn metres(x: f64) -> String {
    format!("{} m", significant(x))
}

/// A speed for flags, in m/s and km/h.
fn speed_words(mps: f64) -> String {
    format!("{} m/s ({} km/h)", significant(mps), significant(mps * 3.6))
}

/// Lays out the survey for a scenario, whatever its values: see [`SurveyPlan`] for each figure.
pub fn plan_survey(scenario: &Scenario, evaluation: &Evaluation) -> SurveyPlan {
    let mut notes: Vec<String> = Vec::new();

    let tilted = match scenario.offset {
        Offset::GroundDistance(g) => g > 0.0,
        Offset::Tilt(t) => t > 0.0,
    };
    if tilted {
        notes.push(
            "The footprint, spacing and counts assume a camera looking straight down; the tilt or \
             ground distance is ignored for them (the blur limit uses the GSD at the target)."
                .to_string(),
        );
    }

    let h = scenario.height_m;
    let footprint_across_m = footprint_m(scenario.sensor_width_mm, h, scenario.focal_mm);
    let footprint_along_m = footprint_m(scenario.sensor_height_mm, h, scenario.focal_mm);
    if footprint_across_m <= 0.0 || footprint_along_m <= 0.0 {
        notes.push(
            "The photo footprint is zero (check the sensor size, the focal length and the height), \
             so there is no layout."
                .to_string(),
        );
    }

    let front = overlap_fraction(scenario.front_overlap_pct, "front", &mut notes);
    let side = overlap_fraction(scenario.side_overlap_pct, "side", &mut notes);
    let base_m = front.map_or(0.0, |fo| (1.0 - fo) * footprint_along_m);
    let line_spacing_m = side.map_or(0.0, |so| (1.0 - so) * footprint_across_m);

    let speed = positive(scenario.speed_mps);
    let trigger_s = speed.and_then(|v| ratio(base_m, v)).filter(|_| base_m > 0.0);

    // The area: both sides are needed for counts; say which is missing or unusable.
    let width = scenario.area_width_m;
    let length = scenario.area_length_m;
    match (width, length) {
        (None, None) => notes.push(
            "No survey area given: give its width across the lines (aw) and its length along them \
             (al) for the line and photo counts, path, flight time, batteries and storage."
                .to_string(),
        ),
        (None, Some(_)) => notes.push(
            "The area width across the lines (aw) is missing: the line count and everything \
             after it need it."
                .to_string(),
        ),
        (Some(_), None) => notes.push(
            "The area length along the lines (al) is missing: the photo count and everything \
             after it need it."
                .to_string(),
        ),
        (Some(_), Some(_)) => {}
    }
    let usable = |x: Option<f64>, what: &str, notes: &mut Vec<String>| match x {
        Some(v) if v.is_finite() && v >= 0.0 => Some(v),
        Some(v) => {
            notes.push(format!("The area {what} ({}) is not a usable length.", significant(v)));
            None
        }
        None => None,
    };
    let width = usable(width, "width", &mut notes);
    let length = usable(length, "length", &mut notes);

    let lines = match width {
        Some(w) if line_spacing_m > 0.0 => {
            let n = stations(w, line_spacing_m, MAX_LINES);
            if n.is_none() {
                notes.push(format!(
                    "More than {} flight lines ({} wide at {} apart): the counts are withheld. Check \
                     the area width, the height and the side overlap.",
                    MAX_LINES,
                    metres(w),
                    metres(line_spacing_m)
                ));
            }
            n
        }
        _ => None,
    };
    let photos_per_line = match length {
        Some(l) if base_m > 0.0 => {
            let n = stations(l, base_m, MAX_PHOTOS);
            if n.is_none() {
                notes.push(format!(
                    "More than {} photos on each line ({} long at {} apart): the photo counts are \
                     withheld. Check the area length, the height and the front overlap.",
                    MAX_PHOTOS,
                    metres(l),
                    metres(base_m)
                ));
            }
            n
        }
        _ => None,
    };
    let photos = match (lines, photos_per_line) {
        (Some(n), Some(p)) => {
            let total = n.checked_mul(p).filter(|&t| t <= MAX_PHOTOS);
            if total.is_none() {
                notes.push(format!(
                    "More than {MAX_PHOTOS} photos in all ({n} lines of {p}): the total and the storage \
                     are withheld. Split the area or fly higher."
                ));
            }
            total
        }
        _ => None,
    };

    let path_length_m = match (lines, length) {
        (Some(n), Some(l)) => {
            let n = n as f64;
            Some(n * l + (n - 1.0) * line_spacing_m).filter(|p| p.is_finite())
        }
        _ => None,
    };

    if speed.is_none() {
        notes.push(
            "The ground speed is 0 or not usable: there is no trigger interval, flight time or \
             battery count. Give the planned ground speed."
                .to_string(),
        );
    }
    let turn_s = if scenario.turn_s.is_finite() {
        scenario.turn_s.max(0.0)
    } else {
        0.0
    };
    let flight_time_s = match (path_length_m, speed, lines) {
        (Some(p), Some(v), Some(n)) => {
            let t = ratio(p, v)
                .map(|t| t + (n as f64 - 1.0) * turn_s)
                .filter(|t| t.is_finite());
            if t.is_none() {
                notes.push("The flight time is too long to count: check the ground speed.".to_string());
            }
            t
        }
        _ => None,
    };
    let endurance_s = positive(scenario.endurance_min * 60.0);
    let batteries = match (flight_time_s, endurance_s) {
        // The bound only guards the conversion to an integer; the line cap keeps real counts far
        // below it.
        (Some(t), Some(e)) => ratio(t, e)
            .map(|b| ceil_forgiving(b).max(1.0))
            .filter(|b| *b < 1e15)
            .map(|b| b as u64),
        (Some(_), None) => {
            notes.push("No usable flight time per battery: the battery count is left out.".to_string());
            None
        }
        _ => None,
    };
    if flight_time_s.is_some() {
        notes.push(
            "The flight time covers the lines and the turns between them; take-off, climb, transit \
             to the area, battery changes and landing come on top."
                .to_string(),
        );
    }
    let storage_mb = match photos {
        Some(p) if scenario.photo_mb.is_finite() && scenario.photo_mb >= 0.0 => {
            Some(p as f64 * scenario.photo_mb).filter(|s| s.is_finite())
        }
        _ => None,
    };

    // Speeds that two different things allow. Blur: smear = speed × exposure within the budget
    // (resolution-model §4). Trigger: a photo every B metres cannot come faster than the camera's
    // shortest interval.
    let budget_m = scenario.blur_budget_px * evaluation.gsd_m;
    let max_speed_blur_mps = positive(budget_m).and_then(|b| ratio(b, scenario.shutter_s));
    let max_speed_trigger_mps = positive(base_m).and_then(|b| ratio(b, scenario.trigger_s));

    let mut speed_flags = Vec::new();
    // A speed a hair above its limit through rounding is at the limit, not above it.
    let exceeds = |v: f64, limit: f64| v > limit * (1.0 + 1e-9);
    if let (Some(v), Some(limit)) = (speed, max_speed_blur_mps) {
        if exceeds(v, limit) {
            speed_flags.push(SpeedFlag {
                code: "blur",
                limit_mps: limit,
                reason: format!(
                    "At {} the ground moves more than {} pixel during the {} s exposure.",
                    speed_words(v),
                    significant(scenario.blur_budget_px),
                    significant(scenario.shutter_s)
                ),
                change: format!(
                    "Slow to {} or less, or shorten the exposure (a faster shutter).",
                    speed_words(limit)
                ),
            });
        }
    }
    if let (Some(v), Some(limit)) = (speed, max_speed_trigger_mps) {
        if exceeds(v, limit) {
            speed_flags.push(SpeedFlag {
                code: "trigger",
                limit_mps: limit,
                reason: format!(
                    "At {} a photo is due every {} s, but the camera needs {} s between photos.",
                    speed_words(v),
                    trigger_s.map_or_else(|| "—".to_string(), significant),
                    significant(scenario.trigger_s)
                ),
                change: format!(
                    "Slow to {} or less, lower the front overlap, or use a camera with a shorter interval.",
                    speed_words(limit)
                ),
            });
        }
    }

    let overlap_guidance = overlap_guidance(scenario.front_overlap_pct, scenario.side_overlap_pct);

    SurveyPlan {
        footprint_across_m,
        footprint_along_m,
        base_m,
        line_spacing_m,
        trigger_s,
        lines,
        photos_per_line,
        photos,
        path_length_m,
        flight_time_s,
        batteries,
        storage_mb,
        max_speed_blur_mps,
        max_speed_trigger_mps,
        speed_flags,
        overlap_guidance,
        survey_notes: notes,
    }
}

/// Words on the chosen front and side overlaps (percent), against common practice: about
/// 75–80 % / 60–70 % for mapping orthomosaics, 80–90 % / 70–80 % for 3D models of buildings and
/// trees, and 60 % / 30 % for classic film surveys and simple inspection.
pub fn overlap_guidance(front_pct: f64, side_pct: f64) -> OverlapGuidance {
    let chosen = format!(
        "{} % front and {} % side",
        significant(front_pct),
        significant(side_pct)
    );
    let (code, advice) = if !(front_pct.is_finite() && side_pct.is_finite()) {
        ("low", "are not numbers the layout can use.".to_string())
    } else if front_pct < 60.0 || side_pct < 30.0 {
        (
            "low",
            "is below common practice: neighbouring photos may share too little ground to be \
             matched, and wind or a turn can leave gaps. Even classic film surveys kept about \
             60 % front and 30 % side."
                .to_string(),
        )
    } else if front_pct > 90.0 || side_pct > 80.0 {
        (
            "heavy",
            "is beyond common practice even for 3D models (about 80–90 % front, 70–80 % side): it \
             costs photos, storage and flight time for little gain."
                .to_string(),
        )
    } else if front_pct >= 80.0 && side_pct >= 70.0 {
        (
            "3d",
            "suits 3D models of buildings and trees, where about 80–90 % front and 70–80 % side is \
             common practice. A flat orthomosaic needs less: about 75–80 % / 60–70 %."
                .to_string(),
        )
    } else if front_pct >= 75.0 && side_pct >= 60.0 {
        (
            "mapping",
            "suits a mapping orthomosaic, where about 75–80 % front and 60–70 % side is common \
             practice. For 3D models of buildings or trees, raise it to about 80–90 % / 70–80 %."
                .to_string(),
        )
    } else {
        (
            "light",
            "is light: like the 60 % / 30 % of classic film surveys, it gives stereo pairs and \
             suits simple inspection, but is thin for a drone orthomosaic, where about 75 % front \
             and 60 % side is common practice."
                .to_string(),
        )
    };
    OverlapGuidance {
        code,
        text: format!("Overlap of {chosen} {advice}"),
    }
}

/// Whether flight line `number` (counted from 1) is flown along the heading: the lines are flown
/// in a serpentine, line 1 along the heading, line 2 back, and so on.
pub fn flies_forward(number: u64) -> bool {
    number % 2 == 1
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
    pub fn centred(centre: Point, width: f64, height: f64) -> Rect {
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
/// implies. Every line spans y = 0 to the area length, as the path length counts it; photos are
/// taken at y = 0, B, 2B, … on every line, so neighbouring lines' photos sit side by side.
pub fn layout(plan: &SurveyPlan, scenario: &Scenario) -> Option<Layout> {
    let width = scenario.area_width_m.filter(|w| w.is_finite() && *w >= 0.0)?;
    let length = scenario.area_length_m.filter(|l| l.is_finite() && *l >= 0.0)?;
    let lines_total = plan.lines?;
    let photos_per_line = plan.photos_per_line?;
    let spacing = positive(plan.line_spacing_m)?;
    let base = positive(plan.base_m)?;
    let across = positive(plan.footprint_across_m)?;
    let along = positive(plan.footprint_along_m)?;

    let drawn = lines_total.min(MAX_DRAWN_LINES);
    let lines: Vec<LayoutLine> = (1..=drawn)
        .map(|number| {
            let x = (number - 1) as f64 * spacing;
            let (near, far) = (Point { x, y: 0.0 }, Point { x, y: length });
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
                y: (photo - 1) as f64 * base,
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
        // Line 2 flies back, so its photo at y = 0 is the last it takes.
        let centre = Point { x: spacing, y: 0.0 };
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
        y: 0.0,
        width: (drawn.max(1) - 1) as f64 * spacing,
        height: length,
    };
    let bounds = footprints.iter().fold(area.union(lines_extent), |b, f| b.union(f.rect));
    let finite = [bounds.x, bounds.y, bounds.width, bounds.height]
        .iter()
        .all(|v| v.is_finite());
    finite.then_some(Layout {
        area,
        lines,
        lines_total,
        lines_omitted: lines_total - drawn,
        footprints,
        bounds,
    })
}
