//! Johnson criteria and the target transfer probability function (resolution-model.md §6).
//!
//! Sources: J. Johnson, "Analysis of image forming systems", Proc. Image Intensifier Symposium,
//! 1958 (AD220160) for the cycles; the TTPF P = (N/N50)^E / (1 + (N/N50)^E), E = 2.7 + 0.7·N/N50,
//! with its published checks 0.107734, 0.944899 and P = 0.8 at N/N50 = 1.452104.

use sharpfield::core::physics::target::{self, CdModel, Task};

fn check(case: &str, actual: f64, expected: f64, tolerance: f64) {
    assert!(
        (actual - expected).abs() <= tolerance,
        "{case}: got {actual}, expected {expected} (± {tolerance:e})"
    );
}

#[test]
fn ttpf_published_checks() {
    // (N/N50, P) as published to six decimals, so ± half a unit in the sixth place.
    let cases = [(0.5, 0.107_734), (2.0, 0.944_899), (1.452_104, 0.8), (1.0, 0.5)];
    for (ratio, p) in cases {
        check(&format!("TTPF({ratio})"), target::ttpf(ratio), p, 5e-7);
    }
}

#[test]
fn ttpf_reaches_80_percent_at_the_published_ratio() {
    // Bisection of the TTPF for P = 0.8 lands on the published 1.452104 (to its six decimals).
    let (mut lo, mut hi) = (1.0, 2.0);
    for _ in 0..100 {
        let mid = 0.5 * (lo + hi);
        if target::ttpf(mid) < 0.8 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    check("N/N50 for P = 0.8", lo, 1.452_104, 5e-7);
}

#[test]
fn ttpf_is_a_probability_rising_with_cycles() {
    let mut previous = 0.0;
    for i in 1..=2000 {
        let ratio = i as f64 * 0.01;
        let p = target::ttpf(ratio);
        assert!((0.0..=1.0).contains(&p), "TTPF({ratio}) = {p}");
        // Near P = 1, t/(1 + t) may round one unit in the last place either way.
        assert!(p >= previous - f64::EPSILON, "TTPF falls at {ratio}");
        previous = p;
    }
    // Degenerate inputs: no cycles, no chance; unbounded cycles, certainty; never NaN.
    let edges = [
        (0.0, 0.0),
        (-1.0, 0.0),
        (f64::NAN, 0.0),
        (f64::NEG_INFINITY, 0.0),
        (f64::INFINITY, 1.0),
        (f64::MAX, 1.0),
        (1e300, 1.0),
    ];
    for (ratio, p) in edges {
        check(&format!("TTPF({ratio})"), target::ttpf(ratio), p, 0.0);
    }
}

#[test]
fn johnson_cycles_for_a_fifty_percent_chance() {
    // Johnson 1958: detection 1.0, orientation 1.4, recognition 4.0, identification 6.4.
    let cases = [
        (Task::Detection, 1.0),
        (Task::Orientation, 1.4),
        (Task::Recognition, 4.0),
        (Task::Identification, 6.4),
    ];
    for (task, n50) in cases {
        check(&format!("{task:?}"), task.n50(), n50, 0.0);
    }
}

#[test]
fn cycles_across_a_target() {
    // N = critical dimension / resolvable period, the governing limit being a period for every
    // limit (resolution-model §5–§6; one cycle is one bar and one gap); (dimension m, period m, N).
    let cases = [
        (0.75, 0.1, 7.5),
        (2.3, 0.2, 11.5),
        (0.75, 0.75 / 6.4, 6.4),
        (1.0, 0.0, f64::MAX),
        (0.0, 0.1, 0.0),
        // A broken limit claims nothing (rather than certainty).
        (1.0, f64::NAN, 0.0),
        (1.0, -0.1, 0.0),
        (f64::NAN, 0.1, 0.0),
        (1e300, 1e-300, f64::MAX),
    ];
    for (dimension, limit, n) in cases {
        check(
            &format!("N({dimension}, {limit})"),
            target::cycles_across(dimension, limit),
            n,
            1e-12 * n,
        );
    }
}

#[test]
fn task_chances_follow_the_ttpf_for_each_task() {
    // A person's 0.75 m (from memory; resolution-model §6) under a 10 cm period: 7.5 cycles.
    let (n, chances) = target::task_chances(0.75, 0.1, CdModel::OneD);
    check("cycles", n, 7.5, 1e-12);
    assert_eq!(chances.len(), 4);
    for (chance, task) in chances.iter().zip(Task::ALL) {
        assert_eq!(chance.task, task);
        check(
            &format!("{task:?}"),
            chance.probability,
            target::ttpf(7.5 / task.n50()),
            0.0,
        );
    }
    // Identification at exactly N50 = 6.4 cycles is the 50 % point.
    let (_, at_n50) = target::task_chances(0.75, 0.75 / 6.4, CdModel::OneD);
    check("P(identification) at N50", at_n50[3].probability, 0.5, 1e-12);
}

#[test]
fn pixel_density_levels_for_watching_people() {
    // IEC 62676-4:2014 operational levels (from memory; resolution-model §6): detection 25 px/m,
    // observation 62.5, recognition 125, identification 250.
    use target::PeopleLevel::*;
    let cases = [
        (10.0, None),
        (25.0, Some(Detection)),
        (62.4, Some(Detection)),
        (62.5, Some(Observation)),
        (124.9, Some(Observation)),
        (125.0, Some(Recognition)),
        (250.0, Some(Identification)),
        (1e6, Some(Identification)),
        (f64::NAN, None),
    ];
    for (px, level) in cases {
        assert_eq!(target::people_level(px), level, "{px} px/m");
    }
}

#[test]
fn the_ttpf_inverse_meets_the_published_points() {
    // resolution-model §6: P = 0.8 at N/N50 = 1.452104 and 0.95 at 2.040548; 50 % at 1.
    for (p, ratio) in [(0.5, 1.0), (0.8, 1.452104), (0.95, 2.040548)] {
        let r = target::ratio_for(p);
        assert!((r - ratio).abs() < 5e-7, "P = {p}: {r} vs {ratio}");
        assert!((target::ttpf(r) - p).abs() < 1e-12, "P = {p}");
    }
    assert!(target::ratio_for(1.0).is_nan() && target::ratio_for(0.0).is_nan());
}

#[test]
fn each_critical_dimension_model_keeps_its_own_n50_set() {
    // 1-D: Johnson (1958) 1.0, 1.4, 4.0, 6.4. 2-D (√area): about 0.75, 3.0, 6.0 (from memory;
    // resolution-model §6), without an orientation figure.
    let one: Vec<_> = Task::ALL.iter().map(|&t| CdModel::OneD.n50(t)).collect();
    assert_eq!(one, [Some(1.0), Some(1.4), Some(4.0), Some(6.4)]);
    let two: Vec<_> = Task::ALL.iter().map(|&t| CdModel::TwoD.n50(t)).collect();
    assert_eq!(two, [Some(0.75), None, Some(3.0), Some(6.0)]);
    let (_, chances) = target::task_chances(0.75, 0.75 / 6.0, CdModel::TwoD);
    assert_eq!(chances.len(), 3);
    assert!(
        (chances[2].probability - 0.5).abs() < 1e-12,
        "identification at its N50"
    );
}
