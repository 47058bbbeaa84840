//! Diffraction by a circular aperture, checked against outside references.
//!
//! The Bessel functions come from the `libm` crate (`j0`, `j1`, `jn`), which is independent of
//! the engine; the expected numbers are the published ones listed in
//! `shared/reference/resolution-model.md` §2 (Born & Wolf, *Principles of Optics*, §8.5;
//! Goodman, *Introduction to Fourier Optics*, ch. 6).

use sharpfield::core::physics::optics::{self, J1_FIRST_ZERO, RAYLEIGH_FACTOR};
use std::f64::consts::PI;

/// Asserts that `actual` is within `tolerance` (absolute) of `expected`, naming the case.
fn check(case: &str, actual: f64, expected: f64, tolerance: f64) {
    assert!(
        (actual - expected).abs() <= tolerance,
        "{case}: got {actual:.17}, expected {expected:.17} (± {tolerance:e})"
    );
}

/// Bisection for a sign change of `f` in [lo, hi], to the last bit.
fn root(f: impl Fn(f64) -> f64, mut lo: f64, mut hi: f64) -> f64 {
    let f_lo = f(lo);
    assert!(f_lo * f(hi) < 0.0, "no sign change in [{lo}, {hi}]");
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if mid <= lo || mid >= hi {
            break;
        }
        if (f(mid) < 0.0) == (f_lo < 0.0) {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

/// The Airy pattern [2J1(x)/x]², normalised to 1 at the centre (Born & Wolf §8.5; resolution-model §2).
fn airy(x: f64) -> f64 {
    if x.abs() < 1e-8 {
        1.0
    } else {
        let g = 2.0 * libm::j1(x) / x;
        g * g
    }
}

/// Second derivative of the Airy pattern, from the Bessel recurrences:
/// g = 2J1/x, g' = −2J2/x, g'' = −2(J2/x² − J3/x), and (g²)'' = 2(g'² + g·g'').
fn airy_second_derivative(x: f64) -> f64 {
    let (j1, j2, j3) = (libm::j1(x), libm::jn(2, x), libm::jn(3, x));
    let g = 2.0 * j1 / x;
    let g1 = -2.0 * j2 / x;
    let g2 = -2.0 * (j2 / (x * x) - j3 / x);
    2.0 * (g1 * g1 + g * g2)
}

/// Energy inside radius x of the Airy pattern: 1 − J0²(x) − J1²(x) (resolution-model §2; Born & Wolf
/// §8.5; attributed to Rayleigh, from memory).
fn encircled_energy(x: f64) -> f64 {
    let (j0, j1) = (libm::j0(x), libm::j1(x));
    1.0 - j0 * j0 - j1 * j1
}

/// Converts the Airy argument x = πD·sinθ/λ to units of λ/D.
fn in_lambda_over_d(x: f64) -> f64 {
    x / PI
}

#[test]
fn first_zero_of_j1_is_a_zero_of_libm_j1() {
    // j1,1 = 3.8317059702075125 (resolution-model §2; the engine cites Abramowitz & Stegun Table
    // 9.5); libm as the independent reference.
    check("J1(j11)", libm::j1(J1_FIRST_ZERO), 0.0, 1e-15);
    let libm_zero = root(libm::j1, 3.0, 4.5);
    check("zero of libm::j1 near 3.83", J1_FIRST_ZERO, libm_zero, 4e-15);
    check("j11 (resolution-model §2)", J1_FIRST_ZERO, 3.831_705_970_207_512_5, 0.0);
}

#[test]
fn rayleigh_factor_is_j11_over_pi() {
    // Born & Wolf §8.5: the first dark ring at 1.2196698912665045 λ/D (not 1.22).
    check("Rayleigh factor", RAYLEIGH_FACTOR, 1.219_669_891_266_504_5, 1e-15);
    check(
        "Rayleigh factor from libm's zero",
        RAYLEIGH_FACTOR,
        root(libm::j1, 3.0, 4.5) / PI,
        2e-15,
    );
}

#[test]
fn rayleigh_angle_is_the_factor_times_lambda_over_d() {
    // (wavelength m, focal m, f-number): hand-checked cases of θ = 1.2196698912665045·λ·N/f.
    let cases = [
        (550e-9, 0.0088, 4.0),
        (850e-9, 0.1, 2.8),
        (10e-6, 0.019, 1.0),
        (500e-9, 1.0, 8.0),
    ];
    for (wl, focal, fnum) in cases {
        let d = optics::aperture_diameter(focal, fnum);
        check("aperture f/N", d, focal / fnum, 1e-18);
        let expected = 1.219_669_891_266_504_5 * wl / (focal / fnum);
        check(
            "Rayleigh angle",
            optics::rayleigh_angle(wl, d),
            expected,
            expected * 1e-14,
        );
    }
}

#[test]
fn airy_pattern_first_dark_ring_is_at_the_rayleigh_factor() {
    // The intensity vanishes at x = j11, i.e. at the Rayleigh factor in units of λ/D.
    check("I(j11)", airy(J1_FIRST_ZERO), 0.0, 1e-30);
    check("ring in λ/D", in_lambda_over_d(J1_FIRST_ZERO), RAYLEIGH_FACTOR, 1e-15);
}

#[test]
fn airy_full_width_at_half_maximum() {
    // Published: FWHM = 1.028993969962188 λ/D (resolution-model §2; Born & Wolf §8.5).
    let half = root(|x| airy(x) - 0.5, 0.5, 2.5);
    check(
        "Airy FWHM (λ/D)",
        in_lambda_over_d(2.0 * half),
        1.028_993_969_962_188,
        1e-12,
    );
}

#[test]
fn airy_encircled_energy() {
    // Published: half the energy within 0.5348321477242647 λ/D; 0.8377848691733143 inside the
    // first dark ring (resolution-model §2; Born & Wolf §8.5).
    let half = root(|x| encircled_energy(x) - 0.5, 0.5, 3.0);
    check(
        "EE 50 % radius (λ/D)",
        in_lambda_over_d(half),
        0.534_832_147_724_264_7,
        1e-12,
    );
    check(
        "EE inside first dark ring",
        encircled_energy(J1_FIRST_ZERO),
        0.837_784_869_173_314_3,
        1e-14,
    );
    check("EE at the centre", encircled_energy(0.0), 0.0, 0.0);
    check("EE far out tends to 1", encircled_energy(1000.0), 1.0, 1e-3);
}

/// J_n(x) by its power series Σ (−1)^m (x/2)^(2m+n) / (m!(m+n)!) (the textbook series, from
/// memory), accurate to rounding for the small arguments used here; independent of `libm`.
fn bessel_series(n: i32, x: f64) -> f64 {
    let half = x / 2.0;
    let mut term = half.powi(n) / (1..=n).map(f64::from).product::<f64>();
    let mut sum = term;
    for m in 1..60 {
        term *= -half * half / (f64::from(m) * f64::from(m + n));
        sum += term;
    }
    sum
}

#[test]
fn sparrow_limit_is_where_the_midpoint_dip_vanishes() {
    // Two equal incoherent points at spacing s: the sum has zero curvature at the midpoint when
    // the Airy pattern has an inflection point at s/2 (Sparrow's criterion; resolution-model §2).
    let inflection = root(airy_second_derivative, 1.0, 2.0);
    let sparrow = in_lambda_over_d(2.0 * inflection);
    // The same root with J1, J2, J3 from their power series instead of libm.
    let by_series = root(
        |x| {
            let (j1, j2, j3) = (bessel_series(1, x), bessel_series(2, x), bessel_series(3, x));
            let (g, g1, g2) = (2.0 * j1 / x, -2.0 * j2 / x, -2.0 * (j2 / (x * x) - j3 / x));
            g1 * g1 + g * g2
        },
        1.0,
        2.0,
    );
    check(
        "Sparrow: libm vs power series",
        sparrow,
        in_lambda_over_d(2.0 * by_series),
        1e-13,
    );
    // resolution-model.md §2 lists 0.9471552756681817 λ/D. Both evaluations above, and a 50-digit
    // decimal evaluation of the series with finite-difference curvature done while writing this
    // test, put the root at 0.94715525270918554…: the listed value is off by 2.3e−8 (in its 8th
    // digit), so it is checked to 5e−8 only.
    check("Sparrow limit (λ/D), as listed", sparrow, 0.947_155_275_668_181_7, 5e-8);
    // The curvature by finite differences changes sign there too: a check of the recurrences.
    let h = 1e-3;
    let curvature = |x: f64| (airy(x + h) - 2.0 * airy(x) + airy(x - h)) / (h * h);
    assert!(curvature(inflection - 0.01) < 0.0 && curvature(inflection + 0.01) > 0.0);
}

#[test]
fn rayleigh_spacing_leaves_a_midpoint_dip_of_73_5_percent() {
    // Published: 0.735031662423275 of a single peak (resolution-model §2). Each peak sits on the
    // other's first dark ring, so the peak of the sum is exactly 1.
    let peak = airy(0.0) + airy(J1_FIRST_ZERO);
    let midpoint = 2.0 * airy(J1_FIRST_ZERO / 2.0);
    check("peak of the pair", peak, 1.0, 1e-30);
    check("midpoint intensity", midpoint / peak, 0.735_031_662_423_275, 1e-13);
}

/// Diffraction MTF from the geometry of the pupil, not from the closed form: the overlap of two
/// unit disks whose centres are 2v apart, over the area of one, (4/π)∫_v^1 √(1 − x²) dx
/// (Goodman ch. 6: the incoherent OTF is the normalised autocorrelation of the pupil).
fn mtf_by_pupil_overlap(v: f64) -> f64 {
    if v >= 1.0 {
        return 0.0;
    }
    let chord = |x: f64| (1.0 - x * x).max(0.0).sqrt();
    4.0 / PI * quadrature::double_exponential::integrate(chord, v, 1.0, 1e-14).integral
}

#[test]
fn diffraction_mtf_published_values() {
    // (v = ν·λ·N, MTF): Goodman ch. 6; 0.3910022189557706 at v = 0.5 (resolution-model §2).
    let cases = [
        (0.0, 1.0),
        (0.5, 0.391_002_218_955_770_6),
        (1.0, 0.0),
        (1.5, 0.0),
        (-0.5, 0.391_002_218_955_770_6),
        (f64::NAN, 0.0),
        (f64::INFINITY, 0.0),
    ];
    for (v, expected) in cases {
        check(&format!("MTF({v})"), optics::diffraction_mtf(v), expected, 1e-15);
    }
}

#[test]
fn diffraction_mtf_matches_the_pupil_overlap_and_falls_monotonically() {
    let mut previous = f64::INFINITY;
    for i in 0..=1000 {
        let v = i as f64 / 1000.0;
        let mtf = optics::diffraction_mtf(v);
        check(&format!("MTF({v}) vs overlap"), mtf, mtf_by_pupil_overlap(v), 1e-12);
        assert!(mtf <= previous, "MTF rises at v = {v}: {mtf} > {previous}");
        assert!((0.0..=1.0).contains(&mtf));
        previous = mtf;
    }
}

#[test]
fn box_mtf_is_the_sinc_of_the_blur_width() {
    // |sin(πx)/(πx)|: 1 at 0, 2/π at a half cycle, zero at whole cycles (Goodman ch. 6).
    let cases = [
        (0.0, 1.0),
        (0.5, 2.0 / PI),
        (1.0, 0.0),
        (2.0, 0.0),
        (-0.5, 2.0 / PI),
        (1.5, 2.0 / (3.0 * PI)),
    ];
    for (x, expected) in cases {
        check(&format!("sinc({x})"), optics::box_mtf(x), expected, 1e-15);
    }
}

#[test]
fn sampling_ratio_q() {
    // Q = λN/p (GIQE 5.0; Fiete 1999); (λ m, N, pitch m, Q) by hand.
    let cases = [
        (550e-9, 4.0, 2.2e-6, 1.0),
        (500e-9, 8.0, 1e-6, 4.0),
        (10e-6, 1.0, 12e-6, 10.0 / 12.0),
        (550e-9, 4.0, 0.0, 0.0),
    ];
    for (wl, n, p, q) in cases {
        check(
            &format!("Q({wl}, {n}, {p})"),
            optics::sampling_ratio(wl, n, p),
            q,
            1e-12,
        );
    }
    // The regime splits where 2·GSD meets the Rayleigh separation, Q = 2π/j₁,₁ = 1.6398
    // (resolution-model §5), so it never contradicts the limit that governs.
    check(
        "crossover Q",
        optics::SAMPLING_DIFFRACTION_Q,
        1.639_787_957_644_179_6,
        1e-12,
    );
    assert_eq!(optics::sampling_regime(1.63), optics::SamplingRegime::DetectorLimited);
    assert_eq!(optics::sampling_regime(1.65), optics::SamplingRegime::OpticsLimited);
}
