//! A labelled text input that keeps exactly what the person types and shows the field's error.

use crate::core::contract::inputs::input;
use crate::core::words::units::{entry_matches, entry_range, from_entry_text, to_entry_text, EntryUnit};
use crate::ui::state::Action;
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
    /// Receives `Action::Set` of (key, contract text) on every keystroke. The app's one dispatch
    /// callback, which never changes, so a field whose text, error and hint stay the same is not
    /// drawn again when another field is typed in.
    pub dispatch: Callback<Action>,
    /// The unit the field is typed in when it is not the contract's (imperial display).
    #[prop_or_default]
    pub entry: Option<EntryUnit>,
}

/// A numeric field; label, unit and range come from the contract's spec for the key.
#[function_component(NumberField)]
pub fn number_field(props: &FieldProps) -> Html {
    let key = props.key_name.to_string();
    let spec = input(&key);
    let label = spec.map(|s| s.label).unwrap_or("Value");
    let entry = props.entry;
    let unit = entry.map(|e| e.unit).or(spec.map(|s| s.unit)).unwrap_or("");
    let id = format!("in-{key}");
    let error_id = format!("err-{key}");

    // Typed in another unit, the field keeps its own text (so "1." survives while typing) and
    // follows the scenario only when the scenario changes from elsewhere (a demo, a link, the
    // unit switch).
    let converted = |value: &str| {
        entry
            .map(|e| to_entry_text(value, e))
            .unwrap_or_else(|| value.to_string())
    };
    let local = use_state(|| converted(&props.value));
    {
        let local = local.clone();
        let value = props.value.to_string();
        use_effect_with((value, entry), move |(value, entry)| {
            if let Some(e) = entry {
                if !entry_matches(&local, value, *e) {
                    local.set(to_entry_text(value, *e));
                }
            }
        });
    }
    let shown: AttrValue = if entry.is_some() {
        (*local).clone().into()
    } else {
        props.value.clone()
    };

    let oninput = {
        let dispatch = props.dispatch.clone();
        let key = key.clone();
        let local = local.clone();
        Callback::from(move |e: InputEvent| {
            let input: HtmlInputElement = e.target_unchecked_into();
            let text = input.value();
            let contract = match entry {
                Some(unit) => from_entry_text(&text, unit),
                None => text.clone(),
            };
            local.set(text);
            dispatch.emit(Action::Set(vec![(key.clone(), contract)]));
        })
    };
    let invalid = props.error.is_some();
    let range_in_entry_unit = match (entry, spec.and_then(|s| s.range()), invalid) {
        (Some(e), Some((min, max)), true) => Some(format!("In {}: {}.", e.unit, entry_range(min, max, e))),
        _ => None,
    };
    html! {
        <div class={classes!("field", invalid.then_some("invalid"))}>
            <label for={id.clone()}>{ label }{ if unit.is_empty() { html!{} } else { html!{ <span class="unit">{ format!(" ({unit})") }</span> } } }</label>
            <input id={id} name={key.clone()} type="text" inputmode={if spec.is_some_and(|s| s.is_single()) { "decimal" } else { "text" }} autocomplete="off" spellcheck="false"
                value={shown} {oninput}
                aria-invalid={invalid.to_string()}
                aria-describedby={invalid.then(|| error_id.clone())} />
            if let Some(hint) = &props.hint {
                <span class="hint">{ hint.clone() }</span>
            }
            if let Some(error) = &props.error {
                <span class="error" id={error_id} role="alert">{ error.clone() }{ range_in_entry_unit.map(|r| format!(" {r}")).unwrap_or_default() }</span>
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
