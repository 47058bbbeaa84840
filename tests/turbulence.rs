//! Optical turbulence: closed forms, the published Hufnagel–Valley table, the accuracy of the path
//! integral against an independent quadrature, and the properties the model must have.
//!
//! Sources: resolution-model.md §3 — Fried, JOSA 56 (1966); J. D. Schmidt, *Numerical Simulation
//! of Optical Wave Propagation*, SPIE 2010, ch. 9; Valley, Appl. Opt. 19 (1980); R. R. Sasiela,
//! *Electromagnetic Wave Propagation in Turbulence* (HV table); L. C. Andrews, *Field Guide to
//! Atmospheric Optics* (SLC).

use sharpfield::core::physics::turbulence::{self, Profile, SlantPath};
use std::f64::consts::PI;

/// Asserts |actual − expected| ≤ tolerance·|expected|, naming the case.
fn check_relative(case: &str, actual: f64, expected: f64, tolerance: f64) {
    let error = (actual - expected).abs() / expected.abs();
    assert!(
        error <= tolerance,
        "{case}: got {actual:e}, expected {expected:e} (relative error {error:e} > {tolerance:e})"
    );
}

fn wavenumber(wavelength_m: f64) -> f64 {
    2.0 * PI / wavelength_m
}

const HV57: Profile = Profile::HV57;
const POWER_DAY: Profile = Profile::PowerLaw {
    cn2_at_1m: 1e-13,
    exponent: -4.0 / 3.0,
};
const POWER_NIGHT: Profile = Profile::PowerLaw {
    cn2_at_1m: 1e-14,
    exponent: -2.0 / 3.0,
};
/// The steepest exponent the scenario accepts (cexp = −3), over hot ground: the most singular case.
const POWER_STEEP: Profile = Profile::PowerLaw {
    cn2_at_1m: 1e-12,
    exponent: -3.0,
};

/// Every profile the engine offers, plus the extreme cases the scenario can ask for.
const PROFILES: [(&str, Profile); 8] = [
    ("HV 5/7", HV57),
    (
        "HV-72",
        Profile::HufnagelValley {
            wind_mps: 72.0,
            ground_cn2: 1.7e-14,
        },
    ),
    ("SLC-Day", Profile::SlcDay),
    ("SLC-Night", Profile::SlcNight),
    ("power −4/3", POWER_DAY),
    ("power −2/3", POWER_NIGHT),
    ("power −3", POWER_STEEP),
    (
        "power 0 (constant)",
        Profile::PowerLaw {
            cn2_at_1m: 1e-14,
            exponent: 0.0,
        },
    ),
];

// ---------------------------------------------------------------------------------------------
// Closed forms for a constant Cn² (Schmidt 2010, ch. 9)
// ---------------------------------------------------------------------------------------------

fn constant(cn2: f64) -> Profile {
    Profile::PowerLaw {
        cn2_at_1m: cn2,
        exponent: 0.0,
    }
}

