//! The imaging chain (resolution-model §5.1–§5.2), checked against outside references:
//! - the obscured pupil's MTF against the pupil's autocorrelation computed from the area of
//!   overlap of two circles (plain geometry, independent of O'Neill's closed form);
//! - the edge response against its closed forms (a perfect pixel, a Gaussian blur with `libm::erf`,
//!   a box smear) and against the `quadrature` crate for diffraction alone;
//! - GIQE 5.0 against the check values printed in the NGA document (NIIRS 5 case, the SNR series,
//!   the 30° case, Eq. 6 / Table 6 NIIRS changes against smear);
//! - the GRD of a turbulence-limited system against the closed form of Fried's long-exposure MTF.

mod common;

use proptest::prelude::*;
use sharpfield::core::physics::chain::{edge_response, giqe5, weighted_rer, ChainInputs};
use sharpfield::core::physics::engine::{evaluate, quality, Setup};
use sharpfield::core::physics::geometry::Geometry;
use sharpfield::core::physics::optics;
use sharpfield::core::physics::turbulence::{Exposure, Profile};
use std::f64::consts::PI;

fn check(case: &str, actual: f64, expected: f64, tolerance: f64) {
    assert!(
        (actual - expected).abs() <= tolerance,
        "{case}: got {actual:.6}, expected {expected:.6} (± {tolerance:e})"
    );
}

/// Area common to two circles of radii `a` and `b` whose centres are `d` apart.
fn overlap(a: f64, b: f64, d: f64) -> f64 {
    if d >= a + b {
        return 0.0;
    }
    if d <= (a - b).abs() {
        return PI * a.min(b).powi(2);
    }
    let alpha = ((d * d + a * a - b * b) / (2.0 * d * a)).acos();
    let beta = ((d * d + b * b - a * a) / (2.0 * d * b)).acos();
    let kite = 0.5 * ((-d + a + b) * (d + a - b) * (d - a + b) * (d + a + b)).sqrt();
    a * a * alpha + b * b * beta - kite
}

#[test]
fn the_obscured_pupil_matches_its_autocorrelation() {
    for e in [0.0, 0.2, 0.35, 0.5, 0.7] {
        for i in 0..=40 {
            let v = i as f64 / 40.0;
            let d = 2.0 * v; // the cutoff is a shift of one pupil diameter
            let expected = (overlap(1.0, 1.0, d) - 2.0 * overlap(1.0, e, d) + overlap(e, e, d)) / (PI * (1.0 - e * e));
            check(
                &format!("annulus ε = {e}, v = {v}"),
                optics::obscured_diffraction_mtf(v, e),
                expected.max(0.0),
                1e-12,
            );
        }
    }
}

#[test]
fn the_wavefront_factor_spares_the_ends_and_bites_in_the_middle() {
    for w in [0.0, 0.05, 0.1, 0.25] {
        check("v = 0", optics::wavefront_error_factor(0.0, w), 1.0, 1e-15);
        check("v = 1", optics::wavefront_error_factor(1.0, w), 1.0, 1e-15);
        check(
            "v = 0.5",
            optics::wavefront_error_factor(0.5, w),
            (-(2.0 * PI * w).powi(2)).exp(),
            1e-15,
        );
    }
}

#[test]
fn a_perfect_pixel_has_an_edge_response_of_one() {
    // Perfect optics and a 100 % fill pixel: ER(x) = x + 0.5 on |x| ≤ 0.5 px, so RER = 1 (§5.1).
    // The integral stops at 128 cycles per pixel; the tail it leaves is below 1/(π²·128).
    let edge = edge_response(optics::box_otf, 128.0);
    check("RER of a perfect pixel", edge.rer, 1.0, 1e-3);
    check("no overshoot: ER at 1.25 px", edge.overshoot, 1.0, 2e-3);
}

