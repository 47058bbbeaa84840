//! The table of inputs: every key of the scenario contract (`shared/reference/url-and-report.md`)
//! declared once, with its label, its unit in the link and for entry, its accepted range or words,
//! its default, whether it is required, what it conflicts with, the report fields it feeds, and
//! how it reads into and writes from a [`Scenario`].
//!
//! Parsing, writing, the field errors, the page's labels and [`inputs_of`] are loops over
//! [`INPUTS`]; adding an input is one entry here plus its use.

use crate::core::contract::scenario::{AirModel, Offset, RawScenario, Scenario, CONTRACT_VERSION};
use crate::core::formats::when::{parse_when, write_when, WHEN_FORMAT};
use crate::core::physics::light::daylight::Sky;
use crate::core::physics::light::sun::CivilTime;
use crate::core::physics::target::CdModel;
use crate::core::planning::solve::TargetPlane;
use crate::core::words::format::format_number;
use crate::core::words::units::{EntryUnit, Units, FEET, INCHES, MPH};

/// How a number is read from and written to the scenario.
#[derive(Clone, Copy)]
pub struct NumberSlot {
    /// The value the scenario holds, `None` when an optional key is left out.
    pub get: fn(&Scenario) -> Option<f64>,
    /// Stores a checked value.
    pub set: fn(&mut Scenario, f64),
}

/// What kind of value a key takes, with what is accepted and where it goes.
#[derive(Clone, Copy)]
pub enum Kind {
    /// The contract's version number.
    Version,
    /// Free text, cut at `max_chars`.
    Text {
        max_chars: usize,
        get: fn(&Scenario) -> &str,
        set: fn(&mut Scenario, String),
    },
    /// A number from `min` to `max` in the link's unit; `default` is used when the key is left out
    /// or rejected (`None`: the scenario goes without it).
    Number {
        min: f64,
        max: f64,
        default: Option<f64>,
        /// Whole numbers only (pixel counts).
        whole: bool,
        /// `1/1000` is read as a fraction (exposure times).
        fraction: bool,
        slot: NumberSlot,
    },
    /// A local date and time with its UTC offset (ISO 8601, `when`); left out unless given.
    Moment {
        get: fn(&Scenario) -> Option<CivilTime>,
        set: fn(&mut Scenario, CivilTime),
    },
    /// Two numbers from `min` to `max`, lowest first, written `a,b` (the ground under a survey);
    /// left out unless given.
    Span {
        min: f64,
        max: f64,
        get: fn(&Scenario) -> Option<(f64, f64)>,
        set: fn(&mut Scenario, (f64, f64)),
    },
    /// One of a list of words; `words[default]` when left out or not known (`None`: the scenario
    /// goes without it, and `unset` says what happens then).
    Choice {
        words: &'static [&'static str],
        default: Option<usize>,
        unset: &'static str,
        get: fn(&Scenario) -> Option<usize>,
        set: fn(&mut Scenario, usize),
    },
}

/// Another key that may not be given with this one, and what happens when both are.
#[derive(Clone, Copy, Debug)]
pub struct Conflict {
    /// The key that wins when both are given.
    pub with: &'static str,
    /// The error shown on this key.
    pub message: &'static str,
}

/// Which figures of the report an input changes, so that the page can say which results an
/// invalid input affects.
#[derive(Clone, Copy, Debug)]
pub enum Feeds {
    /// None of the resolution figures (survey and display settings).
    Nothing,
    /// The named fields, and every resolution figure that no input names.
    Engine(&'static [&'static str]),
}

/// One key of the contract.
#[derive(Clone, Copy)]
pub struct Input {
    pub key: &'static str,
    /// The field's name for people, used in labels and error messages.
    pub label: &'static str,
    /// The unit in the link, and for entry unless `imperial` says otherwise ("" for none).
    pub unit: &'static str,
    pub kind: Kind,
    /// A required key that is missing is named in an error (and its default used).
    pub required: bool,
    /// The unit it is typed in with imperial display, when not the link's.
    pub imperial: Option<EntryUnit>,
    pub conflict: Option<Conflict>,
    pub feeds: Feeds,
    /// In the plural, the verb in messages is "are" ("Display units … are not known").
    pub plural: bool,
}