#[test]
fn constant_cn2_spherical_and_plane_wave_r0_match_the_closed_forms() {
    // (Cn², camera altitude m, path length m, wavelength m)
    let cases = [
        (1e-14, 80.0, 80.0, 550e-9),
        (1e-13, 8.0, 1500.0, 550e-9),
        (1e-15, 2.0, 20_000.0, 850e-9),
        (1e-12, 0.1, 0.1, 10e-6),
        (3e-14, 10_000.0, 12_000.0, 1550e-9),
    ];
    for (cn2, altitude, length, wl) in cases {
        let path = SlantPath {
            camera_altitude_m: altitude,
            length_m: length,
            ..SlantPath::default()
        };
        let k = wavenumber(wl);
        let sphere = (0.423 * k * k * cn2 * length * 3.0 / 8.0).powf(-3.0 / 5.0);
        let plane = (0.423 * k * k * cn2 * length).powf(-3.0 / 5.0);
        let case = format!("Cn² {cn2:e}, h {altitude} m, L {length} m, λ {wl:e}");
        let r0 = turbulence::spherical_wave_r0(&constant(cn2), path, wl).unwrap_or(f64::NAN);
        check_relative(&format!("{case}: spherical"), r0, sphere, 1e-6);
        // For a constant profile the weighting (z/R)^(5/3) and its mirror image integrate alike.
        // The weights (z/R)^(5/3) and (1 − z/R)^(5/3) are integrated numerically (the engine's
        // Gauss–Legendre pieces leave ~7e−8 on these), hence 1e−6 rather than rounding.
        let up = turbulence::spherical_wave_r0_looking_up(&constant(cn2), path, wl).unwrap_or(f64::NAN);
        check_relative(&format!("{case}: looking up"), up, sphere, 1e-6);
        let pw = turbulence::plane_wave_r0(&constant(cn2), path, wl).unwrap_or(f64::NAN);
        check_relative(&format!("{case}: plane"), pw, plane, 1e-6);
        // Schmidt 2010 ch. 9: r0,sphere / r0,plane = (3/8)^(−3/5) = 1.8012800513608178.
        check_relative(&format!("{case}: ratio"), r0 / pw, 1.801_280_051_360_817_8, 1e-6);
    }
    check_relative(
        "(3/8)^(−3/5)",
        (3.0f64 / 8.0).powf(-0.6),
        1.801_280_051_360_817_8,
        1e-15,
    );
}

// ---------------------------------------------------------------------------------------------
// The published Hufnagel–Valley table (Sasiela, as reproduced in the Arroyo library's
// documentation and in resolution-model.md §3): zenith plane-wave r0 and θ0 at 0.5 µm.
// ---------------------------------------------------------------------------------------------

#[test]
fn hufnagel_valley_table_of_sasiela() {
    // (wind m/s, r0 cm, θ0 µrad); ground Cn² 1.7e−14 m^(−2/3).
    let table = [
        (21.0, 4.96, 6.90),
        (35.0, 4.67, 3.95),
        (54.0, 4.18, 2.40),
        (72.0, 3.70, 1.71),
    ];
    // The table is printed to 0.01, so half a unit (0.005) would be its rounding. The engine lands
    // within 0.005 on four of the eight figures and within 0.008 on the other four (HV-35 r0
    // 4.6754, HV-54 r0 4.1854, HV-21 θ0 6.8946, HV-35 θ0 3.9578), which scatter both ways. The
    // moments of the same profile in closed form (next test) give the same numbers to 1e−4, so
    // the engine integrates the HV form as written. While writing this test we looked for a single
    // change that would bring all eight within 0.005 — the isoplanatic coefficient anywhere from
    // 2.85 to 3.00 together with the wind term's 5.94e−53 varied by ±3 % — and none does (the four
    // θ0 ratios table/exact, 1.0008, 0.9980, 0.9999, 0.9996, admit no common factor within their
    // rounding); the table itself is good to about 0.2 %. Hence ±0.01, one unit of the table.
    for (wind, r0_cm, theta0_urad) in table {
        let hv = Profile::HufnagelValley {
            wind_mps: wind,
            ground_cn2: 1.7e-14,
        };
        let r0 = turbulence::zenith_plane_wave_r0(&hv, 0.5e-6).unwrap_or(f64::NAN) * 100.0;
        let theta0 = turbulence::zenith_isoplanatic_angle(&hv, 0.5e-6).unwrap_or(f64::NAN) * 1e6;
        assert!((r0 - r0_cm).abs() <= 0.01, "HV-{wind}: r0 {r0:.4} cm, table {r0_cm}");
        assert!(
            (theta0 - theta0_urad).abs() <= 0.01,
            "HV-{wind}: θ0 {theta0:.4} µrad, table {theta0_urad}"
        );
    }
}