#[test]
fn a_gaussian_blur_gives_the_error_function() {
    // RER = erf(0.5/(σ·√2)) for a Gaussian of σ pixels alone (§5.1); erf from libm.
    for sigma in [0.3, 0.5, 1.0, 2.0] {
        let otf = |u: f64| (-2.0 * PI * PI * sigma * sigma * u * u).exp();
        let edge = edge_response(otf, 20.0 / sigma);
        check(
            &format!("Gaussian σ = {sigma} px"),
            edge.rer,
            libm::erf(0.5 / (sigma * 2f64.sqrt())),
            1e-5, // half-pixel-wide panels resolve a 2 px blur's narrow spectrum to about 1e−6
        );
        // The edge of a Gaussian rises steadily, so H is ER(1.25 px) = 0.5 + erf(1.25/(σ√2))/2.
        check(
            &format!("Gaussian σ = {sigma} px, overshoot"),
            edge.overshoot,
            0.5 + 0.5 * libm::erf(1.25 / (sigma * 2f64.sqrt())),
            1e-5,
        );
    }
}

#[test]
fn a_box_smear_gives_one_over_its_length() {
    // An edge convolved with a box s pixels wide rises linearly over s: RER = min(1, 1/s) (§5.1).
    for s in [0.5, 1.0, 2.0, 4.0, 8.0] {
        let edge = edge_response(|u| optics::box_otf(s * u), 128.0);
        check(&format!("smear {s} px"), edge.rer, (1.0 / s).min(1.0), 3e-3);
    }
}

#[test]
fn diffraction_alone_matches_a_reference_quadrature() {
    // RER = (2/π)·∫₀^(1/Q) MTF(uQ)/u·sin(πu) du for diffraction alone, by the double-exponential
    // quadrature of the `quadrature` crate (an independent integrator).
    for q in [0.5, 1.0, 1.5, 2.0, 3.0] {
        let mtf = |u: f64| optics::diffraction_mtf(u * q);
        let integrand = |u: f64| if u <= 0.0 { PI } else { mtf(u) / u * (PI * u).sin() };
        let reference = 2.0 / PI * quadrature::double_exponential::integrate(integrand, 0.0, 1.0 / q, 1e-12).integral;
        // The MTF's (1 − v)^(3/2) corner at the cutoff limits Gauss–Legendre panels to about 1e−6.
        check(
            &format!("diffraction Q = {q}"),
            edge_response(mtf, 1.0 / q).rer,
            reference,
            1e-5,
        );
    }
}

#[test]
fn giqe5_reproduces_the_documents_checks() {
    // GIQE 5.0 (NGA 2015): RER 0.35, GSD 20.8 in, SNR 50, nadir → 5.0152; SNR 3, 5, 10, 20.
    let gsd = 20.8 * 0.0254;
    check("NIIRS 5 case", giqe5(gsd, 0.35, 50.0), 5.0152, 1e-4);
    for (snr, expected) in [(3.0, 3.7974), (5.0, 4.2691), (10.0, 4.6657), (20.0, 4.8804)] {
        check(&format!("SNR {snr}"), giqe5(gsd, 0.35, snr), expected, 1e-4);
    }
    // The same at 30° elevation: GSD_W = GSD/(sin ε)^(1/4) (GIQE 5.0 Eq. 5) → 4.7653.
    let weighted = gsd / (30f64.to_radians().sin()).powf(0.25);
    check("30° elevation", giqe5(weighted, 0.35, 50.0), 4.7653, 1e-4);
}

#[test]
fn giqe5_niirs_falls_with_smear_as_table_6_says() {
    // GIQE 5.0 Eq. 6 / Table 6: Q = 1, from the Table 3 RERs 0.329 across and 0.302 / 0.247 /
    // 0.169 / 0.100 along at 1 / 2 / 4 / 8 px of smear; the tables are rounded, hence 0.01.
    let gsd = 0.5;
    for (snr, expected) in [
        (50.0, [-0.03, -0.11, -0.33, -0.87]),
        (5.0, [-0.05, -0.19, -0.51, -1.19]),
    ] {
        let base = giqe5(gsd, weighted_rer(0.329, 0.329), snr);
        for (along, delta) in [0.302, 0.247, 0.169, 0.100].into_iter().zip(expected) {
            let niirs = giqe5(gsd, weighted_rer(along, 0.329), snr);
            check(&format!("SNR {snr}, along RER {along}"), niirs - base, delta, 0.01);
        }
    }
}

