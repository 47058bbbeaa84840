//! Backward solves, checked by going forward again: every answer is re-evaluated with
//! `engine::evaluate` at and around the position or focal length it names.

use proptest::prelude::*;
use proptest::test_runner::FileFailurePersistence;
use sharpfield::core::demo;
use sharpfield::core::engine::{evaluate, Limit, Setup};
use sharpfield::core::geometry::Geometry;
use sharpfield::core::solve::{describe_reach, focal_needed, Axis, Crossing, FocalNeed, Reach, Sweep};
use sharpfield::core::turbulence::Profile;

/// A small step, relative, well above the solves' bisection tolerance (1e−9).
const STEP: f64 = 1e-6;

/// Named starting setups: the two demos and variations across the air models and geometries.
fn bases() -> Vec<(String, Setup)> {
    let survey = demo::pasture_survey().setup();
    let mast = demo::fence_mast().setup();
    let profiles = [
        ("none", Profile::None),
        ("HV 5/7", Profile::HV57),
        ("SLC-Day", Profile::SlcDay),
        ("SLC-Night", Profile::SlcNight),
        (
            "power −4/3, 1e−13",
            Profile::PowerLaw {
                cn2_at_1m: 1e-13,
                exponent: -4.0 / 3.0,
            },
        ),
        (
            "power −2/3, 1e−12",
            Profile::PowerLaw {
                cn2_at_1m: 1e-12,
                exponent: -2.0 / 3.0,
            },
        ),
    ];
    let mut out = Vec::new();
    for (name, profile) in profiles {
        out.push((format!("survey drone, {name}"), Setup { profile, ..survey }));
        out.push((format!("fence mast, {name}"), Setup { profile, ..mast }));
        out.push((
            format!("oblique drone 45°, {name}"),
            Setup {
                profile,
                geometry: Geometry::tilted(100.0, 45f64.to_radians()),
                ..survey
            },
        ));
        out.push((
            format!("thermal mast, {name}"),
            Setup {
                profile,
                wavelength_m: 10e-6,
                sensor_width_m: 0.00768,
                cols: 640,
                focal_m: 0.035,
                f_number: 1.0,
                ..mast
            },
        ));
    }
    out
}

const NEEDS: [f64; 9] = [0.0005, 0.002, 0.005, 0.01, 0.03, 0.1, 0.3, 1.0, 10.0];

fn meets(sweep: &Sweep, x: f64, need: f64) -> bool {
    evaluate(&sweep.setup_at(x)).limit_m <= need
}

#[test]
fn reach_meets_the_need_just_below_and_fails_just_above() {
    let mut seen = [0usize; 3];
    for (name, base) in bases() {
        for axis in [Axis::Height, Axis::GroundDistance] {
            let sweep = Sweep::new(base, axis);
            let (lo, hi) = axis.domain();
            for need in NEEDS {
                let case = format!("{name}, {axis:?}, need {need} m");
                match sweep.reach(need) {
                    Reach::UpTo { position_m, bound_by } => {
                        seen[0] += 1;
                        assert!(
                            (lo..=hi).contains(&position_m),
                            "{case}: {position_m} outside the domain"
                        );
                        assert!(
                            meets(&sweep, position_m * (1.0 - STEP), need),
                            "{case}: fails just below {position_m}"
                        );
                        assert!(meets(&sweep, position_m, need), "{case}: fails at {position_m}");
                        let beyond = evaluate(&sweep.setup_at(position_m * (1.0 + STEP)));
                        assert!(beyond.limit_m > need, "{case}: still met just above {position_m}");
                        assert_eq!(beyond.governing, bound_by, "{case}: the wrong limit named");
                    }
                    Reach::Everywhere { up_to_m } => {
                        seen[1] += 1;
                        assert_eq!(up_to_m, hi, "{case}");
                        assert!(meets(&sweep, hi, need), "{case}: fails at the far end");
                    }
                    Reach::Nowhere { forbidden_by, best_m } => {
                        seen[2] += 1;
                        let closest = evaluate(&sweep.setup_at(lo));
                        assert!(!meets(&sweep, lo, need), "{case}: met at the near end");
                        assert_eq!(best_m, closest.limit_m, "{case}: best");
                        let motion_alone = closest.limits.motion > need;
                        assert_eq!(
                            forbidden_by == Limit::Motion,
                            motion_alone || closest.governing == Limit::Motion,
                            "{case}"
                        );
                        // Nowhere on a grid five times finer than the solve's own table.
                        for i in 0..=1000 {
                            let x = lo * (hi / lo).powf(i as f64 / 1000.0);
                            assert!(!meets(&sweep, x, need), "{case}: met at {x} m");
                        }
                    }
                }
            }
        }
    }
    assert!(
        seen.iter().all(|&n| n > 0),
        "every kind of answer is exercised: {seen:?}"
    );
}

