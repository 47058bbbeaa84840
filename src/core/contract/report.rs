//! The report: every computed figure of a scenario, in SI units, with the contract's field names
//! (`shared/reference/url-and-report.md`). The `report` example prints it as JSON and the page
//! shows the same values, each tagged with its field name.

use crate::core::contract::field::{field_report, FieldReport};
use crate::core::contract::plan::Plan;
use crate::core::contract::scenario::{AirModel, FieldError, RawScenario, Scenario, CONTRACT_VERSION};
use crate::core::physics::engine::{quality, Evaluation, Limit, Setup};
use crate::core::physics::optics;
use crate::core::physics::target::{people_level, task_chances, CdModel, PeopleLevel, TaskChance};
use crate::core::physics::turbulence::rytov_variance;
use crate::core::planning::cautions::{self, CautionInputs};
use crate::core::planning::light::{BestSettings, Day, Light, LightSource, SnrSource};
use crate::core::planning::solve::{
    focal_needed, task_ranges, Axis, Crossing, EnvelopeChange, FocalNeed, Reach, Sweep, TargetPlane, TaskRange,
};
use crate::core::planning::survey::SurveyPlan;
use crate::core::words::light::{self as light_words, LightNoteWords};
use crate::core::words::notes::{self, CautionWords, SurveyWords};
use serde::Serialize;

