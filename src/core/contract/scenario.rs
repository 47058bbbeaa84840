//! The scenario: the whole set of inputs, as the public contract defines it
//! (`shared/reference/url-and-report.md`, version 1).
//!
//! Text comes in leniently as a [`RawScenario`] (key, value) list — from a URL query, a form or a
//! saved file — and is validated once by [`Scenario::from_raw`] into typed values in the
//! contract's units, with one [`FieldError`] per rejected value naming the key and the accepted
//! range. A bad value never stops the rest from loading: its default is used and the error says so.
//! [`Scenario::setup`] then converts to SI for the engine.

use crate::core::physics::geometry::Geometry;
use crate::core::physics::turbulence::Profile;
use serde::Serialize;

/// Version of the URL and report contract that this code writes.
pub const CONTRACT_VERSION: u32 = 1;

/// Longest scenario name kept, in characters.
pub const NAME_MAX_CHARS: usize = 120;

/// A value that was rejected, with the key it came under and a message that names the accepted range.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct FieldError {
    pub key: String,
    pub message: String,
}

/// The text of a scenario as given: ordered (key, value) pairs, unknown keys included.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct RawScenario {
    pub pairs: Vec<(String, String)>,
}

impl RawScenario {
    /// Reads a URL query (with or without its leading `?`); never fails.
    pub fn from_query(query: &str) -> RawScenario {
        let query = query.trim().trim_start_matches('?');
        RawScenario {
            pairs: form_urlencoded::parse(query.as_bytes())
                .map(|(k, v)| (k.trim().to_string(), v.into_owned()))
                .filter(|(k, _)| !k.is_empty())
                .collect(),
        }
    }

    /// Writes the pairs as a URL query without the leading `?`.
    pub fn to_query(&self) -> String {
        let mut out = form_urlencoded::Serializer::new(String::new());
        for (k, v) in &self.pairs {
            out.append_pair(k, v);
        }
        out.finish()
    }

    /// The first value given for `key`.
    pub fn get(&self, key: &str) -> Option<&str> {
        self.pairs.iter().find(|(k, _)| k == key).map(|(_, v)| v.as_str())
    }

    /// Sets `key` to `value` in place (keeping its position), or appends it.
    pub fn set(&mut self, key: &str, value: &str) {
        match self.pairs.iter_mut().find(|(k, _)| k == key) {
            Some(pair) => pair.1 = value.to_string(),
            None => self.pairs.push((key.to_string(), value.to_string())),
        }
    }

    /// Removes every value of `key`.
    pub fn remove(&mut self, key: &str) {
        self.pairs.retain(|(k, _)| k != key);
    }
}

/// Where the target lies relative to the point below the camera.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Offset {
    /// Horizontal ground distance in metres (`gd`); 0 is straight down.
    GroundDistance(f64),
    /// Look angle from straight down in degrees (`tilt`).
    Tilt(f64),
}

/// The turbulence profile named by `air`.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum AirModel {
    None,
    Hv57,
    SlcDay,
    SlcNight,
    Power,
}

impl AirModel {
    /// Every model, in the order the contract lists them.
    pub const ALL: [AirModel; 5] = [
        AirModel::None,
        AirModel::Hv57,
        AirModel::SlcDay,
        AirModel::SlcNight,
        AirModel::Power,
    ];

    /// The contract's word for the model.
    pub fn key(self) -> &'static str {
        match self {
            AirModel::None => "none",
            AirModel::Hv57 => "hv57",
            AirModel::SlcDay => "slc-day",
            AirModel::SlcNight => "slc-night",
            AirModel::Power => "power",
        }
    }

    /// Reads the contract's word.
    pub fn from_key(word: &str) -> Option<AirModel> {
        AirModel::ALL.into_iter().find(|m| m.key() == word.trim())
    }
}

/// Display units; the URL and the engine stay SI either way.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Units {
    Metric,
    Imperial,
}

impl Units {
    /// The contract's word.
    pub fn key(self) -> &'static str {
        match self {
            Units::Metric => "metric",
            Units::Imperial => "imperial",
        }
    }
}

