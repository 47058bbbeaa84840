//! The imaging chain: the system MTF along and across the motion, the ground resolved distance, the
//! edge response and the GIQE-5 NIIRS (resolution-model §5.1).
//!
//! Sources: Goodman, *Introduction to Fourier Optics*, ch. 6 (the transfer functions of the pupil,
//! the detector and linear motion); Fried, JOSA 56 (1966) for turbulence; Holst, *Electro-Optical
//! Imaging System Performance*, and the IBSM equations for jitter, the GRD (Eq. 3-54) and the edge
//! response (Eqs. 3-61, 3-63); NGA, *General Image Quality Equation 5.0* (2015) for the NIIRS and
//! the weighted RER; Leachtenauer et al., Appl. Opt. 36 (1997) for the edge overshoot.

use crate::core::physics::optics;
use crate::core::physics::roots;
use crate::core::physics::turbulence::Exposure;
use std::f64::consts::PI;

/// The contrast SNR assumed when the scenario gives none: a well-lit scene (the GIQE 5.0 document's
/// check case uses 50; an assumption until the light is computed).
pub const DEFAULT_SNR: f64 = 50.0;

/// The parts of the chain that are properties of the camera rather than of the geometry.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ChainInputs {
    /// Central obscuration ratio of the lens, 0 for an open pupil.
    pub obscuration: f64,
    /// rms wavefront error, in waves.
    pub wfe_waves: f64,
    /// Pixel fill factor: active width over pitch.
    pub fill: f64,
    /// rms line-of-sight jitter during the exposure (rad).
    pub jitter_rad: f64,
    /// Contrast SNR (GIQE 5.0: a 15 % target against a 7 % background).
    pub snr: f64,
}

impl ChainInputs {
    /// A perfect lens, a fully active pixel, a steady camera, and [`DEFAULT_SNR`].
    pub const IDEAL: ChainInputs = ChainInputs {
        obscuration: 0.0,
        wfe_waves: 0.0,
        fill: 1.0,
        jitter_rad: 0.0,
        snr: DEFAULT_SNR,
    };

    /// The SNR, or [`DEFAULT_SNR`] when it is not a positive number.
    pub fn snr(&self) -> f64 {
        if self.snr.is_finite() && self.snr > 0.0 {
            self.snr
        } else {
            DEFAULT_SNR
        }
    }
}

/// Along the motion (the smear adds to the blur) or across it.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Direction {
    Along,
    Across,
}

/// The system transfer function of one setup, in angular frequency at the camera (cycles/rad).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SystemMtf {
    pub wavelength_m: f64,
    pub aperture_m: f64,
    pub obscuration: f64,
    pub wfe_waves: f64,
    /// The pixel's active width as an angle, fill·p/f (rad).
    pub active_width_rad: f64,
    pub exposure: Exposure,
    /// Linear smear during the exposure, as an angle (rad), along the motion only.
    pub smear_rad: f64,
    /// rms jitter (rad).
    pub jitter_rad: f64,
}

impl SystemMtf {
    /// The diffraction cutoff D/λ (cycles/rad); zero for a setup without an aperture.
    pub fn cutoff(&self) -> f64 {
        if self.wavelength_m > 0.0 && self.aperture_m > 0.0 {
            self.aperture_m / self.wavelength_m
        } else {
            0.0
        }
    }

    /// The transfer function with its sign (the sinc terms reverse phase past their zeros), at
    /// `xi` cycles/rad: diffraction with obscuration × wavefront error × detector × turbulence ×
    /// jitter, times the smear along the motion. Zero at and beyond the cutoff.
    pub fn otf(&self, xi: f64, direction: Direction) -> f64 {
        let common = self.common(xi);
        match direction {
            Direction::Along => common * optics::box_otf(self.smear_rad * xi),
            Direction::Across => common,
        }
    }

    /// The modulus of [`SystemMtf::otf`].
    pub fn mtf(&self, xi: f64, direction: Direction) -> f64 {
        self.otf(xi, direction).abs()
    }

