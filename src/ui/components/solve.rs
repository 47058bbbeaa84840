//! The backward solve: from "I need X on the ground" to the greatest height or range, the lens that
//! would do, and where the limits cross.

use crate::core::physics::engine::Limit;
use crate::core::planning::solve::{Crossing, FocalNeed, Reach};
use crate::core::words::format;
use crate::core::words::notes;
use crate::ui::markup::Markup;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the solve panel, which draws the target panel after it.
#[derive(Properties, PartialEq, Clone)]
pub struct SolveProps {
    pub state: Rc<State>,
    /// The state the target panel is shown with (each panel out of view shows the settled one).
    pub target: Rc<State>,
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

/// The solve panel (written as text: `ui::markup`).
#[function_component(SolvePanel)]
pub fn solve_panel(props: &SolveProps) -> Html {
    let plan = &props.state.plan;
    let report = &plan.report;
    let units = plan.scenario.units;
    let axis = plan.sweep.axis;
    let noun = notes::axis_noun(axis);
    let length = move |m: f64| format::length(m, units);
    let need_text = notes::need_text(&plan.scenario.need(), units);
    let mut m = Markup::default();
    match (need_text, report.reach, report.focal_needed) {
        (Some(need_text), Some(reach), Some(focal)) => {
            let kind = match reach {
                Reach::UpTo { .. } => "up_to",
                Reach::Horizon { .. } => "horizon",
                Reach::Everywhere { .. } => "everywhere",
                Reach::Nowhere { .. } => "nowhere",
            };
            m.tag(&format!(r#"<p class="reach" data-reach="{kind}"><strong>"#))
                .text(&notes::reach(&reach, axis, &need_text, units))
                .tag("</strong>");
            if let Some(position_m) = reach.position_m() {
                m.tag(r#"<span class="sr-only"> Greatest: "#)
                    .figure("reach_m", position_m, &length(position_m))
                    .tag("</span>");
            }
            m.tag("</p><p>");
            match focal {
                FocalNeed::AtLeast { focal_m, bound_by } => {
                    m.text(&format!("At the current {noun} a focal length of at least "))
                        .figure(
                            "focal_needed_m",
                            focal_m,
                            &format!("{} mm", format::significant(focal_m * 1000.0)),
                        )
                        .text(&format!(
                            " at f/{} meets it ({} sets it).",
                            format::significant(plan.scenario.f_number),
                            bound_by.key()
                        ));
                }
                FocalNeed::Impossible { forbidden_by } => {
                    m.text(&format!(
                        "No lens meets it at the current {noun}: {} does not depend on the lens. {}",
                        forbidden_by.key(),
                        notes::limit_advice(forbidden_by)
                    ));
                }
            }
            m.tag("</p>");
        }
        _ => {
            m.tag("<p>").text("Enter the smallest detail or a required GSD under “What you need to see” to get the greatest height or range and the lens that would do.").tag("</p>");
        }
    }
    m.tag(r#"<ul class="crossings"><li>"#)
        .text(&crossing_text(
            &report.diffraction_crossing,
            Limit::Diffraction,
            noun,
            &length,
        ))
        .tag("</li><li>")
        .text(&crossing_text(
            &report.turbulence_crossing,
            Limit::Turbulence,
            noun,
            &length,
        ))
        .tag("</li>");
    for c in &report.envelope_changes {
        m.tag("<li>")
            .text(&format!(
                "At a {noun} of {} the governing limit changes from {} to {}.",
                length(c.position_m),
                c.from.key(),
                c.to.key()
            ))
            .tag("</li>");
    }
    m.tag("</ul>");
    html! {
        <>
        <section class="panel" id="solve" aria-labelledby="solve-title">
            <h2 id="solve-title">{ "How high or how far" }</h2>
            { m.html() }
        </section>
        { super::target::target_panel(&props.target) }
        </>
    }
}