/// A real number key, optional unless `.required()`; the builders below add the rest.
const fn number(
    key: &'static str,
    label: &'static str,
    unit: &'static str,
    range: (f64, f64),
    slot: NumberSlot,
) -> Input {
    Input {
        key,
        label,
        unit,
        kind: Kind::Number {
            min: range.0,
            max: range.1,
            default: None,
            whole: false,
            fraction: false,
            slot,
        },
        ..INPUTS_BASE
    }
}

impl Input {
    /// The same number key with a default value.
    const fn or(mut self, value: f64) -> Input {
        if let Kind::Number { ref mut default, .. } = self.kind {
            *default = Some(value);
        }
        self
    }

    /// The same key, required.
    const fn required(mut self) -> Input {
        self.required = true;
        self
    }

    /// The same number key, whole numbers only.
    const fn whole(mut self) -> Input {
        if let Kind::Number { ref mut whole, .. } = self.kind {
            *whole = true;
        }
        self
    }

    /// The same number key, also read as a fraction.
    const fn fraction(mut self) -> Input {
        if let Kind::Number { ref mut fraction, .. } = self.kind {
            *fraction = true;
        }
        self
    }

    /// The same key, typed in `unit` with imperial display.
    const fn imperial(mut self, unit: EntryUnit) -> Input {
        self.imperial = Some(unit);
        self
    }

    /// The same key, feeding the resolution engine (and the named report fields in particular).
    const fn feeds(mut self, fields: &'static [&'static str]) -> Input {
        self.feeds = Feeds::Engine(fields);
        self
    }

    /// The same key, refused when `with` is given too.
    const fn conflicts(mut self, with: &'static str, message: &'static str) -> Input {
        self.conflict = Some(Conflict { with, message });
        self
    }
}

/// A slot for a plain `f64` field.
macro_rules! plain {
    ($($field:ident).+) => {
        NumberSlot {
            get: |s| Some(s.$($field).+),
            set: |s, v| s.$($field).+ = v,
        }
    };
}

/// A slot for an `Option<f64>` field (an optional key).
macro_rules! optional {
    ($($field:ident).+) => {
        NumberSlot {
            get: |s| s.$($field).+,
            set: |s, v| s.$($field).+ = Some(v),
        }
    };
}

/// A slot for a `u32` field (a pixel count, checked whole and in range before it is stored).
macro_rules! count {
    ($field:ident) => {
        NumberSlot {
            get: |s| Some(f64::from(s.$field)),
            set: |s, v| s.$field = v as u32,
        }
    };
}

const SENSOR: (f64, f64) = (0.1, 200.0);
const PIXELS: (f64, f64) = (16.0, 100_000.0);
const OVERLAP: (f64, f64) = (0.0, 95.0);
const INTERVAL: (f64, f64) = (0.0, 600.0);
/// Report fields that follow the viewing geometry.
const GEOMETRY: &[&str] = &[
    "slant_range_m",
    "look_angle_deg",
    "gsd_m",
    "gsd_ground_m",
    "sampling_m",
    "px_per_m",
    "diffraction_m",
    "r0_m",
    "turbulence_m",
];
const PIXEL_PITCH: &[&str] = &["pitch_m", "gsd_m", "gsd_ground_m", "sampling_m", "px_per_m", "q"];
const TURBULENCE: &[&str] = &["r0_m", "turbulence_m"];
/// Report fields that follow the light: the exposure time used, the smear and the SNR, and so
/// the image quality.
const LIGHT: &[&str] = &[
    "illuminance_lx",
    "ev100",
    "exposure_s",
    "motion_m",
    "snr",
    "grd_m",
    "rer_along",
    "rer_across",
    "rer",
    "overshoot",
    "niirs",
];
/// Report fields that follow the wind: the smear on the fastest leg, and so the image quality.
const WIND: &[&str] = &[
    "motion_m",
    "grd_m",
    "rer_along",
    "rer_across",
    "rer",
    "overshoot",
    "niirs",
];
/// Report fields that follow the sensor's charge and noise.
const SIGNAL: &[&str] = &["snr", "grd_m", "rer_along", "rer_across", "rer", "overshoot", "niirs"];
/// The image-quality figures of the imaging chain.
const CHAIN: &[&str] = &["grd_m", "rer_along", "rer_across", "rer", "overshoot", "niirs"];