    fn common(&self, xi: f64) -> f64 {
        let cutoff = self.cutoff();
        if cutoff <= 0.0 || !xi.is_finite() {
            return 0.0;
        }
        let v = xi.abs() / cutoff;
        if v >= 1.0 {
            return 0.0;
        }
        // Terms that are 1 for this system are left out: this runs some ten times per GRD.
        let mut value =
            optics::obscured_diffraction_mtf(v, self.obscuration) * optics::box_otf(self.active_width_rad * xi);
        if self.wfe_waves > 0.0 {
            value *= optics::wavefront_error_factor(v, self.wfe_waves);
        }
        if self.exposure != Exposure::Clear {
            value *= self.exposure.mtf(self.wavelength_m, self.aperture_m, xi);
        }
        if self.jitter_rad > 0.0 {
            value *= (-2.0 * PI * PI * self.jitter_rad * self.jitter_rad * xi * xi).exp();
        }
        if value.is_finite() {
            value
        } else {
            0.0
        }
    }

    /// How far from 0 |OTF| can only fall (cycles/rad), up to `top` (which the caller keeps on the
    /// sinc terms' main lobes): the wavefront factor falls up to half the cutoff and the
    /// turbulence MTF up to where its exponent peaks, v = (5/(6a))³; the other terms fall throughout.
    fn steady_end(&self, top: f64) -> f64 {
        let cutoff = self.cutoff();
        let mut v_end: f64 = 1.0;
        if self.wfe_waves > 0.0 {
            v_end = v_end.min(0.5);
        }
        if let Some(peak) = self.turbulence_peak() {
            v_end = v_end.min(peak);
        }
        top.min(v_end * cutoff)
    }

    /// Where the turbulence MTF's exponent c·v^(5/3)·(1 − a·v^(1/3)) peaks, v = (5/(6a))³ of the
    /// cutoff, past which the MTF rises again; `None` when no tilt is left frozen (a = 0).
    fn turbulence_peak(&self) -> Option<f64> {
        let a = self.exposure.tilt_removed();
        (a > 0.0).then(|| (5.0 / (6.0 * a)).powi(3))
    }

    /// A lower bound of |OTF| over [0, `xi_max`]: the falling terms at `xi_max` times the least
    /// value of the others there (the wavefront factor is least at half the cutoff, the
    /// short-exposure turbulence MTF where its exponent peaks, v = (5/(6α))³). Zero when a sinc term
    /// passes its first zero. Lets the common case (everything resolved up to Nyquist) skip the scan.
    fn lower_bound(&self, xi_max: f64, direction: Direction) -> f64 {
        let cutoff = self.cutoff();
        let smear = match direction {
            Direction::Along => self.smear_rad * xi_max,
            Direction::Across => 0.0,
        };
        if cutoff <= 0.0 || xi_max >= cutoff || smear > 1.0 || self.active_width_rad * xi_max > 1.0 {
            return 0.0;
        }
        let v = xi_max / cutoff;
        let falling = optics::obscured_diffraction_mtf(v, self.obscuration)
            * optics::box_mtf(self.active_width_rad * xi_max)
            * optics::box_mtf(smear)
            * (-2.0 * PI * PI * self.jitter_rad * self.jitter_rad * xi_max * xi_max).exp();
        let wavefront = optics::wavefront_error_factor(v.min(0.5), self.wfe_waves);
        let v_worst = self.turbulence_peak().map_or(v, |peak| v.min(peak));
        let turbulence = self.exposure.mtf(self.wavelength_m, self.aperture_m, v_worst * cutoff);
        falling * wavefront * turbulence
    }

    /// The highest frequency up to `xi_max` before |OTF| first falls below `threshold` (cycles/rad):
    /// `xi_max` when it never does. A lower bound settles the common case at once; otherwise the
    /// first fall is bracketed (a scan where the curve may rise again) and refined.
    pub fn resolved_frequency(&self, threshold: f64, xi_max: f64, direction: Direction) -> f64 {
        if xi_max.is_nan() || xi_max <= 0.0 {
            return 0.0;
        }
        // Along the motion the smear's first zero bounds the first fall.
        let top = match direction {
            Direction::Along if self.smear_rad > 0.0 => xi_max.min(1.0 / self.smear_rad),
            _ => xi_max,
        };
        let above = |xi: f64| self.mtf(xi, direction) >= threshold;
        if self.lower_bound(top, direction) >= threshold {
            return top;
        }
        // Up to the steady end the curve only falls: one look there brackets the first fall. Beyond
        // it a scan on one grid for both directions (steps of xi_max/32), so that along the motion,
        // where the MTF is never higher, the first fall is never found later than across it.
        let steady = self.steady_end(top);
        let (lo, hi) = if !above(steady) {
            (0.0, steady)
        } else if steady >= top {
            return top;
        } else {
            const SCAN: usize = 32;
            let step = xi_max / SCAN as f64;
            let mut bracket = None;
            let mut previous = steady;
            let mut i = (steady / step).floor() as usize + 1;
            while bracket.is_none() && previous < top {
                let xi = (step * i as f64).min(top);
                if !above(xi) {
                    bracket = Some((previous, xi));
                }
                previous = xi;
                i += 1;
            }
            match bracket {
                Some(b) => b,
                None => return top,
            }
        };
        // ln|OTF| − ln(threshold) is smooth in the bracket: regula falsi to 1e−7 relative, far
        // finer than any figure is shown, in about eight evaluations.
        roots::last_not_negative(lo, hi, |xi| (self.mtf(xi, direction) / threshold).ln(), 1e-7)
    }
}

