//! The resolution engine on worked geometry: the GIQE 5.0 GSD definitions, the four limits, which
//! one governs, and how they grow with range.
//!
//! Sources: resolution-model.md §1–§5 — NGA, *General Image Quality Equation (GIQE) Version 5.0*,
//! 2015 (GSD definitions); Born & Wolf §8.5 (Rayleigh); Schmidt 2010 ch. 9 (r0); the 0.98·λ/r0
//! seeing FWHM (common practice in adaptive optics).

mod common;

use proptest::prelude::*;
use proptest::test_runner::FileFailurePersistence;
use sharpfield::core::physics::chain::ChainInputs;
use sharpfield::core::physics::engine::{evaluate, Limit, Limits, Setup};
use sharpfield::core::physics::geometry::Geometry;
use sharpfield::core::physics::turbulence::Profile;
use sharpfield::core::planning::solve::{Axis, Sweep};
use std::f64::consts::PI;

fn check(case: &str, actual: f64, expected: f64) {
    let error = (actual - expected).abs();
    assert!(
        error <= 1e-12 * expected.abs().max(1e-300),
        "{case}: got {actual:e}, expected {expected:e}"
    );
}

/// A 3-4-5 worked example: 4 µm pixels (8 mm over 2000 columns), 50 mm f/4 at 500 nm, 300 m up,
/// 400 m out, so R = 500 m and cos θ = sin ε = 0.6. No air, 10 m/s at 1/500 s.
fn worked() -> Setup {
    Setup {
        sensor_width_m: 0.008,
        sensor_height_m: 0.006,
        cols: 2000,
        rows: 1500,
        focal_m: 0.05,
        f_number: 4.0,
        wavelength_m: 500e-9,
        geometry: Geometry {
            height_m: 300.0,
            ground_distance_m: 400.0,
            ..Geometry::default()
        },
        profile: Profile::None,
        speed_mps: 10.0,
        exposure_s: 1.0 / 500.0,
        turn_rate_rad_s: 0.0,
        target_speed_mps: 0.0,
        chain: ChainInputs::IDEAL,
    }
}

#[test]
fn giqe5_gsd_definitions_on_a_3_4_5_triangle() {
    // GIQE 5.0 §2.3: normal-plane GSD = p·R/f = 4e−6 · 500 / 0.05 = 0.04 m. Ground along the look
    // GSD/cos θ; geometric mean GSD/√(sin ε); GIQE-5 weighted GSD/(sin ε)^(1/4) (eq. 5).
    let e = evaluate(&worked());
    check("pitch", e.pitch_m, 4e-6);
    check("slant range", e.slant_range_m, 500.0);
    check("look angle", e.look_angle_deg, (4.0f64 / 3.0).atan().to_degrees());
    check("GSD", e.gsd_m, 0.04);
    check("ground GSD along the look", e.gsd_ground_m, 0.04 / 0.6);
    check("geometric-mean GSD", e.gsd_geomean_m, 0.04 / 0.6f64.sqrt());
    check("weighted GSD", e.gsd_weighted_m, 0.04 / 0.6f64.powf(0.25));
}

#[test]
fn gsd_definitions_over_look_angles() {
    // (look angle from straight down in degrees); sin ε = cos θ by definition of ε = 90° − θ.
    for degrees in [0.0, 10.0, 30.0, 45.0, 60.0, 75.0, 85.0] {
        let theta = f64::to_radians(degrees);
        let setup = Setup {
            geometry: Geometry::tilted(120.0, theta),
            ..worked()
        };
        let e = evaluate(&setup);
        let range = 120.0 / theta.cos();
        let gsd = 4e-6 * range / 0.05;
        let case = format!("tilt {degrees}°");
        assert!((e.slant_range_m - range).abs() <= 1e-9 * range, "{case}: range");
        assert!((e.gsd_m - gsd).abs() <= 1e-12 * gsd, "{case}: GSD");
        assert!(
            (e.gsd_ground_m - gsd / theta.cos()).abs() <= 1e-9 * gsd / theta.cos(),
            "{case}: ground"
        );
        let geomean = gsd / theta.cos().sqrt();
        assert!(
            (e.gsd_geomean_m - geomean).abs() <= 1e-9 * geomean,
            "{case}: geometric mean"
        );
        let weighted = gsd / theta.cos().powf(0.25);
        assert!(
            (e.gsd_weighted_m - weighted).abs() <= 1e-9 * weighted,
            "{case}: weighted"
        );
        // Ordering follows from sin ε ≤ 1: normal ≤ weighted ≤ geometric mean ≤ ground.
        assert!(e.gsd_m <= e.gsd_weighted_m * (1.0 + 1e-15));
        assert!(e.gsd_weighted_m <= e.gsd_geomean_m * (1.0 + 1e-15));
        assert!(e.gsd_geomean_m <= e.gsd_ground_m * (1.0 + 1e-15));
    }
}