/// Every key of the contract, in the order a query is written and errors are listed.
pub const INPUTS: &[Input] = &[
    Input {
        key: "v",
        label: "Contract version",
        ..INPUTS_BASE
    },
    Input {
        key: "name",
        label: "Scenario name",
        unit: "",
        kind: Kind::Text {
            max_chars: NAME_MAX_CHARS,
            get: |s| &s.name,
            set: |s, v| s.name = v,
        },
        ..INPUTS_BASE
    },
    number("sw", "Sensor width", "mm", SENSOR, plain!(sensor_width_mm))
        .or(13.2)
        .required()
        .feeds(PIXEL_PITCH),
    number("sh", "Sensor height", "mm", SENSOR, plain!(sensor_height_mm))
        .or(8.8)
        .required()
        .feeds(&[]),
    number("cols", "Image width", "pixels", PIXELS, count!(cols))
        .or(5472.0)
        .whole()
        .required()
        .feeds(PIXEL_PITCH),
    number("rows", "Image height", "pixels", PIXELS, count!(rows))
        .or(3648.0)
        .whole()
        .required()
        .feeds(&[]),
    number("focal", "Focal length", "mm", (0.5, 5000.0), plain!(focal_mm))
        .or(8.8)
        .required()
        .feeds(&[
            "aperture_m",
            "gsd_m",
            "gsd_ground_m",
            "sampling_m",
            "px_per_m",
            "diffraction_m",
        ]),
    number("fnum", "f-number", "", (0.5, 64.0), plain!(f_number))
        .or(4.0)
        .required()
        .feeds(&["aperture_m", "diffraction_m", "q"]),
    number("wl", "Wavelength", "nm", (200.0, 20_000.0), plain!(wavelength_nm))
        .or(550.0)
        .feeds(&["diffraction_m", "r0_m", "turbulence_m", "q"]),
    number("h", "Height above the ground", "m", (0.1, 20_000.0), plain!(height_m))
        .or(80.0)
        .required()
        .imperial(FEET)
        .feeds(GEOMETRY),
    number(
        "gd",
        "Ground distance to the target",
        "m",
        (0.0, 100_000.0),
        NumberSlot {
            get: |s| match s.offset {
                Offset::GroundDistance(g) => Some(g),
                Offset::Tilt(_) => None,
            },
            set: |s, v| s.offset = Offset::GroundDistance(v),
        },
    )
    .or(0.0)
    .imperial(FEET)
    .feeds(GEOMETRY),
    number(
        "tilt",
        "Tilt from straight down",
        "degrees",
        (0.0, 85.0),
        NumberSlot {
            get: |s| match s.offset {
                Offset::Tilt(t) => Some(t),
                Offset::GroundDistance(_) => None,
            },
            set: |s, v| s.offset = Offset::Tilt(v),
        },
    )
    .conflicts(
        "gd",
        "Give either the ground distance (gd) or the tilt, not both; the ground distance is used.",
    )
    .feeds(GEOMETRY),
    number(
        "tht",
        "Target height above its ground",
        "m",
        (0.0, 10_000.0),
        optional!(target_height_m),
    )
    .imperial(FEET)
    .feeds(GEOMETRY),
    number(
        "refk",
        "Refraction factor of the Earth's radius",
        "",
        (0.5, 100.0),
        optional!(earth_k),
    )
    .feeds(GEOMETRY),
    Input {
        key: "air",
        label: "Turbulence profile",
        unit: "",
        kind: Kind::Choice {
            words: &AirModel::WORDS,
            default: Some(0),
            unset: "",
            get: |s| Some(s.air as usize),
            set: |s, i| s.air = AirModel::ALL.get(i).copied().unwrap_or_default(),
        },
        ..INPUTS_BASE
    }
    .feeds(TURBULENCE),
    number(
        "cn2",
        "Cn² at 1 m above the ground",
        "m^-2/3",
        (1e-18, 1e-11),
        plain!(cn2_at_1m),
    )
    .or(1e-14)
    .feeds(TURBULENCE),
    number("cexp", "Cn² height exponent", "", (-3.0, 0.0), plain!(cn2_exponent))
        .or(-4.0 / 3.0)
        .feeds(TURBULENCE),
    number("speed", "Speed", "m/s", (0.0, 150.0), plain!(speed_mps))
        .or(0.0)
        .imperial(MPH)
        .feeds(&["motion_m"]),
    number("shutter", "Exposure time", "s", (1e-6, 10.0), plain!(shutter_s))
        .or(0.001)
        .fraction()
        .feeds(&["exposure_s", "motion_m"]),
    number(
        "rate",
        "Camera turning rate during the exposure",
        "°/s",
        (0.0, 360.0),
        plain!(turn_rate_deg_s),
    )
    .or(0.0)
    .feeds(&["motion_m"]),
    number(
        "tspeed",
        "Target speed across the view",
        "m/s",
        (0.0, 150.0),
        plain!(target_speed_mps),
    )
    .or(0.0)
    .imperial(MPH)
    .feeds(&["motion_m"]),
    number(
        "obsc",
        "Central obscuration of the lens",
        "",
        (0.0, 0.89),
        plain!(obscuration),
    )
    .or(0.0)
    .feeds(CHAIN),
    number("wfe", "Wavefront error (rms)", "waves", (0.0, 0.25), plain!(wfe_waves))
        .or(0.0)
        .feeds(CHAIN),
    number("fill", "Pixel fill factor", "", (0.1, 1.0), plain!(fill))
        .or(1.0)
        .feeds(CHAIN),
    number(
        "jitter",
        "Line-of-sight jitter (rms)",
        "µrad",
        (0.0, 10_000.0),
        plain!(jitter_urad),
    )
    .or(0.0)
    .feeds(&[
        "motion_m",
        "grd_m",
        "rer_along",
        "rer_across",
        "rer",
        "overshoot",
        "niirs",
    ]),
    number(
        "snr",
        "Contrast signal-to-noise ratio",
        "",
        (1.0, 1000.0),
        optional!(snr),
    )
    .feeds(CHAIN),
    number(
        "aw",
        "Area width (across the lines)",
        "m",
        (1.0, 100_000.0),
        optional!(survey.area_width_m),
    )
    .imperial(FEET),
    number(
        "al",
        "Area length (along the lines)",
        "m",
        (1.0, 100_000.0),
        optional!(survey.area_length_m),
    )
    .imperial(FEET),
    number("fo", "Front overlap", "%", OVERLAP, plain!(survey.front_overlap_pct)).or(75.0),
    number("so", "Side overlap", "%", OVERLAP, plain!(survey.side_overlap_pct)).or(65.0),
    number(
        "need",
        "Smallest detail to resolve",
        "m",
        (0.0001, 1000.0),
        optional!(need_m),
    )
    .imperial(INCHES),
    number(
        "needgsd",
        "Required GSD on the target's plane",
        "m",
        (0.0001, 1000.0),
        optional!(need_gsd_m),
    )
    .imperial(INCHES),
    Input {
        key: "tplane",
        label: "Target plane",
        unit: "",
        kind: Kind::Choice {
            words: &["ground", "upright"],
            default: None,
            unset: "the plane follows the view (the ground from the air, upright for a camera looking across)",
            get: |s| s.target_plane.map(|p| p as usize),
            set: |s, i| s.target_plane = [TargetPlane::Ground, TargetPlane::Upright].get(i).copied(),
        },
        ..INPUTS_BASE
    },
    number(
        "tdim",
        "Target critical dimension",
        "m",
        (0.01, 10_000.0),
        optional!(target_m),
    )
    .imperial(FEET),
    Input {
        key: "cdm",
        label: "Critical-dimension model",
        unit: "",
        kind: Kind::Choice {
            words: &["1d", "2d"],
            default: Some(1),
            unset: "",
            get: |s| Some(s.cd_model as usize),
            set: |s, i| s.cd_model = [CdModel::OneD, CdModel::TwoD].get(i).copied().unwrap_or_default(),
        },
        ..INPUTS_BASE
    },
    number(
        "trig",
        "Shortest interval between photos",
        "s",
        INTERVAL,
        plain!(survey.trigger_s),
    )
    .or(2.0),
    number(
        "endur",
        "Usable flight time per battery",
        "min",
        (1.0, 600.0),
        plain!(survey.endurance_min),
    )
    .or(25.0),
    number(
        "turn",
        "Time per turn between lines",
        "s",
        INTERVAL,
        plain!(survey.turn_s),
    )
    .or(10.0),
    number("mb", "Size of one photo", "MB", (0.0, 2000.0), plain!(survey.photo_mb)).or(10.0),
    number(
        "blur",
        "Motion-blur budget",
        "pixels",
        (0.05, 10.0),
        plain!(survey.blur_budget_px),
    )
    .or(0.5),
    number(
        "lat",
        "Survey origin latitude",
        "degrees",
        (-89.0, 89.0),
        optional!(survey.latitude_deg),
    ),
    number(
        "lon",
        "Survey origin longitude",
        "degrees",
        (-180.0, 180.0),
        optional!(survey.longitude_deg),
    ),
    number(
        "hdg",
        "Flight-line heading",
        "degrees from north",
        (0.0, 360.0),
        plain!(survey.heading_deg),
    )
    .or(0.0),
    Input {
        key: "relief",
        label: "Ground height under the block",
        unit: "m from take-off",
        kind: Kind::Span {
            min: -10_000.0,
            max: 10_000.0,
            get: |s| s.survey.relief_m,
            set: |s, v| s.survey.relief_m = Some(v),
        },
        ..INPUTS_BASE
    },
    number(
        "wind",
        "Wind speed (the speed above is then through the air)",
        "m/s",
        (0.0, 60.0),
        plain!(survey.wind_mps),
    )
    .or(0.0)
    .imperial(MPH)
    .feeds(WIND),
    number(
        "wdir",
        "Wind from",
        "degrees from north",
        (0.0, 360.0),
        plain!(survey.wind_from_deg),
    )
    .or(0.0)
    .feeds(WIND),
    Input {
        key: "field",
        label: "Survey boundary",
        unit: "",
        kind: Kind::Text {
            max_chars: FIELD_MAX_CHARS,
            get: |s| &s.field,
            set: |s, v| s.field = v,
        },
        ..INPUTS_BASE
    },
    Input {
        key: "when",
        label: "Date and time",
        unit: "",
        kind: Kind::Moment {
            get: |s| s.when,
            set: |s, t| s.when = Some(t),
        },
        ..INPUTS_BASE
    }
    .feeds(LIGHT),
    Input {
        key: "sky",
        label: "Sky",
        unit: "",
        kind: Kind::Choice {
            words: &["clear", "partly", "overcast"],
            default: Some(0),
            unset: "",
            get: |s| Some(s.sky as usize),
            set: |s, i| {
                s.sky = [Sky::Clear, Sky::PartlyCloudy, Sky::Overcast]
                    .get(i)
                    .copied()
                    .unwrap_or_default()
            },
        },
        ..INPUTS_BASE
    }
    .feeds(LIGHT),
    number(
        "lux",
        "Illuminance on the ground",
        "lx",
        (0.01, 200_000.0),
        optional!(lux),
    )
    .feeds(LIGHT),
    number("refl", "Mean scene reflectance", "", (0.01, 1.0), plain!(reflectance))
        .or(0.18)
        .feeds(LIGHT),
    Input {
        key: "expmode",
        label: "Exposure mode",
        unit: "",
        kind: Kind::Choice {
            words: &["set", "auto"],
            default: Some(0),
            unset: "",
            get: |s| Some(usize::from(s.auto_exposure)),
            set: |s, i| s.auto_exposure = i == 1,
        },
        ..INPUTS_BASE
    }
    .feeds(LIGHT),
    number("iso", "ISO speed", "", (25.0, 409_600.0), plain!(iso))
        .or(100.0)
        .feeds(LIGHT),
    number(
        "baseiso",
        "Base ISO of the sensor",
        "",
        (25.0, 3200.0),
        optional!(base_iso),
    )
    .feeds(SIGNAL),
    number(
        "fw",
        "Full-well capacity",
        "electrons",
        (100.0, 1_000_000.0),
        optional!(full_well_e),
    )
    .feeds(SIGNAL),
    number("rn", "Read noise", "electrons", (0.0, 100.0), optional!(read_noise_e)).feeds(SIGNAL),
    number(
        "fmin",
        "Widest aperture of the lens",
        "f-number",
        (0.5, 64.0),
        optional!(widest_f_number),
    ),
    Input {
        key: "units",
        label: "Display units",
        unit: "",
        kind: Kind::Choice {
            words: &UNIT_WORDS,
            default: Some(0),
            unset: "",
            get: |s| Some(s.units as usize),
            set: |s, i| s.units = Units::ALL.get(i).copied().unwrap_or_default(),
        },
        plural: true,
        ..INPUTS_BASE
    },
];