#[test]
fn nowhere_names_motion_when_the_smear_alone_exceeds_the_need() {
    // 20 m/s at 1/100 s smears 0.2 m whatever the height: a 5 cm need is out of reach and motion,
    // not the pixels, must be named, with its advice.
    let setup = Setup {
        speed_mps: 20.0,
        exposure_s: 0.01,
        ..demo::pasture_survey().setup()
    };
    for axis in [Axis::Height, Axis::GroundDistance] {
        let reach = Sweep::new(setup, axis).reach(0.05);
        match reach {
            Reach::Nowhere { forbidden_by, best_m } => {
                assert_eq!(forbidden_by, Limit::Motion, "{axis:?}");
                assert!((best_m - 0.2).abs() < 1e-12, "{axis:?}: best {best_m}");
            }
            other => panic!("{axis:?}: expected Nowhere, got {other:?}"),
        }
        let text = describe_reach(&reach, axis, "5 cm", |m| format!("{m} m"));
        assert!(text.contains("motion"), "{text}");
        assert!(text.contains(Limit::Motion.advice()), "{text}");
    }
}

#[test]
fn focal_needed_meets_the_need_when_evaluated_again() {
    let mut seen = [0usize; 2];
    for (name, base) in bases() {
        let e = evaluate(&base);
        for need in NEEDS {
            let case = format!("{name}, need {need} m");
            match focal_needed(&e, &base, need) {
                FocalNeed::AtLeast { focal_m, bound_by } => {
                    seen[0] += 1;
                    let at = evaluate(&Setup { focal_m, ..base });
                    assert!(
                        at.limit_m <= need * (1.0 + 1e-12),
                        "{case}: {} at f = {focal_m}",
                        at.limit_m
                    );
                    let value = at.limits.get(bound_by);
                    assert!(
                        (value - need).abs() <= 1e-12 * need,
                        "{case}: {bound_by:?} is {value} at f = {focal_m}"
                    );
                    let shorter = evaluate(&Setup {
                        focal_m: focal_m * (1.0 - STEP),
                        ..base
                    });
                    assert!(shorter.limit_m > need, "{case}: a shorter lens also meets the need");
                    // Longer lenses at the same f-number meet it too.
                    let longer = evaluate(&Setup {
                        focal_m: focal_m * 10.0,
                        ..base
                    });
                    assert!(longer.limit_m <= need, "{case}: a longer lens fails");
                }
                FocalNeed::Impossible { forbidden_by } => {
                    seen[1] += 1;
                    assert!(
                        matches!(forbidden_by, Limit::Turbulence | Limit::Motion),
                        "{case}: {forbidden_by:?}"
                    );
                    assert!(e.limits.get(forbidden_by) > need, "{case}");
                    // However long the lens, the need stays out of reach.
                    let huge = evaluate(&Setup {
                        focal_m: base.focal_m * 1e6,
                        ..base
                    });
                    assert!(huge.limit_m > need, "{case}: met with a huge lens");
                }
            }
        }
    }
    assert!(
        seen.iter().all(|&n| n > 0),
        "both kinds of answer are exercised: {seen:?}"
    );
}