#[test]
fn the_four_limits_of_the_worked_example() {
    let e = evaluate(&worked());
    // Rayleigh: 1.2196698912665045 · λ/D · R with D = 50 mm / 4 (Born & Wolf §8.5).
    let rayleigh = 1.219_669_891_266_504_5 * 500e-9 / 0.0125;
    check("Rayleigh angle", e.rayleigh_rad, rayleigh);
    check("diffraction", e.limits.diffraction, rayleigh * 500.0);
    // No air: no r0 and no seeing limit.
    assert_eq!(e.r0_m, None);
    assert_eq!(e.limits.turbulence, 0.0);
    // Motion: 10 m/s × 1/500 s = 2 cm, half a 4 cm pixel.
    check("motion", e.limits.motion, 0.02);
    check("motion in pixels", e.motion_px, 0.5);
    // Q = λN/p = 500e−9 · 4 / 4e−6 = 0.5 (GIQE 5.0).
    check("Q", e.q, 0.5);
    // Sampling passes periods down to 2·GSD = 8 cm (Nyquist; resolution-model §5) and governs,
    // 0.08 / 0.0243933… times the runner-up, diffraction.
    check("sampling", e.limits.sampling, 0.08);
    assert_eq!(e.governing, Limit::Sampling);
    assert_eq!(e.runner_up, Limit::Diffraction);
    check("limit", e.limit_m, 0.08);
    check("margin", e.margin, 0.08 / (rayleigh * 500.0));
}

#[test]
fn motion_adds_the_turning_rate_and_the_target_speed() {
    // Smear on the target (resolution-model §4): ground speed × t + target speed × t + ω·t·R.
    // 10 m/s and 2 m/s at 1/500 s, and 1°/s at R = 500 m: 0.02 + 0.004 + 0.0174533/500·500·…
    let setup = Setup {
        turn_rate_rad_s: 1f64.to_radians(),
        target_speed_mps: 2.0,
        ..worked()
    };
    let e = evaluate(&setup);
    let expected = (10.0 + 2.0 + 1f64.to_radians() * 500.0) / 500.0;
    check("motion", e.limits.motion, expected);
    check("motion in pixels", e.motion_px, expected / 0.04);
}

#[test]
fn sampling_and_diffraction_cross_at_q_1_64() {
    // 2·p·R/f = (j₁,₁/π)·λ·N·R/f ⇔ Q = λN/p = 2π/j₁,₁ = 1.6398 (resolution-model §5), so the
    // limit that governs between the two always agrees with the regime Q names.
    let q_cross = 2.0 * PI / 3.831_705_970_207_512_5;
    for (q, governs) in [(q_cross * 0.99, Limit::Sampling), (q_cross * 1.01, Limit::Diffraction)] {
        // Q = λN/p with λ = 500 nm and p = 4 µm: N = Q·p/λ.
        let setup = Setup {
            f_number: q * 4e-6 / 500e-9,
            speed_mps: 0.0,
            ..worked()
        };
        let e = evaluate(&setup);
        assert_eq!(e.governing, governs, "Q = {q}");
        let regime = sharpfield::core::physics::optics::sampling_regime(e.q);
        let detector = regime == sharpfield::core::physics::optics::SamplingRegime::DetectorLimited;
        assert_eq!(detector, governs == Limit::Sampling, "Q = {q}: {regime:?}");
    }
}

#[test]
fn seeing_limit_with_a_constant_cn2_matches_the_closed_form() {
    // Constant Cn² over the path: r0 = (0.423·k²·Cn²·R·3/8)^(−3/5) (Schmidt 2010 ch. 9) and the
    // seeing limit 0.98·λ/r0·R (resolution-model §3).
    for cn2 in [1e-15, 1e-14, 1e-13] {
        let setup = Setup {
            profile: Profile::PowerLaw {
                cn2_at_1m: cn2,
                exponent: 0.0,
            },
            ..worked()
        };
        let e = evaluate(&setup);
        let k = 2.0 * PI / 500e-9;
        let r0 = (0.423 * k * k * cn2 * 500.0 * 3.0 / 8.0).powf(-0.6);
        let r0_engine = e.r0_m.unwrap_or(f64::NAN);
        assert!(
            (r0_engine - r0).abs() <= 1e-6 * r0,
            "Cn² {cn2:e}: r0 {r0_engine} vs {r0}"
        );
        let seeing = 0.98 * 500e-9 / r0 * 500.0;
        assert!(
            (e.limits.turbulence - seeing).abs() <= 1e-6 * seeing,
            "Cn² {cn2:e}: seeing"
        );
    }
}