/// Longest scenario name kept, in characters.
pub const NAME_MAX_CHARS: usize = 120;

/// Longest boundary text kept, in characters: about 5000 points (`formats::boundary::MAX_POINTS`).
pub const FIELD_MAX_CHARS: usize = 150_000;

/// The words of the `units` key, in [`Units::ALL`] order.
const UNIT_WORDS: [&str; 2] = [Units::Metric.key(), Units::Imperial.key()];

/// What every entry shares unless it says otherwise.
const INPUTS_BASE: Input = Input {
    key: "",
    label: "",
    unit: "",
    kind: Kind::Version,
    required: false,
    imperial: None,
    conflict: None,
    feeds: Feeds::Nothing,
    plural: false,
};

/// The entry of `key`, if the contract has one.
pub fn input(key: &str) -> Option<&'static Input> {
    INPUTS.iter().find(|i| i.key == key)
}

/// The unit `key` is typed in with `units` display, when it differs from the link's.
pub fn entry_unit(key: &str, units: Units) -> Option<EntryUnit> {
    match units {
        Units::Metric => None,
        Units::Imperial => input(key)?.imperial,
    }
}

/// The scenario keys a report field depends on: the inputs that name it, or, for a resolution
/// figure that no input names, every input that feeds the engine.
pub fn inputs_of(field: &str) -> Vec<&'static str> {
    let named = |i: &&Input| matches!(i.feeds, Feeds::Engine(fields) if fields.contains(&field));
    let keys: Vec<&'static str> = INPUTS.iter().filter(named).map(|i| i.key).collect();
    if !keys.is_empty() {
        return keys;
    }
    INPUTS
        .iter()
        .filter(|i| matches!(i.feeds, Feeds::Engine(_)))
        .map(|i| i.key)
        .collect()
}