#[test]
fn hufnagel_valley_moments_match_their_closed_forms() {
    // Each HV term integrates in closed form: ∫ A·e^(−h/H)·h^m dh = A·Γ(m+1)·H^(m+1), and the wind
    // term 5.94e−53·(W/27)²·h^10·e^(−h/1000) gives 5.94e−53·(W/27)²·Γ(11+m)·1000^(11+m)
    // (Valley 1980). Γ(8/3) and Γ(38/3) are computed by libm's tgamma.
    for wind in [21.0, 35.0, 54.0, 72.0] {
        let hv = Profile::HufnagelValley {
            wind_mps: wind,
            ground_cn2: 1.7e-14,
        };
        let w = (wind / 27.0) * (wind / 27.0);
        let mu0 = 1.7e-14 * 100.0 + 2.7e-16 * 1500.0 + 5.94e-53 * w * libm::tgamma(11.0) * 1000f64.powi(11);
        let mu53 = libm::tgamma(8.0 / 3.0) * (1.7e-14 * 100f64.powf(8.0 / 3.0) + 2.7e-16 * 1500f64.powf(8.0 / 3.0))
            + 5.94e-53 * w * libm::tgamma(11.0 + 5.0 / 3.0) * 1000f64.powf(11.0 + 5.0 / 3.0);
        let k = wavenumber(0.5e-6);
        let r0 = (0.423 * k * k * mu0).powf(-0.6);
        let theta0 = (2.914 * k * k * mu53).powf(-0.6);
        let case = format!("HV-{wind}");
        let engine_r0 = turbulence::zenith_plane_wave_r0(&hv, 0.5e-6).unwrap_or(f64::NAN);
        let engine_theta0 = turbulence::zenith_isoplanatic_angle(&hv, 0.5e-6).unwrap_or(f64::NAN);
        // The engine's 10-point Gauss–Legendre pieces leave ~6e−5 on θ0 (the h^(5/3)-weighted
        // integrand peaks near 12 km on a 15–30 km piece); the goal is 0.1 %.
        check_relative(&format!("{case} r0"), engine_r0, r0, 1e-5);
        check_relative(&format!("{case} θ0"), engine_theta0, theta0, 1e-4);
    }
}

// ---------------------------------------------------------------------------------------------
// Accuracy of the path integral against an independent reference quadrature
// ---------------------------------------------------------------------------------------------

/// ∫₀¹ Cn²(top·u)·weight(u) du by adaptive double-exponential quadrature (the `quadrature` crate),
/// split at the profile's breakpoints and, independently of the engine's own grading, at every
/// decade of height from 1 cm to 10 km, with a tolerance 1e−12 of the integral's size.
fn reference_unit_path(profile: &Profile, top: f64, weight: &dyn Fn(f64) -> f64) -> f64 {
    let mut cuts = vec![0.0, 1.0];
    let decades = [0.01, 0.1, 1.0, 10.0, 100.0, 1000.0, 10_000.0];
    for &b in profile.breakpoints().iter().chain(decades.iter()) {
        if b < top {
            cuts.push(b / top);
        }
    }
    cuts.sort_by(f64::total_cmp);
    cuts.dedup();
    // Scale so that the absolute tolerance of the quadrature means something.
    let scale = profile.cn2(0.0).max(1e-30);
    let integrand = |u: f64| profile.cn2(top * u) / scale * weight(u);
    let pass = |tolerance: f64| -> (f64, f64) {
        cuts.windows(2)
            .map(|w| {
                let out = quadrature::double_exponential::integrate(integrand, w[0], w[1], tolerance);
                (out.integral, out.error_estimate)
            })
            .fold((0.0, 0.0), |(s, e), (i, err)| (s + i, e + err))
    };
    let (rough, _) = pass(1e-6);
    let (integral, error) = pass(rough.abs().max(1e-300) * 1e-12);
    assert!(
        error <= 1e-9 * integral.abs(),
        "reference quadrature did not converge: top {top}, integral {integral:e}, error {error:e}"
    );
    integral * scale
}

/// Heights of the camera above the target (m): the valid range of the scenario (0.1 m up to
/// 20 km), masts of 2–10 m, and the heights where the profiles change form.
const TOPS: [f64; 17] = [
    0.1, 0.5, 1.0, 2.0, 5.0, 10.0, 18.5, 30.0, 100.0, 240.0, 300.0, 1000.0, 1500.0, 3000.0, 7200.0, 10_000.0, 20_000.0,
];

