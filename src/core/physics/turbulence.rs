//! Optical turbulence: Cn² profiles, path integrals, the Fried parameter and seeing blur.
//!
//! Sources: Fried, JOSA 56 (1966) for r0; J. D. Schmidt, *Numerical Simulation of Optical Wave
//! Propagation*, SPIE 2010, ch. 9 for the spherical-wave r0 and the weighting of the path;
//! R. J. Flenniken, NPS thesis 1983, for the (z/R)^(5/3) weighting being the right one for imaging;
//! Valley, Appl. Opt. 19 (1980) and Sasiela for Hufnagel–Valley; L. C. Andrews, *Field Guide to
//! Atmospheric Optics* for the SLC models.

use std::f64::consts::PI;
use std::sync::OnceLock;

/// Coefficient of the Fried parameter, 0.423 (Fried 1966; Schmidt 2010 eq. 9.42).
const FRIED_COEFFICIENT: f64 = 0.423;
/// Coefficient of the isoplanatic angle, 2.914 (Fried 1982; Schmidt 2010 eq. 9.47).
const ISOPLANATIC_COEFFICIENT: f64 = 2.914;
/// Long-exposure seeing FWHM in units of λ/r0, as used across adaptive optics.
const SEEING_FWHM_FACTOR: f64 = 0.98;
/// Altitude above which every profile here is taken as free of turbulence (m).
pub const TOP_OF_TURBULENCE_M: f64 = 30_000.0;

/// A profile of the refractive-index structure constant Cn² (m^(−2/3)) against height above the
/// ground (m).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Profile {
    /// No turbulence: the seeing limit is left out.
    None,
    /// Hufnagel–Valley with upper-wind speed `wind_mps` and ground value `ground_cn2`
    /// (Valley 1980); HV 5/7 is wind 21 m/s, ground 1.7e−14.
    HufnagelValley { wind_mps: f64, ground_cn2: f64 },
    /// SLC-Day (Andrews, *Field Guide to Atmospheric Optics*).
    SlcDay,
    /// SLC-Night (same source).
    SlcNight,
    /// Near-ground power law Cn²(h) = C1·max(h, 1 m)^e (surface-layer similarity).
    PowerLaw { cn2_at_1m: f64, exponent: f64 },
}

impl Profile {
    /// Hufnagel–Valley 5/7: r0 ≈ 5 cm and θ0 ≈ 7 µrad at 0.5 µm looking straight up.
    pub const HV57: Profile = Profile::HufnagelValley {
        wind_mps: 21.0,
        ground_cn2: 1.7e-14,
    };

    /// Cn² at `altitude_m` metres above the ground; never negative, never NaN.
    pub fn cn2(&self, altitude_m: f64) -> f64 {
        let h = if altitude_m.is_finite() {
            altitude_m.max(0.0)
        } else {
            0.0
        };
        let value = match *self {
            Profile::None => 0.0,
            Profile::HufnagelValley { wind_mps, ground_cn2 } => {
                let w = wind_mps / 27.0;
                0.00594 * w * w * (1e-5 * h).powi(10) * (-h / 1000.0).exp()
                    + 2.7e-16 * (-h / 1500.0).exp()
                    + ground_cn2 * (-h / 100.0).exp()
            }
            Profile::SlcDay => match h {
                h if h < 18.5 => 1.7e-14,
                h if h < 240.0 => 3.13e-13 * power(h, -1.05),
                h if h < 880.0 => 1.3e-15,
                h if h < 7200.0 => 8.87e-7 / (h * h * h),
                h if h < 20_000.0 => 2e-16 / h.sqrt(),
                _ => 0.0,
            },
            Profile::SlcNight => match h {
                h if h < 18.5 => 8.4e-15,
                h if h < 110.0 => 2.87e-12 / (h * h),
                h if h < 1500.0 => 2.5e-16,
                h if h < 7200.0 => 8.87e-7 / (h * h * h),
                h if h < 20_000.0 => 2e-16 / h.sqrt(),
                _ => 0.0,
            },
            Profile::PowerLaw { cn2_at_1m, exponent } => cn2_at_1m * power(h.max(1.0), exponent),
        };
        if value.is_finite() && value > 0.0 {
            value
        } else {
            0.0
        }
    }