/// The first `max` characters of `text`, with an ellipsis when cut.
pub(crate) fn clip(text: &str, max: usize) -> String {
    if text.chars().count() <= max {
        text.to_string()
    } else {
        let head: String = text.chars().take(max).collect();
        format!("{head}…")
    }
}

/// Reads a number or a fraction such as `1/1000`.
fn parse_fraction(text: &str) -> Option<f64> {
    match text.split_once('/') {
        Some((num, den)) => {
            let num: f64 = num.trim().parse().ok()?;
            let den: f64 = den.trim().parse().ok()?;
            (den != 0.0).then(|| num / den)
        }
        None => text.parse().ok(),
    }
}

impl Input {
    /// The accepted values in words, e.g. "a number from 0.5 to 5000 mm" or "metric or imperial".
    pub fn range_text(&self) -> String {
        match self.kind {
            Kind::Number { min, max, whole, .. } => {
                let unit = if self.unit.is_empty() {
                    String::new()
                } else {
                    format!(" {}", self.unit)
                };
                let kind = if whole { "a whole number" } else { "a number" };
                format!("{kind} from {} to {}{unit}", format_number(min), format_number(max))
            }
            Kind::Choice { words, .. } => match words {
                [a, b] => format!("{a} or {b}"),
                _ => format!("one of {}", words.join(", ")),
            },
            Kind::Text { max_chars, .. } => format!("text of at most {max_chars} characters"),
            Kind::Moment { .. } => WHEN_FORMAT.to_string(),
            Kind::Span { min, max, .. } => format!(
                "two numbers from {} to {} {}, lowest first, e.g. -5,25",
                format_number(min),
                format_number(max),
                self.unit
            ),
            Kind::Version => "1".to_string(),
        }
    }

