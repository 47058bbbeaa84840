//! Light for a plan: where the light comes from (typed, or the sun at a date, time and place), the
//! exposure time used (typed, or metered as a camera would), the signal and the contrast SNR that
//! the imaging chain takes; the day's hours when the need is met; and the settings (f-number,
//! exposure, ISO) that resolve the finest detail under this light. Typed results with SI figures;
//! `words` says them.

use crate::core::physics::engine::{evaluate, quality, Evaluation, Limit, Setup};
use crate::core::physics::light::daylight::{daylight, Sky};
use crate::core::physics::light::exposure::{contrast_signal, ev100, metered_exposure_s, ContrastSignal, Sensor, Shot};
use crate::core::physics::light::sun::{
    glint_angle_deg, sun_day, CivilTime, Direction, Place, Spa, SunPosition, Sunlight,
};
use crate::core::planning::solve::{Axis, Need, Reach, Sweep};
use serde::Serialize;

/// Below this elevation of the sun, shadows are long (more than about 3.7 times an object's
/// height) and low relief hides detail: a rule of thumb of aerial photography (common practice).
pub const LOW_SUN_DEG: f64 = 15.0;
/// Within this angle of the sun's mirror direction, water and glass may throw glare into the view
/// (a rule of thumb, common practice).
pub const GLINT_WARN_DEG: f64 = 20.0;
/// The shortest exposure a camera is taken to have (1/8000 s; common practice for mechanical and
/// electronic shutters).
pub const SHORTEST_EXPOSURE_S: f64 = 1.0 / 8000.0;
/// The longest exposure the meter sets (30 s, the usual longest timed setting; common practice).
pub const LONGEST_EXPOSURE_S: f64 = 30.0;
/// The highest ISO the best-settings search tries (common practice: noise makes higher settings of
/// little use for mapping and inspection).
pub const HIGHEST_ISO: f64 = 6400.0;
/// The narrowest aperture the best-settings search tries.
pub const NARROWEST_F_NUMBER: f64 = 16.0;
/// Wavelengths beyond this are thermal: no reflected daylight, no photoelectron model.
pub const REFLECTIVE_BAND_MAX_NM: f64 = 1100.0;

/// Everything light depends on, in the contract's units.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LightInputs {
    /// Local date and time (`when`).
    pub when: Option<CivilTime>,
    /// The place (`lat`, `lon`), degrees.
    pub latitude_deg: Option<f64>,
    pub longitude_deg: Option<f64>,
    /// The sky (`sky`).
    pub sky: Sky,
    /// Illuminance typed in (`lux`), instead of the sun's.
    pub lux: Option<f64>,
    /// Mean scene reflectance the meter sees (`refl`).
    pub reflectance: f64,
    /// Chosen ISO (`iso`).
    pub iso: f64,
    /// Metered exposure (`expmode=auto`) rather than the typed shutter.
    pub auto_exposure: bool,
    /// The typed exposure time, s (`shutter`).
    pub shutter_s: f64,
    /// f-number (`fnum`).
    pub f_number: f64,
    /// Wavelength, nm (`wl`): beyond [`REFLECTIVE_BAND_MAX_NM`] no daylight model applies.
    pub wavelength_nm: f64,
    /// The sensor's full well, read noise and base ISO (typed or generic for the pitch).
    pub sensor: Sensor,
    /// A contrast SNR typed in (`snr`), used instead of the light's.
    pub typed_snr: Option<f64>,
    /// The SNR used when neither is known.
    pub assumed_snr: f64,
    /// The direction the camera looks (for glare): straight down, or tilted along an azimuth.
    pub view: Direction,
    /// The sun at `when` and the place, once it is known ([`LightInputs::with_sun`]).
    pub sun: SunFix,
}

/// What is known of the sun for a plan.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SunFix {
    /// No time and place to place it.
    Unplaced,
    /// A time and place are given, and the sun is being worked out elsewhere (the page's second
    /// module): the light is planned without it until it is told.
    Pending { unix_s: f64, place: Place },
    /// Worked out: the position, or `None` for a time SPA cannot take.
    Placed(Option<SunPosition>),
}

/// Where the illuminance comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum LightSource {
    /// Typed in (`lux`).
    Typed,
    /// The sun and sky at `when`, `lat`, `lon`.
    Sun,
    /// Not known: no light figures; the exposure is the typed one.
    Unknown,
}

/// Where the contrast SNR comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum SnrSource {
    Typed,
    Light,
    Assumed,
}