    /// Heights (m) where the profile changes form or slope abruptly; the integrator splits there.
    pub fn breakpoints(&self) -> &'static [f64] {
        match self {
            Profile::None | Profile::HufnagelValley { .. } => &[],
            Profile::SlcDay => &[18.5, 240.0, 880.0, 7200.0, 20_000.0],
            Profile::SlcNight => &[18.5, 110.0, 1500.0, 7200.0, 20_000.0],
            Profile::PowerLaw { .. } => &[1.0],
        }
    }

    /// True when the profile has no turbulence at all.
    pub fn is_none(&self) -> bool {
        matches!(self, Profile::None)
    }
}

/// x^(5/3) for x ≥ 0 (0 for anything else). The path weight is evaluated hundreds of times per
/// plan; in WebAssembly `powf` and `cbrt` (which leans on a software fused multiply-add) cost
/// several times more than the exp(e·ln x) used here.
fn five_thirds(x: f64) -> f64 {
    if x > 0.0 {
        power(x, 5.0 / 3.0)
    } else {
        0.0
    }
}

/// x^e for x > 0 as exp(e·ln x): cheaper than `powf` in WebAssembly and within a few units in the
/// last place for the exponents and heights of the profiles here.
fn power(x: f64, e: f64) -> f64 {
    (e * x.ln()).exp()
}

/// A straight optical path `length_m` long between a target `target_altitude_m` above the ground
/// and a camera `camera_altitude_m` above the ground; over a round Earth the line sags below the
/// straight rise between its ends, by `sag_m` at its middle (resolution-model §10).
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct SlantPath {
    pub camera_altitude_m: f64,
    pub length_m: f64,
    pub target_altitude_m: f64,
    pub sag_m: f64,
}

impl SlantPath {
    /// A path from a target on flat ground to a camera `camera_altitude_m` above it.
    pub fn straight(camera_altitude_m: f64, length_m: f64) -> SlantPath {
        SlantPath {
            camera_altitude_m,
            length_m,
            ..SlantPath::default()
        }
    }

    /// The heights along the path.
    pub fn heights(&self) -> PathHeights {
        PathHeights {
            bottom_m: self.target_altitude_m,
            top_m: self.camera_altitude_m,
            sag_m: self.sag_m,
        }
    }
}

/// Heights above the ground along a path, from its target end (u = 0) to its camera end (u = 1):
/// a straight rise from `bottom_m` to `top_m`, less a parabolic sag of `sag_m` at the middle (a
/// straight line over a round Earth; the parabola meets the exact heights at both ends and the
/// middle, and differs from them by the path's length to the fourth power over the Earth's radius
/// cubed, below a millimetre for paths under 100 km).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PathHeights {
    pub bottom_m: f64,
    pub top_m: f64,
    pub sag_m: f64,
}

impl PathHeights {
    /// The height a fraction `u` of the way from the target to the camera (never below ground).
    pub fn at(&self, u: f64) -> f64 {
        (self.bottom_m + (self.top_m - self.bottom_m) * u - 4.0 * self.sag_m * u * (1.0 - u)).max(0.0)
    }
}

/// Gauss–Legendre nodes and weights on [0, 1], computed once by Newton's method on P_n.
fn gauss_legendre() -> &'static [(f64, f64)] {
    const ORDER: usize = 10;
    static RULE: OnceLock<Vec<(f64, f64)>> = OnceLock::new();
    RULE.get_or_init(|| {
        let n = ORDER as f64;
        (1..=ORDER)
            .map(|i| {
                let mut x = (PI * (i as f64 - 0.25) / (n + 0.5)).cos();
                let mut derivative = 1.0;
                for _ in 0..100 {
                    let (mut p0, mut p1) = (1.0, x);
                    for k in 2..=ORDER {
                        let k = k as f64;
                        let p2 = ((2.0 * k - 1.0) * x * p1 - (k - 1.0) * p0) / k;
                        p0 = p1;
                        p1 = p2;
                    }
                    derivative = n * (x * p1 - p0) / (x * x - 1.0);
                    let step = p1 / derivative;
                    x -= step;
                    if step.abs() < 1e-16 {
                        break;
                    }
                }
                let weight = 2.0 / ((1.0 - x * x) * derivative * derivative);
                // Map from [−1, 1] to [0, 1].
                (0.5 * (x + 1.0), 0.5 * weight)
            })
            .collect()
    })
}

