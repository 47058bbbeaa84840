//! The scenario: the whole set of inputs, as the public contract defines it
//! (`shared/reference/url-and-report.md`, version 1).
//!
//! Text comes in leniently as a [`RawScenario`] (key, value) list — from a URL query, a form or a
//! saved file — and is validated once by [`Scenario::from_raw`] into typed values in the
//! contract's units, with one [`FieldError`] per rejected value naming the key and the accepted
//! range. A bad value never stops the rest from loading: its default is used and the error says so.
//! Both directions are loops over the table of inputs ([`crate::core::contract::inputs::INPUTS`]),
//! which also holds the contract's defaults. [`Scenario::setup`] then converts to SI for the engine.

use crate::core::contract::inputs::INPUTS;
use crate::core::physics::chain::{ChainInputs, DEFAULT_SNR};
use crate::core::physics::earth::STANDARD_REFRACTION_K;
use crate::core::physics::engine::Setup;
use crate::core::physics::geometry::Geometry;
use crate::core::physics::light::daylight::Sky;
use crate::core::physics::light::exposure::Sensor;
use crate::core::physics::light::sun::{CivilTime, Direction};
use crate::core::physics::light::sun::{Spa, Sunlight};
use crate::core::physics::target::CdModel;
use crate::core::physics::turbulence::Profile;
use crate::core::planning::field::FieldLayout;
use crate::core::planning::light::{lit, plan_light, Light, LightInputs, SunFix};
use crate::core::planning::solve::{Axis, Need, TargetPlane};
use crate::core::planning::survey::{SurveyInputs, SurveyPlan, SurveySettings};
use crate::core::words::units::Units;
use serde::Serialize;

/// Version of the URL and report contract that this code writes.
pub(crate) const CONTRACT_VERSION: u32 = 1;

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

impl Default for Offset {
    /// Straight down.
    fn default() -> Offset {
        Offset::GroundDistance(0.0)
    }
}

/// The turbulence profile named by `air`.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum AirModel {
    #[default]
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

    /// The contract's words, in [`AirModel::ALL`] order.
    pub(crate) const WORDS: [&'static str; 5] = ["none", "hv57", "slc-day", "slc-night", "power"];

    /// The contract's word for the model.
    pub fn key(self) -> &'static str {
        AirModel::WORDS[self as usize]
    }
}

/// A validated scenario, in the contract's units (mm, nm, %, degrees, as the URL writes them), so
/// that writing it to a query and reading it back gives exactly the same values.
///
/// `Scenario::default()` is the blank that the table of inputs fills in (zeros); the contract's
/// defaults, what an empty link reads as, are [`Scenario::contract_defaults`].
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Scenario {
    pub name: String,
    /// The survey boundary as the `field` key writes it (`lon lat,…`; see
    /// `formats::boundary`), empty without one. Read and planned off the page's first load.
    pub field: String,
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
    /// The camera's turning rate during the exposure, °/s (`rate`).
    pub turn_rate_deg_s: f64,
    /// The target's own speed across the view (`tspeed`).
    pub target_speed_mps: f64,
    /// The target's height above its ground, m (`tht`; 0 when not given).
    pub target_height_m: Option<f64>,
    /// The refraction factor of the Earth's radius (`refk`; 4/3, standard air, when not given).
    pub earth_k: Option<f64>,
    pub shutter_s: f64,
    /// Central obscuration ratio of the lens (`obsc`).
    pub obscuration: f64,
    /// rms wavefront error, waves (`wfe`).
    pub wfe_waves: f64,
    /// Pixel fill factor (`fill`).
    pub fill: f64,
    /// rms line-of-sight jitter during the exposure, µrad (`jitter`).
    pub jitter_urad: f64,
    /// Contrast SNR typed in (`snr`); without it the light's, or the assumed one.
    pub snr: Option<f64>,
    pub need_m: Option<f64>,
    /// A required GSD on the target's plane (`needgsd`).
    pub need_gsd_m: Option<f64>,
    /// The plane the target lies in (`tplane`); `None` follows the view.
    pub target_plane: Option<TargetPlane>,
    pub target_m: Option<f64>,
    /// How the target's critical dimension is taken (`cdm`).
    pub cd_model: CdModel,
    /// The survey keys.
    pub survey: SurveySettings,
    /// Local date and time (`when`), for the sun at `lat`, `lon`.
    pub when: Option<CivilTime>,
    /// The sky (`sky`).
    pub sky: Sky,
    /// Illuminance on the ground typed in, lux (`lux`).
    pub lux: Option<f64>,
    /// Mean scene reflectance (`refl`).
    pub reflectance: f64,
    /// Metered exposure (`expmode=auto`) instead of the typed `shutter`.
    pub auto_exposure: bool,
    /// Chosen ISO (`iso`) and the sensor's base ISO (`baseiso`; generic when left out).
    pub iso: f64,
    pub base_iso: Option<f64>,
    /// Full well and read noise, electrons (`fw`, `rn`; generic for the pitch when left out).
    pub full_well_e: Option<f64>,
    pub read_noise_e: Option<f64>,
    /// The lens's widest aperture, f-number (`fmin`; the typed f-number when left out).
    pub widest_f_number: Option<f64>,
    pub units: Units,
    /// Keys this version does not know, kept so that a re-shared link loses nothing.
    pub extra: Vec<(String, String)>,
}

