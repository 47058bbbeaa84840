//! Exposure and signal: what a reflected-light meter sets (ISO 2720), the exposure on the focal
//! plane (ISO 12232), the photoelectrons of a 15 % target and a 7 % background, their noise and
//! the contrast SNR that the imaging chain and GIQE 5 take (resolution-model §5.1, §9).

use std::f64::consts::PI;

/// Reflected-light meter calibration constant K (ISO 2720; 12.5 is the usual value).
pub const METER_K: f64 = 12.5;
/// Lens transmission and vignetting factor q in H = q·L·t/N² (ISO 12232, q = 0.65).
pub const LENS_Q: f64 = 0.65;
/// Saturation-based speed constant: S_sat = 78/H_sat with H_sat in lx·s (ISO 12232).
pub const SATURATION_SPEED_CONSTANT: f64 = 78.0;
/// Reflectance of the GIQE 5 target (NGA, GIQE 5.0, 2015).
pub const TARGET_REFLECTANCE: f64 = 0.15;
/// Reflectance of the GIQE 5 background (NGA, GIQE 5.0, 2015).
pub const BACKGROUND_REFLECTANCE: f64 = 0.07;
/// The ISO speed of the exposure value EV100.
const ISO_100: f64 = 100.0;

/// A positive finite number, or `None`.
fn positive(x: f64) -> Option<f64> {
    (x.is_finite() && x > 0.0).then_some(x)
}

/// A finite result, or `None`.
fn finite(x: f64) -> Option<f64> {
    x.is_finite().then_some(x)
}

/// Luminance of a matte (Lambertian) surface of `reflectance` under `illuminance_lx`, cd/m²:
/// L = ρ·E/π (resolution-model §9; any photometry text). Reflectance is held within 0–1 and a
/// negative or non-finite input gives 0.
pub fn scene_luminance_cd_m2(illuminance_lx: f64, reflectance: f64) -> f64 {
    let e = if illuminance_lx.is_finite() {
        illuminance_lx.clamp(0.0, f64::MAX)
    } else {
        0.0
    };
    let rho = if reflectance.is_finite() {
        reflectance.clamp(0.0, 1.0)
    } else {
        0.0
    };
    rho * e / PI
}

/// The exposure time in seconds a reflected-light meter sets for a scene of mean `reflectance`
/// under `illuminance_lx`, at `f_number` and ISO `iso`: N²/t = L·S/K with K = 12.5 (ISO 2720).
/// `None` without light or with an input that is not a positive finite number.
pub fn metered_exposure_s(illuminance_lx: f64, reflectance: f64, f_number: f64, iso: f64) -> Option<f64> {
    let luminance = positive(scene_luminance_cd_m2(illuminance_lx, reflectance))?;
    let (n, s) = (positive(f_number)?, positive(iso)?);
    positive(n * n * METER_K / (luminance * s))
}

/// Exposure value EV = log2(N²/t) (ISO 2720, APEX); `None` unless both are positive and finite.
pub fn exposure_value(f_number: f64, exposure_s: f64) -> Option<f64> {
    let (n, t) = (positive(f_number)?, positive(exposure_s)?);
    finite((n * n / t).log2())
}

/// The exposure value at ISO 100 that a reflected-light meter gives for a scene of mean
/// `reflectance` under `illuminance_lx`: EV100 = log2(L·100/K) (ISO 2720); `None` without light.
pub fn ev100(illuminance_lx: f64, reflectance: f64) -> Option<f64> {
    let luminance = positive(scene_luminance_cd_m2(illuminance_lx, reflectance))?;
    finite((luminance * ISO_100 / METER_K).log2())
}

/// How the exposure time is chosen (the contract's `expmode`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ExposureMode {
    /// The typed shutter time, seconds.
    Set(f64),
    /// Metered (ISO 2720) for the scene at the chosen f-number and ISO.
    Auto,
}

/// The exposure time in seconds for `mode`: the typed one, or the metered one
/// ([`metered_exposure_s`]); `None` when it is not a positive finite number.
pub fn exposure_time_s(
    mode: ExposureMode,
    illuminance_lx: f64,
    reflectance: f64,
    f_number: f64,
    iso: f64,
) -> Option<f64> {
    match mode {
        ExposureMode::Set(t) => positive(t),
        ExposureMode::Auto => metered_exposure_s(illuminance_lx, reflectance, f_number, iso),
    }
}

/// Photometric exposure on the focal plane, lx·s, for a scene `luminance_cd_m2` held for
/// `exposure_s` at `f_number`: H = q·L·t/N² with q = 0.65 (ISO 12232; on axis, a distant scene).
/// 0 when an input is not a positive finite number.
pub fn focal_plane_exposure_lx_s(luminance_cd_m2: f64, f_number: f64, exposure_s: f64) -> f64 {
    match (positive(luminance_cd_m2), positive(f_number), positive(exposure_s)) {
        (Some(l), Some(n), Some(t)) => finite(LENS_Q * l * t / (n * n)).unwrap_or(0.0),
        _ => 0.0,
    }
}

/// A sensor's charge and noise (the contract's `fw`, `rn`, `baseiso`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Sensor {
    /// Full-well capacity, electrons.
    pub full_well_e: f64,
    /// Read noise, electrons rms (taken as the same at every ISO).
    pub read_noise_e: f64,
    /// Base ISO: the saturation-based speed at which the full well is just reached.
    pub base_iso: f64,
}

