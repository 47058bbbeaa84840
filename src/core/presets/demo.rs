//! Demo scenarios of our own invention, shown when the page opens with no scenario in its URL.
//! The farm, the site and the cameras are made up; sensors are described as generic formats.
//! Each demo is the contract's defaults with what it changes, so the contract, not a demo, says
//! how a link without a key reads.

use crate::core::contract::scenario::{AirModel, Offset, Scenario};
use crate::core::planning::survey::SurveySettings;

/// Invented: a pasture survey over "Hollow Creek" farm with a 1-type camera drone (the contract's
/// default camera, lens and height).
pub fn pasture_survey() -> Scenario {
    Scenario {
        name: "Hollow Creek pasture survey (demo)".to_string(),
        air: AirModel::Power,
        cn2_at_1m: 1e-13,
        cn2_exponent: -1.333,
        speed_mps: 8.0,
        need_m: Some(0.03),
        target_m: Some(0.75),
        survey: SurveySettings {
            area_width_m: Some(400.0),
            area_length_m: Some(600.0),
            latitude_deg: Some(-36.8512),
            longitude_deg: Some(146.2934),
            ..Scenario::contract_defaults().survey
        },
        ..Scenario::contract_defaults()
    }
}

/// Invented: a fence-line camera on an 8 m mast watching a gate 1.5 km away on a sunny day.
pub fn fence_mast() -> Scenario {
    Scenario {
        name: "Ridge Road fence-line mast camera (demo)".to_string(),
        sensor_width_mm: 6.17,
        sensor_height_mm: 4.55,
        cols: 4000,
        rows: 3000,
        focal_mm: 100.0,
        height_m: 8.0,
        offset: Offset::GroundDistance(1500.0),
        speed_mps: 0.0,
        shutter_s: 0.002,
        need_m: Some(0.1),
        survey: SurveySettings {
            area_width_m: None,
            area_length_m: None,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    }
}

/// Every demo, for the demo picker.
pub fn all() -> Vec<Scenario> {
    vec![pasture_survey(), fence_mast()]
}
