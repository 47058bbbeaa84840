//! What a target will look like: Johnson cycles and the chance of each task.

use crate::core::physics::target::CdModel;
use crate::core::planning::solve::Reach;
use crate::core::words::format;
use crate::core::words::notes;
use crate::core::words::units::Units;
use crate::ui::markup::Markup;
use crate::ui::state::State;
use yew::prelude::*;

/// One task range: a figure when bounded, words when met everywhere or nowhere.
/// `key` is the figure's path in the report (`task_ranges.0.p50_m`).
fn range_cell(m: &mut Markup, reach: &Reach, key: &str, units: Units) {
    match *reach {
        Reach::UpTo { position_m, .. } | Reach::Horizon { position_m } => {
            m.figure(key, position_m, &format::length(position_m, units));
        }
        Reach::Everywhere { up_to_m } => {
            m.text(&format!("beyond {}", format::length(up_to_m, units)));
        }
        Reach::Nowhere { .. } => {
            m.text("not reached");
        }
    }
}

/// The target panel (its figures written as text: `ui::markup`), drawn by the solve panel's
/// component (a component of its own costs about 1 kB of the first load) from the state it is
/// shown with.
pub fn target_panel(state: &State) -> Html {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let axis = state.plan.sweep.axis;
    let (Some(size), Some(cycles)) = (report.target_m, report.target_cycles) else {
        return html! {
            <section class="panel" id="target"><h2>{ "What a target will look like" }</h2>
            <p>{ "Enter a target's critical dimension (0.75 m for a person, about 2.3 m for a car) to see the chance of detecting, recognising and identifying it." }</p></section>
        };
    };
    let mut m = Markup::default();
    m.tag("<p>")
        .text(&format!("A target {} across spans ", format::length(size, units)))
        .figure("target_cycles", cycles, &format::significant(cycles))
        .text(&format!(
            " resolvable cycles {} ({} critical dimension).",
            notes::plane(report.target_plane),
            match report.cdm {
                CdModel::OneD => "Johnson's 1-D",
                CdModel::TwoD => "2-D, √area",
            }
        ))
        .tag(r#"</p><table class="chances"><thead><tr><th scope="col">Task</th><th scope="col">Cycles for 50 %</th><th scope="col">Chance</th></tr></thead><tbody>"#);
    for c in &report.target_chances {
        m.tag(&format!(r#"<tr data-task="{}"><th scope="row">"#, c.task.key()))
            .text(notes::task_name(c.task))
            .tag("<br><small>")
            .text(notes::task(c.task))
            .tag("</small></th><td>")
            .text(&format::significant(c.cycles_needed))
            .tag(&format!(r#"</td><td data-si="{}">"#, c.probability))
            .text(&format::percent(c.probability))
            .tag("</td></tr>");
    }
    m.tag("</tbody></table>");
    if !report.task_ranges.is_empty() {
        m.tag(r#"<table class="chances" id="task-ranges"><caption>"#)
            .text(&format!("Greatest {} for each task", notes::axis_noun(axis)))
            .tag(r#"</caption><thead><tr><th scope="col">Task</th><th scope="col">50 %</th><th scope="col">80 %</th></tr></thead><tbody>"#);
        for (i, t) in report.task_ranges.iter().enumerate() {
            m.tag(&format!(r#"<tr data-task="{}"><th scope="row">"#, t.task.key()))
                .text(notes::task_name(t.task))
                .tag("</th><td>");
            range_cell(&mut m, &t.p50, &format!("task_ranges.{i}.p50_m"), units);
            m.tag("</td><td>");
            range_cell(&mut m, &t.p80, &format!("task_ranges.{i}.p80_m"), units);
            m.tag("</td></tr>");
        }
        m.tag("</tbody></table>");
    }
    html! {
        <section class="panel" id="target" aria-labelledby="target-title">
            <h2 id="target-title">{ "What a target will look like" }</h2>
            { m.html() }
        </section>
    }
}
