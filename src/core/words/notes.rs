//! Words for the typed results: the physics and the planning return enums with their figures in
//! SI, and this module alone turns them into sentences, in the units the person chose.

use crate::core::physics::chain::NiirsCaveats;
use crate::core::physics::engine::Limit;
use crate::core::physics::optics::SamplingRegime;
use crate::core::physics::target::{PeopleLevel, Task};
use crate::core::planning::cautions::Caution;
use crate::core::planning::ground::{Leg, OverlapNeed, ReliefNote, ReliefUnusable, WindLimit};
use crate::core::planning::solve::{Axis, Need, Reach, TargetPlane};
use crate::core::planning::survey::{
    AreaSide, OverlapAdvice, OverlapClass, OverlapSide, SpeedFlag, SurveyNote, SurveyPlan, MAX_LINES, MAX_PHOTOS,
};
use crate::core::words::format::{length, significant, speed};
use crate::core::words::units::Units;
use serde::Serialize;

/// `text` with its first letter in lower case, for a title used inside a sentence (so that
/// "GSD" keeps its capitals). ASCII only: every title here starts with an ASCII letter, and the
/// Unicode case tables would cost the page several kilobytes.
pub fn lower_first(text: &str) -> String {
    let mut chars = text.chars();
    match chars.next() {
        Some(c) => std::iter::once(c.to_ascii_lowercase()).chain(chars).collect(),
        None => String::new(),
    }
}

/// The limit's name in plain words.
pub fn limit_title(limit: Limit) -> &'static str {
    match limit {
        Limit::Sampling => "Pixel sampling (2 × GSD)",
        Limit::Diffraction => "Lens diffraction (Rayleigh)",
        Limit::Turbulence => "Air turbulence (seeing)",
        Limit::Motion => "Motion during the exposure",
    }
}

/// What a person can change to make this limit smaller.
pub fn limit_advice(limit: Limit) -> &'static str {
    match limit {
        Limit::Sampling => "Fly lower or stand closer, use a longer focal length, or a sensor with smaller pixels.",
        Limit::Diffraction => {
            "Open the aperture (a smaller f-number), or come closer; a longer lens at the same f-number also helps."
        }
        Limit::Turbulence => {
            "Shorten the air path (fly lower, stand closer), work early in the morning or in overcast, or keep the \
             path away from hot ground."
        }
        Limit::Motion => "Use a shorter exposure time, a slower ground speed or a steadier camera.",
    }
}

/// What a limit's figure means, in one plain sentence.
pub fn limit_meaning(limit: Limit) -> &'static str {
    match limit {
        Limit::Sampling => "The finest bar pattern the pixels can record: one bar and one gap need a pixel each.",
        Limit::Diffraction => "The closest two points can be and still show as two through this aperture.",
        Limit::Turbulence => "How far the shimmering air spreads a point along this path during the frame.",
        Limit::Motion => "How far the scene slides across the sensor while the shutter is open.",
    }
}

/// What the ground resolved distance means, in one plain sentence.
pub const GRD_MEANING: &str = "All the blurs together: the finest bar pattern whose contrast still stands out of the \
                               noise (the system MTF at 3/SNR), never finer than two pixels.";

/// Whether the frame froze the turbulence, in a short phrase.
pub fn exposure_kind(short: bool, has_turbulence: bool) -> &'static str {
    match (has_turbulence, short) {
        (false, _) => "no turbulence in this scenario",
        (true, true) => "short exposure: the frame is quicker than the air changes, so the shimmer is frozen (it shifts the image between frames instead)",
        (true, false) => "long exposure: the frame averages the shimmering air",
    }
}

