//! Light and exposure: the inputs (date and time, sky, illuminance, exposure mode, ISO, the
//! sensor's charge and noise) and the panel (the sun, the light, the exposure used, electrons and
//! SNR, the day's good hours on a timeline, and the best settings with a button to apply them).

use super::field::{Choice, NumberField};
use super::inputs::{use_action, InputsProps};
use crate::core::contract::inputs::entry_unit;
use crate::core::contract::plan::Plan;
use crate::ui::aside::{self, Drawing};
use crate::ui::browser;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// How long typing must pause before the day and the best settings are worked out (ms): each is
/// some hundreds of evaluations, too many for every keystroke.
const EXTRAS_PAUSE_MS: u32 = 250;

/// A numeric field of the light group.
fn field(props: &InputsProps, key: &'static str, hint: Option<&str>) -> Html {
    let state = &props.state;
    html! {
        <NumberField key_name={key} value={state.text(key)} error={state.error(key).map(AttrValue::from)}
            hint={hint.map(AttrValue::from)} dispatch={props.dispatch.clone()} entry={entry_unit(key, state.plan.scenario.units)} />
    }
}

/// Light: when and where, the sky or a measured illuminance, how the exposure is set, the sensor.
#[function_component(LightGroup)]
pub fn light_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let skies = [
        ("clear", "Clear sky"),
        ("partly", "Partly cloudy"),
        ("overcast", "Overcast"),
    ]
    .map(|(v, l)| (AttrValue::from(v), AttrValue::from(l)))
    .to_vec();
    let sky = match state.text("sky").trim() {
        "partly" => "partly",
        "overcast" => "overcast",
        _ => "clear",
    };
    let on_sky = use_action(&props.dispatch, |word: String| Action::set("sky", word));
    let modes = [
        ("set", "As typed (exposure time above)"),
        ("auto", "Metered by the camera (ISO 2720)"),
    ]
    .map(|(v, l)| (AttrValue::from(v), AttrValue::from(l)))
    .to_vec();
    let mode = if state.text("expmode").trim() == "auto" {
        "auto"
    } else {
        "set"
    };
    let on_mode = use_action(&props.dispatch, |word: String| Action::set("expmode", word));
    // The date and time: ISO 8601 text, kept as typed, with the device's clock as a start.
    let error = state.error("when");
    let oninput = use_action(&props.dispatch, |e: InputEvent| {
        Action::set("when", e.target_unchecked_into::<HtmlInputElement>().value())
    });
    let on_now = use_action(&props.dispatch, |_: MouseEvent| {
        Action::set("when", browser::now_local_iso())
    });
    html! {
        <fieldset class="group" id="group-light">
            <legend>{ "Light and exposure" }</legend>
            <div class={classes!("field", error.is_some().then_some("invalid"))}>
                <label for="in-when">{ "Date and time" }<span class="unit">{ " (local, with UTC offset)" }</span></label>
                <input id="in-when" name="when" type="text" autocomplete="off" spellcheck="false" placeholder="2026-06-21T10:30+02:00"
                    value={state.text("when")} {oninput} aria-invalid={error.is_some().to_string()}
                    aria-describedby={error.is_some().then_some("err-when")} />
                <span class="hint">
                    <button type="button" id="when-now" onclick={on_now}>{ "Use this device's clock" }</button>
                    { " The place is the survey origin (latitude, longitude) below." }
                </span>
                if let Some(error) = error { <span class="error" id="err-when" role="alert">{ error }</span> }
            </div>
            <Choice id="sky" label="Sky" options={skies} selected={sky} on_change={on_sky} />
            { field(props, "lux", Some("measured, instead of the sun's (leave empty)")) }
            <Choice id="expmode" label="Exposure time" options={modes} selected={mode} on_change={on_mode} />
            <div class="pair">{ field(props, "iso", None) }{ field(props, "refl", Some("0.18 for an average scene")) }</div>
            { field(props, "fmin", Some("for the best settings; the f-number above if empty")) }
            <details class="sensor">
                <summary>{ "Sensor charge and noise" }</summary>
                <p class="hint">{ "Generic figures for the pixel size are used when these are empty (from memory; a maker's sheet is better)." }</p>
                <div class="pair">{ field(props, "fw", None) }{ field(props, "rn", None) }</div>
                { field(props, "baseiso", None) }
            </details>
        </fieldset>
    }
}

