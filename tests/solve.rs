//! Backward solves, checked by going forward again: every answer is re-evaluated with
//! `engine::evaluate` at and around the position or focal length it names.

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

#[test]
fn envelope_changes_where_the_two_limits_are_equal() {
    let mut changes = 0;
    for (name, base) in bases() {
        for axis in [Axis::Height, Axis::GroundDistance] {
            let sweep = Sweep::new(base, axis);
            for change in sweep.envelope_changes() {
                changes += 1;
                let at = evaluate(&sweep.setup_at(change.position_m));
                let (from, to) = (at.limits.get(change.from), at.limits.get(change.to));
                assert!(
                    (from - to).abs() <= 1e-6 * from.max(to),
                    "{name}, {axis:?}: {:?} {from:e} vs {:?} {to:e} at {}",
                    change.from,
                    change.to,
                    change.position_m
                );
            }
        }
    }
    assert!(changes > 0);
}