/// A validated scenario, in the contract's units (mm, nm, %, degrees, as the URL writes them), so
/// that writing it to a query and reading it back gives exactly the same values.
#[derive(Clone, Debug, PartialEq)]
pub struct Scenario {
    pub name: String,
    pub sensor_width_mm: f64,
    pub sensor_height_mm: f64,
    pub cols: u32,
    pub rows: u32,
    pub focal_mm: f64,
    pub f_number: f64,
    pub wavelength_nm: f64,
    pub height_m: f64,
    pub offset: Offset,
    pub air: AirModel,
    pub cn2_at_1m: f64,
    pub cn2_exponent: f64,
    pub speed_mps: f64,
    pub shutter_s: f64,
    pub area_width_m: Option<f64>,
    pub area_length_m: Option<f64>,
    pub front_overlap_pct: f64,
    pub side_overlap_pct: f64,
    pub need_m: Option<f64>,
    pub target_m: Option<f64>,
    pub trigger_s: f64,
    pub endurance_min: f64,
    pub turn_s: f64,
    pub photo_mb: f64,
    pub blur_budget_px: f64,
    pub latitude_deg: Option<f64>,
    pub longitude_deg: Option<f64>,
    pub heading_deg: f64,
    pub units: Units,
    /// Keys this version does not know, kept so that a re-shared link loses nothing.
    pub extra: Vec<(String, String)>,
}

/// The accepted range of one numeric key, and the words used to name it.
#[derive(Clone, Copy, Debug)]
pub struct NumberSpec {
    pub key: &'static str,
    pub label: &'static str,
    pub unit: &'static str,
    pub min: f64,
    pub max: f64,
    /// Whole numbers only (pixel counts).
    pub integer: bool,
}

const fn spec(key: &'static str, label: &'static str, unit: &'static str, min: f64, max: f64) -> NumberSpec {
    NumberSpec {
        key,
        label,
        unit,
        min,
        max,
        integer: false,
    }
}

/// Every numeric key of the contract with its label, unit and accepted range.
pub const NUMBER_SPECS: &[NumberSpec] = &[
    spec("sw", "Sensor width", "mm", 0.1, 200.0),
    spec("sh", "Sensor height", "mm", 0.1, 200.0),
    NumberSpec {
        integer: true,
        ..spec("cols", "Image width", "pixels", 16.0, 100_000.0)
    },
    NumberSpec {
        integer: true,
        ..spec("rows", "Image height", "pixels", 16.0, 100_000.0)
    },
    spec("focal", "Focal length", "mm", 0.5, 5000.0),
    spec("fnum", "f-number", "", 0.5, 64.0),
    spec("wl", "Wavelength", "nm", 200.0, 20_000.0),
    spec("h", "Height above the target", "m", 0.1, 20_000.0),
    spec("gd", "Ground distance to the target", "m", 0.0, 100_000.0),
    spec("tilt", "Tilt from straight down", "degrees", 0.0, 85.0),
    spec("cn2", "Cn² at 1 m above the ground", "m^-2/3", 1e-18, 1e-11),
    spec("cexp", "Cn² height exponent", "", -3.0, 0.0),
    spec("speed", "Ground speed", "m/s", 0.0, 150.0),
    spec("shutter", "Exposure time", "s", 1e-6, 10.0),
    spec("aw", "Area width (across the lines)", "m", 1.0, 100_000.0),
    spec("al", "Area length (along the lines)", "m", 1.0, 100_000.0),
    spec("fo", "Front overlap", "%", 0.0, 95.0),
    spec("so", "Side overlap", "%", 0.0, 95.0),
    spec("need", "Required resolution on the ground", "m", 0.0001, 1000.0),
    spec("tdim", "Target critical dimension", "m", 0.01, 10_000.0),
    spec("trig", "Shortest interval between photos", "s", 0.0, 600.0),
    spec("endur", "Usable flight time per battery", "min", 1.0, 600.0),
    spec("turn", "Time per turn between lines", "s", 0.0, 600.0),
    spec("mb", "Size of one photo", "MB", 0.0, 2000.0),
    spec("blur", "Motion-blur budget", "pixels", 0.05, 10.0),
    spec("lat", "Survey origin latitude", "degrees", -89.0, 89.0),
    spec("lon", "Survey origin longitude", "degrees", -180.0, 180.0),
    spec("hdg", "Flight-line heading", "degrees from north", 0.0, 360.0),
];

/// Keys that a scenario must give; a missing one is named and its default used.
pub const REQUIRED_KEYS: &[&str] = &["sw", "sh", "cols", "rows", "focal", "fnum", "h"];

