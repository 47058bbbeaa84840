//! The resolution engine: the four limits on the smallest detail at the target, and which governs.
//!
//! Formulas and sources: `shared/reference/resolution-model.md` §1–§5. Every figure is a distance
//! at the target in the plane normal to the line of sight, so the four compare as they are; the
//! ground-plane stretch of the sampling figure for oblique views is reported beside them.

use crate::core::physics::chain::{self, ChainInputs, Direction, Quality, SystemMtf};
use crate::core::physics::geometry::{Geometry, View};
use crate::core::physics::optics;
use crate::core::physics::turbulence::{self, Exposure, Profile};
use serde::Serialize;

/// Everything the engine needs, in SI units.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Setup {
    pub sensor_width_m: f64,
    pub sensor_height_m: f64,
    pub cols: u32,
    pub rows: u32,
    pub focal_m: f64,
    pub f_number: f64,
    pub wavelength_m: f64,
    pub geometry: Geometry,
    pub profile: Profile,
    /// Ground speed of the camera.
    pub speed_mps: f64,
    pub exposure_s: f64,
    /// The camera's turning rate during the exposure (gimbal slew, mast sway), rad/s.
    pub turn_rate_rad_s: f64,
    /// The target's own speed across the view.
    pub target_speed_mps: f64,
    /// The lens, pixel, jitter and SNR terms of the imaging chain.
    pub chain: ChainInputs,
}

impl Setup {
    /// Pixel pitch p = sensor width / columns.
    pub fn pixel_pitch_m(&self) -> f64 {
        self.sensor_width_m / f64::from(self.cols.max(1))
    }

    /// The same setup seen from another place.
    pub fn with_geometry(&self, geometry: Geometry) -> Setup {
        Setup { geometry, ..*self }
    }
}

/// One of the four things that can limit the detail an image shows.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Limit {
    Sampling,
    Diffraction,
    Turbulence,
    Motion,
}

impl Limit {
    /// All four, in the order they are shown.
    pub const ALL: [Limit; 4] = [Limit::Sampling, Limit::Diffraction, Limit::Turbulence, Limit::Motion];

    /// The report's word for the limit.
    pub fn key(self) -> &'static str {
        match self {
            Limit::Sampling => "sampling",
            Limit::Diffraction => "diffraction",
            Limit::Turbulence => "turbulence",
            Limit::Motion => "motion",
        }
    }
}

/// The four limits as distances at the target (m).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Limits {
    pub sampling: f64,
    pub diffraction: f64,
    pub turbulence: f64,
    pub motion: f64,
}

impl Limits {
    /// The value of one limit.
    pub fn get(&self, limit: Limit) -> f64 {
        match limit {
            Limit::Sampling => self.sampling,
            Limit::Diffraction => self.diffraction,
            Limit::Turbulence => self.turbulence,
            Limit::Motion => self.motion,
        }
    }

    /// The limits ordered from the largest (governing) down; ties keep the display order.
    pub fn ranked(&self) -> [Limit; 4] {
        let mut order = Limit::ALL;
        super::sort_short(&mut order, |a, b| self.get(*a) > self.get(*b));
        order
    }

    /// The governing limit and its value.
    pub fn governing(&self) -> (Limit, f64) {
        let top = self.ranked()[0];
        (top, self.get(top))
    }
}

