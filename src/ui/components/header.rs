//! The page's header: the name of the app and its tools (demos, units, contrast).

use super::field::Choice;
use super::inputs::use_action;
use super::theme::use_theme_toggle;
use crate::core::presets::demo;
use crate::core::words::units::Units;
use crate::ui::state::Action;
use yew::prelude::*;

/// Properties of the header.
#[derive(Properties, PartialEq, Clone)]
pub struct HeaderProps {
    /// The scenario's display units.
    pub units: Units,
    pub dispatch: Callback<Action>,
}

/// The header with the demo picker, the units and the theme toggle.
#[function_component(Header)]
pub fn header(props: &HeaderProps) -> Html {
    let demos = demo::all();
    let demo_options: Vec<(AttrValue, AttrValue)> = std::iter::once(("".into(), "Open a demo…".into()))
        .chain(
            demos
                .iter()
                .enumerate()
                .map(|(i, d)| (i.to_string().into(), d.name.clone().into())),
        )
        .collect();
    let on_demo = use_callback(props.dispatch.clone(), |index: String, dispatch| {
        if let Some(d) = index.parse::<usize>().ok().and_then(|i| demo::all().into_iter().nth(i)) {
            dispatch.emit(Action::Load(d.to_raw()));
        }
    });
    let on_units = use_action(&props.dispatch, |units: String| Action::set("units", units));
    let theme = use_theme_toggle();
    html! {
        <header class="top">
            <div class="brand">
                <h1>{ "Sharpfield" }</h1>
                <p class="tagline">{ "How high to fly or how far to stand, so your images show what you need." }</p>
            </div>
            <div class="tools">
                <Choice id="demo" label="Demos" options={demo_options} selected="" on_change={on_demo} />
                <Choice id="units" label="Units" options={vec![("metric".into(), "Metric".into()), ("imperial".into(), "Imperial".into())]}
                    selected={AttrValue::from(props.units.key())} on_change={on_units} />
                { theme }
            </div>
        </header>
    }
}