/// Something about the light a person should know; figures in SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LightNote {
    /// A time was given without a place: the sun is not placed.
    SunNeedsTimeAndPlace,
    /// The sun is being worked out (the page's second module): the light follows in a moment.
    SunPending,
    /// The sun is below the horizon: the daylight model gives no light (twilight is not modelled).
    SunDown { elevation_deg: f64 },
    /// The sun is low: long shadows.
    LowSun { elevation_deg: f64 },
    /// The view is near the sun's mirror direction: glare from water or glass.
    Glare { angle_deg: f64 },
    /// Metering was asked for without any light to meter: the typed exposure is used.
    NothingToMeter,
    /// The meter wanted a shorter exposure than the camera has: the frame is overexposed.
    Overexposed { wanted_s: f64 },
    /// The meter wanted a longer exposure than it sets.
    LongestExposure { wanted_s: f64 },
    /// The target's highlights clip at this ISO and exposure.
    Clipped,
    /// A thermal band: no daylight or photoelectron model; the SNR is typed or assumed.
    Thermal,
}

/// The light of a plan.
#[derive(Clone, Debug, PartialEq)]
pub struct Light {
    pub sun: Option<SunPosition>,
    pub source: LightSource,
    /// Illuminance on the ground, lux (`None` when not known).
    pub illuminance_lx: Option<f64>,
    /// Exposure value at ISO 100 for the scene's reflectance.
    pub ev100: Option<f64>,
    /// The exposure time used, s: metered or typed.
    pub exposure_s: f64,
    /// Whether the exposure was metered.
    pub metered: bool,
    /// The target's and background's electrons and the noise, when the light is known.
    pub signal: Option<ContrastSignal>,
    /// The contrast SNR the chain uses, and where it comes from.
    pub snr: f64,
    pub snr_source: SnrSource,
    pub notes: Vec<LightNote>,
    /// The instant and place whose sun the light waits for (the page asks and plans again).
    pub pending: Option<(f64, Place)>,
}

/// The SNR range the imaging chain accepts (the contract's `snr` range).
const SNR_RANGE: (f64, f64) = (1.0, 1000.0);

impl LightInputs {
    /// The instant of `when` and the place, when both are given.
    fn instant_and_place(&self) -> Option<(f64, Place)> {
        let unix_s = self.when?.unix_s()?;
        Some((
            unix_s,
            Place {
                latitude_deg: self.latitude_deg?,
                longitude_deg: self.longitude_deg?,
                height_m: 0.0,
            },
        ))
    }

    fn thermal(&self) -> bool {
        self.wavelength_nm > REFLECTIVE_BAND_MAX_NM
    }

    /// The same inputs at another instant (for the day's samples), the sun placed by SPA.
    fn at(&self, unix_s: f64) -> LightInputs {
        let offset = self.when.map_or(0, |w| w.offset_minutes);
        LightInputs {
            when: CivilTime::from_unix_s(unix_s, offset),
            ..*self
        }
        .with_sun(&Spa)
    }

    /// The same inputs with the sun at `when` and the place from `sunlight`.
    pub fn with_sun(self, sunlight: &dyn Sunlight) -> LightInputs {
        let sun = match self.instant_and_place() {
            None => SunFix::Unplaced,
            Some((unix_s, place)) => match sunlight.sun_at(unix_s, place) {
                Some(position) => SunFix::Placed(position),
                None => SunFix::Pending { unix_s, place },
            },
        };
        LightInputs { sun, ..self }
    }
}