/// What a person can make out at each level of the NIIRS scale, in this planner's own words, from
/// 0 to 9 (each level roughly halves the detail; the level figures follow GIQE's GSD scaling).
pub const NIIRS_SCALE: [(u8, &str); 10] = [
    (0, "nothing useful can be made out"),
    (1, "large features only: rivers, big fields, the extent of a town"),
    (2, "big buildings, wide roads and the shape of fields"),
    (3, "single large buildings, road junctions, the layout of a farmyard"),
    (4, "sheds and houses one by one, lorries, hedges and field edges"),
    (5, "single cars and their size, gates and tracks, large animals"),
    (
        6,
        "a car told from a van by its shape, a person as a small figure, rows in a crop",
    ),
    (
        7,
        "fence posts one by one, a car's windows and wheels, a person's arms and legs",
    ),
    (
        8,
        "a vehicle's mirrors, single plants in a row, roof tiles, the wires of a fence",
    ),
    (
        9,
        "bolts and cable ties, cracks a few centimetres wide, a seedling's first leaves",
    ),
];

/// The level of the scale a NIIRS figure reaches (rounded down, 0 for none), or `None` above 9,
/// finer than the scale describes.
pub fn niirs_level(niirs: f64) -> Option<u8> {
    if niirs > 9.0 {
        None
    } else if niirs.is_finite() {
        Some(niirs.floor().clamp(0.0, 9.0) as u8)
    } else {
        Some(0)
    }
}

/// What the scale says for a NIIRS figure (the level it reaches, rounded down).
pub fn niirs_reading(niirs: f64) -> &'static str {
    match niirs_level(niirs) {
        Some(level) => NIIRS_SCALE[usize::from(level)].1,
        None => "finer than the scale describes: detail of a few centimetres and less",
    }
}

/// Why a NIIRS figure is only indicative, in one sentence; `None` inside GIQE 5.0's range.
pub fn niirs_note(caveats: &NiirsCaveats, q: f64, wavelength_m: f64, snr: f64, elevation_deg: f64) -> Option<String> {
    if !caveats.any() {
        return None;
    }
    let mut reasons = Vec::new();
    if caveats.band {
        reasons.push(format!(
            "the wavelength {} nm is not visible light (GIQE 5.0 is for visible panchromatic images)",
            significant(wavelength_m * 1e9)
        ));
    }
    if caveats.sampling {
        reasons.push(format!("Q = {} lies outside the 1–2 it was fitted on", significant(q)));
    }
    if caveats.snr {
        reasons.push(format!("the SNR {} is below 5", significant(snr)));
    }
    if caveats.elevation {
        reasons.push(format!(
            "the view is {}° above the horizon, below 8.9°",
            significant(elevation_deg)
        ));
    }
    if caveats.off_scale {
        reasons.push("the figure lies beyond the scale's 0–9".to_string());
    }
    Some(format!("Indicative only: {}.", reasons.join("; ")))
}

/// The sampling regime in a short phrase (GIQE 5.0).
pub fn sampling_regime(regime: SamplingRegime) -> &'static str {
    match regime {
        SamplingRegime::DetectorLimited => {
            "detector-limited (below 1.64): two pixels span more than the lens blur, fine patterns may alias"
        }
        SamplingRegime::OpticsLimited => "optics-limited (1.64 or more): the lens blur spans more than two pixels",
    }
}

/// The task in plain words.
pub fn task(task: Task) -> &'static str {
    match task {
        Task::Detection => "see that something is there",
        Task::Orientation => "tell which way it lies",
        Task::Recognition => "tell what kind of thing it is (a person, a vehicle, an animal)",
        Task::Identification => "tell which kind within its class (a tractor, not a truck)",
    }
}

/// The task's name, as a heading.
pub fn task_name(task: Task) -> &'static str {
    match task {
        Task::Detection => "Detection",
        Task::Orientation => "Orientation",
        Task::Recognition => "Recognition",
        Task::Identification => "Identification",
    }
}

/// The task in one word, for marks on the chart.
pub fn task_verb(task: Task) -> &'static str {
    match task {
        Task::Detection => "detect",
        Task::Orientation => "orient",
        Task::Recognition => "recognise",
        Task::Identification => "identify",
    }
}