/// A camera looking straight down with no turbulence, no motion and the ideal chain.
fn nadir(focal_m: f64, f_number: f64, pitch_m: f64, height_m: f64) -> Setup {
    Setup {
        sensor_width_m: pitch_m * 4000.0,
        sensor_height_m: pitch_m * 3000.0,
        cols: 4000,
        rows: 3000,
        focal_m,
        f_number,
        wavelength_m: 550e-9,
        geometry: Geometry::tilted(height_m, 0.0),
        profile: Profile::None,
        speed_mps: 0.0,
        exposure_s: 0.001,
        turn_rate_rad_s: 0.0,
        target_speed_mps: 0.0,
        chain: ChainInputs::IDEAL,
    }
}

#[test]
fn a_detector_limited_camera_resolves_two_pixels() {
    // Q = 0.55 µm·4/4.4 µm = 0.5: the MTF at Nyquist is far above 3/SNR, so GRD = 2·GSD.
    let e = evaluate(&nadir(0.0088, 4.0, 4.4e-6, 80.0));
    check("GRD along", e.grd_along_m, 2.0 * e.gsd_m, 1e-15);
    check("GRD", e.grd_m, 2.0 * e.gsd_m, 1e-15);
}

#[test]
fn a_turbulence_limited_camera_follows_frieds_mtf() {
    // Long exposure, a huge aperture and tiny pixels: only turbulence matters, so the GRD is the
    // period where exp[−3.44(λξ/r0)^(5/3)] = 3/SNR: ξ = (r0/λ)·(ln(SNR/3)/3.44)^(3/5) (Fried 1966).
    let mut setup = nadir(2.0, 2.0, 0.5e-6, 3000.0);
    setup.geometry = Geometry {
        height_m: 8.0,
        ground_distance_m: 3000.0,
        ..Geometry::default()
    };
    setup.profile = Profile::PowerLaw {
        cn2_at_1m: 1e-13,
        exponent: -4.0 / 3.0,
    };
    setup.exposure_s = 1.0; // far longer than the coherence time: long exposure
    let e = evaluate(&setup);
    assert!(!e.short_exposure);
    let r0 = e.r0_m.expect("the path has turbulence");
    let snr = ChainInputs::IDEAL.snr;
    let xi = r0 / setup.wavelength_m * ((snr / 3.0).ln() / 3.44).powf(0.6);
    // Diffraction (D = 1 m) and the detector still shave a little off; within 1 %.
    check("GRD across / Fried", e.grd_across_m / (e.slant_range_m / xi), 1.0, 0.01);
    assert!(
        e.grd_across_m > e.limits.turbulence,
        "GRD at 3/SNR is coarser than the seeing FWHM"
    );
}

#[test]
fn smear_coarsens_the_grd_along_the_motion_only() {
    let mut setup = nadir(0.0088, 4.0, 2.4e-6, 80.0);
    setup.speed_mps = 15.0;
    setup.exposure_s = 1.0 / 250.0; // 6 cm of smear, about 2.7 px
    let e = evaluate(&setup);
    assert!(
        e.grd_along_m > 1.5 * e.grd_across_m,
        "{} vs {}",
        e.grd_along_m,
        e.grd_across_m
    );
    let q = quality(&setup, &e);
    assert!(q.rer_along < q.rer_across);
    check("weighted RER", q.rer, weighted_rer(q.rer_along, q.rer_across), 1e-15);
}

#[test]
fn a_lower_snr_never_resolves_finer() {
    let mut setup = nadir(0.05, 8.0, 2.4e-6, 120.0); // Q = 1.8
    let mut last = 0.0;
    for snr in [200.0, 50.0, 20.0, 10.0, 5.0, 2.0] {
        setup.chain.snr = snr;
        let grd = evaluate(&setup).grd_m;
        assert!(grd >= last, "SNR {snr}: GRD {grd} below {last}");
        last = grd;
    }
}