/// The light of a plan for `inputs`, with the sun placed when a time and place are given.
pub fn plan_light(inputs: &LightInputs) -> Light {
    let mut notes = Vec::new();
    let placed = inputs.instant_and_place();
    // A time without a place asks for a sun that cannot be placed; a place alone (a survey's
    // origin) asks for nothing of the light.
    if placed.is_none() && inputs.when.is_some() && inputs.lux.is_none() {
        notes.push(LightNote::SunNeedsTimeAndPlace);
    }
    let (sun, pending) = match inputs.sun {
        SunFix::Placed(sun) => (sun, None),
        SunFix::Pending { unix_s, place } => {
            notes.push(LightNote::SunPending);
            (None, Some((unix_s, place)))
        }
        SunFix::Unplaced => (None, None),
    };
    let day_of_year = inputs.when.and_then(|w| w.day_of_year()).unwrap_or(172);
    let (source, illuminance_lx) = if inputs.thermal() {
        notes.push(LightNote::Thermal);
        (LightSource::Unknown, None)
    } else if let Some(lux) = inputs.lux {
        (LightSource::Typed, Some(lux))
    } else if let Some(sun) = sun {
        if sun.elevation_deg > 0.0 {
            (
                LightSource::Sun,
                Some(daylight(sun.elevation_deg, inputs.sky, f64::from(day_of_year)).total_lx()),
            )
        } else {
            notes.push(LightNote::SunDown {
                elevation_deg: sun.elevation_deg,
            });
            (LightSource::Unknown, None)
        }
    } else {
        (LightSource::Unknown, None)
    };
    if let Some(sun) = sun.filter(|s| s.elevation_deg > 0.0) {
        if sun.elevation_deg < LOW_SUN_DEG {
            notes.push(LightNote::LowSun {
                elevation_deg: sun.elevation_deg,
            });
        }
        if let Some(angle_deg) = glint_angle_deg(inputs.view, sun).filter(|a| *a < GLINT_WARN_DEG) {
            notes.push(LightNote::Glare { angle_deg });
        }
    }
    let light = illuminance_lx.filter(|e| *e > 0.0);
    let ev = light.and_then(|e| ev100(e, inputs.reflectance));
    let (exposure_s, metered) = match (inputs.auto_exposure, light) {
        (true, Some(e)) => match metered_exposure_s(e, inputs.reflectance, inputs.f_number, inputs.iso) {
            Some(wanted_s) => {
                if wanted_s < SHORTEST_EXPOSURE_S {
                    notes.push(LightNote::Overexposed { wanted_s });
                } else if wanted_s > LONGEST_EXPOSURE_S {
                    notes.push(LightNote::LongestExposure { wanted_s });
                }
                (wanted_s.clamp(SHORTEST_EXPOSURE_S, LONGEST_EXPOSURE_S), true)
            }
            None => (inputs.shutter_s, false),
        },
        (true, None) => {
            notes.push(LightNote::NothingToMeter);
            (inputs.shutter_s, false)
        }
        (false, _) => (inputs.shutter_s, false),
    };
    let signal = light.and_then(|illuminance_lx| {
        contrast_signal(
            &Shot {
                illuminance_lx,
                f_number: inputs.f_number,
                exposure_s,
                iso: inputs.iso,
            },
            &inputs.sensor,
        )
    });
    if signal.is_some_and(|s| s.clipped) {
        notes.push(LightNote::Clipped);
    }
    let (snr, snr_source) = match (inputs.typed_snr, signal) {
        (Some(snr), _) => (snr, SnrSource::Typed),
        (None, Some(s)) => (s.snr.clamp(SNR_RANGE.0, SNR_RANGE.1), SnrSource::Light),
        (None, None) => (inputs.assumed_snr, SnrSource::Assumed),
    };
    Light {
        sun,
        source,
        illuminance_lx,
        ev100: ev,
        exposure_s,
        metered,
        signal,
        snr,
        snr_source,
        notes,
        pending,
    }
}

/// The setup with the exposure time and contrast SNR of `light`.
pub fn lit(setup: &Setup, light: &Light) -> Setup {
    let mut lit = *setup;
    lit.exposure_s = light.exposure_s;
    lit.chain.snr = light.snr;
    lit
}

/// One sample of the day: the sun's elevation and whether the need is met then.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DaySample {
    pub unix_s: f64,
    pub elevation_deg: f64,
    /// The sun is at least [`LOW_SUN_DEG`] high, and the need (when one is given) is met under
    /// its light with these settings.
    pub good: bool,
}

/// The day of `when` at the place: sunrise, noon and sunset, and the hours when it is good to fly.
#[derive(Clone, Debug, PartialEq)]
pub struct Day {
    /// The offset of local time from UTC, minutes (as `when` gives it).
    pub offset_minutes: i32,
    pub sunrise_unix_s: Option<f64>,
    pub sunset_unix_s: Option<f64>,
    pub noon_unix_s: f64,
    pub noon_elevation_deg: f64,
    /// Whether the sun is above the horizon at `when` (the turbulence profile that suits the hour
    /// follows it: a daytime or a night-time one).
    pub sun_up: bool,
    pub samples: Vec<DaySample>,
    /// Spans of consecutive good samples, (start, end) Unix seconds.
    pub windows: Vec<(f64, f64)>,
}