/// The quantity the backward solves vary, in plain words.
pub fn axis_noun(axis: Axis) -> &'static str {
    match axis {
        Axis::Height => "height",
        Axis::GroundDistance => "ground distance",
    }
}

/// The plane a need is on, in a few words.
pub fn plane(plane: TargetPlane) -> &'static str {
    match plane {
        TargetPlane::Ground => "on the ground",
        TargetPlane::Upright => "on an upright target facing the camera",
    }
}

/// What the needs ask for, as the subject of a sentence: "A detail of 3 cm and a GSD of 2 cm on
/// the ground"; `None` when nothing is asked.
pub fn need_text(need: &Need, units: Units) -> Option<String> {
    let parts = match (need.detail_m, need.gsd_m) {
        (Some(d), Some(g)) => format!("A detail of {} and a GSD of {}", length(d, units), length(g, units)),
        (Some(d), None) => format!("A detail of {}", length(d, units)),
        (None, Some(g)) => format!("A GSD of {}", length(g, units)),
        (None, None) => return None,
    };
    Some(format!("{parts} {}", plane(need.plane)))
}

/// The reach in one plain sentence, lengths in `units`.
pub fn reach(reach: &Reach, axis: Axis, need_text: &str, units: Units) -> String {
    let noun = axis_noun(axis);
    match *reach {
        Reach::UpTo { position_m, bound_by } => format!(
            "{need_text} is met up to a {noun} of {}; beyond that {} exceeds it.",
            length(position_m, units),
            lower_first(limit_title(bound_by))
        ),
        Reach::Horizon { position_m } => format!(
            "{need_text} is met up to a {noun} of {}, where the target sinks below the horizon.",
            length(position_m, units)
        ),
        Reach::Everywhere { up_to_m } => {
            format!("{need_text} is met at every {noun} up to {}.", length(up_to_m, units))
        }
        Reach::Nowhere { forbidden_by, best_m } => format!(
            "{need_text} cannot be met at any {noun}: {} alone is {} even close in. {}",
            lower_first(limit_title(forbidden_by)),
            length(best_m, units),
            limit_advice(forbidden_by)
        ),
    }
}

/// A caution in plain words.
pub fn caution(caution: Caution, units: Units) -> String {
    match caution {
        Caution::BeyondHorizon { distance_m, horizon_m } => format!(
            "The target, {} away, is below the horizon, which for these heights lies {} away with \
             the refraction assumed: it is not in view, so nothing of it can be seen from here. Raise the \
             camera, or come closer.",
            length(distance_m, units),
            length(horizon_m, units)
        ),
        Caution::General => "This planner estimates image detail; it does not tell you that a flight or a camera \
                             placement is allowed. Rules differ between countries and change: check the rules \
                             where you work, and follow licensed practice."
            .to_string(),
        Caution::Height { airborne } => {
            let aircraft = if airborne {
                ""
            } else {
                " (if this camera is carried by an aircraft)"
            };
            format!(
                "The height is above 120 m (400 ft){aircraft}. Many jurisdictions cap small unmanned \
                 aircraft at about that height above the ground and require the pilot to keep the \
                 aircraft in sight. Check local rules before planning this."
            )
        }
        Caution::Scintillation { rytov } => format!(
            "The air path is in strong scintillation (Rytov variance {}, above 1): images shimmer and \
             break up, and the turbulence figures here are indicative only. Shorten the path, or work \
             early in the morning, in overcast or away from hot ground.",
            significant(rytov)
        ),
        Caution::Privacy { px_per_m, level } => format!(
            "At about {} pixels per metre on the target {}. In many jurisdictions such images are \
             personal data: tell people nearby, avoid private spaces, keep only what the job needs, and \
             check local privacy law.",
            significant(px_per_m),
            match level {
                PeopleLevel::Identification => "a person could be identified, even by someone who does not know them",
                _ => "a person could be recognised by someone who knows them (identifying a stranger takes about 250)",
            }
        ),
    }
}