/// An edge response read at the pixel scale.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Edge {
    /// Relative edge response ER(+0.5) − ER(−0.5).
    pub rer: f64,
    /// Edge overshoot H: ER at 1.25 px when ER rises steadily over 1–3 px, else its largest value there.
    pub overshoot: f64,
}

/// Nodes and weights of 8-point Gauss–Legendre quadrature on [−1, 1] (Abramowitz & Stegun, Table 25.4).
const GAUSS_8: [(f64, f64); 4] = [
    (0.183_434_642_495_65, 0.362_683_783_378_362),
    (0.525_532_409_916_329, 0.313_706_645_877_887),
    (0.796_666_477_413_627, 0.222_381_034_453_374),
    (0.960_289_856_497_536, 0.101_228_536_290_376),
];
/// Width of one quadrature panel (cycles per pixel) and the most panels an edge integral uses.
const PANEL: f64 = 0.5;
const MAX_PANELS: usize = 256;
/// Positions of the edge samples for the overshoot, in quarter pixels: 1, 1.25, …, 3 px.
const OVERSHOOT_QUARTERS: std::ops::RangeInclusive<usize> = 4..=12;

/// The edge response of a system whose signed OTF at `u` cycles per pixel is `otf(u)`, zero beyond
/// `u_max`: ER(x) = 0.5 + (1/π)·∫₀^∞ OTF(u)/u·sin(2πux) du (IBSM Eq. 3-61), integrated by
/// Gauss–Legendre panels of half a cycle per pixel (at most 128 cycles per pixel are integrated).
pub fn edge_response(otf: impl Fn(f64) -> f64, u_max: f64) -> Edge {
    let u_max = if u_max.is_finite() { u_max.max(0.0) } else { 0.0 };
    let panels = ((u_max / PANEL).ceil() as usize).clamp(1, MAX_PANELS);
    let width = u_max.min(PANEL * MAX_PANELS as f64) / panels as f64;
    // sums[k] = Σ wᵢ·OTF(uᵢ)/uᵢ·sin(2π·uᵢ·k/4) for x = k/4 px, k = 0..=12.
    let mut sums = [0.0f64; 13];
    for panel in 0..panels {
        let centre = (panel as f64 + 0.5) * width;
        for &(node, weight) in &GAUSS_8 {
            for u in [centre - 0.5 * width * node, centre + 0.5 * width * node] {
                if u <= 0.0 {
                    continue;
                }
                let g = 0.5 * width * weight * otf(u) / u;
                if !g.is_finite() {
                    continue;
                }
                // sin(k·a) for a = πu/2 by the Chebyshev recurrence sin((k+1)a) = 2cos a·sin(ka) − sin((k−1)a).
                let a = 0.5 * PI * u;
                let (two_cos, mut previous, mut current) = (2.0 * a.cos(), 0.0f64, a.sin());
                for slot in sums.iter_mut().skip(1) {
                    *slot += g * current;
                    let next = two_cos * current - previous;
                    previous = current;
                    current = next;
                }
            }
        }
    }
    let er = |k: usize| 0.5 + sums[k] / PI;
    let rer = er(2) - (1.0 - er(2)); // ER is odd about 0.5: ER(−x) = 1 − ER(x)
                                     // Quadrature ripples on a flat edge (below 1e−6) are not a fall.
    let rises = OVERSHOOT_QUARTERS
        .zip(OVERSHOOT_QUARTERS.skip(1))
        .all(|(a, b)| er(b) >= er(a) - 1e-6);
    let overshoot = if rises {
        er(5)
    } else {
        OVERSHOOT_QUARTERS.map(er).fold(f64::MIN, f64::max)
    };
    Edge {
        rer: if rer.is_finite() { rer } else { 0.0 },
        overshoot: if overshoot.is_finite() { overshoot } else { 0.0 },
    }
}