/// ∫₀¹ Cn²(a·u)·weight(u) du for a path whose altitude rises linearly from 0 (u = 0, at the
/// target) to `a` (u = 1, at the camera).
///
/// The interval is split at the profile's breakpoints and graded geometrically towards the
/// ground, where near-ground profiles change fastest; each piece gets a 10-point Gauss–Legendre
/// rule. Accuracy against an adaptive double-exponential quadrature is tested in
/// `tests/turbulence.rs`.
pub fn integrate_unit_path(profile: &Profile, top_altitude_m: f64, weight: impl Fn(f64) -> f64) -> f64 {
    integrate_along(
        profile,
        PathHeights {
            bottom_m: 0.0,
            top_m: top_altitude_m,
            sag_m: 0.0,
        },
        weight,
    )
}

/// ∫₀¹ Cn²(height(u))·weight(u) du along a path whose heights are `heights` (u = 0 at the target,
/// 1 at the camera); [`integrate_unit_path`] is the straight path up from the ground.
pub fn integrate_along(profile: &Profile, heights: PathHeights, weight: impl Fn(f64) -> f64) -> f64 {
    let numbers = [heights.bottom_m, heights.top_m, heights.sag_m];
    if profile.is_none() || numbers.iter().any(|x| !x.is_finite()) {
        return 0.0;
    }
    let heights = PathHeights {
        bottom_m: heights.bottom_m.max(0.0),
        top_m: heights.top_m.max(0.0),
        sag_m: heights.sag_m.max(0.0),
    };
    let (bottom, top) = (heights.bottom_m, heights.top_m);
    let rise = top - bottom;
    let mut cuts: Vec<f64> = Vec::with_capacity(40);
    cuts.push(0.0);
    cuts.push(1.0);
    if rise.abs() > 0.0 {
        // Where the straight rise crosses the profile's breakpoints.
        for &b in profile.breakpoints() {
            let u = (b - bottom) / rise;
            if u > 0.0 && u < 1.0 {
                cuts.push(u);
            }
        }
    }
    if bottom < 1.0 && rise > 0.0 {
        // Halve towards the ground until the altitude is below a few centimetres.
        let mut u = 0.5;
        while rise * u > 0.05 && u > 1e-12 {
            cuts.push(u);
            u *= 0.5;
        }
        cuts.push(u);
    }
    super::sort_short(&mut cuts, |a, b| a.total_cmp(b).is_lt());
    cuts.dedup();
    let rule = gauss_legendre();
    let mut total = 0.0;
    for pair in cuts.windows(2) {
        let (lo, hi) = (pair[0], pair[1]);
        let width = hi - lo;
        if width <= 0.0 {
            continue;
        }
        let piece: f64 = rule
            .iter()
            .map(|&(x, w)| {
                let u = lo + width * x;
                w * profile.cn2(heights.at(u)) * weight(u)
            })
            .sum();
        total += piece * width;
    }
    if total.is_finite() {
        total.max(0.0)
    } else {
        0.0
    }
}

/// Wavenumber k = 2π/λ.
fn wavenumber(wavelength_m: f64) -> f64 {
    2.0 * PI / wavelength_m
}

/// Turns an integral I into a coherence length [c·k²·I]^(−3/5); `None` when there is no turbulence.
fn coherence_length(coefficient: f64, wavelength_m: f64, integral: f64) -> Option<f64> {
    let k = wavenumber(wavelength_m);
    let base = coefficient * k * k * integral;
    if base > 0.0 && base.is_finite() {
        let r = base.powf(-0.6);
        r.is_finite().then_some(r)
    } else {
        None
    }
}

/// Spherical-wave Fried parameter of the path from a point on the ground to the camera:
/// r0 = [0.423·k²·∫₀ᴿ Cn²(h(z))·(z/R)^(5/3) dz]^(−3/5), z measured from the target
/// (Schmidt 2010, ch. 9; Flenniken 1983). `None` when the path has no turbulence.
pub fn spherical_wave_r0(profile: &Profile, path: SlantPath, wavelength_m: f64) -> Option<f64> {
    if !(path.length_m > 0.0 && wavelength_m > 0.0) {
        return None;
    }
    let integral = path.length_m * integrate_along(profile, path.heights(), five_thirds);
    coherence_length(FRIED_COEFFICIENT, wavelength_m, integral)
}