#[test]
fn removing_the_tilt_never_lowers_the_turbulence_mtf() {
    // Fried 1966: the short-exposure MTF is the long-exposure one with the tilt taken out, so it is
    // never lower, and a frame that averages all the wander gives the long-exposure MTF.
    let (wl, d, r0) = (550e-9, 0.2, 0.02);
    let long = |xi: f64| (-3.44 * (wl * xi / r0).powf(5.0 / 3.0)).exp(); // Fried's long exposure
    for exposure_s in [1e-5, 1e-3, 1e-2, 1.0] {
        let e = Exposure::choose(Some(r0), exposure_s, d, wl, 3000.0);
        for i in 0..=50 {
            let xi = d / wl * i as f64 / 50.0;
            assert!(
                e.mtf(wl, d, xi) >= long(xi) * (1.0 - 1e-12),
                "t = {exposure_s}, ξ = {xi}"
            );
        }
    }
    let averaged = Exposure::choose(Some(r0), 1e3, d, wl, 3000.0);
    check(
        "a long frame: Fried's long exposure",
        averaged.mtf(wl, d, 0.3 * d / wl),
        long(0.3 * d / wl),
        1e-9,
    );
    // Frozen near field (α → 1) at λξ/D = 1: the bracket vanishes and the MTF returns to 1.
    let frozen = Exposure::Air {
        r0_m: r0,
        alpha: 1.0,
        tilt_share: 0.0,
    };
    check("α = 1 at the cutoff", frozen.mtf(wl, d, d / wl), 1.0, 1e-12);
}

#[test]
fn a_frame_shorter_than_the_airs_time_scale_is_short_exposure() {
    // τ0 = 0.314·r0/v with v = 5 m/s: r0 = 5 cm gives 3.1 ms.
    let choose = |exposure| Exposure::choose(Some(0.05), exposure, 0.01, 550e-9, 1000.0);
    assert!(choose(0.001).is_short());
    assert!(!choose(0.01).is_short());
    // The share of the wander averaged at t = τ0 is one half; α is 0.75 where D = √(λL).
    let tau = 0.314 * 0.05 / 5.0;
    let fresnel = (550e-9f64 * 1000.0).sqrt();
    match Exposure::choose(Some(0.05), tau, fresnel, 550e-9, 1000.0) {
        Exposure::Air { alpha, tilt_share, .. } => {
            check("share at τ0", tilt_share, 0.5, 1e-12);
            check("α at the Fresnel scale", alpha, 0.75, 1e-12);
        }
        Exposure::Clear => panic!("the path has turbulence"),
    }
    assert_eq!(Exposure::choose(None, 0.001, 0.01, 550e-9, 1000.0), Exposure::Clear);
}

#[test]
fn the_niirs_of_a_drone_camera_is_flagged_when_q_is_below_one() {
    let setup = nadir(0.0088, 4.0, 2.41e-6, 80.0); // Q = 0.91
    let e = evaluate(&setup);
    let q = quality(&setup, &e);
    assert!(q.caveats.sampling && !q.caveats.band && !q.caveats.snr && !q.caveats.elevation);
    assert!(q.niirs.is_finite() && q.rer > 0.0 && q.rer <= 1.0);
    check(
        "NIIRS from its parts",
        q.niirs,
        giqe5(e.gsd_weighted_m, q.rer, 50.0),
        1e-12,
    );
}

proptest! {
    #[test]
    fn the_chain_never_panics_and_stays_finite(setup in common::any_setup()) {
        let e = evaluate(&setup);
        let q = quality(&setup, &e);
        for (name, x) in [
            ("grd", e.grd_m),
            ("grd along", e.grd_along_m),
            ("grd across", e.grd_across_m),
            ("rer", q.rer),
            ("overshoot", q.overshoot),
            ("niirs", q.niirs),
        ] {
            prop_assert!(x.is_finite(), "{} = {} for {:?}", name, x, setup);
        }
        prop_assert!(e.grd_along_m >= e.limits.sampling * (1.0 - 1e-12), "GRD below 2·GSD for {:?}", setup);
        prop_assert!(e.grd_along_m >= e.grd_across_m * (1.0 - 1e-6), "smear made the GRD finer for {:?}", setup);
        prop_assert!((-0.5..=1.5).contains(&q.rer), "RER {} for {:?}", q.rer, setup);
    }
}
