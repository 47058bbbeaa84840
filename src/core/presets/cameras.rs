//! Camera presets: generic sensor formats and the usual imaging bands (common practice; no
//! product is named).

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
