//! Generators shared by the property tests of several test files.
//!
//! Each test file is its own crate and uses only some of these, hence the `dead_code` allowance.
#![allow(dead_code)]

use proptest::prelude::*;
use sharpfield::core::contract::scenario::Scenario;
use sharpfield::core::physics::chain::ChainInputs;
use sharpfield::core::physics::engine::Setup;
use sharpfield::core::physics::geometry::Geometry;
use sharpfield::core::physics::turbulence::Profile;
use sharpfield::core::planning::survey::{plan_survey, SurveyInputs, SurveyPlan};
use sharpfield::core::words::notes::{survey_words, SurveyWords};
use sharpfield::core::words::units::Units;

/// Log-uniform in [lo, hi], ends included.
pub fn log_range(lo: f64, hi: f64) -> impl Strategy<Value = f64> {
    (0.0f64..=1.0).prop_map(move |u| (lo * (hi / lo).powf(u)).clamp(lo, hi))
}

/// One profile of each kind the scenario offers, by name, for the named (non-random) cases.
pub fn named_profiles() -> [(&'static str, Profile); 6] {
    [
        ("none", Profile::None),
        ("HV 5/7", Profile::HV57),
        ("SLC-Day", Profile::SlcDay),
        ("SLC-Night", Profile::SlcNight),
        (
            "power −4/3, 1e−13",
            Profile::PowerLaw {
                cn2_at_1m: 1e-13,
                exponent: -4.0 / 3.0,
            },
        ),
        (
            "power −2/3, 1e−12",
            Profile::PowerLaw {
                cn2_at_1m: 1e-12,
                exponent: -2.0 / 3.0,
            },
        ),
    ]
}

/// Any turbulence profile the scenario can ask for, with the power law over its whole valid range.
pub fn any_profile() -> impl Strategy<Value = Profile> {
    prop_oneof![
        Just(Profile::None),
        Just(Profile::HV57),
        Just(Profile::SlcDay),
        Just(Profile::SlcNight),
        (log_range(1e-18, 1e-11), -3.0f64..=0.0).prop_map(|(c, e)| Profile::PowerLaw {
            cn2_at_1m: c,
            exponent: e
        }),
    ]
}

/// Any engine setup within the scenario's valid ranges (`contract::inputs::INPUTS`, in SI): the
/// target placed by ground distance (0 or 1 m to 100 km) or by tilt (0–85°).
pub fn any_setup() -> impl Strategy<Value = Setup> {
    let optics = (
        log_range(0.1, 200.0),
        16u32..=100_000,
        log_range(0.5, 5000.0),
        log_range(0.5, 64.0),
        log_range(200.0, 20_000.0),
    );
    let place = (
        log_range(0.1, 20_000.0),
        prop_oneof![log_range(1.0, 100_000.0), Just(0.0)],
        0.0f64..=85.0,
        any::<bool>(),
    );
    let motion = (prop_oneof![Just(0.0), log_range(0.1, 150.0)], log_range(1e-6, 10.0));
    let chain = (
        prop_oneof![Just(0.0), 0.0f64..=0.89],
        prop_oneof![Just(0.0), 0.0f64..=0.25],
        prop_oneof![Just(1.0), 0.1f64..=1.0],
        prop_oneof![Just(0.0), log_range(0.1, 10_000.0)],
        log_range(1.0, 1000.0),
    )
        .prop_map(|(obscuration, wfe_waves, fill, jitter_urad, snr)| ChainInputs {
            obscuration,
            wfe_waves,
            fill,
            jitter_rad: jitter_urad * 1e-6,
            snr,
        });
    (optics, place, any_profile(), (motion, chain)).prop_map(
        |((sw, cols, focal, fnum, wl), (h, gd, tilt, use_tilt), profile, ((speed, shutter), chain))| Setup {
            sensor_width_m: sw * 1e-3,
            sensor_height_m: sw * 1e-3,
            cols,
            rows: cols,
            focal_m: focal * 1e-3,
            f_number: fnum,
            wavelength_m: wl * 1e-9,
            geometry: if use_tilt {
                Geometry::tilted(h, tilt.to_radians())
            } else {
                Geometry {
                    height_m: h,
                    ground_distance_m: gd,
                    ..Geometry::default()
                }
            },
            profile,
            speed_mps: speed,
            exposure_s: shutter,
            turn_rate_rad_s: 0.0,
            target_speed_mps: 0.0,
            chain,
        },
    )
}

/// The survey inputs of a scenario, with the GSD from the engine's evaluation as the plan takes it.
pub fn inputs(scenario: &Scenario) -> SurveyInputs {
    scenario.planned_survey_inputs()
}

/// The survey plan of a scenario, as the plan computes it.
pub fn plan(scenario: &Scenario) -> SurveyPlan {
    plan_survey(&inputs(scenario))
}

/// What a survey plan says, in words, in `units`.
pub fn words(plan: &SurveyPlan, units: Units) -> SurveyWords {
    survey_words(plan, units)
}

/// Asserts that `actual` is within `tolerance` of `expected`.
pub fn close(actual: f64, expected: f64, tolerance: f64) {
    assert!(
        (actual - expected).abs() <= tolerance,
        "{actual} differs from {expected} by more than {tolerance}"
    );
}
