//! Demo scenarios of our own invention, shown when the page opens with no scenario in its URL.
//! The farm, the site and the cameras are made up; sensors are described as generic formats.

use crate::core::contract::scenario::{AirModel, Offset, Scenario, Units};

/// A generic sensor format: the camera presets offered in the planner.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SensorFormat {
    pub id: &'static str,
    pub label: &'static str,
    pub width_mm: f64,
    pub height_mm: f64,
    pub cols: u32,
    pub rows: u32,
}

/// Generic sensor formats with typical dimensions and pixel counts (common practice).
pub const SENSOR_FORMATS: &[SensorFormat] = &[
    SensorFormat {
        id: "type-1-2.3",
        label: "1/2.3-type, 12 MP",
        width_mm: 6.17,
        height_mm: 4.55,
        cols: 4000,
        rows: 3000,
    },
    SensorFormat {
        id: "type-1",
        label: "1-type, 20 MP",
        width_mm: 13.2,
        height_mm: 8.8,
        cols: 5472,
        rows: 3648,
    },
    SensorFormat {
        id: "type-4-3",
        label: "4/3-type, 20 MP",
        width_mm: 17.3,
        height_mm: 13.0,
        cols: 5184,
        rows: 3888,
    },
    SensorFormat {
        id: "aps-c",
        label: "APS-C, 24 MP",
        width_mm: 23.5,
        height_mm: 15.6,
        cols: 6000,
        rows: 4000,
    },
    SensorFormat {
        id: "full-frame",
        label: "Full frame, 45 MP",
        width_mm: 35.9,
        height_mm: 24.0,
        cols: 8192,
        rows: 5464,
    },
    SensorFormat {
        id: "thermal-640",
        label: "Thermal core 640×512, 12 µm",
        width_mm: 7.68,
        height_mm: 6.144,
        cols: 640,
        rows: 512,
    },
];

/// A spectral band: the wavelength presets offered in the planner (common practice).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Band {
    pub id: &'static str,
    pub label: &'static str,
    pub wavelength_nm: f64,
}

/// Representative wavelengths of the usual imaging bands.
pub const BANDS: &[Band] = &[
    Band {
        id: "visible",
        label: "Visible (550 nm)",
        wavelength_nm: 550.0,
    },
    Band {
        id: "nir",
        label: "Near infrared (850 nm)",
        wavelength_nm: 850.0,
    },
    Band {
        id: "swir",
        label: "Short-wave infrared (1.55 µm)",
        wavelength_nm: 1550.0,
    },
    Band {
        id: "mwir",
        label: "Mid-wave infrared (4 µm)",
        wavelength_nm: 4000.0,
    },
    Band {
        id: "lwir",
        label: "Long-wave infrared (10 µm)",
        wavelength_nm: 10_000.0,
    },
];

/// Invented: a pasture survey over "Hollow Creek" farm with a 1-type camera drone.
pub fn pasture_survey() -> Scenario {
    Scenario {
        name: "Hollow Creek pasture survey (demo)".to_string(),
        sensor_width_mm: 13.2,
        sensor_height_mm: 8.8,
        cols: 5472,
        rows: 3648,
        focal_mm: 8.8,
        f_number: 4.0,
        wavelength_nm: 550.0,
        height_m: 80.0,
        offset: Offset::GroundDistance(0.0),
        air: AirModel::Power,
        cn2_at_1m: 1e-13,
        cn2_exponent: -1.333,
        speed_mps: 8.0,
        shutter_s: 0.001,
        area_width_m: Some(400.0),
        area_length_m: Some(600.0),
        front_overlap_pct: 75.0,
        side_overlap_pct: 65.0,
        need_m: Some(0.03),
        target_m: Some(0.75),
        trigger_s: 2.0,
        endurance_min: 25.0,
        turn_s: 10.0,
        photo_mb: 10.0,
        blur_budget_px: 0.5,
        latitude_deg: Some(-36.8512),
        longitude_deg: Some(146.2934),
        heading_deg: 0.0,
        units: Units::Metric,
        extra: Vec::new(),
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
        f_number: 4.0,
        wavelength_nm: 550.0,
        height_m: 8.0,
        offset: Offset::GroundDistance(1500.0),
        air: AirModel::Power,
        cn2_at_1m: 1e-13,
        cn2_exponent: -1.333,
        speed_mps: 0.0,
        shutter_s: 0.002,
        area_width_m: None,
        area_length_m: None,
        need_m: Some(0.1),
        target_m: Some(0.75),
        ..pasture_survey()
    }
}

/// Every demo, for the demo picker.
pub fn all() -> Vec<Scenario> {
    vec![pasture_survey(), fence_mast()]
}