/// Why a flagged speed is a problem.
pub fn speed_flag_reason(flag: &SpeedFlag, units: Units) -> String {
    match *flag {
        SpeedFlag::Blur {
            speed_mps,
            budget_px,
            exposure_s,
            ..
        } => format!(
            "At {} the ground moves more than {} pixel during the {} s exposure.",
            speed(speed_mps, units),
            significant(budget_px),
            significant(exposure_s)
        ),
        SpeedFlag::Trigger {
            speed_mps,
            due_s,
            camera_interval_s,
            ..
        } => format!(
            "At {} a photo is due every {} s, but the camera needs {} s between photos.",
            speed(speed_mps, units),
            due_s.map_or_else(|| "—".to_string(), significant),
            significant(camera_interval_s)
        ),
    }
}

/// What a person can change about a flagged speed.
pub fn speed_flag_change(flag: &SpeedFlag, units: Units) -> String {
    let limit = speed(flag.limit_mps(), units);
    match flag {
        SpeedFlag::Blur { .. } => format!("Slow to {limit} or less, or shorten the exposure (a faster shutter)."),
        SpeedFlag::Trigger { .. } => {
            format!("Slow to {limit} or less, lower the front overlap, or use a camera with a shorter interval.")
        }
    }
}

/// The chosen overlaps against common practice, in one sentence.
pub fn overlap(advice: &OverlapAdvice) -> String {
    let chosen = format!(
        "{} % front and {} % side",
        significant(advice.front_pct),
        significant(advice.side_pct)
    );
    let words = match advice.class {
        OverlapClass::NotNumbers => "are not numbers the layout can use.",
        OverlapClass::Low => {
            "is below common practice: neighbouring photos may share too little ground to be matched, and wind \
             or a turn can leave gaps. Even classic film surveys kept about 60 % front and 30 % side."
        }
        OverlapClass::Heavy => {
            "is beyond common practice even for 3D models (about 80–90 % front, 70–80 % side): it costs photos, \
             storage and flight time for little gain."
        }
        OverlapClass::ThreeD => {
            "suits 3D models of buildings and trees, where about 80–90 % front and 70–80 % side is common \
             practice. A flat orthomosaic needs less: about 75–80 % / 60–70 %."
        }
        OverlapClass::Mapping => {
            "suits a mapping orthomosaic, where about 75–80 % front and 60–70 % side is common practice. For 3D \
             models of buildings or trees, raise it to about 80–90 % / 70–80 %."
        }
        OverlapClass::Light => {
            "is light: like the 60 % / 30 % of classic film surveys, it gives stereo pairs and suits simple \
             inspection, but is thin for a drone orthomosaic, where about 75 % front and 60 % side is common \
             practice."
        }
    };
    format!("Overlap of {chosen} {words}")
}