/// GIQE 5.0 (NGA 2015, Eq. 2): NIIRS = 9.57 − 3.32·log10(GSD_W) + 3.32·[1 − e^(−1.9/SNR)]·log10(RER)
/// − 2·(log10 RER)⁴ − 1.8/SNR, with the weighted GSD in inches. Finite for any positive inputs.
pub fn giqe5(gsd_weighted_m: f64, rer: f64, snr: f64) -> f64 {
    let gsd_in = (gsd_weighted_m / 0.0254).max(1e-12);
    let rer = rer.max(1e-6);
    let snr = snr.max(1e-6);
    let l = rer.log10();
    let niirs = 9.57 - 3.32 * gsd_in.log10() + 3.32 * (1.0 - (-1.9 / snr).exp()) * l - 2.0 * l.powi(4) - 1.8 / snr;
    if niirs.is_finite() {
        niirs
    } else {
        0.0
    }
}

/// GIQE 5.0 Eq. 7: the weighted RER (RER_max·RER_min²)^(1/3).
pub fn weighted_rer(a: f64, b: f64) -> f64 {
    let (hi, lo) = if a >= b { (a, b) } else { (b, a) };
    (hi.max(0.0) * lo.max(0.0) * lo.max(0.0)).cbrt()
}

/// Why a NIIRS figure is only indicative: the inputs lie outside what GIQE 5.0 was fitted on.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct NiirsCaveats {
    /// The wavelength is not visible light (400–700 nm); GIQE 5.0 is for visible panchromatic images.
    pub band: bool,
    /// Q lies outside about 1–2.
    pub sampling: bool,
    /// SNR below 5.
    pub snr: bool,
    /// Elevation angle below 8.9°.
    pub elevation: bool,
    /// The figure lies beyond the scale's 0–9.
    pub off_scale: bool,
}

impl NiirsCaveats {
    /// The checks of resolution-model §5.1.
    pub fn of(wavelength_m: f64, q: f64, snr: f64, elevation_deg: f64, niirs: f64) -> NiirsCaveats {
        NiirsCaveats {
            band: !(400e-9..=700e-9).contains(&wavelength_m),
            sampling: !(1.0..=2.0).contains(&q),
            snr: snr < 5.0,
            elevation: elevation_deg < 8.9,
            off_scale: !(0.0..=9.0).contains(&niirs),
        }
    }

    /// Whether any applies.
    pub fn any(&self) -> bool {
        self.band || self.sampling || self.snr || self.elevation || self.off_scale
    }
}

/// The image-quality figures of one setup, from its system MTF.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Quality {
    pub rer_along: f64,
    pub rer_across: f64,
    /// GIQE 5.0 weighted RER.
    pub rer: f64,
    /// Geometric mean of the overshoots along and across (GIQE 4 convention).
    pub overshoot: f64,
    pub snr: f64,
    pub niirs: f64,
    pub caveats: NiirsCaveats,
}

/// The edge responses and the NIIRS of `system`, sampled with pixels of `ifov_rad` (pitch / focal
/// length) and weighted GSD `gsd_weighted_m`.
pub fn quality(
    system: &SystemMtf,
    ifov_rad: f64,
    gsd_weighted_m: f64,
    q: f64,
    elevation_deg: f64,
    snr: f64,
) -> Quality {
    let (along, across) = if ifov_rad > 0.0 && ifov_rad.is_finite() {
        let u_max = system.cutoff() * ifov_rad;
        let edge = |direction| edge_response(|u| system.otf(u / ifov_rad, direction), u_max);
        (edge(Direction::Along), edge(Direction::Across))
    } else {
        let none = Edge {
            rer: 0.0,
            overshoot: 0.0,
        };
        (none, none)
    };
    let rer = weighted_rer(along.rer, across.rer);
    let niirs = giqe5(gsd_weighted_m, rer, snr);
    Quality {
        rer_along: along.rer,
        rer_across: across.rer,
        rer,
        overshoot: (along.overshoot.max(0.0) * across.overshoot.max(0.0)).sqrt(),
        snr,
        niirs,
        caveats: NiirsCaveats::of(system.wavelength_m, q, snr, elevation_deg, niirs),
    }
}
