//! The backward solve: from "I need X on the ground" to the greatest height or range, the lens that
//! would do, and where the limits cross.

use crate::core::physics::engine::Limit;
use crate::core::planning::solve::{Crossing, FocalNeed, Reach};
use crate::core::words::format;
use crate::core::words::notes;
use crate::ui::components::results::value;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the solve panel.
#[derive(Properties, PartialEq, Clone)]
pub struct SolveProps {
    pub state: Rc<State>,
}

fn crossing_text(crossing: &Crossing, a: Limit, noun: &str, length: &dyn Fn(f64) -> String) -> String {
    match *crossing {
        Crossing::At {
            position_m,
            larger_below,
            larger_above,
        } => format!(
            "{} and pixel sampling are equal at a {noun} of {}: below it {} is larger, above it {}.",
            notes::limit_title(a),
            length(position_m),
            larger_below.key(),
            larger_above.key()
        ),
        Crossing::Never { larger } => format!(
            "{} and pixel sampling do not cross between 0.1 m and the largest {noun}: {} is the larger throughout.",
            notes::limit_title(a),
            larger.key()
        ),
    }
}

/// The solve panel.
#[function_component(SolvePanel)]
pub fn solve_panel(props: &SolveProps) -> Html {
    let plan = &props.state.plan;
    let report = &plan.report;
    let units = plan.scenario.units;
    let axis = plan.sweep.axis;
    let length = move |m: f64| format::length(m, units);
    let need_text = notes::need_text(&plan.scenario.need(), units);
    let need_block = match (need_text, report.reach, report.focal_needed) {
        (Some(need_text), Some(reach), Some(focal)) => {
            let reach_html = match reach {
                Reach::UpTo { position_m, .. } | Reach::Horizon { position_m } => {
                    value("reach_m", position_m, length(position_m))
                }
                _ => html! {},
            };
            let focal_text = match focal {
                FocalNeed::AtLeast { focal_m, bound_by } => html! { <>
                    { format!("At the current {} a focal length of at least ", notes::axis_noun(axis)) }
                    { value("focal_needed_m", focal_m, format!("{} mm", format::significant(focal_m * 1000.0))) }
                    { format!(" at f/{} meets it ({} sets it).", format::significant(plan.scenario.f_number), bound_by.key()) }
                </> },
                FocalNeed::Impossible { forbidden_by } => html! {
                    { format!("No lens meets it at the current {}: {} does not depend on the lens. {}", notes::axis_noun(axis), forbidden_by.key(), notes::limit_advice(forbidden_by)) }
                },
            };
            html! { <>
                <p class="reach" data-reach={match reach { Reach::UpTo{..} => "up_to", Reach::Horizon{..} => "horizon", Reach::Everywhere{..} => "everywhere", Reach::Nowhere{..} => "nowhere" }}>
                    <strong>{ notes::reach(&reach, axis, &need_text, units) }</strong>
                    if reach.position_m().is_some() { <span class="sr-only">{ " Greatest: " }{ reach_html }</span> }
                </p>
                <p>{ focal_text }</p>
            </> }
        }
        _ => {
            html! { <p>{ "Enter the smallest detail or a required GSD under “What you need to see” to get the greatest height or range and the lens that would do." }</p> }
        }
    };
    html! {
        <section class="panel" id="solve" aria-labelledby="solve-title">
            <h2 id="solve-title">{ "How high or how far" }</h2>
            { need_block }
            <ul class="crossings">
                <li>{ crossing_text(&report.diffraction_crossing, Limit::Diffraction, notes::axis_noun(axis), &length) }</li>
                <li>{ crossing_text(&report.turbulence_crossing, Limit::Turbulence, notes::axis_noun(axis), &length) }</li>
                { for report.envelope_changes.iter().map(|c| html! {
                    <li>{ format!("At a {} of {} the governing limit changes from {} to {}.", notes::axis_noun(axis), length(c.position_m), c.from.key(), c.to.key()) }</li>
                }) }
            </ul>
        </section>
    }
}