/// A survey note in plain words, lengths in `units`.
pub fn survey_note(note: &SurveyNote, units: Units) -> String {
    let len = |m: f64| length(m, units);
    match *note {
        SurveyNote::AssumesStraightDown => "The footprint, spacing and counts assume a camera looking straight \
                                            down; the tilt or ground distance is ignored for them (the blur \
                                            limit uses the GSD at the target)."
            .to_string(),
        SurveyNote::NoFootprint => "The photo footprint is zero (check the sensor size, the focal length and the \
                                    height), so there is no layout."
            .to_string(),
        SurveyNote::OverlapUnusable { side, pct } => format!(
            "The {} overlap must be at least 0 % and below 100 %; with {} % there is no layout.",
            match side {
                OverlapSide::Front => "front",
                OverlapSide::Side => "side",
            },
            significant(pct)
        ),
        SurveyNote::NoArea => "No survey area given: give its width across the lines (aw) and its length along \
                               them (al) for the line and photo counts, path, flight time, batteries and storage."
            .to_string(),
        SurveyNote::AreaSideMissing { side: AreaSide::Width } => "The area width across the lines (aw) is \
                                                                  missing: the line count and everything after \
                                                                  it need it."
            .to_string(),
        SurveyNote::AreaSideMissing { side: AreaSide::Length } => "The area length along the lines (al) is \
                                                                   missing: the photo count and everything \
                                                                   after it need it."
            .to_string(),
        SurveyNote::AreaSideUnusable { side, value } => format!(
            "The area {} ({}) is not a usable length.",
            match side {
                AreaSide::Width => "width",
                AreaSide::Length => "length",
            },
            significant(value)
        ),
        SurveyNote::TooManyLines { width_m, spacing_m } => format!(
            "More than {MAX_LINES} flight lines ({} wide at {} apart): the counts are withheld. Check the area \
             width, the height and the side overlap.",
            len(width_m),
            len(spacing_m)
        ),
        SurveyNote::TooManyPhotosPerLine { length_m, base_m } => format!(
            "More than {MAX_PHOTOS} photos on each line ({} long at {} apart): the photo counts are withheld. \
             Check the area length, the height and the front overlap.",
            len(length_m),
            len(base_m)
        ),
        SurveyNote::TooManyPhotos { lines, photos_per_line } => format!(
            "More than {MAX_PHOTOS} photos in all ({lines} lines of {photos_per_line}): the total and the storage \
             are withheld. Split the area or fly higher."
        ),
        SurveyNote::NoSpeed => "The ground speed is 0 or not usable: there is no trigger interval, flight time or \
                                battery count. Give the planned ground speed."
            .to_string(),
        SurveyNote::FlightTimeUncountable => {
            "The flight time is too long to count: check the ground speed.".to_string()
        }
        SurveyNote::NoEndurance => "No usable flight time per battery: the battery count is left out.".to_string(),
        SurveyNote::FlightTimeCovers => "The flight time covers the lines and the turns between them; take-off, \
                                         climb, transit to the area, battery changes and landing come on top."
            .to_string(),
        SurveyNote::Wind(limit) => wind_limit(limit, units),
        SurveyNote::Relief(reason) => relief_unusable(reason, units),
    }
}

/// Why the lines cannot be flown in the wind, in words.
fn wind_limit(limit: WindLimit, units: Units) -> String {
    match limit {
        WindLimit::NoAirspeed => "A wind is given but no speed: give the speed through the air.".to_string(),
        WindLimit::WindUnusable => "The wind speed or direction is not usable: the wind is left out.".to_string(),
        WindLimit::CannotHoldLine {
            across_mps,
            airspeed_mps,
        } => format!(
            "The wind across the lines ({}) is as fast as the speed through the air ({}): no heading holds the \
             line. Turn the lines into the wind, fly faster or wait for less wind.",
            speed(across_mps, units),
            speed(airspeed_mps, units)
        ),
        WindLimit::NoHeadway {
            leg,
            wind_mps,
            airspeed_mps,
        } => format!(
            "Against a {} wind at {} through the air the {} leg makes no way over the ground. Fly faster, turn \
             the lines across the wind or wait for less wind.",
            speed(wind_mps, units),
            speed(airspeed_mps, units),
            match leg {
                Leg::Out => "outbound",
                Leg::Back => "return",
            }
        ),
    }
}

/// Why the relief cannot be used, in words.
fn relief_unusable(reason: ReliefUnusable, units: Units) -> String {
    match reason {
        ReliefUnusable::GroundReachesFlight {
            highest_ground_m,
            height_m,
        } => format!(
            "The highest ground ({} above take-off) reaches the flight height ({}): the aircraft would meet \
             it. Fly higher than the highest ground with room to spare.",
            length(highest_ground_m, units),
            length(height_m, units)
        ),
        ReliefUnusable::NoOverlapPlanned => "No overlap is planned: the relief is left out.".to_string(),
        ReliefUnusable::Height { .. } | ReliefUnusable::Ground | ReliefUnusable::Layout => {
            "The relief cannot be used with this layout: it is left out.".to_string()
        }
    }
}