#[test]
fn governing_is_the_largest_and_ties_keep_the_display_order() {
    // (sampling, diffraction, turbulence, motion) → ranking, largest first.
    let cases = [
        (
            (4.0, 3.0, 2.0, 1.0),
            [Limit::Sampling, Limit::Diffraction, Limit::Turbulence, Limit::Motion],
        ),
        (
            (1.0, 2.0, 3.0, 4.0),
            [Limit::Motion, Limit::Turbulence, Limit::Diffraction, Limit::Sampling],
        ),
        (
            (1.0, 1.0, 0.0, 0.0),
            [Limit::Sampling, Limit::Diffraction, Limit::Turbulence, Limit::Motion],
        ),
        (
            (0.0, 0.0, 5.0, 5.0),
            [Limit::Turbulence, Limit::Motion, Limit::Sampling, Limit::Diffraction],
        ),
    ];
    for ((sampling, diffraction, turbulence, motion), expected) in cases {
        let limits = Limits {
            sampling,
            diffraction,
            turbulence,
            motion,
        };
        assert_eq!(limits.ranked(), expected, "{limits:?}");
        assert_eq!(limits.governing().0, expected[0]);
    }
}

/// The setups the sweeps start from: every air model, a nadir drone and a mast.
fn sweep_bases() -> Vec<(String, Setup)> {
    let profiles = common::named_profiles();
    let mut bases = Vec::new();
    for (name, profile) in profiles {
        for (place, geometry) in [
            (
                "nadir 80 m",
                Geometry {
                    height_m: 80.0,
                    ground_distance_m: 0.0,
                    ..Geometry::default()
                },
            ),
            ("tilted 60°", Geometry::tilted(100.0, 60f64.to_radians())),
            (
                "mast 8 m",
                Geometry {
                    height_m: 8.0,
                    ground_distance_m: 1500.0,
                    ..Geometry::default()
                },
            ),
        ] {
            bases.push((
                format!("{name}, {place}"),
                Setup {
                    geometry,
                    profile,
                    ..worked()
                },
            ));
        }
    }
    bases
}

#[test]
fn each_limit_grows_with_range() {
    // Along a height sweep at a fixed look angle, and along a ground-distance sweep at a fixed
    // height, every limit is non-decreasing with slant range (motion stays constant).
    for (name, base) in sweep_bases() {
        for axis in [Axis::Height, Axis::GroundDistance] {
            let sweep = Sweep::new(base, axis);
            let (lo, hi) = axis.domain();
            let mut previous: Option<(f64, Limits, f64)> = None;
            for i in 0..=400 {
                let x = lo * (hi / lo).powf(i as f64 / 400.0);
                let e = evaluate(&sweep.setup_at(x));
                if let Some((x0, before, range0)) = previous {
                    assert!(e.slant_range_m >= range0, "{name}, {axis:?}: range falls at {x}");
                    for limit in Limit::ALL {
                        let (a, b) = (before.get(limit), e.limits.get(limit));
                        assert!(
                            b >= a * (1.0 - 1e-9),
                            "{name}, {axis:?}: {limit:?} falls from {a:e} at {x0} m to {b:e} at {x} m"
                        );
                    }
                    assert_eq!(e.limits.motion, before.motion);
                }
                previous = Some((x, e.limits, e.slant_range_m));
            }
        }
    }
}