/// Everything the planner computes for one scenario.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Report {
    pub v: u32,
    pub name: String,
    pub pitch_m: f64,
    pub aperture_m: f64,
    pub slant_range_m: f64,
    pub look_angle_deg: f64,
    pub gsd_m: f64,
    pub gsd_ground_m: f64,
    pub gsd_geomean_m: f64,
    pub gsd_weighted_m: f64,
    /// The sampling limit, 2·GSD: the finest period the pixels record (resolution-model §5).
    pub sampling_m: f64,
    pub rayleigh_rad: f64,
    pub diffraction_m: f64,
    pub r0_m: Option<f64>,
    pub seeing_rad: f64,
    pub turbulence_m: f64,
    pub motion_m: f64,
    pub motion_px: f64,
    pub limit_m: f64,
    pub governing: Limit,
    pub runner_up: Limit,
    pub governing_margin: f64,
    pub advice: &'static str,
    pub q: f64,
    pub sampling_regime: &'static str,
    /// Whether the short-exposure turbulence MTF was used (the frame is quicker than the air).
    pub short_exposure: bool,
    /// Ground resolved distance from the system MTF, a period (resolution-model §5.1): the
    /// geometric mean of the two below.
    pub grd_m: f64,
    pub grd_along_m: f64,
    pub grd_across_m: f64,
    /// Relative edge responses along and across the motion, and the GIQE-5 weighted one.
    pub rer_along: f64,
    pub rer_across: f64,
    pub rer: f64,
    /// Edge overshoot H.
    pub overshoot: f64,
    /// Contrast SNR used (given, or the default).
    pub snr: f64,
    /// GIQE-5 NIIRS, and why it is only indicative (null inside its range).
    pub niirs: f64,
    pub niirs_note: Option<String>,
    /// What the NIIRS scale says can be made out at that level.
    pub niirs_reading: &'static str,
    /// What the backward solves vary: height (drone) or ground distance (fixed camera).
    pub solve_axis: Axis,
    /// The smallest detail to resolve on the target's plane (`need`).
    pub need_m: Option<f64>,
    /// A required GSD on the target's plane (`needgsd`).
    pub need_gsd_m: Option<f64>,
    /// The plane the needs are on: `ground` or `upright` (`tplane`, or what the view implies).
    pub target_plane: TargetPlane,
    /// How much longer a figure normal to the view is on the target's plane (1/cos θ on the
    /// ground, 1/sin θ upright; at most 1e6 where the plane is seen edge-on).
    pub plane_stretch: f64,
    /// The detail resolved in every direction (the coarser GRD) and the GSD on the target's plane,
    /// as the needs are compared.
    pub detail_on_plane_m: f64,
    pub gsd_on_plane_m: f64,
    pub reach: Option<Reach>,
    /// The greatest height or ground distance meeting the need (null when none or unbounded).
    pub reach_m: Option<f64>,
    pub focal_needed: Option<FocalNeed>,
    pub focal_needed_m: Option<f64>,
    pub diffraction_crossing: Crossing,
    pub turbulence_crossing: Crossing,
    pub envelope_changes: Vec<EnvelopeChange>,
    pub target_m: Option<f64>,
    pub target_cycles: Option<f64>,
    pub target_chances: Vec<TaskChance>,
    /// The critical-dimension model the chances and ranges use (`1d` or `2d`).
    pub cdm: CdModel,
    /// Detection, recognition and identification: the greatest height or ground distance for
    /// 50 % and 80 %.
    pub task_ranges: Vec<TaskRange>,
    /// Whether a stranger could be identified (IEC 62676-4 identification, 250 px/m).
    pub identifies_people: bool,
    /// Pixels per metre on the target, 1/GSD in the plane normal to the view.
    pub px_per_m: f64,
    /// Rytov variance of the path (plane wave); above 1 the turbulence is strong and its figures
    /// indicative.
    pub rytov: f64,
    /// The greatest ground distance at which a target of this height is above the horizon from
    /// this camera height, over the round Earth with refraction (the two horizon arcs).
    pub horizon_m: Option<f64>,
    /// Whether the target is above the horizon; when not, it is not in view and the task chances
    /// are nil.
    pub visible: bool,
    /// The highest level for watching people that the pixel density reaches (null below 25 px/m).
    pub people_level: Option<PeopleLevel>,
    pub cautions: Vec<CautionWords>,
    /// The sun's elevation and azimuth (from north, clockwise) at `when` (null without it).
    pub sun_elevation_deg: Option<f64>,
    pub sun_azimuth_deg: Option<f64>,
    /// Illuminance on the ground, lux, where it comes from, and the EV at ISO 100 (`refl`).
    pub illuminance_lx: Option<f64>,
    pub light_source: LightSource,
    pub ev100: Option<f64>,
    /// The exposure time used (typed, or metered with `expmode=auto`), and whether it was metered.
    pub exposure_s: f64,
    pub metered: bool,
    /// Electrons of the 15 % target and the 7 % background, and the noise (null without light).
    pub target_e: Option<f64>,
    pub background_e: Option<f64>,
    pub noise_e: Option<f64>,
    /// The sensor figures used: full well and read noise (electrons), base ISO.
    pub full_well_e: f64,
    pub read_noise_e: f64,
    pub base_iso: f64,
    /// Where the contrast SNR comes from: typed, the light, or assumed.
    pub snr_source: SnrSource,
    pub light_notes: Vec<LightNoteWords>,
    /// The day of `when` at the place: sunrise, noon, sunset and the hours good to fly (null
    /// without a time and place). Computed apart from the keystroke's figures (`Plan::extras`).
    pub day: Option<DayReport>,
    /// The settings that resolve the finest detail under this light (null without light).
    pub best: Option<BestReport>,
    #[serde(flatten)]
    pub survey: SurveyPlan,
    /// The survey's flags, guidance and notes in words (flattened after its figures).
    #[serde(flatten)]
    pub survey_words: SurveyWords,
    /// The survey over the boundary (`field`), flattened; absent without one. Only the report
    /// (`report_for_query`) fills it: the page's plan never does (see `contract::field`).
    #[serde(flatten)]
    pub field: Option<FieldReport>,
    pub errors: Vec<FieldError>,
    pub ignored: Vec<String>,
}