#[test]
fn unit_path_integral_within_a_thousandth_of_the_reference() {
    let weights: [(&str, &dyn Fn(f64) -> f64); 3] = [
        ("looking down (u^5/3)", &|u| u.powf(5.0 / 3.0)),
        ("looking up ((1−u)^5/3)", &|u| (1.0 - u).powf(5.0 / 3.0)),
        ("plane wave (1)", &|_| 1.0),
    ];
    let mut worst = (0.0, String::new());
    for (name, profile) in PROFILES {
        for top in TOPS {
            for (label, weight) in weights {
                let engine = turbulence::integrate_unit_path(&profile, top, weight);
                let reference = reference_unit_path(&profile, top, weight);
                let error = (engine - reference).abs() / reference;
                if error > worst.0 {
                    worst = (error, format!("{name}, top {top} m, {label}"));
                }
                check_relative(&format!("{name}, top {top} m, {label}"), engine, reference, 1e-3);
            }
        }
    }
    println!(
        "worst relative error of integrate_unit_path: {:e} ({})",
        worst.0, worst.1
    );
}

#[test]
fn spherical_wave_r0_of_slant_and_nadir_paths_within_a_thousandth() {
    // (camera height m, ground distance m): nadir drones from 1 m to 20 km, and masts of 2–10 m
    // looking at targets 100 m to 20 km away (near-horizontal paths close to the ground).
    let mut paths = vec![];
    for h in [1.0, 10.0, 100.0, 1000.0, 5000.0, 20_000.0] {
        paths.push((h, 0.0));
    }
    for h in [2.0, 5.0, 10.0] {
        for g in [100.0, 1000.0, 5000.0, 20_000.0] {
            paths.push((h, g));
        }
    }
    paths.push((120.0, 300.0));
    for (name, profile) in PROFILES {
        for &(h, g) in &paths {
            let length = f64::hypot(h, g);
            let path = SlantPath {
                camera_altitude_m: h,
                length_m: length,
                ..SlantPath::default()
            };
            let k = wavenumber(550e-9);
            let reference = |weight: &dyn Fn(f64) -> f64| {
                (0.423 * k * k * length * reference_unit_path(&profile, h, weight)).powf(-0.6)
            };
            let case = format!("{name}, h {h} m, g {g} m");
            let down = turbulence::spherical_wave_r0(&profile, path, 550e-9).unwrap_or(f64::NAN);
            check_relative(&format!("{case}: r0"), down, reference(&|u| u.powf(5.0 / 3.0)), 1e-3);
            let up = turbulence::spherical_wave_r0_looking_up(&profile, path, 550e-9).unwrap_or(f64::NAN);
            check_relative(
                &format!("{case}: r0 looking up"),
                up,
                reference(&|u| (1.0 - u).powf(5.0 / 3.0)),
                1e-3,
            );
        }
    }
}

#[test]
fn zenith_figures_within_a_thousandth_of_the_reference() {
    for (name, profile) in PROFILES {
        let top = turbulence::TOP_OF_TURBULENCE_M;
        let k = wavenumber(0.5e-6);
        let plane = (0.423 * k * k * top * reference_unit_path(&profile, top, &|_| 1.0)).powf(-0.6);
        let iso = (2.914 * k * k * top * reference_unit_path(&profile, top, &|u| (top * u).powf(5.0 / 3.0))).powf(-0.6);
        let r0 = turbulence::zenith_plane_wave_r0(&profile, 0.5e-6).unwrap_or(f64::NAN);
        let theta0 = turbulence::zenith_isoplanatic_angle(&profile, 0.5e-6).unwrap_or(f64::NAN);
        check_relative(&format!("{name}: zenith r0"), r0, plane, 1e-3);
        check_relative(&format!("{name}: θ0"), theta0, iso, 1e-3);
    }
}

// ---------------------------------------------------------------------------------------------
// Properties
// ---------------------------------------------------------------------------------------------