/// Full-well density of a generic CMOS sensor, electrons per µm² of pixel (from memory: makers'
/// figures run from about 1500 to 3000 e⁻/µm²).
pub const GENERIC_FULL_WELL_E_PER_UM2: f64 = 2000.0;
/// Read noise of a generic CMOS sensor at base ISO, electrons rms (from memory: about 1.5–5 e⁻).
pub const GENERIC_READ_NOISE_E: f64 = 3.0;
/// Base ISO of a generic sensor (from memory: 100 for most, 64–200 for some).
pub const GENERIC_BASE_ISO: f64 = 100.0;

impl Sensor {
    /// Generic figures for a pixel pitch in metres (from memory; make them editable): full well
    /// 2000 e⁻/µm² of pixel area, read noise 3 e⁻, base ISO 100. For the usual formats this gives
    /// about 4800 e⁻ (1/2.3-type 12 MP, 1.54 µm), 12 000 e⁻ (1-type 20 MP, 2.41 µm), 22 000 e⁻
    /// (4/3-type 20 MP, 3.34 µm), 31 000 e⁻ (APS-C 24 MP, 3.92 µm) and 38 000 e⁻ (full frame
    /// 45 MP, 4.38 µm). Not for thermal cores, which count no photoelectrons. `None` unless the
    /// pitch is positive and finite; it is held within 0.5–50 µm.
    pub fn generic(pixel_pitch_m: f64) -> Option<Sensor> {
        let pitch_um = (positive(pixel_pitch_m)? * 1e6).clamp(0.5, 50.0);
        Some(Sensor {
            full_well_e: GENERIC_FULL_WELL_E_PER_UM2 * pitch_um * pitch_um,
            read_noise_e: GENERIC_READ_NOISE_E,
            base_iso: GENERIC_BASE_ISO,
        })
    }

    /// The sensor if every figure is usable: full well and base ISO positive and finite, read
    /// noise finite and not negative.
    fn checked(&self) -> Option<Sensor> {
        positive(self.full_well_e)?;
        positive(self.base_iso)?;
        (self.read_noise_e.is_finite() && self.read_noise_e >= 0.0).then_some(*self)
    }

    /// Most electrons a pixel records at ISO `iso`: the full well at base ISO and below, and
    /// full_well·S0/S above it, where the gain makes the output clip at H_sat = 78/S (ISO 12232).
    pub fn clip_e(&self, iso: f64) -> f64 {
        match (self.checked(), positive(iso)) {
            (Some(s), Some(iso)) => s.full_well_e * (s.base_iso / iso).min(1.0),
            _ => 0.0,
        }
    }

    /// Photoelectrons collected for a focal-plane exposure `exposure_lx_s` and recorded at ISO
    /// `iso`: full_well·H·S0/78, since the full well is reached at H_sat = 78/S0 at base ISO S0
    /// (ISO 12232 saturation-based speed). The charge depends on the light alone; the ISO only
    /// sets where the output clips ([`Sensor::clip_e`]). 0 for an unusable input.
    pub fn electrons(&self, exposure_lx_s: f64, iso: f64) -> f64 {
        let Some(s) = self.checked() else {
            return 0.0;
        };
        let Some(h) = positive(exposure_lx_s) else {
            return 0.0;
        };
        let collected = s.full_well_e * h * s.base_iso / SATURATION_SPEED_CONSTANT;
        finite(collected).unwrap_or(f64::MAX).min(self.clip_e(iso))
    }
}

/// One frame's settings and light.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Shot {
    /// Illuminance on the scene, lux.
    pub illuminance_lx: f64,
    /// f-number N.
    pub f_number: f64,
    /// Exposure time, seconds.
    pub exposure_s: f64,
    /// Chosen ISO speed.
    pub iso: f64,
}

/// The GIQE contrast signal of a frame, electrons.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ContrastSignal {
    /// Electrons from the 15 % target.
    pub target_e: f64,
    /// Electrons from the 7 % background.
    pub background_e: f64,
    /// Noise, electrons rms: √(n̄ + σ_read²) at the mean n̄ of the two signals.
    pub noise_e: f64,
    /// Contrast SNR = (target − background)/noise; 0 without light.
    pub snr: f64,
    /// Whether the target clipped (the frame is overexposed for it).
    pub clipped: bool,
}

/// The contrast SNR of a frame as GIQE 5 uses it (NGA 2015; IBSM radiometry): the electrons of a
/// 15 % target minus those of a 7 % background, both matte under `shot.illuminance_lx`, over the
/// noise: photon shot noise √n and read noise added in quadrature at the mean of the two signals
/// (the definition as recalled from GIQE 4/5 and the IBSM, from memory; some texts take the noise
/// at the background). Electrons come from [`Sensor::electrons`]. `None` when the f-number, time,
/// ISO or sensor is unusable; no light gives an SNR of 0.
pub fn contrast_signal(shot: &Shot, sensor: &Sensor) -> Option<ContrastSignal> {
    let sensor = sensor.checked()?;
    let (n, t, iso) = (
        positive(shot.f_number)?,
        positive(shot.exposure_s)?,
        positive(shot.iso)?,
    );
    let electrons = |reflectance: f64| {
        let luminance = scene_luminance_cd_m2(shot.illuminance_lx, reflectance);
        sensor.electrons(focal_plane_exposure_lx_s(luminance, n, t), iso)
    };
    let (target_e, background_e) = (electrons(TARGET_REFLECTANCE), electrons(BACKGROUND_REFLECTANCE));
    let mean_e = 0.5 * target_e + 0.5 * background_e;
    let noise_e = mean_e.sqrt().hypot(sensor.read_noise_e);
    let snr = if noise_e > 0.0 {
        finite((target_e - background_e) / noise_e).unwrap_or(0.0)
    } else {
        0.0
    };
    Some(ContrastSignal {
        target_e,
        background_e,
        noise_e: finite(noise_e).unwrap_or(0.0),
        snr,
        clipped: target_e >= sensor.clip_e(iso),
    })
}