/// The day of `when` at the place, as the report gives it; clock times in `when`'s offset.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DayReport {
    pub sunrise: Option<String>,
    pub sunset: Option<String>,
    pub noon: String,
    pub noon_elevation_deg: f64,
    /// The hours when the sun is at least 15° high and the need (if any) is met under its light,
    /// as "HH:MM–HH:MM".
    pub windows: Vec<String>,
    /// Their total length, hours.
    pub good_hours: f64,
    /// The turbulence profile that suits the hour of `when`: `slc-day` with the sun up, `slc-night`
    /// with it down (a suggestion; the scenario's `air` is used as chosen).
    pub air_suggested: &'static str,
}

impl DayReport {
    /// The day in the report's words.
    pub fn new(day: &Day) -> DayReport {
        let at = |t: f64| light_words::clock(t, day.offset_minutes);
        DayReport {
            sunrise: day.sunrise_unix_s.map(at),
            sunset: day.sunset_unix_s.map(at),
            noon: at(day.noon_unix_s),
            noon_elevation_deg: day.noon_elevation_deg,
            windows: day
                .windows
                .iter()
                .map(|&(a, b)| format!("{}–{}", at(a), at(b)))
                .collect(),
            good_hours: day.windows.iter().map(|&(a, b)| (b - a) / 3600.0).sum(),
            air_suggested: if day.sun_up {
                AirModel::SlcDay.key()
            } else {
                AirModel::SlcNight.key()
            },
        }
    }
}

/// The best settings as the report gives them.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct BestReport {
    pub f_number: f64,
    pub exposure_s: f64,
    pub iso: f64,
    /// The detail resolved (coarser GRD, normal to the view) with them, and as set now.
    pub resolved_m: f64,
    pub current_resolved_m: f64,
    pub niirs: f64,
    pub snr: f64,
    pub governing: Limit,
    /// The greatest height or ground distance, and ground speed, that meet the need with them.
    pub reach_m: Option<f64>,
    pub max_speed_mps: Option<f64>,
    /// Why: what one step either way of each setting gives.
    pub why: Vec<String>,
}

impl BestReport {
    /// The best settings in the report's words.
    pub fn new(best: &BestSettings, units: crate::core::words::units::Units) -> BestReport {
        let mut why = Vec::new();
        let f = |n: f64| format!("f/{}", crate::core::words::format::significant(n));
        let iso = |s: f64| format!("ISO {}", s.round());
        for (label, trade) in [
            (best.wider.map(|t| format!("wider, {}", f(t.value))), best.wider),
            (
                best.narrower.map(|t| format!("narrower, {}", f(t.value))),
                best.narrower,
            ),
            (
                best.lower_iso.map(|t| format!("lower, {}", iso(t.value))),
                best.lower_iso,
            ),
            (
                best.higher_iso.map(|t| format!("higher, {}", iso(t.value))),
                best.higher_iso,
            ),
        ] {
            if let (Some(label), Some(trade)) = (label, trade) {
                why.push(light_words::trade(&label, &trade, units));
            }
        }
        BestReport {
            f_number: best.f_number,
            exposure_s: best.exposure_s,
            iso: best.iso,
            resolved_m: best.resolved_m,
            current_resolved_m: best.current_resolved_m,
            niirs: best.niirs,
            snr: best.snr,
            governing: best.governing,
            reach_m: best.reach.and_then(|r| r.position_m()),
            max_speed_mps: best.max_speed_mps,
            why,
        }
    }
}

/// What a target will look like: the cycles across it under `period_on_plane` (the GRD on its
/// plane, in its coarser direction) and the chance of each task; empty without a target. Its task
/// ranges come with the sweep's figures.
fn target_figures(scenario: &Scenario, period_on_plane: f64) -> (Option<f64>, Vec<TaskChance>) {
    let Some(t) = scenario.target_m else {
        return (None, Vec::new());
    };
    let (n, chances) = task_chances(t, period_on_plane, scenario.cd_model);
    (Some(n), chances)
}