/// Minutes between the day's samples: 20 (73 samples a day, each an evaluation of the chain).
pub const DAY_STEP_S: f64 = 1200.0;

/// The day of `inputs.when` at the place, sampled every [`DAY_STEP_S`]: at each sample the light,
/// the exposure and the SNR follow the sun, and the need is judged on `setup` lit by them. `None`
/// without a time and place.
pub fn plan_day(inputs: &LightInputs, setup: &Setup, need: &Need) -> Option<Day> {
    let when = inputs.when?;
    let (_, place) = inputs.instant_and_place()?;
    let start = when.day_start().unix_s()?;
    let day = sun_day(start, place)?;
    let count = (86_400.0 / DAY_STEP_S) as usize;
    let samples: Vec<DaySample> = (0..=count)
        .filter_map(|i| {
            let unix_s = start + i as f64 * DAY_STEP_S;
            let light = plan_light(&inputs.at(unix_s));
            let elevation_deg = light.sun?.elevation_deg;
            let high = elevation_deg >= LOW_SUN_DEG;
            let good = high && (!need.is_given() || need.meets(&evaluate(&lit(setup, &light))));
            Some(DaySample {
                unix_s,
                elevation_deg,
                good,
            })
        })
        .collect();
    let mut windows: Vec<(f64, f64)> = Vec::new();
    let mut open: Option<f64> = None;
    for s in &samples {
        match (s.good, open) {
            (true, None) => open = Some(s.unix_s),
            (false, Some(from)) => {
                windows.push((from, s.unix_s - DAY_STEP_S));
                open = None;
            }
            _ => {}
        }
    }
    if let (Some(from), Some(last)) = (open, samples.last()) {
        windows.push((from, last.unix_s));
    }
    Some(Day {
        offset_minutes: when.offset_minutes,
        sunrise_unix_s: day.sunrise_unix_s,
        sunset_unix_s: day.sunset_unix_s,
        noon_unix_s: day.noon_unix_s,
        noon_elevation_deg: day.noon_elevation_deg,
        sun_up: plan_light(inputs).sun.is_some_and(|s| s.elevation_deg > 0.0),
        samples,
        windows,
    })
}

/// What moving one setting a step away from the best does.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Trade {
    /// The setting's value one step away.
    pub value: f64,
    /// The detail resolved then (the coarser GRD), m.
    pub resolved_m: f64,
    /// The limit that governs then.
    pub governing: Limit,
    /// The contrast SNR then.
    pub snr: f64,
}

/// The settings that resolve the finest detail under this light at this height and speed.
#[derive(Clone, Debug, PartialEq)]
pub struct BestSettings {
    pub f_number: f64,
    pub exposure_s: f64,
    pub iso: f64,
    /// The detail resolved (the coarser GRD, normal to the view), m, and the NIIRS.
    pub resolved_m: f64,
    pub niirs: f64,
    pub snr: f64,
    pub governing: Limit,
    /// The same figure with the settings as they are, for comparison.
    pub current_resolved_m: f64,
    /// The greatest height (or ground distance) that meets the need with these settings.
    pub reach: Option<Reach>,
    /// The greatest speed that meets the need with these settings, m/s (`None` without a need,
    /// or when no speed does).
    pub max_speed_mps: Option<f64>,
    /// One step wider and narrower, and one step lower and higher in ISO (`None` outside the
    /// ranges searched).
    pub wider: Option<Trade>,
    pub narrower: Option<Trade>,
    pub lower_iso: Option<Trade>,
    pub higher_iso: Option<Trade>,
}

/// Third stops from `from` to `to` (f-numbers: a factor 2^(1/6); ISO: 2^(1/3)).
fn stops(from: f64, to: f64, factor: f64) -> Vec<f64> {
    let mut out = Vec::new();
    let mut v = from;
    while v <= to * 1.0001 && out.len() < 64 {
        out.push(v);
        v *= factor;
    }
    out
}

const F_THIRD: f64 = 1.122_462_048_309_373; // 2^(1/6): a third of a stop in f-number
const ISO_THIRD: f64 = 1.259_921_049_894_873; // 2^(1/3): a third of a stop in ISO