#[test]
fn focal_needed_of_a_worked_example() {
    // 2.4 µm pixels (13.2 mm / 5500), nadir at 100 m, no air, still: GSD = 2.4e−6 m · 100 m / f,
    // so a 1 cm need takes f = 24 mm; diffraction at f/2.8, 550 nm is 1.21967·550e−9·2.8·100 m / f
    // = 1.88e−4 m² / f (Born & Wolf §8.5), smaller than 2.4e−4 m² / f, so sampling sets it.
    let setup = Setup {
        sensor_width_m: 0.0132,
        sensor_height_m: 0.0088,
        cols: 5500,
        rows: 3667,
        focal_m: 0.0088,
        f_number: 2.8,
        wavelength_m: 550e-9,
        geometry: Geometry {
            height_m: 100.0,
            ground_distance_m: 0.0,
        },
        profile: Profile::None,
        speed_mps: 0.0,
        exposure_s: 0.001,
    };
    let need = focal_needed(&evaluate(&setup), &setup, 0.01);
    match need {
        FocalNeed::AtLeast { focal_m, bound_by } => {
            assert!((focal_m - 0.024).abs() < 1e-15, "{focal_m}");
            assert_eq!(bound_by, Limit::Sampling);
        }
        other => panic!("expected AtLeast, got {other:?}"),
    }
    // At f/32 diffraction (1.21967·550e−9·32·100/0.01 = 0.2147 m of focal length) sets it instead.
    let slow = Setup {
        f_number: 32.0,
        ..setup
    };
    match focal_needed(&evaluate(&slow), &slow, 0.01) {
        FocalNeed::AtLeast { focal_m, bound_by } => {
            let expected = 1.219_669_891_266_504_5 * 550e-9 * 32.0 * 100.0 / 0.01;
            assert!((focal_m - expected).abs() < 1e-12 * expected, "{focal_m}");
            assert_eq!(bound_by, Limit::Diffraction);
        }
        other => panic!("expected AtLeast, got {other:?}"),
    }
    for bad in [0.0, -1.0, f64::NAN] {
        assert!(
            matches!(
                focal_needed(&evaluate(&setup), &setup, bad),
                FocalNeed::Impossible { .. }
            ),
            "need {bad}"
        );
    }
}

#[test]
fn crossings_have_the_two_limits_equal_there() {
    let pairs = [
        (Limit::Turbulence, Limit::Sampling),
        (Limit::Diffraction, Limit::Sampling),
        (Limit::Turbulence, Limit::Diffraction),
        (Limit::Motion, Limit::Sampling),
    ];
    let mut crossings = 0;
    for (name, base) in bases() {
        for axis in [Axis::Height, Axis::GroundDistance] {
            let sweep = Sweep::new(base, axis);
            for (a, b) in pairs {
                let case = format!("{name}, {axis:?}, {a:?} × {b:?}");
                match sweep.crossing(a, b) {
                    Crossing::At {
                        position_m,
                        larger_below,
                        larger_above,
                    } => {
                        crossings += 1;
                        let at = evaluate(&sweep.setup_at(position_m));
                        let (va, vb) = (at.limits.get(a), at.limits.get(b));
                        assert!(
                            (va - vb).abs() <= 1e-6 * va.max(vb),
                            "{case}: {va:e} vs {vb:e} at {position_m}"
                        );
                        let below = evaluate(&sweep.setup_at(position_m * (1.0 - 1e-4)));
                        let above = evaluate(&sweep.setup_at(position_m * (1.0 + 1e-4)));
                        let other = |l: Limit| if l == a { b } else { a };
                        assert!(
                            below.limits.get(larger_below) >= below.limits.get(other(larger_below)),
                            "{case}: below"
                        );
                        assert!(
                            above.limits.get(larger_above) >= above.limits.get(other(larger_above)),
                            "{case}: above"
                        );
                        assert_ne!(larger_below, larger_above, "{case}");
                    }
                    Crossing::Never { larger } => {
                        let other = if larger == a { b } else { a };
                        for (x, e) in sweep.table() {
                            assert!(
                                e.limits.get(larger) >= e.limits.get(other) * (1.0 - 1e-12),
                                "{case}: {other:?} is larger at {x}"
                            );
                        }
                    }
                }
            }
        }
    }
    assert!(crossings > 0);
}

