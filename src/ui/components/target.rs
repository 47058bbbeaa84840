//! What a target will look like: Johnson cycles and the chance of each task.

use crate::core::physics::target::CdModel;
use crate::core::planning::solve::Reach;
use crate::core::words::format;
use crate::core::words::notes;
use crate::core::words::units::Units;
use crate::ui::components::results::value;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the target panel.
#[derive(Properties, PartialEq, Clone)]
pub struct TargetProps {
    pub state: Rc<State>,
}

/// One task range: a figure when bounded, words when met everywhere or nowhere.
/// `key` is the figure's path in the report (`task_ranges.0.p50_m`).
fn range_cell(reach: &Reach, key: String, units: Units) -> Html {
    match *reach {
        Reach::UpTo { position_m, .. } | Reach::Horizon { position_m } => {
            value(key, position_m, format::length(position_m, units))
        }
        Reach::Everywhere { up_to_m } => html! { { format!("beyond {}", format::length(up_to_m, units)) } },
        Reach::Nowhere { .. } => html! { { "not reached" } },
    }
}

/// The target panel.
#[function_component(TargetPanel)]
pub fn target_panel(props: &TargetProps) -> Html {
    let report = &props.state.plan.report;
    let units = props.state.plan.scenario.units;
    let axis = props.state.plan.sweep.axis;
    let (Some(size), Some(cycles)) = (report.target_m, report.target_cycles) else {
        return html! {
            <section class="panel" id="target"><h2>{ "What a target will look like" }</h2>
            <p>{ "Enter a target's critical dimension (0.75 m for a person, about 2.3 m for a car) to see the chance of detecting, recognising and identifying it." }</p></section>
        };
    };
    html! {
        <section class="panel" id="target" aria-labelledby="target-title">
            <h2 id="target-title">{ "What a target will look like" }</h2>
            <p>{ format!("A target {} across spans ", format::length(size, units)) }
                { value("target_cycles", cycles, format::significant(cycles)) }
                { format!(" resolvable cycles {} ({} critical dimension).", notes::plane(report.target_plane), match report.cdm { CdModel::OneD => "Johnson's 1-D", CdModel::TwoD => "2-D, √area" }) }</p>
            <table class="chances">
                <thead><tr><th scope="col">{ "Task" }</th><th scope="col">{ "Cycles for 50 %" }</th><th scope="col">{ "Chance" }</th></tr></thead>
                <tbody>
                { for report.target_chances.iter().map(|c| html! {
                    <tr data-task={c.task.key()}>
                        <th scope="row">{ notes::task_name(c.task) }<br/><small>{ notes::task(c.task) }</small></th>
                        <td>{ format::significant(c.cycles_needed) }</td>
                        <td data-si={c.probability.to_string()}>{ format::percent(c.probability) }</td>
                    </tr>
                }) }
                </tbody>
            </table>
            if !report.task_ranges.is_empty() {
                <table class="chances" id="task-ranges">
                    <caption>{ format!("Greatest {} for each task", notes::axis_noun(axis)) }</caption>
                    <thead><tr><th scope="col">{ "Task" }</th><th scope="col">{ "50 %" }</th><th scope="col">{ "80 %" }</th></tr></thead>
                    <tbody>
                    { for report.task_ranges.iter().enumerate().map(|(i, t)| html! {
                        <tr data-task={t.task.key()}>
                            <th scope="row">{ notes::task_name(t.task) }</th>
                            <td>{ range_cell(&t.p50, format!("task_ranges.{i}.p50_m"), units) }</td>
                            <td>{ range_cell(&t.p80, format!("task_ranges.{i}.p80_m"), units) }</td>
                        </tr>
                    }) }
                    </tbody>
                </table>
            }
        </section>
    }
}
