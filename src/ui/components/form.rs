//! The scenario's inputs as one form: the name, the input groups, and what the link held that
//! no field shows (unknown keys, errors of keys without a field).

use super::inputs::{
    AirGroup, BandGroup, CameraGroup, GeometryGroup, InputsProps, LensGroup, MotionGroup, NeedGroup, SurveyGroup,
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
    html! {
        <form class="inputs" onsubmit={Callback::from(|e: SubmitEvent| e.prevent_default())} aria-label="Scenario inputs">
            { name_field(props) }
            <CameraGroup state={state.clone()} dispatch={dispatch.clone()} />
            <LensGroup state={state.clone()} dispatch={dispatch.clone()} />
            <BandGroup state={state.clone()} dispatch={dispatch.clone()} />
            <GeometryGroup state={state.clone()} dispatch={dispatch.clone()} />
            <AirGroup state={state.clone()} dispatch={dispatch.clone()} />
            <MotionGroup state={state.clone()} dispatch={dispatch.clone()} />
            <LightGroup state={state.clone()} dispatch={dispatch.clone()} />
            <NeedGroup state={state.clone()} dispatch={dispatch.clone()} />
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
