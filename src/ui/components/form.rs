//! The scenario's inputs as one form: the name, the input groups, and what the link held that
//! no field shows (unknown keys, errors of keys without a field).

use super::inputs::{
    lens_group, motion_group, use_air_group, use_band_group, use_camera_group, use_geometry_group, use_need_group,
    InputsProps, SurveyGroup,
};
use super::light::LightGroup;
use super::name::name_field;
use crate::core::contract::inputs::input;
use yew::prelude::*;

/// The inputs form; it never submits.
#[function_component(ScenarioForm)]
pub fn scenario_form(props: &InputsProps) -> Html {
    let state = &props.state;
    let dispatch = &props.dispatch;
    let report = &state.plan.report;
    // The groups with hooks of their own, called in order before drawing.
    let camera = use_camera_group(props);
    let band = use_band_group(props);
    let geometry = use_geometry_group(props);
    let air = use_air_group(props);
    let need = use_need_group(props);
    html! {
        <form class="inputs" onsubmit={Callback::from(|e: SubmitEvent| e.prevent_default())} aria-label="Scenario inputs">
            { name_field(props) }
            { camera }
            { lens_group(props) }
            { band }
            { geometry }
            { air }
            { motion_group(props) }
            <LightGroup state={state.clone()} dispatch={dispatch.clone()} />
            { need }
            <SurveyGroup state={state.clone()} dispatch={dispatch.clone()} />
            if !report.ignored.is_empty() {
                <p class="note">{ format!("Kept but not used (unknown keys in the link): {}", report.ignored.join(", ")) }</p>
            }
            { for report.errors.iter().filter(|e| !["name", "when"].contains(&e.key.as_str()) && !input(&e.key).is_some_and(|i| i.is_number())).map(|e| html! {
                <p class="error" role="alert" data-error-key={e.key.clone()}>{ e.message.clone() }</p>
            }) }
        </form>
    }
}