/// A relief warning in words, with what restores the planned overlaps.
pub fn relief_note(note: &ReliefNote, plan: &SurveyPlan, units: Units) -> String {
    match *note {
        ReliefNote::OverlapShort {
            side,
            least_pct,
            planned_pct,
            need,
        } => {
            let restore = match (plan.relief_height_m, &plan.relief) {
                (Some(h), Some(r)) => format!(
                    " Fly at {} above take-off, or keep the height and space photos {} apart and lines {} \
                     apart, to keep {} % over the highest ground.",
                    length(h, units),
                    r.restoring_base_m.map_or_else(|| "—".into(), |b| length(b, units)),
                    r.restoring_line_spacing_m
                        .map_or_else(|| "—".into(), |b| length(b, units)),
                    significant(planned_pct)
                ),
                _ => String::new(),
            };
            format!(
                "Over the highest ground the {} overlap falls from {} % to {} %, below the {} % {}.{restore}",
                match side {
                    OverlapSide::Front => "front",
                    OverlapSide::Side => "side",
                },
                significant(planned_pct),
                significant(least_pct),
                significant(need.pct(side)),
                match need {
                    OverlapNeed::Mapping => "that a mapping orthomosaic needs (common practice)",
                    OverlapNeed::Minimum => "that any survey keeps at least (common practice)",
                }
            )
        }
        ReliefNote::GroundSwapped => "The lowest and highest ground were swapped into order.".to_string(),
    }
}

/// A caution as the report gives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct CautionWords {
    /// `general`, `height` or `privacy`.
    pub code: &'static str,
    pub text: String,
}

/// The cautions in words.
pub fn cautions(cautions: &[Caution], units: Units) -> Vec<CautionWords> {
    cautions
        .iter()
        .map(|&c| CautionWords {
            code: c.code(),
            text: caution(c, units),
        })
        .collect()
}

/// A speed flag as the report gives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SpeedFlagWords {
    /// `blur` or `trigger`.
    pub code: &'static str,
    /// The largest ground speed that this limit allows, m/s.
    pub limit_mps: f64,
    /// Why the planned speed is a problem.
    pub reason: String,
    /// What a person can change.
    pub change: String,
}

/// The overlap guidance as the report gives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OverlapWords {
    /// `low`, `light`, `mapping`, `3d` or `heavy`.
    pub code: &'static str,
    pub text: String,
}

/// The survey's flags, guidance and notes in words, with the report's field names.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SurveyWords {
    pub speed_flags: Vec<SpeedFlagWords>,
    pub overlap_guidance: OverlapWords,
    /// Named `survey_notes` rather than `notes` because the report flattens it into its own fields.
    pub survey_notes: Vec<String>,
}

/// Everything the survey says, in words and in `units`.
pub fn survey_words(plan: &SurveyPlan, units: Units) -> SurveyWords {
    SurveyWords {
        speed_flags: plan
            .speed_flags
            .iter()
            .map(|f| SpeedFlagWords {
                code: f.code(),
                limit_mps: f.limit_mps(),
                reason: speed_flag_reason(f, units),
                change: speed_flag_change(f, units),
            })
            .collect(),
        overlap_guidance: OverlapWords {
            code: plan.overlap.class.code(),
            text: overlap(&plan.overlap),
        },
        survey_notes: {
            let mut notes = Vec::new();
            if let Some(relief) = &plan.relief {
                for n in &relief.notes {
                    notes.push(relief_note(n, plan, units));
                }
            }
            for n in &plan.notes {
                notes.push(survey_note(n, units));
            }
            notes
        },
    }
}
