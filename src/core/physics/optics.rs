//! Diffraction by a circular aperture and the other optical transfer terms.
//!
//! Sources: Lord Rayleigh (1879) and Born & Wolf, *Principles of Optics*, §8.5 for the Airy
//! pattern; Goodman, *Introduction to Fourier Optics*, ch. 6 for the diffraction MTF.

use std::f64::consts::PI;

/// First positive zero of the Bessel function J1, j₁,₁ (Abramowitz & Stegun, Table 9.5).
pub const J1_FIRST_ZERO: f64 = 3.831_705_970_207_512_5;

/// The Rayleigh factor j₁,₁/π: the first dark ring of the Airy pattern lies at this many λ/D.
pub const RAYLEIGH_FACTOR: f64 = J1_FIRST_ZERO / PI;

/// Aperture diameter D = f/N.
pub fn aperture_diameter(focal_length_m: f64, f_number: f64) -> f64 {
    if f_number > 0.0 {
        focal_length_m / f_number
    } else {
        0.0
    }
}

/// Rayleigh angular resolution (j₁,₁/π)·λ/D in radians (Born & Wolf §8.5).
pub fn rayleigh_angle(wavelength_m: f64, aperture_diameter_m: f64) -> f64 {
    if aperture_diameter_m > 0.0 {
        RAYLEIGH_FACTOR * wavelength_m / aperture_diameter_m
    } else {
        f64::MAX
    }
}

/// Sampling ratio Q = λN/p (GIQE 5.0; Fiete, Opt. Eng. 38(7), 1999).
pub fn sampling_ratio(wavelength_m: f64, f_number: f64, pixel_pitch_m: f64) -> f64 {
    if pixel_pitch_m > 0.0 {
        wavelength_m * f_number / pixel_pitch_m
    } else {
        0.0
    }
}

/// Diffraction MTF of an aberration-free circular pupil at normalised frequency v = ν·λ·N
/// (Goodman, ch. 6): (2/π)[acos v − v·√(1 − v²)], zero at and beyond the cutoff v = 1.
pub fn diffraction_mtf(normalised_frequency: f64) -> f64 {
    let v = normalised_frequency.abs();
    if v >= 1.0 || v.is_nan() {
        return 0.0;
    }
    (2.0 / PI) * (v.acos() - v * (1.0 - v * v).sqrt())
}

/// |sinc(π·x)| with sinc(0) = 1: the MTF of a uniform blur of width d at frequency ν, x = d·ν.
/// Used for the detector footprint and for linear motion (common practice; Goodman ch. 6).
pub fn box_mtf(width_times_frequency: f64) -> f64 {
    box_otf(width_times_frequency).abs()
}

/// Q at which the sampling limit 2·GSD equals the Rayleigh separation: 2·p = (j₁,₁/π)·λN, so
/// Q = 2π/j₁,₁ = 1.640 (resolution-model §5).
pub const SAMPLING_DIFFRACTION_Q: f64 = 2.0 / RAYLEIGH_FACTOR;

/// What limits a sampled optical system, from Q.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SamplingRegime {
    /// Q below [`SAMPLING_DIFFRACTION_Q`]: two pixels span more than the Rayleigh separation.
    DetectorLimited,
    /// Q at or above it: the lens blur is wider than two pixels.
    OpticsLimited,
}

/// The sampling regime of Q = λN/p, split where sampling and diffraction limit alike (Q = 1.64),
/// so that it always agrees with the limit that governs between the two.
pub fn sampling_regime(q: f64) -> SamplingRegime {
    if q < SAMPLING_DIFFRACTION_Q {
        SamplingRegime::DetectorLimited
    } else {
        SamplingRegime::OpticsLimited
    }
}

/// Diffraction MTF of a circular pupil with a central obscuration of ratio `obscuration` (inner /
/// outer diameter, 0 ≤ ε < 1) at normalised frequency v = ν·λ·N (O'Neill, JOSA 46, 1956; the
/// closed form as given in Schroeder, *Astronomical Optics*, §10.2): [A + B + C]/(1 − ε²), where A
/// is the open pupil's MTF, B the obscuration's own and C their cross term. Equal to
/// [`diffraction_mtf`] for ε = 0; zero at and beyond the cutoff v = 1.
pub fn obscured_diffraction_mtf(normalised_frequency: f64, obscuration: f64) -> f64 {
    let v = normalised_frequency.abs();
    let e = if obscuration.is_finite() {
        obscuration.clamp(0.0, 0.99)
    } else {
        0.0
    };
    if e <= 0.0 {
        return diffraction_mtf(v);
    }
    if v >= 1.0 || v.is_nan() {
        return 0.0;
    }
    let a = diffraction_mtf(v);
    let b = if v <= e { e * e * diffraction_mtf(v / e) } else { 0.0 };
    let c = if v <= 0.5 * (1.0 - e) {
        -2.0 * e * e
    } else if v < 0.5 * (1.0 + e) {
        let phi = ((1.0 + e * e - 4.0 * v * v) / (2.0 * e)).clamp(-1.0, 1.0).acos();
        (2.0 * e / PI) * phi.sin() + ((1.0 + e * e) / PI) * phi
            - (2.0 * (1.0 - e * e) / PI) * (((1.0 + e) / (1.0 - e)) * (0.5 * phi).tan()).atan()
            - 2.0 * e * e
    } else {
        0.0
    };
    ((a + b + c) / (1.0 - e * e)).max(0.0)
}

/// Aberration transfer factor of a random wavefront error of `rms_waves` waves rms at normalised
/// frequency v: exp{−(2π·W)²·[1 − 4(v − 0.5)²]}, equal to 1 at v = 0 and at the cutoff (the
/// Gaussian form of Shannon's empirical ATF as used by Fiete, *Modeling the Imaging Chain of Digital
/// Cameras*, SPIE 2010, ch. 4; quoted from memory).
pub fn wavefront_error_factor(normalised_frequency: f64, rms_waves: f64) -> f64 {
    let v = normalised_frequency.abs().min(1.0);
    let w = if rms_waves.is_finite() { rms_waves.max(0.0) } else { 0.0 };
    let shape = 1.0 - 4.0 * (v - 0.5) * (v - 0.5);
    (-(2.0 * PI * w).powi(2) * shape).exp()
}

/// The signed sinc(π·x) = sin(πx)/(πx), sinc(0) = 1: the optical transfer function of a uniform
/// blur of width d at frequency ν, x = d·ν. Its phase (the sign) matters for edge responses.
pub fn box_otf(width_times_frequency: f64) -> f64 {
    let x = PI * width_times_frequency;
    if x.abs() < 1e-9 {
        1.0
    } else {
        x.sin() / x
    }
}
