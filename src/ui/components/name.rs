//! The scenario's name field, the first of the inputs.

use super::inputs::InputsProps;
use crate::ui::state::Action;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// The scenario name, kept as typed, with its error if it was rejected (drawn by the form: a
/// component of its own would cost more code than it saves work, as the form draws it anew with
/// every change anyway).
pub fn name_field(props: &InputsProps) -> Html {
    let on_name = props.dispatch.reform(|e: InputEvent| {
        let input: HtmlInputElement = e.target_unchecked_into();
        Action::set("name", input.value())
    });
    html! {
        <div class="field">
            <label for="in-name">{ "Scenario name" }</label>
            <input id="in-name" type="text" value={props.state.text("name")} oninput={on_name} maxlength="120" autocomplete="off" />
            if let Some(error) = props.state.error("name") { <span class="error" role="alert">{ error }</span> }
        </div>
    }
}