/// Every key of the contract, in the order a query is written.
pub const KEYS: &[&str] = &[
    "v", "name", "sw", "sh", "cols", "rows", "focal", "fnum", "wl", "h", "gd", "tilt", "air", "cn2", "cexp", "speed",
    "shutter", "aw", "al", "fo", "so", "need", "tdim", "trig", "endur", "turn", "mb", "blur", "lat", "lon", "hdg",
    "units",
];

/// The accepted range of a numeric key.
pub fn number_spec(key: &str) -> Option<&'static NumberSpec> {
    NUMBER_SPECS.iter().find(|s| s.key == key)
}

/// Formats a number as the URL writes it: whole numbers without a decimal point, very small or
/// very large ones in exponent form, the rest in the shortest decimal that reads back exactly.
pub fn format_number(x: f64) -> String {
    if !x.is_finite() {
        return "0".to_string();
    }
    let a = x.abs();
    if x.fract() == 0.0 && a < 1e15 {
        format!("{}", x as i64)
    } else if a != 0.0 && !(1e-4..1e15).contains(&a) {
        format!("{x:e}")
    } else {
        format!("{x}")
    }
}

impl NumberSpec {
    /// The accepted range in words, e.g. "from 0.5 to 5000 mm".
    pub fn range_text(&self) -> String {
        let unit = if self.unit.is_empty() {
            String::new()
        } else {
            format!(" {}", self.unit)
        };
        let kind = if self.integer { "a whole number" } else { "a number" };
        format!(
            "{kind} from {} to {}{unit}",
            format_number(self.min),
            format_number(self.max)
        )
    }

    /// Parses and checks one value; the error message names the field and the accepted range.
    pub fn parse(&self, text: &str) -> Result<f64, String> {
        let t = text.trim();
        let value = if self.key == "shutter" {
            parse_fraction(t)
        } else {
            t.parse::<f64>().ok()
        };
        let reason = match value {
            None if t.is_empty() => "is empty".to_string(),
            None => format!("'{}' is not a number", clip(t, 24)),
            Some(v) if !v.is_finite() => format!("'{}' is not a finite number", clip(t, 24)),
            Some(v) if v < self.min || v > self.max => format!("{} is out of range", format_number(v)),
            Some(v) if self.integer && v.fract() != 0.0 => format!("{} is not a whole number", format_number(v)),
            Some(v) => return Ok(v),
        };
        Err(format!("{} {reason}: give {}.", self.label, self.range_text()))
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

/// The first `max` characters of `text`, with an ellipsis when cut.
fn clip(text: &str, max: usize) -> String {
    if text.chars().count() <= max {
        text.to_string()
    } else {
        let head: String = text.chars().take(max).collect();
        format!("{head}…")
    }
}

/// Reads keys one by one, collecting errors, so each key's rules live in one place.
struct Reader<'a> {
    raw: &'a RawScenario,
    errors: Vec<FieldError>,
}

impl Reader<'_> {
    fn error(&mut self, key: &str, message: String) {
        self.errors.push(FieldError {
            key: key.to_string(),
            message,
        });
    }

    /// The checked value of a numeric key, or `None` when absent or rejected (the error is kept).
    fn number(&mut self, key: &'static str) -> Option<f64> {
        let spec = number_spec(key)?;
        let text = self.raw.get(key)?;
        match spec.parse(text) {
            Ok(v) => Some(v),
            Err(message) => {
                self.error(key, message);
                None
            }
        }
    }

    /// A numeric key with a default; a required key that is missing is named.
    fn number_or(&mut self, key: &'static str, default: f64) -> f64 {
        if self.raw.get(key).is_none() && REQUIRED_KEYS.contains(&key) {
            if let Some(spec) = number_spec(key) {
                let message = format!(
                    "{} is missing: give {}; {} is used meanwhile.",
                    spec.label,
                    spec.range_text(),
                    format_number(default)
                );
                self.error(key, message);
            }
        }
        self.number(key).unwrap_or(default)
    }
}

