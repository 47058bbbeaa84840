//! Cautions: always visible, and printed with the plan.

use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the cautions panel.
#[derive(Properties, PartialEq, Clone)]
pub struct CautionsProps {
    pub state: Rc<State>,
}

/// The cautions panel.
#[function_component(Cautions)]
pub fn cautions(props: &CautionsProps) -> Html {
    html! {
        <section class="panel cautions" id="cautions" aria-labelledby="cautions-title">
            <h2 id="cautions-title">{ "Cautions" }</h2>
            <ul>
                { for props.state.plan.report.cautions.iter().map(|c| html! {
                    <li class={classes!("caution", c.code)} data-caution={c.code}><strong>{ match c.code { "height" => "Height: ", "privacy" => "Privacy: ", _ => "Please note: " } }</strong>{ c.text.clone() }</li>
                }) }
            </ul>
        </section>
    }
}