    /// Whether the key takes a number or a span (and so has a field of its own on the page).
    pub fn is_number(&self) -> bool {
        matches!(self.kind, Kind::Number { .. } | Kind::Span { .. })
    }

    /// Whether the key takes one number (not a span of two).
    pub fn is_single(&self) -> bool {
        matches!(self.kind, Kind::Number { .. })
    }

    /// Whether the key takes whole numbers only.
    pub fn is_whole(&self) -> bool {
        matches!(self.kind, Kind::Number { whole: true, .. })
    }

    /// The accepted range of a number key, `(min, max)` in the link's unit.
    pub fn range(&self) -> Option<(f64, f64)> {
        match self.kind {
            Kind::Number { min, max, .. } | Kind::Span { min, max, .. } => Some((min, max)),
            _ => None,
        }
    }

    /// Parses and checks one number; the error message names the field and the accepted range.
    pub fn parse(&self, text: &str) -> Result<f64, String> {
        let Kind::Number {
            min,
            max,
            whole,
            fraction,
            ..
        } = self.kind
        else {
            return Err(format!("{} is not a number field.", self.label));
        };
        let t = text.trim();
        let value = if fraction {
            parse_fraction(t)
        } else {
            t.parse::<f64>().ok()
        };
        let reason = match value {
            None if t.is_empty() => "is empty".to_string(),
            None => format!("'{}' is not a number", clip(t, 24)),
            Some(v) if !v.is_finite() => format!("'{}' is not a finite number", clip(t, 24)),
            Some(v) if v < min || v > max => format!("{} is out of range", format_number(v)),
            Some(v) if whole && v.fract() != 0.0 => format!("{} is not a whole number", format_number(v)),
            Some(v) => return Ok(v),
        };
        Err(format!("{} {reason}: give {}.", self.label, self.range_text()))
    }