/// Spherical-wave r0 for a camera on the ground looking up the same path at a source in the air:
/// the weighting is reversed, so turbulence near the ground now weighs fully (Schmidt 2010, ch. 9).
pub fn spherical_wave_r0_looking_up(profile: &Profile, path: SlantPath, wavelength_m: f64) -> Option<f64> {
    if !(path.length_m > 0.0 && wavelength_m > 0.0) {
        return None;
    }
    let integral = path.length_m * integrate_along(profile, path.heights(), |u| five_thirds(1.0 - u));
    coherence_length(FRIED_COEFFICIENT, wavelength_m, integral)
}

/// Rytov variance (plane wave) of the path, σ_R² = 2.25·k^(7/6)·∫₀ᴸ Cn²(z)·(L − z)^(5/6) dz with
/// z from the target (the source) to the camera; for a constant Cn² it is 2.25·(6/11)·Cn²·
/// k^(7/6)·L^(11/6) = 1.23·Cn²·k^(7/6)·L^(11/6) (Andrews & Phillips 2005; resolution-model §5.2).
/// Above 1 the turbulence is strong (saturated scintillation) and the r0 figures are indicative.
/// 0 for a path without turbulence.
pub fn rytov_variance(profile: &Profile, path: SlantPath, wavelength_m: f64) -> f64 {
    if !(path.length_m > 0.0 && wavelength_m > 0.0) || profile.is_none() {
        return 0.0;
    }
    let k = 2.0 * PI / wavelength_m;
    let weight = |u: f64| (1.0 - u).max(0.0).powf(5.0 / 6.0);
    let value =
        2.25 * k.powf(7.0 / 6.0) * path.length_m.powf(11.0 / 6.0) * integrate_along(profile, path.heights(), weight);
    if value.is_finite() && value > 0.0 {
        value
    } else {
        0.0
    }
}

/// Plane-wave r0 of a path with uniform weighting: [0.423·k²·∫ Cn² dz]^(−3/5) (Fried 1966).
pub fn plane_wave_r0(profile: &Profile, path: SlantPath, wavelength_m: f64) -> Option<f64> {
    if !(path.length_m > 0.0 && wavelength_m > 0.0) {
        return None;
    }
    let integral = path.length_m * integrate_along(profile, path.heights(), |_| 1.0);
    coherence_length(FRIED_COEFFICIENT, wavelength_m, integral)
}

/// Plane-wave r0 looking straight up from the ground through the whole profile.
pub fn zenith_plane_wave_r0(profile: &Profile, wavelength_m: f64) -> Option<f64> {
    plane_wave_r0(
        profile,
        SlantPath::straight(TOP_OF_TURBULENCE_M, TOP_OF_TURBULENCE_M),
        wavelength_m,
    )
}

/// Isoplanatic angle looking straight up from the ground:
/// θ0 = [2.914·k²·∫ Cn²(h)·h^(5/3) dh]^(−3/5) (Fried 1982; Schmidt 2010 eq. 9.47).
pub fn zenith_isoplanatic_angle(profile: &Profile, wavelength_m: f64) -> Option<f64> {
    let top = TOP_OF_TURBULENCE_M;
    let integral = top * integrate_unit_path(profile, top, |u| five_thirds(top * u));
    coherence_length(ISOPLANATIC_COEFFICIENT, wavelength_m, integral)
}

/// Long-exposure seeing blur (FWHM) in radians, 0.98·λ/r0; zero when there is no turbulence.
pub fn seeing_angle(wavelength_m: f64, r0_m: Option<f64>) -> f64 {
    match r0_m {
        Some(r0) if r0 > 0.0 => SEEING_FWHM_FACTOR * wavelength_m / r0,
        _ => 0.0,
    }
}

/// Long-exposure atmospheric MTF exp[−3.44(λξ/r0)^(5/3)], ξ in cycles per radian (Fried 1966).
pub fn long_exposure_mtf(wavelength_m: f64, r0_m: Option<f64>, cycles_per_radian: f64) -> f64 {
    match r0_m {
        Some(r0) if r0 > 0.0 => (-3.44 * (wavelength_m * cycles_per_radian.abs() / r0).powf(5.0 / 3.0)).exp(),
        _ => 1.0,
    }
}

/// The speed at which the air crosses the path, assumed for the turbulence's time scale until the
/// wind is an input: a light breeze of 5 m/s (an assumption, not a measurement).
pub const ASSUMED_AIR_SPEED_MPS: f64 = 5.0;

