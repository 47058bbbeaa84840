//! Cautions: always visible, and printed with the plan.

use crate::ui::markup::Markup;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the cautions panel.
#[derive(Properties, PartialEq, Clone)]
pub struct CautionsProps {
    pub state: Rc<State>,
}

/// The cautions panel (its list written as text: `ui::markup`).
#[function_component(Cautions)]
pub fn cautions(props: &CautionsProps) -> Html {
    let mut m = Markup::default();
    m.tag("<ul>");
    for c in &props.state.plan.report.cautions {
        let lead = match c.code {
            "height" => "Height: ",
            "privacy" => "Privacy: ",
            _ => "Please note: ",
        };
        m.tag(&format!(
            r#"<li class="caution {0}" data-caution="{0}"><strong>"#,
            c.code
        ))
        .text(lead)
        .tag("</strong>")
        .text(&c.text)
        .tag("</li>");
    }
    m.tag("</ul>");
    html! {
        <section class="panel cautions" id="cautions" aria-labelledby="cautions-title">
            <h2 id="cautions-title">{ "Cautions" }</h2>
            { m.html() }
        </section>
    }
}