    /// The value's text in the link, or `None` when the scenario leaves the key out.
    pub(crate) fn write(&self, scenario: &Scenario) -> Option<String> {
        match self.kind {
            Kind::Version => Some(CONTRACT_VERSION.to_string()),
            Kind::Text { get, .. } => Some(get(scenario).to_string()).filter(|t| !t.is_empty()),
            Kind::Number { slot, .. } => (slot.get)(scenario).map(format_number),
            Kind::Choice { words, get, .. } => get(scenario).and_then(|i| words.get(i)).map(|w| w.to_string()),
            Kind::Moment { get, .. } => get(scenario).map(|t| write_when(&t)),
            Kind::Span { get, .. } => get(scenario).map(|(a, b)| format!("{},{}", format_number(a), format_number(b))),
        }
    }

    /// Reads this key from `raw` into `scenario`, reporting each rejected value through `error`
    /// (key, message); a rejected or missing value leaves the default in place.
    pub(crate) fn read(&self, raw: &RawScenario, scenario: &mut Scenario, error: &mut impl FnMut(&str, String)) {
        let input = self;
        let text = raw.get(input.key);
        let verb = if input.plural { "are" } else { "is" };
        match (input.kind, text) {
            (Kind::Version, Some(v)) if v.trim() != CONTRACT_VERSION.to_string() => error(
                input.key,
                format!(
                    "{} '{}' {verb} not known: give {CONTRACT_VERSION}; read as version {CONTRACT_VERSION}.",
                    input.label,
                    clip(v, 12)
                ),
            ),
            (Kind::Text { max_chars, set, .. }, Some(t)) => {
                if t.chars().count() > max_chars {
                    error(
                        input.key,
                        format!("{} is longer than {max_chars} characters; it was cut.", input.label),
                    );
                }
                set(scenario, t.chars().take(max_chars).collect());
            }
            (
                Kind::Choice {
                    words,
                    default,
                    unset,
                    set,
                    ..
                },
                Some(w),
            ) => match words.iter().position(|x| *x == w.trim()) {
                Some(i) => set(scenario, i),
                None => error(
                    input.key,
                    format!(
                        "{} '{}' {verb} not known: give {}; {}.",
                        input.label,
                        clip(w.trim(), 24),
                        input.range_text(),
                        match default.and_then(|d| words.get(d)) {
                            Some(word) => format!("{word} is used"),
                            None => unset.to_string(),
                        }
                    ),
                ),
            },
            (Kind::Moment { set, .. }, Some(t)) => match parse_when(t) {
                Some(time) => set(scenario, time),
                None => error(
                    input.key,
                    format!(
                        "{} '{}' is not {WHEN_FORMAT}; the sun is left out.",
                        input.label,
                        clip(t.trim(), 32)
                    ),
                ),
            },
            (Kind::Span { min, max, set, .. }, Some(t)) => {
                let parts: Vec<&str> = t.split(',').map(str::trim).collect();
                let values: Vec<f64> = parts.iter().filter_map(|p| p.parse::<f64>().ok()).collect();
                match values[..] {
                    [a, b] if parts.len() == 2 && [a, b].iter().all(|v| (min..=max).contains(v)) => {
                        set(scenario, (a.min(b), a.max(b)))
                    }
                    _ => error(
                        input.key,
                        format!(
                            "{} '{}' is not usable: give {}; the ground is taken as level.",
                            input.label,
                            clip(t.trim(), 24),
                            input.range_text()
                        ),
                    ),
                }
            }
            (Kind::Number { default, .. }, None) if input.required => error(
                input.key,
                format!(
                    "{} is missing: give {}; {} is used meanwhile.",
                    input.label,
                    input.range_text(),
                    format_number(default.unwrap_or_default())
                ),
            ),
            (Kind::Number { slot, .. }, Some(t)) => {
                let value = input.parse(t).map_err(|message| error(input.key, message));
                match input.conflict.filter(|c| raw.get(c.with).is_some()) {
                    Some(conflict) => error(input.key, conflict.message.to_string()),
                    None => {
                        if let Ok(v) = value {
                            (slot.set)(scenario, v);
                        }
                    }
                }
            }
            _ => {}
        }
    }

    /// Stores the default of this key (nothing for an optional number or text).
    pub(crate) fn apply_default(&self, scenario: &mut Scenario) {
        match self.kind {
            Kind::Number {
                default: Some(v), slot, ..
            } => (slot.set)(scenario, v),
            Kind::Choice {
                default: Some(default),
                set,
                ..
            } => set(scenario, default),
            _ => {}
        }
    }
}