/// Properties of the light panel.
#[derive(Properties, PartialEq, Clone)]
pub struct LightProps {
    pub state: Rc<State>,
    pub dispatch: Callback<Action>,
}

/// Part of the light panel drawn by the second module for `plan`, asked for `pause_ms` after the
/// plan changes (only when `wanted`); the last drawing is kept, with the plan it was drawn for.
#[hook]
fn use_drawing(plan: &Rc<Plan>, drawing: Drawing, pause_ms: u32, wanted: bool) -> Option<(Rc<Plan>, AttrValue)> {
    let drawn = use_state(|| None::<(Rc<Plan>, AttrValue)>);
    {
        let drawn = drawn.clone();
        use_effect_with((plan.clone(), wanted), move |(plan, wanted)| {
            let fresh = drawn.as_ref().is_some_and(|(p, _)| Rc::ptr_eq(p, plan));
            let timer = (!fresh && *wanted).then(|| {
                let (drawn, plan) = (drawn.clone(), plan.clone());
                gloo::timers::callback::Timeout::new(pause_ms, move || {
                    let query = plan.scenario.to_query();
                    aside::draw(drawing, &query, move |answer| {
                        if let Ok(html) = answer {
                            drawn.set(Some((plan, html.into())));
                        }
                    })
                })
            });
            move || drop(timer)
        });
    }
    (*drawn).clone()
}

/// A drawing of the module in its wrapper, marked stale while it shows an earlier plan.
fn drawing_html(
    drawn: &Option<(Rc<Plan>, AttrValue)>,
    plan: &Rc<Plan>,
    class: &'static str,
    onclick: Option<Callback<MouseEvent>>,
) -> Html {
    match drawn {
        Some((drawn_plan, html)) => {
            let settled = Rc::ptr_eq(drawn_plan, plan);
            html! {
                <div class={classes!(class, (!settled).then_some("stale"))} data-settled={settled.to_string()} {onclick}>
                    { Html::from_html_unchecked(html.clone()) }
                </div>
            }
        }
        None => html! { <div class={class} data-settled="false"></div> },
    }
}

/// The light panel.
#[function_component(LightPanel)]
pub fn light_panel(props: &LightProps) -> Html {
    let plan = &props.state.plan;
    let lit = plan.scenario.when.is_some() || plan.report.illuminance_lx.is_some();
    let figures = use_drawing(plan, Drawing::Light, 0, true);
    let extras = use_drawing(plan, Drawing::Extras, EXTRAS_PAUSE_MS, lit);
    // The settings the button in the module's drawing carries, applied on its click.
    let on_click = {
        let dispatch = props.dispatch.clone();
        Callback::from(move |e: MouseEvent| {
            let Some(button) = e
                .target_dyn_into::<web_sys::Element>()
                .and_then(|t| t.closest("#apply-best").ok().flatten())
            else {
                return;
            };
            let (Some(f_number), Some(iso)) = (button.get_attribute("data-fnum"), button.get_attribute("data-iso"))
            else {
                return;
            };
            dispatch.emit(Action::Set(vec![
                ("fnum".into(), f_number),
                ("iso".into(), iso),
                ("expmode".into(), "auto".into()),
            ]))
        })
    };
    html! {
        <section class="panel" id="light" aria-labelledby="light-title">
            <h2 id="light-title">{ "Light and exposure" }</h2>
            { drawing_html(&figures, plan, "light-figures", None) }
            if lit { { drawing_html(&extras, plan, "extras", Some(on_click)) } }
            <p class="note">{ "Daylight from the IES sky model; sensor figures generic unless typed. Low sun, glare and twilight are shown as information only." }</p>
        </section>
    }
}