/// The lit setup and its figures for an f-number and ISO, the exposure metered for them.
fn try_settings(inputs: &LightInputs, setup: &Setup, f_number: f64, iso: f64) -> Option<(Setup, Light, Evaluation)> {
    let trial = LightInputs {
        f_number,
        iso,
        auto_exposure: true,
        ..*inputs
    };
    let light = plan_light(&trial);
    // Overexposed at the shortest exposure: not a setting a camera would pick.
    if !light.metered || light.notes.iter().any(|n| matches!(n, LightNote::Overexposed { .. })) {
        return None;
    }
    let mut lit = lit(setup, &light);
    lit.f_number = f_number;
    let e = evaluate(&lit);
    Some((lit, light, e))
}

/// The f-number (from `widest_f_number` to f/16), ISO (base to 6400) and metered exposure, in
/// third stops, that resolve the finest detail normal to the view at this geometry and speed; ties
/// go to the higher SNR. `None` without light to meter, in a thermal band, or when every setting is
/// overexposed. With a need, the greatest height (or ground distance) and speed that still meet it.
pub fn best_settings(
    inputs: &LightInputs,
    setup: &Setup,
    widest_f_number: f64,
    need: &Need,
    axis: Axis,
) -> Option<BestSettings> {
    let light_now = plan_light(inputs);
    light_now.illuminance_lx.filter(|e| *e > 0.0)?;
    let f_numbers = stops(
        widest_f_number.max(0.5),
        NARROWEST_F_NUMBER.max(widest_f_number),
        F_THIRD,
    );
    let isos = stops(
        inputs.sensor.base_iso.max(1.0),
        HIGHEST_ISO.max(inputs.sensor.base_iso),
        ISO_THIRD,
    );
    let mut best: Option<(usize, usize, Setup, Light, Evaluation)> = None;
    for (i, &n) in f_numbers.iter().enumerate() {
        for (j, &iso) in isos.iter().enumerate() {
            let Some((s, light, e)) = try_settings(inputs, setup, n, iso) else {
                continue;
            };
            let better = match &best {
                None => true,
                Some((_, _, _, best_light, best_e)) => {
                    e.resolved_m < best_e.resolved_m * (1.0 - 1e-9)
                        || (e.resolved_m <= best_e.resolved_m * (1.0 + 1e-9) && light.snr > best_light.snr)
                }
            };
            if better {
                best = Some((i, j, s, light, e));
            }
        }
    }
    let (i, j, best_setup, light, e) = best?;
    let trade = |n: Option<&f64>, iso: Option<&f64>, value: Option<&f64>| -> Option<Trade> {
        let (_, l, e) = try_settings(inputs, setup, *n?, *iso?)?;
        Some(Trade {
            value: *value?,
            resolved_m: e.resolved_m,
            governing: e.governing,
            snr: l.snr,
        })
    };
    let wider_n = i.checked_sub(1).and_then(|k| f_numbers.get(k));
    let lower_iso = j.checked_sub(1).and_then(|k| isos.get(k));
    let current = evaluate(&lit(setup, &light_now));
    let (reach, max_speed_mps) = if need.is_given() {
        let sweep = Sweep::new(best_setup, axis);
        (Some(sweep.reach(need)), max_speed(&best_setup, need))
    } else {
        (None, None)
    };
    Some(BestSettings {
        f_number: f_numbers[i],
        exposure_s: light.exposure_s,
        iso: isos[j],
        resolved_m: e.resolved_m,
        niirs: quality(&best_setup, &e).niirs,
        snr: light.snr,
        governing: e.governing,
        current_resolved_m: current.resolved_m,
        reach,
        max_speed_mps,
        wider: trade(wider_n, isos.get(j), wider_n),
        narrower: trade(f_numbers.get(i + 1), isos.get(j), f_numbers.get(i + 1)),
        lower_iso: trade(f_numbers.get(i), lower_iso, lower_iso),
        higher_iso: trade(f_numbers.get(i), isos.get(j + 1), isos.get(j + 1)),
    })
}

/// The greatest ground speed (up to 150 m/s, the contract's range) at which `setup` still meets
/// `need`, by bisection to 1 mm/s: the smear grows with speed, so meeting it is monotone.
fn max_speed(setup: &Setup, need: &Need) -> Option<f64> {
    let meets = |v: f64| need.meets(&evaluate(&Setup { speed_mps: v, ..*setup }));
    if !meets(0.0) {
        return None;
    }
    let (mut lo, mut hi) = (0.0_f64, 150.0_f64);
    if meets(hi) {
        return Some(hi);
    }
    while hi - lo > 1e-3 {
        let mid = 0.5 * (lo + hi);
        if meets(mid) {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Some(lo)
}