/// What the backward solves find on a sweep: they depend on the sweep, the need and the target,
/// not on where along the axis the plan stands, so a plan that only moves along the axis keeps them.
#[derive(Clone, Debug, PartialEq)]
pub struct SweepFigures {
    pub reach: Option<Reach>,
    pub diffraction_crossing: Crossing,
    pub turbulence_crossing: Crossing,
    pub envelope_changes: Vec<EnvelopeChange>,
    pub task_ranges: Vec<TaskRange>,
}

impl SweepFigures {
    /// The solves of `scenario`'s need and target on `sweep`.
    pub fn new(scenario: &Scenario, sweep: &Sweep) -> SweepFigures {
        let need = scenario.need();
        SweepFigures {
            reach: need.is_given().then(|| sweep.reach(&need)),
            diffraction_crossing: sweep.crossing(Limit::Diffraction, Limit::Sampling),
            turbulence_crossing: sweep.crossing(Limit::Turbulence, Limit::Sampling),
            envelope_changes: sweep.envelope_changes(),
            task_ranges: scenario
                .target_m
                .map(|t| task_ranges(sweep, t, need.plane, scenario.cd_model))
                .unwrap_or_default(),
        }
    }
}

/// What a plan computed for a scenario, from which its report is written.
#[derive(Clone, Copy)]
pub struct Computed<'a> {
    pub setup: &'a Setup,
    pub evaluation: &'a Evaluation,
    pub sweep: &'a Sweep,
    /// The solves on the sweep.
    pub figures: &'a SweepFigures,
    pub survey: &'a SurveyPlan,
    pub light: &'a Light,
}