impl Scenario {
    /// The contract's defaults: what a link without any key reads as. Demos start from these.
    pub fn contract_defaults() -> Scenario {
        let mut scenario = Scenario::default();
        for input in INPUTS {
            input.apply_default(&mut scenario);
        }
        scenario
    }

    /// Validates raw text into a scenario; every rejected value is named in the returned errors
    /// and replaced by the default's value, so the rest still loads.
    pub fn from_raw(raw: &RawScenario) -> (Scenario, Vec<FieldError>) {
        let mut scenario = Scenario::contract_defaults();
        let mut errors = Vec::new();
        let mut error = |key: &str, message: String| {
            errors.push(FieldError {
                key: key.to_string(),
                message,
            })
        };

        let mut seen: Vec<&str> = Vec::new();
        for (k, v) in &raw.pairs {
            if seen.contains(&k.as_str()) {
                error(k, format!("'{k}' is given more than once; the first value is used."));
            } else {
                seen.push(k);
            }
            if crate::core::contract::inputs::input(k).is_none() {
                scenario.extra.push((k.clone(), v.clone()));
            }
        }

        for input in INPUTS {
            input.read(raw, &mut scenario, &mut error);
        }
        (scenario, errors)
    }

    /// Reads a URL query; see [`Scenario::from_raw`].
    pub fn from_query(query: &str) -> (Scenario, Vec<FieldError>) {
        Scenario::from_raw(&RawScenario::from_query(query))
    }