#[test]
fn every_figure_is_finite_at_the_edges_of_the_valid_ranges() {
    // The extremes the scenario accepts: 0.1 m to 20 km up, tilt up to 85°, up to 100 km out,
    // the finest and coarsest pixels, wavelengths from 200 nm to 20 µm, the strongest turbulence.
    let profiles = [
        Profile::None,
        Profile::HV57,
        Profile::SlcDay,
        Profile::SlcNight,
        Profile::PowerLaw {
            cn2_at_1m: 1e-11,
            exponent: 0.0,
        },
        Profile::PowerLaw {
            cn2_at_1m: 1e-18,
            exponent: -3.0,
        },
    ];
    let geometries = [
        Geometry {
            height_m: 0.1,
            ground_distance_m: 0.0,
            ..Geometry::default()
        },
        Geometry {
            height_m: 0.1,
            ground_distance_m: 100_000.0,
            ..Geometry::default()
        },
        Geometry {
            height_m: 20_000.0,
            ground_distance_m: 0.0,
            ..Geometry::default()
        },
        Geometry {
            height_m: 20_000.0,
            ground_distance_m: 100_000.0,
            ..Geometry::default()
        },
        Geometry::tilted(0.1, 85f64.to_radians()),
        Geometry::tilted(20_000.0, 85f64.to_radians()),
    ];
    // (sensor width m, cols, focal m, f-number, wavelength m)
    let optics = [
        (0.0001, 100_000, 0.0005, 0.5, 200e-9),
        (0.2, 16, 5.0, 64.0, 20e-6),
        (0.2, 100_000, 0.0005, 64.0, 20e-6),
    ];
    for profile in profiles {
        for geometry in geometries {
            for (sw, cols, focal, fnum, wl) in optics {
                for (speed, exposure) in [(0.0, 1e-6), (150.0, 10.0)] {
                    let setup = Setup {
                        sensor_width_m: sw,
                        sensor_height_m: sw,
                        cols,
                        rows: cols,
                        focal_m: focal,
                        f_number: fnum,
                        wavelength_m: wl,
                        geometry,
                        profile,
                        speed_mps: speed,
                        exposure_s: exposure,
                        turn_rate_rad_s: 0.0,
                        target_speed_mps: 0.0,
                        chain: ChainInputs::IDEAL,
                    };
                    let e = evaluate(&setup);
                    let figures = [
                        e.pitch_m,
                        e.aperture_m,
                        e.slant_range_m,
                        e.look_angle_deg,
                        e.gsd_m,
                        e.gsd_ground_m,
                        e.gsd_geomean_m,
                        e.gsd_weighted_m,
                        e.rayleigh_rad,
                        e.r0_m.unwrap_or(1.0),
                        e.seeing_rad,
                        e.motion_px,
                        e.limit_m,
                        e.margin,
                        e.q,
                        e.limits.sampling,
                        e.limits.diffraction,
                        e.limits.turbulence,
                        e.limits.motion,
                    ];
                    assert!(
                        figures.iter().all(|x| x.is_finite() && *x >= 0.0),
                        "{setup:?}: {figures:?}"
                    );
                    assert!(e.limit_m > 0.0, "{setup:?}: no limit");
                    if !profile.is_none() {
                        assert!(e.r0_m.is_some_and(|r| r > 0.0), "{setup:?}: r0 missing");
                    }
                }
            }
        }
    }
}

// ---------------------------------------------------------------------------------------------
// The same properties on random setups across the valid ranges of the scenario
// ---------------------------------------------------------------------------------------------

proptest! {
    #![proptest_config(ProptestConfig {
        cases: 256,
        failure_persistence: Some(Box::new(FileFailurePersistence::Direct("proptest-regressions/engine.txt"))),
        ..ProptestConfig::default()
    })]

    #[test]
    fn limits_grow_with_range_on_random_setups(setup in common::any_setup(), axis_is_height in any::<bool>()) {
        // ∫₀^R Cn²(z)·z^(5/3) dz only grows with R, so the seeing limit R·0.98λ/r0 cannot fall; the
        // other limits are proportional to R or constant. 1e−6 allows for the path integral's own
        // error (about 1e−7 at worst, tests/turbulence.rs), which jumps as its pieces change.
        let axis = if axis_is_height { Axis::Height } else { Axis::GroundDistance };
        let sweep = Sweep::new(setup, axis);
        let (lo, hi) = axis.domain();
        let mut before = evaluate(&sweep.setup_at(lo)).limits;
        for i in 1..=300 {
            let x = lo * (hi / lo).powf(i as f64 / 300.0);
            let now = evaluate(&sweep.setup_at(x)).limits;
            for limit in Limit::ALL {
                prop_assert!(
                    now.get(limit) >= before.get(limit) * (1.0 - 1e-6),
                    "{:?} falls from {:e} to {:e} at {} m", limit, before.get(limit), now.get(limit), x
                );
            }
            before = now;
        }
    }
}