/// The turbulence's coherence time τ0 = 0.314·r0/v for air crossing the path at `air_speed_mps`
/// (Roddier 1981, quoted from memory; a few milliseconds near the ground). `None` without turbulence.
pub fn coherence_time(r0_m: Option<f64>, air_speed_mps: f64) -> Option<f64> {
    match r0_m {
        Some(r0) if r0 > 0.0 && r0.is_finite() && air_speed_mps > 0.0 => Some(0.314 * r0 / air_speed_mps),
        _ => None,
    }
}

/// How the turbulence blurs one frame: Fried's short-exposure MTF with the part of the image's
/// wander (tilt) that the frame averages put back. A frame far shorter than the coherence time
/// freezes the tilt (short exposure); a frame far longer averages all of it, which gives the
/// long-exposure MTF exactly, since exp{−3.44·α(λξ/r0)^(5/3)(λξ/D)^(1/3)} is Fried's tilt term.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Exposure {
    /// No turbulence on the path.
    Clear,
    /// Turbulence with Fried parameter `r0_m`; `alpha` runs from 0.5 (far field) to 1 (near field)
    /// and `tilt_share` from 0 (the frame freezes the wander) to 1 (it averages all of it).
    Air { r0_m: f64, alpha: f64, tilt_share: f64 },
}

impl Exposure {
    /// The exposure of a frame `exposure_s` long through air of Fried parameter `r0_m`, on a path
    /// `length_m` long to an aperture `aperture_m` wide. The share of the wander averaged is
    /// x²/(1 + x²) with x = t/τ0 (a smooth step from frozen to averaged, our assumption); α
    /// runs as 0.5 + 0.5·s²/(1 + s²) with s = D/√(λL), from Fried's far field (D ≪ √(λL)) to
    /// his near field (D ≫ √(λL)) (Fried 1966; resolution-model §5.2).
    pub fn choose(r0_m: Option<f64>, exposure_s: f64, aperture_m: f64, wavelength_m: f64, length_m: f64) -> Exposure {
        let r0 = match r0_m {
            Some(r0) if r0 > 0.0 && r0.is_finite() => r0,
            _ => return Exposure::Clear,
        };
        let tilt_share = match coherence_time(Some(r0), ASSUMED_AIR_SPEED_MPS) {
            Some(tau) if exposure_s.is_finite() => {
                let x = (exposure_s.max(0.0) / tau).min(1e6);
                x * x / (1.0 + x * x)
            }
            _ => 1.0,
        };
        let fresnel = (wavelength_m.max(0.0) * length_m.max(0.0)).sqrt();
        let alpha = if fresnel > 0.0 && aperture_m.is_finite() {
            let s2 = (aperture_m.max(0.0) / fresnel).powi(2).min(1e12);
            0.5 + 0.5 * s2 / (1.0 + s2)
        } else {
            1.0
        };
        Exposure::Air {
            r0_m: r0,
            alpha,
            tilt_share,
        }
    }

    /// Whether the frame is short exposure: shorter than the coherence time, so that it freezes
    /// most of the wander (the share averaged is below one half).
    pub fn is_short(&self) -> bool {
        matches!(self, Exposure::Air { tilt_share, .. } if *tilt_share < 0.5)
    }

    /// The factor that multiplies α(λξ/D)^(1/3) in the exponent's bracket: the wander left frozen.
    pub fn tilt_removed(&self) -> f64 {
        match *self {
            Exposure::Clear => 0.0,
            Exposure::Air { alpha, tilt_share, .. } => alpha * (1.0 - tilt_share),
        }
    }

    /// The turbulence MTF at `cycles_per_radian` for an aperture `aperture_m` wide:
    /// exp{−3.44(λξ/r0)^(5/3)[1 − a(λξ/D)^(1/3)]} with a = α·(1 − tilt share) (Fried 1966): the
    /// long-exposure MTF for a = 0, the short-exposure one for a = α.
    pub fn mtf(&self, wavelength_m: f64, aperture_m: f64, cycles_per_radian: f64) -> f64 {
        let Exposure::Air { r0_m, .. } = *self else {
            return 1.0;
        };
        let xi = cycles_per_radian.abs();
        let a = self.tilt_removed();
        let tilt = if aperture_m > 0.0 && a > 0.0 {
            (wavelength_m * xi / aperture_m).min(1.0).cbrt()
        } else {
            0.0
        };
        // y^(5/3) = y·∛y², cheaper than a general power.
        let y = wavelength_m * xi / r0_m;
        let c = y.cbrt();
        (-3.44 * y * c * c * (1.0 - a * tilt)).exp()
    }
}