#[test]
fn a_camera_looking_down_sees_a_larger_r0_than_one_looking_up() {
    // Schmidt 2010 ch. 9; Flenniken 1983: turbulence next to the object weighs 0, next to the
    // camera 1, and every profile here is strongest near the ground.
    for (name, profile) in PROFILES {
        if matches!(profile, Profile::PowerLaw { exponent, .. } if exponent == 0.0) {
            continue; // A constant profile is symmetric: checked equal above.
        }
        for (h, g) in [
            (2.0, 0.0),
            (10.0, 1000.0),
            (80.0, 0.0),
            (300.0, 400.0),
            (3000.0, 0.0),
            (20_000.0, 5000.0),
        ] {
            let path = SlantPath {
                camera_altitude_m: h,
                length_m: f64::hypot(h, g),
                ..SlantPath::default()
            };
            let down = turbulence::spherical_wave_r0(&profile, path, 550e-9).unwrap_or(f64::NAN);
            let up = turbulence::spherical_wave_r0_looking_up(&profile, path, 550e-9).unwrap_or(f64::NAN);
            // Where the profile is constant along the whole path (SLC below 18.5 m) the two are
            // equal; elsewhere looking down must win by more than the integrator's error.
            let varies = profile.cn2(h) < profile.cn2(0.0);
            let margin = if varies { 1.0 + 1e-6 } else { 1.0 - 1e-6 };
            assert!(
                down > up * margin,
                "{name}, h {h} m, g {g} m: looking down {down:e}, looking up {up:e}"
            );
        }
    }
}

#[test]
fn r0_scales_as_the_six_fifths_power_of_wavelength() {
    // Fried 1966: r0 ∝ λ^(6/5), because k² enters to the power −3/5.
    let path = SlantPath {
        camera_altitude_m: 8.0,
        length_m: 1500.0,
        ..SlantPath::default()
    };
    for (name, profile) in PROFILES {
        let base = turbulence::spherical_wave_r0(&profile, path, 500e-9).unwrap_or(f64::NAN);
        for wl in [550e-9, 850e-9, 1550e-9, 4e-6, 10e-6] {
            let r0 = turbulence::spherical_wave_r0(&profile, path, wl).unwrap_or(f64::NAN);
            check_relative(&format!("{name} at {wl:e}"), r0 / base, (wl / 500e-9).powf(1.2), 1e-12);
        }
    }
}

#[test]
fn seeing_blur_and_long_exposure_mtf() {
    // Seeing FWHM 0.98·λ/r0 (resolution-model §3, common practice in adaptive optics); the
    // long-exposure MTF exp[−3.44(λξ/r0)^(5/3)] is e^(−3.44) at ξ = r0/λ (Fried 1966).
    let cases = [(550e-9, 0.05), (10e-6, 1.2), (850e-9, 0.003)];
    for (wl, r0) in cases {
        check_relative("seeing", turbulence::seeing_angle(wl, Some(r0)), 0.98 * wl / r0, 1e-15);
        check_relative(
            "MTF at r0/λ",
            turbulence::long_exposure_mtf(wl, Some(r0), r0 / wl),
            (-3.44f64).exp(),
            1e-14,
        );
        assert_eq!(turbulence::long_exposure_mtf(wl, Some(r0), 0.0), 1.0);
    }
    assert_eq!(turbulence::seeing_angle(550e-9, None), 0.0);
    assert_eq!(turbulence::long_exposure_mtf(550e-9, None, 1e6), 1.0);
}

#[test]
fn no_turbulence_and_degenerate_paths_give_no_r0() {
    let path = SlantPath {
        camera_altitude_m: 80.0,
        length_m: 80.0,
        ..SlantPath::default()
    };
    assert_eq!(turbulence::spherical_wave_r0(&Profile::None, path, 550e-9), None);
    let degenerate = [
        (0.0, 550e-9),
        (-1.0, 550e-9),
        (f64::NAN, 550e-9),
        (80.0, 0.0),
        (80.0, f64::NAN),
    ];
    for (length, wl) in degenerate {
        let path = SlantPath {
            camera_altitude_m: 80.0,
            length_m: length,
            ..SlantPath::default()
        };
        assert_eq!(
            turbulence::spherical_wave_r0(&HV57, path, wl),
            None,
            "L {length}, λ {wl}"
        );
    }
    for altitude in [f64::NAN, f64::INFINITY, -5.0] {
        for (name, profile) in PROFILES {
            let value = profile.cn2(altitude);
            assert!(value.is_finite() && value >= 0.0, "{name}: Cn²({altitude}) = {value}");
        }
    }
}

