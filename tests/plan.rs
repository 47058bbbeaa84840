//! A plan computed after another keeps what the change cannot have touched (the sweep and its
//! solves when only the position along the solve axis moves) and comes out exactly as a plan
//! computed afresh, whatever changes.

use sharpfield::core::contract::plan::Plan;
use sharpfield::core::contract::scenario::RawScenario;
use sharpfield::core::words::chart;

const BASES: [&str; 4] = [
    // A drone looking down, with a need and a target.
    "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&air=power&cn2=1e-13&speed=8&need=0.03&tdim=0.75",
    // The same drone tilted.
    "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&tilt=40&air=hv57&need=0.05&needgsd=0.03",
    // A mast looking across at a target some distance off.
    "sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&h=8&gd=1500&air=power&cn2=1e-13&need=0.1&tdim=0.75",
    // A thermal camera with a bad value.
    "sw=7.68&sh=6.14&cols=640&rows=512&focal=35&fnum=1&wl=10000&h=30&gd=200&need=abc&tdim=2.3",
];

/// Changes a person makes one at a time: along the axis (kept), and everything else (recomputed).
const CHANGES: [(&str, &str); 14] = [
    ("h", "81"),
    ("h", "120"),
    ("gd", "1600"),
    ("gd", "20"),
    ("need", "0.02"),
    ("tdim", "2.3"),
    ("cdm", "1d"),
    ("tilt", "60"),
    ("focal", "24"),
    ("snr", "10"),
    ("air", "none"),
    ("h", "-3"),
    ("tht", "3"),
    ("refk", "1"),
];

fn raw(query: &str) -> RawScenario {
    RawScenario::from_query(query)
}

#[test]
fn a_plan_after_another_equals_a_fresh_one() {
    for base in BASES {
        let first = Plan::from_raw(&raw(base));
        let mut previous = first.clone();
        for (key, value) in CHANGES {
            let mut next = raw(base);
            next.set(key, value);
            let fresh = Plan::from_raw(&next);
            assert_eq!(Plan::from_raw_after(&next, &first), fresh, "{base} then {key}={value}");
            // And in a chain of changes, each after the last.
            let chained = Plan::from_raw_after(&next, &previous);
            assert_eq!(chained, fresh, "{base}, chained, then {key}={value}");
            previous = chained;
        }
    }
}

#[test]
fn moving_along_the_axis_keeps_the_sweep() {
    let first = Plan::from_raw(&raw(BASES[0]));
    let mut next = raw(BASES[0]);
    next.set("h", "95");
    let moved = first.sweep.moved_to(Plan::from_raw(&next).setup, first.sweep.axis);
    assert!(moved.is_some(), "a new height at the same look angle keeps the table");
    next.set("focal", "12");
    let other = first.sweep.moved_to(Plan::from_raw(&next).setup, first.sweep.axis);
    assert!(other.is_none(), "another lens needs a new table");
}

/// The chart of a plan, with the marks the page gives it.
fn chart_of(plan: &Plan, previous: Option<(&Plan, &chart::Chart)>) -> chart::Chart {
    let r = &plan.report;
    let crossings: Vec<f64> = r.envelope_changes.iter().map(|c| c.position_m).collect();
    let tasks: Vec<_> = r.task_ranges.iter().filter_map(|t| Some((t.task, t.p50_m?))).collect();
    let marks = chart::Marks {
        need_m: r.need_m.map(|n| n / r.plane_stretch),
        reach_m: r.reach_m,
        crossings: &crossings,
        tasks: &tasks,
    };
    chart::build_after(
        &plan.sweep,
        &marks,
        plan.scenario.units,
        previous.map(|(p, c)| (&p.sweep, c)),
    )
}

#[test]
fn a_chart_after_another_equals_a_fresh_one() {
    for base in BASES {
        let first = Plan::from_raw(&raw(base));
        let first_chart = chart_of(&first, None);
        for (key, value) in CHANGES {
            let mut next = raw(base);
            next.set(key, value);
            let plan = Plan::from_raw_after(&next, &first);
            assert_eq!(
                chart_of(&plan, Some((&first, &first_chart))),
                chart_of(&plan, None),
                "{base} then {key}={value}"
            );
        }
    }
}