/// What the engine finds for one setup.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Evaluation {
    pub pitch_m: f64,
    pub aperture_m: f64,
    pub slant_range_m: f64,
    pub look_angle_deg: f64,
    /// The line of sight's angle from the target's vertical (90° − its elevation there): the look
    /// angle on a flat Earth, larger by the angle of Earth between camera and target on a round
    /// one. Ground-plane figures stretch by its secant.
    pub incidence_deg: f64,
    /// Whether the target is above the horizon.
    pub visible: bool,
    /// Normal-plane GSD p·R/f (GIQE 5.0 §2.3).
    pub gsd_m: f64,
    /// Ground-plane GSD along the look direction, GSD/cos θ (GIQE 5.0).
    pub gsd_ground_m: f64,
    /// Geometric-mean ground GSD, GSD/√(sin ε) (GIQE 5.0).
    pub gsd_geomean_m: f64,
    /// GIQE-5 weighted GSD, GSD/(sin ε)^(1/4) (GIQE 5.0 eq. 5).
    pub gsd_weighted_m: f64,
    pub rayleigh_rad: f64,
    pub r0_m: Option<f64>,
    pub seeing_rad: f64,
    pub motion_px: f64,
    pub limits: Limits,
    pub governing: Limit,
    pub limit_m: f64,
    /// The next largest limit and how many times the governing one exceeds it (≥ 1).
    pub runner_up: Limit,
    pub margin: f64,
    /// Sampling ratio Q = λN/p.
    pub q: f64,
    /// Whether the frame freezes the turbulence (short exposure) or averages it (long).
    pub short_exposure: bool,
    /// Ground resolved distance, the geometric mean of the two below (resolution-model §5.1).
    pub grd_m: f64,
    /// GRD along the motion and across it: the period R/ξ at which the system MTF first falls to
    /// 3/SNR, never less than 2·GSD (IBSM Eq. 3-54).
    pub grd_along_m: f64,
    pub grd_across_m: f64,
    /// The detail resolved in every direction, the larger of the two: what needs and target
    /// cycles are judged by, so that a smear is never hidden by the sharper direction.
    pub resolved_m: f64,
    /// The system transfer function, for the edge response.
    pub system: SystemMtf,
}

/// FWHM of a Gaussian in units of its σ, 2·√(2 ln 2).
const GAUSSIAN_FWHM: f64 = 2.354_820_045_030_949;

/// A number that is finite and not negative, or zero.
fn finite(x: f64) -> f64 {
    if x.is_finite() && x > 0.0 {
        x
    } else {
        0.0
    }
}

/// Evaluates the four limits for a setup. Never panics; every figure is finite.
pub fn evaluate(setup: &Setup) -> Evaluation {
    let view = setup.geometry.view();
    let r0 = turbulence::spherical_wave_r0(&setup.profile, view.path, setup.wavelength_m);
    evaluate_in(setup, &view, r0)
}

/// [`evaluate`] with the path's Fried parameter already known: for solves that change only the
/// lens, which leaves the air path (and so r0, the costly path integral) as it is.
pub fn evaluate_through(setup: &Setup, r0: Option<f64>) -> Evaluation {
    evaluate_in(setup, &setup.geometry.view(), r0)
}