#[test]
fn profiles_follow_their_published_forms() {
    // (profile, height m, Cn²): Andrews' SLC tables and Valley's HV form evaluated by hand.
    let hv_at_1000 = 0.00594 * (21.0f64 / 27.0).powi(2) * 1e-20 * (-1.0f64).exp()
        + 2.7e-16 * (-1000.0f64 / 1500.0).exp()
        + 1.7e-14 * (-10.0f64).exp();
    let cases = [
        (Profile::SlcDay, 10.0, 1.7e-14),
        (Profile::SlcDay, 100.0, 3.13e-13 / 100f64.powf(1.05)),
        (Profile::SlcDay, 500.0, 1.3e-15),
        (Profile::SlcDay, 1000.0, 8.87e-7 / 1e9),
        (Profile::SlcDay, 10_000.0, 2e-16 / 100.0),
        (Profile::SlcNight, 10.0, 8.4e-15),
        (Profile::SlcNight, 100.0, 2.87e-12 / 1e4),
        (Profile::SlcNight, 1000.0, 2.5e-16),
        (Profile::SlcNight, 2000.0, 8.87e-7 / 8e9),
        (Profile::SlcNight, 10_000.0, 2e-16 / 100.0),
        (HV57, 0.0, 1.7e-14 + 2.7e-16),
        (HV57, 1000.0, hv_at_1000),
        (POWER_DAY, 0.5, 1e-13),
        (POWER_DAY, 8.0, 1e-13 / 16.0),
        (POWER_NIGHT, 8.0, 1e-14 / 4.0),
    ];
    for (profile, h, expected) in cases {
        check_relative(&format!("{profile:?} at {h} m"), profile.cn2(h), expected, 1e-14);
    }
}

#[test]
fn rytov_variance_of_a_constant_cn2_path_matches_the_closed_form() {
    // Plane wave, constant Cn²: σ_R² = 1.23·Cn²·k^(7/6)·L^(11/6) (Andrews & Phillips 2005;
    // resolution-model §5.2), 1.23 being 2.25 · 6/11 = 1.2273 rounded.
    for (cn2, length) in [(1e-15, 500.0), (1e-14, 1500.0), (1e-13, 3000.0)] {
        let path = SlantPath {
            camera_altitude_m: 8.0,
            length_m: length,
            ..SlantPath::default()
        };
        let k = wavenumber(550e-9);
        let expected = 2.25 * 6.0 / 11.0 * cn2 * k.powf(7.0 / 6.0) * f64::powf(length, 11.0 / 6.0);
        let engine = turbulence::rytov_variance(&constant(cn2), path, 550e-9);
        // The path quadrature is graded towards the ground, not towards the camera end where
        // (1 − u)^(5/6) bends: a few parts in a million, well within the 1e-3 kept for r0.
        check_relative(&format!("Cn² {cn2:e}, {length} m"), engine, expected, 1e-4);
        assert!((2.25 * 6.0 / 11.0 - 1.23f64).abs() < 0.005, "the rounded coefficient");
    }
    // The weighting (L − z)^(5/6) against the reference quadrature on a varying profile.
    let path = SlantPath {
        camera_altitude_m: 300.0,
        length_m: 2000.0,
        ..SlantPath::default()
    };
    let k = wavenumber(1e-6);
    let reference = 2.25
        * k.powf(7.0 / 6.0)
        * f64::powf(2000.0, 11.0 / 6.0)
        * reference_unit_path(&Profile::SlcDay, 300.0, &|u: f64| (1.0 - u).powf(5.0 / 6.0));
    check_relative(
        "SLC-Day slant path",
        turbulence::rytov_variance(&Profile::SlcDay, path, 1e-6),
        reference,
        1e-3,
    );
    assert_eq!(turbulence::rytov_variance(&Profile::None, path, 1e-6), 0.0);
}
