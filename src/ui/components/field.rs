//! A labelled text input that keeps exactly what the person types and shows the field's error.

use crate::core::scenario::number_spec;
use web_sys::{HtmlInputElement, HtmlSelectElement};
use yew::prelude::*;

/// Properties of a numeric field bound to one scenario key.
#[derive(Properties, PartialEq, Clone)]
pub struct FieldProps {
    /// The contract key, e.g. "focal".
    pub key_name: AttrValue,
    /// The raw text of the key.
    pub value: AttrValue,
    /// The error for the key, if its value was rejected.
    #[prop_or_default]
    pub error: Option<AttrValue>,
    /// A short note under the field (e.g. the value in other units).
    #[prop_or_default]
    pub hint: Option<AttrValue>,
    /// Called with (key, text) on every keystroke.
    pub on_input: Callback<(String, String)>,
}

/// A numeric field; label, unit and range come from the contract's spec for the key.
#[function_component(NumberField)]
pub fn number_field(props: &FieldProps) -> Html {
    let key = props.key_name.to_string();
    let spec = number_spec(&key);
    let label = spec.map(|s| s.label).unwrap_or("Value");
    let unit = spec.map(|s| s.unit).unwrap_or("");
    let id = format!("in-{key}");
    let error_id = format!("err-{key}");
    let oninput = {
        let on_input = props.on_input.clone();
        let key = key.clone();
        Callback::from(move |e: InputEvent| {
            let input: HtmlInputElement = e.target_unchecked_into();
            on_input.emit((key.clone(), input.value()));
        })
    };
    let invalid = props.error.is_some();
    html! {
        <div class={classes!("field", invalid.then_some("invalid"))}>
            <label for={id.clone()}>{ label }{ if unit.is_empty() { html!{} } else { html!{ <span class="unit">{ format!(" ({unit})") }</span> } } }</label>
            <input id={id} name={key.clone()} type="text" inputmode="decimal" autocomplete="off" spellcheck="false"
                value={props.value.clone()} {oninput}
                aria-invalid={invalid.to_string()}
                aria-describedby={invalid.then(|| error_id.clone())} />
            if let Some(hint) = &props.hint {
                <span class="hint">{ hint.clone() }</span>
            }
            if let Some(error) = &props.error {
                <span class="error" id={error_id} role="alert">{ error.clone() }</span>
            }
        </div>
    }
}

/// Properties of a select that picks among presets.
#[derive(Properties, PartialEq, Clone)]
pub struct ChoiceProps {
    pub id: AttrValue,
    pub label: AttrValue,
    /// (value, label) pairs.
    pub options: Vec<(AttrValue, AttrValue)>,
    pub selected: AttrValue,
    pub on_change: Callback<String>,
}

/// A labelled select.
#[function_component(Choice)]
pub fn choice(props: &ChoiceProps) -> Html {
    let onchange = {
        let on_change = props.on_change.clone();
        Callback::from(move |e: Event| {
            let select: HtmlSelectElement = e.target_unchecked_into();
            on_change.emit(select.value());
        })
    };
    html! {
        <div class="field">
            <label for={props.id.clone()}>{ props.label.clone() }</label>
            <select id={props.id.clone()} {onchange}>
                { for props.options.iter().map(|(value, label)| html! {
                    <option value={value.clone()} selected={*value == props.selected}>{ label.clone() }</option>
                }) }
            </select>
        </div>
    }
}