/// Checks a sweep's envelope changes: the limits are equal at each change, the changes chain
/// (each `to` is the next `from`), and on a grid ten times finer than the solve's own table the
/// governing limit is the one the changes predict (away from the changes themselves).
fn check_envelope(case: &str, sweep: &Sweep) -> usize {
    let changes = sweep.envelope_changes();
    for change in &changes {
        let at = evaluate(&sweep.setup_at(change.position_m));
        let (from, to) = (at.limits.get(change.from), at.limits.get(change.to));
        assert!(
            (from - to).abs() <= 1e-6 * from.max(to),
            "{case}: {:?} {from:e} vs {:?} {to:e} at {}",
            change.from,
            change.to,
            change.position_m
        );
    }
    for pair in changes.windows(2) {
        assert_eq!(pair[0].to, pair[1].from, "{case}: {changes:?}");
        assert!(pair[0].position_m < pair[1].position_m, "{case}: {changes:?}");
    }
    let (lo, hi) = sweep.axis.domain();
    let first = evaluate(&sweep.setup_at(lo)).governing;
    for i in 0..=2000 {
        let x = lo * (hi / lo).powf(i as f64 / 2000.0);
        let near_a_change = changes.iter().any(|c| (x / c.position_m - 1.0).abs() < 1e-6);
        if near_a_change {
            continue;
        }
        let predicted = changes
            .iter()
            .take_while(|c| c.position_m < x)
            .last()
            .map_or(first, |c| c.to);
        let governing = evaluate(&sweep.setup_at(x)).governing;
        assert_eq!(governing, predicted, "{case}: at {x} m, changes {changes:?}");
    }
    changes.len()
}

#[test]
fn envelope_changes_where_the_two_limits_are_equal() {
    let mut changes = 0;
    for (name, base) in bases() {
        for axis in [Axis::Height, Axis::GroundDistance] {
            changes += check_envelope(&format!("{name}, {axis:?}"), &Sweep::new(base, axis));
        }
    }
    assert!(changes > 0);
}

#[test]
fn envelope_keeps_a_brief_lead_between_two_table_points() {
    // Found by the property test below: looking 85.7° from straight down, motion governs up to
    // 64.3 m, sampling only until 66.6 m, then turbulence — both changes between two neighbouring
    // points of the 200-point table. The envelope once reported a single motion → turbulence change.
    let setup = Setup {
        sensor_width_m: 0.18369001230276225,
        sensor_height_m: 0.18369001230276225,
        cols: 95207,
        rows: 95207,
        focal_m: 0.1260875687708549,
        f_number: 0.5,
        wavelength_m: 2.3816523154847486e-7,
        geometry: Geometry {
            height_m: 28.954783277864603,
            ground_distance_m: 386.14497345049216,
        },
        profile: Profile::HV57,
        speed_mps: 2.271532168577941,
        exposure_s: 0.005790549606693558,
    };
    let sweep = Sweep::new(setup, Axis::Height);
    check_envelope("brief sampling lead", &sweep);
    let between: Vec<_> = sweep
        .envelope_changes()
        .into_iter()
        .filter(|c| c.position_m < 100.0)
        .collect();
    assert_eq!(between.len(), 2, "{between:?}");
    assert_eq!(evaluate(&sweep.setup_at(65.0)).governing, Limit::Sampling);
}

// ---------------------------------------------------------------------------------------------
// The same checks on random setups across the valid ranges of the scenario
// ---------------------------------------------------------------------------------------------

/// log-uniform in [lo, hi].
fn log_range(lo: f64, hi: f64) -> impl Strategy<Value = f64> {
    (0.0f64..=1.0).prop_map(move |u| (lo * (hi / lo).powf(u)).clamp(lo, hi))
}

fn any_profile() -> impl Strategy<Value = Profile> {
    prop_oneof![
        Just(Profile::None),
        Just(Profile::HV57),
        Just(Profile::SlcDay),
        Just(Profile::SlcNight),
        (log_range(1e-18, 1e-11), -3.0f64..=0.0).prop_map(|(c, e)| Profile::PowerLaw {
            cn2_at_1m: c,
            exponent: e
        }),
    ]
}