    /// The scenario as (key, value) text pairs, in the contract's order, unknown keys last.
    pub fn to_raw(&self) -> RawScenario {
        let mut pairs: Vec<(String, String)> = INPUTS
            .iter()
            .filter_map(|input| input.write(self).map(|v| (input.key.to_string(), v)))
            .collect();
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

    /// The viewing geometry in metres, over the round Earth.
    pub fn geometry(&self) -> Geometry {
        let target_height_m = self.target_height_m.unwrap_or(0.0);
        let earth_k = self.earth_k.unwrap_or(STANDARD_REFRACTION_K);
        match self.offset {
            Offset::GroundDistance(g) => Geometry {
                height_m: self.height_m,
                ground_distance_m: g,
                target_height_m,
                earth_k,
            },
            Offset::Tilt(t) => Geometry::tilted_over(self.height_m, t.to_radians(), target_height_m, earth_k),
        }
    }

    /// Everything the resolution engine needs, in SI units, lit: the exposure time and the
    /// contrast SNR follow the light ([`Scenario::light`]).
    pub fn setup(&self) -> Setup {
        lit(&self.unlit_setup(), &self.light())
    }

    /// The sensor's charge and noise: as typed, or generic for the pixel pitch (from memory).
    pub fn sensor(&self) -> Sensor {
        let generic = Sensor::generic(self.pixel_pitch_m()).unwrap_or(Sensor {
            full_well_e: 10_000.0,
            read_noise_e: 3.0,
            base_iso: 100.0,
        });
        Sensor {
            full_well_e: self.full_well_e.unwrap_or(generic.full_well_e),
            read_noise_e: self.read_noise_e.unwrap_or(generic.read_noise_e),
            base_iso: self.base_iso.unwrap_or(generic.base_iso),
        }
    }

    /// What the light depends on, the sun placed by NREL's SPA.
    pub fn light_inputs(&self) -> LightInputs {
        self.light_inputs_with(&Spa)
    }

    /// What the light depends on, the sun from `sunlight`.
    pub fn light_inputs_with(&self, sunlight: &dyn Sunlight) -> LightInputs {
        let view = match self.offset {
            Offset::GroundDistance(g) if g <= 0.0 => Direction {
                azimuth_deg: 0.0,
                elevation_deg: -90.0,
            },
            _ => Direction {
                azimuth_deg: self.survey.heading_deg,
                elevation_deg: -(90.0 - self.geometry().look_angle_rad().to_degrees()),
            },
        };
        LightInputs {
            when: self.when,
            latitude_deg: self.survey.latitude_deg,
            longitude_deg: self.survey.longitude_deg,
            sky: self.sky,
            lux: self.lux,
            reflectance: self.reflectance,
            iso: self.iso,
            auto_exposure: self.auto_exposure,
            shutter_s: self.shutter_s,
            f_number: self.f_number,
            wavelength_nm: self.wavelength_nm,
            sensor: self.sensor(),
            typed_snr: self.snr,
            assumed_snr: DEFAULT_SNR,
            view,
            sun: SunFix::Unplaced,
        }
        .with_sun(sunlight)
    }

    /// The light: the sun (by NREL's SPA), the illuminance, the exposure time used and the SNR.
    pub fn light(&self) -> Light {
        self.light_with(&Spa)
    }

    /// The light with the sun from `sunlight`.
    pub fn light_with(&self, sunlight: &dyn Sunlight) -> Light {
        plan_light(&self.light_inputs_with(sunlight))
    }

    /// The speed over the ground whose smear the engine counts: the planned speed in still air;
    /// in a wind, the ground speed on the faster leg of the survey lines (the worst smear), or the
    /// planned speed when the lines cannot be flown in that wind (the survey says why).
    pub fn ground_speed_mps(&self) -> f64 {
        match self.survey.wind_on_lines(self.speed_mps) {
            Some(Ok(w)) => w.fastest_ground_speed_mps(),
            _ => self.speed_mps,
        }
    }

    /// What the boundary's plan takes from this scenario and its survey `plan`: the survey's
    /// footprint, base, spacing and speed, and the scenario's heading and time settings.
    pub fn field_layout(&self, plan: &SurveyPlan) -> FieldLayout {
        let s = &self.survey;
        FieldLayout::of(plan, s.heading_deg, s.turn_s, s.endurance_min, s.photo_mb)
    }

    /// The engine's setup with the typed exposure time and the assumed or typed SNR.
    pub fn unlit_setup(&self) -> Setup {
        Setup {
            sensor_width_m: self.sensor_width_mm * 1e-3,
            sensor_height_m: self.sensor_height_mm * 1e-3,
            cols: self.cols.max(1),
            rows: self.rows.max(1),
            focal_m: self.focal_mm * 1e-3,
            f_number: self.f_number,
            wavelength_m: self.wavelength_nm * 1e-9,
            geometry: self.geometry(),
            profile: self.profile(),
            speed_mps: self.ground_speed_mps(),
            exposure_s: self.shutter_s,
            turn_rate_rad_s: self.turn_rate_deg_s.to_radians(),
            target_speed_mps: self.target_speed_mps,
            chain: ChainInputs {
                obscuration: self.obscuration,
                wfe_waves: self.wfe_waves,
                fill: self.fill,
                jitter_rad: self.jitter_urad * 1e-6,
                snr: self.snr.unwrap_or(DEFAULT_SNR),
            },
        }
    }

    /// The axis the backward solves use: a fixed camera looking across at a target some distance
    /// off solves for ground distance; a camera looking down or tilted solves for height.
    pub fn solve_axis(&self) -> Axis {
        match self.offset {
            Offset::GroundDistance(g) if g > 0.0 => Axis::GroundDistance,
            _ => Axis::Height,
        }
    }

    /// The plane the target lies in: as given, or the ground when the camera is in the air (looking
    /// down or tilted) and upright for a fixed camera looking across (resolution-model §5).
    pub fn target_plane(&self) -> TargetPlane {
        self.target_plane.unwrap_or(match self.solve_axis() {
            Axis::Height => TargetPlane::Ground,
            Axis::GroundDistance => TargetPlane::Upright,
        })
    }

    /// What the images must show, on the target's plane.
    pub fn need(&self) -> Need {
        Need {
            detail_m: self.need_m,
            gsd_m: self.need_gsd_m,
            plane: self.target_plane(),
        }
    }

    /// What the survey is planned from; `gsd_m` is the GSD at the target, for the blur limit, and
    /// `exposure_s` the exposure time used (typed or metered).
    pub fn survey_inputs(&self, gsd_m: f64, exposure_s: f64) -> SurveyInputs {
        let looks_down = match self.offset {
            Offset::GroundDistance(g) => g <= 0.0,
            Offset::Tilt(t) => t <= 0.0,
        };
        SurveyInputs {
            sensor_width_mm: self.sensor_width_mm,
            sensor_height_mm: self.sensor_height_mm,
            focal_mm: self.focal_mm,
            height_m: self.height_m,
            looks_down,
            gsd_m,
            speed_mps: self.speed_mps,
            shutter_s: exposure_s,
            settings: self.survey,
        }
    }

    /// What the survey is planned from, from the scenario alone (the export module and tests).
    pub fn planned_survey_inputs(&self) -> SurveyInputs {
        let light = self.light();
        let gsd_m = crate::core::physics::engine::evaluate(&lit(&self.unlit_setup(), &light)).gsd_m;
        self.survey_inputs(gsd_m, light.exposure_s)
    }

    /// The keys this scenario carries that the contract does not know.
    pub(crate) fn ignored_keys(&self) -> Vec<String> {
        self.extra.iter().map(|(k, _)| k.clone()).collect()
    }
}