impl Scenario {
    /// Validates raw text into a scenario; every rejected value is named in the returned errors
    /// and replaced by the default's value, so the rest still loads.
    pub fn from_raw(raw: &RawScenario) -> (Scenario, Vec<FieldError>) {
        let d = crate::core::presets::demo::pasture_survey();
        let mut r = Reader {
            raw,
            errors: Vec::new(),
        };

        let mut seen: Vec<&str> = Vec::new();
        let mut extra = Vec::new();
        for (k, v) in &raw.pairs {
            if seen.contains(&k.as_str()) {
                r.error(k, format!("'{k}' is given more than once; the first value is used."));
            } else {
                seen.push(k);
            }
            if !KEYS.contains(&k.as_str()) {
                extra.push((k.clone(), v.clone()));
            }
        }

        if let Some(v) = raw.get("v") {
            if v.trim() != CONTRACT_VERSION.to_string() {
                r.error(
                    "v",
                    format!(
                        "Contract version '{}' is not known: give 1; read as version 1.",
                        clip(v, 12)
                    ),
                );
            }
        }

        let name = match raw.get("name") {
            Some(n) if n.chars().count() > NAME_MAX_CHARS => {
                r.error(
                    "name",
                    format!("Scenario name is longer than {NAME_MAX_CHARS} characters; it was cut."),
                );
                n.chars().take(NAME_MAX_CHARS).collect()
            }
            Some(n) => n.to_string(),
            None => String::new(),
        };

        let sensor_width_mm = r.number_or("sw", d.sensor_width_mm);
        let sensor_height_mm = r.number_or("sh", d.sensor_height_mm);
        let cols = r.number_or("cols", f64::from(d.cols)) as u32;
        let rows = r.number_or("rows", f64::from(d.rows)) as u32;
        let focal_mm = r.number_or("focal", d.focal_mm);
        let f_number = r.number_or("fnum", d.f_number);
        let wavelength_nm = r.number_or("wl", 550.0);
        let height_m = r.number_or("h", d.height_m);

        let gd = r.number("gd");
        let tilt = r.number("tilt");
        let offset = match (gd, tilt, raw.get("gd").is_some() && raw.get("tilt").is_some()) {
            (_, _, true) => {
                r.error(
                    "tilt",
                    "Give either the ground distance (gd) or the tilt, not both; the ground distance is used."
                        .to_string(),
                );
                Offset::GroundDistance(gd.unwrap_or(0.0))
            }
            (Some(g), _, _) => Offset::GroundDistance(g),
            (None, Some(t), _) => Offset::Tilt(t),
            (None, None, _) => Offset::GroundDistance(0.0),
        };

        let air = match raw.get("air") {
            None => AirModel::None,
            Some(word) => AirModel::from_key(word).unwrap_or_else(|| {
                r.error(
                    "air",
                    format!(
                        "Turbulence profile '{}' is not known: give one of none, hv57, slc-day, slc-night, power; none is used.",
                        clip(word, 24)
                    ),
                );
                AirModel::None
            }),
        };
        let cn2_at_1m = r.number_or("cn2", 1e-14);
        let cn2_exponent = r.number_or("cexp", -4.0 / 3.0);

        let speed_mps = r.number_or("speed", 0.0);
        let shutter_s = r.number_or("shutter", 0.001);
        let area_width_m = r.number("aw");
        let area_length_m = r.number("al");
        let front_overlap_pct = r.number_or("fo", 75.0);
        let side_overlap_pct = r.number_or("so", 65.0);
        let need_m = r.number("need");
        let target_m = r.number("tdim");
        let trigger_s = r.number_or("trig", 2.0);
        let endurance_min = r.number_or("endur", 25.0);
        let turn_s = r.number_or("turn", 10.0);
        let photo_mb = r.number_or("mb", 10.0);
        let blur_budget_px = r.number_or("blur", 0.5);
        let latitude_deg = r.number("lat");
        let longitude_deg = r.number("lon");
        let heading_deg = r.number_or("hdg", 0.0);

        let units = match raw.get("units").map(str::trim) {
            None | Some("metric") => Units::Metric,
            Some("imperial") => Units::Imperial,
            Some(other) => {
                r.error(
                    "units",
                    format!(
                        "Display units '{}' are not known: give metric or imperial; metric is used.",
                        clip(other, 24)
                    ),
                );
                Units::Metric
            }
        };

        let scenario = Scenario {
            name,
            sensor_width_mm,
            sensor_height_mm,
            cols,
            rows,
            focal_mm,
            f_number,
            wavelength_nm,
            height_m,
            offset,
            air,
            cn2_at_1m,
            cn2_exponent,
            speed_mps,
            shutter_s,
            area_width_m,
            area_length_m,
            front_overlap_pct,
            side_overlap_pct,
            need_m,
            target_m,
            trigger_s,
            endurance_min,
            turn_s,
            photo_mb,
            blur_budget_px,
            latitude_deg,
            longitude_deg,
            heading_deg,
            units,
            extra,
        };
        (scenario, r.errors)
    }