fn any_setup() -> impl Strategy<Value = Setup> {
    let optics = (
        log_range(0.1, 200.0),
        16u32..=100_000,
        log_range(0.5, 5000.0),
        log_range(0.5, 64.0),
        log_range(200.0, 20_000.0),
    );
    let place = (
        log_range(0.1, 20_000.0),
        prop_oneof![log_range(1.0, 100_000.0), Just(0.0)],
        0.0f64..=85.0,
        any::<bool>(),
    );
    let motion = (prop_oneof![Just(0.0), log_range(0.1, 150.0)], log_range(1e-6, 10.0));
    (optics, place, any_profile(), motion).prop_map(
        |((sw, cols, focal, fnum, wl), (h, gd, tilt, use_tilt), profile, (speed, shutter))| Setup {
            sensor_width_m: sw * 1e-3,
            sensor_height_m: sw * 1e-3,
            cols,
            rows: cols,
            focal_m: focal * 1e-3,
            f_number: fnum,
            wavelength_m: wl * 1e-9,
            geometry: if use_tilt {
                Geometry::tilted(h, tilt.to_radians())
            } else {
                Geometry {
                    height_m: h,
                    ground_distance_m: gd,
                }
            },
            profile,
            speed_mps: speed,
            exposure_s: shutter,
        },
    )
}

proptest! {
    #![proptest_config(ProptestConfig {
        cases: 128,
        failure_persistence: Some(Box::new(FileFailurePersistence::Direct("proptest-regressions/solve.txt"))),
        ..ProptestConfig::default()
    })]

    #[test]
    fn solves_hold_on_random_setups(setup in any_setup(), need in log_range(1e-4, 1000.0)) {
        for axis in [Axis::Height, Axis::GroundDistance] {
            let sweep = Sweep::new(setup, axis);
            let (lo, hi) = axis.domain();
            match sweep.reach(need) {
                Reach::UpTo { position_m, bound_by } => {
                    prop_assert!((lo..=hi).contains(&position_m));
                    prop_assert!(meets(&sweep, position_m * (1.0 - STEP), need), "{:?}: fails below {}", axis, position_m);
                    let beyond = evaluate(&sweep.setup_at(position_m * (1.0 + STEP)));
                    prop_assert!(beyond.limit_m > need, "{:?}: met above {}", axis, position_m);
                    prop_assert_eq!(beyond.governing, bound_by);
                }
                Reach::Everywhere { up_to_m } => {
                    prop_assert_eq!(up_to_m, hi);
                    prop_assert!(meets(&sweep, hi, need));
                }
                Reach::Nowhere { forbidden_by, .. } => {
                    let closest = evaluate(&sweep.setup_at(lo));
                    prop_assert!(!meets(&sweep, lo, need));
                    if closest.limits.motion > need {
                        prop_assert_eq!(forbidden_by, Limit::Motion);
                    }
                }
            }
            for (a, b) in [(Limit::Turbulence, Limit::Sampling), (Limit::Diffraction, Limit::Sampling)] {
                if let Crossing::At { position_m, .. } = sweep.crossing(a, b) {
                    let at = evaluate(&sweep.setup_at(position_m));
                    let (va, vb) = (at.limits.get(a), at.limits.get(b));
                    prop_assert!((va - vb).abs() <= 1e-6 * va.max(vb), "{:?} {:?}×{:?}: {} vs {} at {}", axis, a, b, va, vb, position_m);
                }
            }
            let changes = sweep.envelope_changes();
            for change in &changes {
                let at = evaluate(&sweep.setup_at(change.position_m));
                let (from, to) = (at.limits.get(change.from), at.limits.get(change.to));
                prop_assert!((from - to).abs() <= 1e-6 * from.max(to), "{:?}: {:?}", axis, change);
            }
            for pair in changes.windows(2) {
                prop_assert_eq!(pair[0].to, pair[1].from, "{:?}: {:?}", axis, changes);
            }
        }
        let e = evaluate(&setup);
        match focal_needed(&e, &setup, need) {
            FocalNeed::AtLeast { focal_m, .. } => {
                let at = evaluate(&Setup { focal_m, ..setup });
                prop_assert!(at.limit_m <= need * (1.0 + 1e-12), "{} at f = {}", at.limit_m, focal_m);
                let shorter = evaluate(&Setup { focal_m: focal_m * (1.0 - STEP), ..setup });
                prop_assert!(shorter.limit_m > need);
            }
            FocalNeed::Impossible { forbidden_by } => {
                prop_assert!(e.limits.get(forbidden_by) > need);
            }
        }
    }
}