impl Report {
    /// The report of a validated scenario from what its plan computed: the engine setup, the
    /// evaluation, the sweep and the solves on it, the survey plan and the light.
    pub fn new(scenario: &Scenario, parts: &Computed, errors: Vec<FieldError>) -> Report {
        let Computed {
            setup,
            evaluation: e,
            sweep,
            figures,
            survey,
            light,
        } = *parts;
        let need = scenario.need();
        let plane_stretch = need.plane.stretch(e.incidence_deg);
        let reach = figures.reach;
        let reach_m = reach.and_then(|r| r.position_m());
        let focal = need.is_given().then(|| focal_needed(e, setup, &need));
        let focal_needed_m = match focal {
            Some(FocalNeed::AtLeast { focal_m, .. }) => Some(focal_m),
            _ => None,
        };
        let detail_on_plane_m = e.resolved_m * plane_stretch;
        let (target_cycles, mut target_chances) = target_figures(scenario, detail_on_plane_m);
        if !e.visible {
            // Below the horizon the target is not in view, whatever the optics could resolve.
            for chance in &mut target_chances {
                chance.probability = 0.0;
            }
        }
        let g = setup.geometry;
        let horizon_m = g
            .earth()
            .and_then(|earth| earth.max_visible_ground_m(g.height_m, g.target_height_m));
        let px_per_m = if e.gsd_m > 0.0 { 1.0 / e.gsd_m } else { 0.0 };
        let rytov = rytov_variance(&setup.profile, setup.geometry.slant_path(), setup.wavelength_m);
        let people = people_level(px_per_m);
        let sensor = scenario.sensor();
        let image = quality(setup, e);
        let cautions = cautions::cautions(CautionInputs {
            height_m: scenario.height_m,
            airborne: sweep.axis == Axis::Height,
            px_per_m,
            rytov,
            beyond_horizon: horizon_m
                .filter(|_| !e.visible)
                .map(|h| (setup.geometry.ground_distance_m, h)),
        });
        Report {
            v: CONTRACT_VERSION,
            name: scenario.name.clone(),
            pitch_m: e.pitch_m,
            aperture_m: e.aperture_m,
            slant_range_m: e.slant_range_m,
            look_angle_deg: e.look_angle_deg,
            gsd_m: e.gsd_m,
            gsd_ground_m: e.gsd_ground_m,
            gsd_geomean_m: e.gsd_geomean_m,
            gsd_weighted_m: e.gsd_weighted_m,
            sampling_m: e.limits.sampling,
            rayleigh_rad: e.rayleigh_rad,
            diffraction_m: e.limits.diffraction,
            r0_m: e.r0_m,
            seeing_rad: e.seeing_rad,
            turbulence_m: e.limits.turbulence,
            motion_m: e.limits.motion,
            motion_px: e.motion_px,
            limit_m: e.limit_m,
            governing: e.governing,
            runner_up: e.runner_up,
            governing_margin: e.margin,
            advice: notes::limit_advice(e.governing),
            q: e.q,
            sampling_regime: notes::sampling_regime(optics::sampling_regime(e.q)),
            short_exposure: e.short_exposure,
            grd_m: e.grd_m,
            grd_along_m: e.grd_along_m,
            grd_across_m: e.grd_across_m,
            rer_along: image.rer_along,
            rer_across: image.rer_across,
            rer: image.rer,
            overshoot: image.overshoot,
            snr: image.snr,
            niirs: image.niirs,
            niirs_note: notes::niirs_note(
                &image.caveats,
                e.q,
                setup.wavelength_m,
                image.snr,
                90.0 - e.look_angle_deg,
            ),
            niirs_reading: notes::niirs_reading(image.niirs),
            solve_axis: sweep.axis,
            need_m: scenario.need_m,
            need_gsd_m: scenario.need_gsd_m,
            target_plane: need.plane,
            plane_stretch,
            detail_on_plane_m,
            gsd_on_plane_m: e.gsd_m * plane_stretch,
            reach,
            reach_m,
            focal_needed: focal,
            focal_needed_m,
            diffraction_crossing: figures.diffraction_crossing,
            turbulence_crossing: figures.turbulence_crossing,
            envelope_changes: figures.envelope_changes.clone(),
            target_m: scenario.target_m,
            target_cycles,
            target_chances,
            cdm: scenario.cd_model,
            task_ranges: figures.task_ranges.clone(),
            identifies_people: people == Some(PeopleLevel::Identification),
            px_per_m,
            people_level: people,
            rytov,
            horizon_m,
            visible: e.visible,
            cautions: notes::cautions(&cautions, scenario.units),
            sun_elevation_deg: light.sun.map(|s| s.elevation_deg),
            sun_azimuth_deg: light.sun.map(|s| s.azimuth_deg),
            illuminance_lx: light.illuminance_lx,
            light_source: light.source,
            ev100: light.ev100,
            exposure_s: light.exposure_s,
            metered: light.metered,
            target_e: light.signal.map(|s| s.target_e),
            background_e: light.signal.map(|s| s.background_e),
            noise_e: light.signal.map(|s| s.noise_e),
            full_well_e: sensor.full_well_e,
            read_noise_e: sensor.read_noise_e,
            base_iso: sensor.base_iso,
            snr_source: light.snr_source,
            light_notes: light.notes.iter().map(light_words::light_note).collect(),
            day: None,
            best: None,
            survey: survey.clone(),
            survey_words: notes::survey_words(survey, scenario.units),
            field: None,
            errors,
            ignored: scenario.ignored_keys(),
        }
    }
}

/// The report for a URL query, with the day and the best settings (`Plan::extras`).
pub fn report_for_query(query: &str) -> Report {
    let plan = Plan::from_raw(&RawScenario::from_query(query));
    let extras = plan.extras();
    let mut errors = plan.report.errors.clone();
    let field = field_report(&plan.scenario, &plan.report.survey);
    if let Some(problem) = field.as_ref().and_then(|f| f.field_problem.clone()) {
        errors.push(FieldError {
            key: "field".to_string(),
            message: problem,
        });
    }
    Report {
        day: extras.day,
        best: extras.best,
        field,
        errors,
        ..plan.report
    }
}

/// The report as one line of JSON.
pub fn report_json(query: &str) -> String {
    serde_json::to_string(&report_for_query(query))
        .unwrap_or_else(|e| format!("{{\"errors\":[{{\"key\":\"\",\"message\":\"{e}\"}}]}}"))
}