    /// Reads a URL query; see [`Scenario::from_raw`].
    pub fn from_query(query: &str) -> (Scenario, Vec<FieldError>) {
        Scenario::from_raw(&RawScenario::from_query(query))
    }

    /// The scenario as (key, value) text pairs, in the contract's order, unknown keys last.
    pub fn to_raw(&self) -> RawScenario {
        let mut pairs: Vec<(String, String)> = Vec::new();
        let mut put = |k: &str, v: String| pairs.push((k.to_string(), v));
        let n = format_number;
        put("v", CONTRACT_VERSION.to_string());
        if !self.name.is_empty() {
            put("name", self.name.clone());
        }
        put("sw", n(self.sensor_width_mm));
        put("sh", n(self.sensor_height_mm));
        put("cols", self.cols.to_string());
        put("rows", self.rows.to_string());
        put("focal", n(self.focal_mm));
        put("fnum", n(self.f_number));
        put("wl", n(self.wavelength_nm));
        put("h", n(self.height_m));
        match self.offset {
            Offset::GroundDistance(g) => put("gd", n(g)),
            Offset::Tilt(t) => put("tilt", n(t)),
        }
        put("air", self.air.key().to_string());
        put("cn2", n(self.cn2_at_1m));
        put("cexp", n(self.cn2_exponent));
        put("speed", n(self.speed_mps));
        put("shutter", n(self.shutter_s));
        let optional = [("aw", self.area_width_m), ("al", self.area_length_m)];
        for (k, v) in optional {
            if let Some(v) = v {
                put(k, n(v));
            }
        }
        put("fo", n(self.front_overlap_pct));
        put("so", n(self.side_overlap_pct));
        for (k, v) in [("need", self.need_m), ("tdim", self.target_m)] {
            if let Some(v) = v {
                put(k, n(v));
            }
        }
        put("trig", n(self.trigger_s));
        put("endur", n(self.endurance_min));
        put("turn", n(self.turn_s));
        put("mb", n(self.photo_mb));
        put("blur", n(self.blur_budget_px));
        for (k, v) in [("lat", self.latitude_deg), ("lon", self.longitude_deg)] {
            if let Some(v) = v {
                put(k, n(v));
            }
        }
        put("hdg", n(self.heading_deg));
        put("units", self.units.key().to_string());
        pairs.extend(self.extra.iter().cloned());
        RawScenario { pairs }
    }

    /// The scenario as a URL query.
    pub fn to_query(&self) -> String {
        self.to_raw().to_query()
    }

    /// Pixel pitch in metres (sensor width over columns).
    pub fn pixel_pitch_m(&self) -> f64 {
        self.sensor_width_mm * 1e-3 / f64::from(self.cols.max(1))
    }

    /// The turbulence profile in engine form.
    pub fn profile(&self) -> Profile {
        match self.air {
            AirModel::None => Profile::None,
            AirModel::Hv57 => Profile::HV57,
            AirModel::SlcDay => Profile::SlcDay,
            AirModel::SlcNight => Profile::SlcNight,
            AirModel::Power => Profile::PowerLaw {
                cn2_at_1m: self.cn2_at_1m,
                exponent: self.cn2_exponent,
            },
        }
    }

    /// The viewing geometry in metres.
    pub fn geometry(&self) -> Geometry {
        match self.offset {
            Offset::GroundDistance(g) => Geometry {
                height_m: self.height_m,
                ground_distance_m: g,
            },
            Offset::Tilt(t) => Geometry::tilted(self.height_m, t.to_radians()),
        }
    }

    /// Everything the resolution engine needs, in SI units.
    pub fn setup(&self) -> crate::core::physics::engine::Setup {
        crate::core::physics::engine::Setup {
            sensor_width_m: self.sensor_width_mm * 1e-3,
            sensor_height_m: self.sensor_height_mm * 1e-3,
            cols: self.cols.max(1),
            rows: self.rows.max(1),
            focal_m: self.focal_mm * 1e-3,
            f_number: self.f_number,
            wavelength_m: self.wavelength_nm * 1e-9,
            geometry: self.geometry(),
            profile: self.profile(),
            speed_mps: self.speed_mps,
            exposure_s: self.shutter_s,
        }
    }

    /// The keys this scenario carries that the contract does not know.
    pub fn ignored_keys(&self) -> Vec<String> {
        self.extra.iter().map(|(k, _)| k.clone()).collect()
    }
}