/// [`evaluate_through`] with the geometry's view already worked out.
fn evaluate_in(setup: &Setup, view: &View, r0: Option<f64>) -> Evaluation {
    let pitch = finite(setup.pixel_pitch_m());
    let aperture = finite(optics::aperture_diameter(setup.focal_m, setup.f_number));
    let range = finite(view.slant_range_m);
    let look = view.look_angle_rad;
    let look = if look.is_finite() { look } else { 0.0 };
    let elevation = view.elevation_rad;
    let elevation = if elevation.is_finite() {
        elevation.max(1e-6)
    } else {
        1e-6
    };

    let gsd = if setup.focal_m > 0.0 {
        finite(pitch * range / setup.focal_m)
    } else {
        0.0
    };
    let sin_elev = elevation.sin().max(1e-6);

    let rayleigh = finite(optics::rayleigh_angle(setup.wavelength_m, aperture));
    let exposure = Exposure::choose(r0, setup.exposure_s, aperture, setup.wavelength_m, range);
    let seeing = finite(turbulence::seeing_angle(setup.wavelength_m, r0));
    // Smear on the target during the exposure (resolution-model §4): the camera's ground speed, the
    // target's own speed and the camera's turning rate ω·R, taken as adding up (the worst case).
    let smear = finite(
        (finite(setup.speed_mps) + finite(setup.target_speed_mps) + finite(setup.turn_rate_rad_s) * range)
            * setup.exposure_s,
    );
    let jitter = finite(setup.chain.jitter_rad);
    // Random jitter blurs by its FWHM; it and the smear add in quadrature.
    let motion = finite(smear.hypot(GAUSSIAN_FWHM * jitter * range));

    // Every limit is the smallest separation it lets through (resolution-model §5): a pixel is a
    // sample spacing, so sampling passes periods down to 2·GSD (Nyquist).
    let limits = Limits {
        sampling: 2.0 * gsd,
        diffraction: finite(rayleigh * range),
        turbulence: finite(seeing * range),
        motion,
    };
    let ranked = limits.ranked();
    let (governing, limit_m) = (ranked[0], limits.get(ranked[0]));
    let runner_up = ranked[1];
    let second = limits.get(runner_up);
    let margin = if second > 0.0 {
        finite(limit_m / second).max(1.0)
    } else {
        1.0
    };

    let ifov = if setup.focal_m > 0.0 {
        finite(pitch / setup.focal_m)
    } else {
        0.0
    };
    let system = SystemMtf {
        wavelength_m: setup.wavelength_m,
        aperture_m: aperture,
        obscuration: setup.chain.obscuration,
        wfe_waves: setup.chain.wfe_waves,
        active_width_rad: ifov * setup.chain.fill.clamp(0.0, 1.0),
        exposure,
        smear_rad: if range > 0.0 { smear / range } else { 0.0 },
        jitter_rad: jitter,
    };
    let grd = |direction| resolved_distance(&system, setup.chain.snr(), ifov, range, 2.0 * gsd, direction);
    let grd_across = grd(Direction::Across);
    // Without smear the two directions are the same system.
    let grd_along = if system.smear_rad > 0.0 {
        grd(Direction::Along)
    } else {
        grd_across
    };

    Evaluation {
        pitch_m: pitch,
        aperture_m: aperture,
        slant_range_m: range,
        look_angle_deg: look.to_degrees(),
        incidence_deg: (std::f64::consts::FRAC_PI_2 - elevation).to_degrees(),
        visible: view.visible,
        gsd_m: gsd,
        gsd_ground_m: finite(gsd / sin_elev),
        gsd_geomean_m: finite(gsd / sin_elev.sqrt()),
        gsd_weighted_m: finite(gsd / sin_elev.powf(0.25)),
        rayleigh_rad: rayleigh,
        r0_m: r0.filter(|r| r.is_finite()),
        seeing_rad: seeing,
        motion_px: if gsd > 0.0 { finite(motion / gsd) } else { 0.0 },
        limits,
        governing,
        limit_m,
        runner_up,
        margin,
        q: finite(optics::sampling_ratio(setup.wavelength_m, setup.f_number, pitch)),
        short_exposure: exposure.is_short(),
        grd_m: finite(grd_along.sqrt() * grd_across.sqrt()),
        grd_along_m: grd_along,
        grd_across_m: grd_across,
        resolved_m: grd_along.max(grd_across),
        system,
    }
}

/// The GRD in one direction: the period at the target of the finest bar pattern whose MTF still
/// reaches 3/SNR, searched up to the pixels' Nyquist frequency, so never finer than 2·GSD.
fn resolved_distance(system: &SystemMtf, snr: f64, ifov: f64, range: f64, sampling: f64, direction: Direction) -> f64 {
    if !(ifov > 0.0 && range > 0.0) {
        return 0.0;
    }
    // Below SNR 3.2 the criterion 3/SNR would ask for more than 95 % modulation; it is held there,
    // so a very noisy image still gets a (coarse) figure, flagged through the NIIRS caveats.
    let xi = system.resolved_frequency((3.0 / snr).min(0.95), 0.5 / ifov, direction);
    let period = if xi > 0.0 { range / xi } else { f64::MAX };
    finite(period.max(sampling))
}

/// The edge responses and the GIQE-5 NIIRS of an evaluated setup (resolution-model §5.1).
pub fn quality(setup: &Setup, evaluation: &Evaluation) -> Quality {
    let ifov = if setup.focal_m > 0.0 {
        finite(evaluation.pitch_m / setup.focal_m)
    } else {
        0.0
    };
    chain::quality(
        &evaluation.system,
        ifov,
        evaluation.gsd_weighted_m,
        evaluation.q,
        90.0 - evaluation.look_angle_deg,
        setup.chain.snr(),
    )
}
