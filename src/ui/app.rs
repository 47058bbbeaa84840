//! The root component: one state, the input groups, the results, and the browser effects.

use crate::core::contract::scenario::RawScenario;
use crate::core::formats::qr::qr_svg;
use crate::core::presets::demo;
use crate::core::words::chart;
use crate::core::words::format;
use crate::core::words::notes;
use crate::ui::browser;
use crate::ui::components::cautions::Cautions;
use crate::ui::components::chart::LimitsChart;
use crate::ui::components::field::Choice;
use crate::ui::components::inputs::{
    AirGroup, BandGroup, CameraGroup, GeometryGroup, LensGroup, MotionGroup, NeedGroup, SurveyGroup,
};
use crate::ui::components::print::PrintSheet;
use crate::ui::components::results::Results;
use crate::ui::components::share::SharePanel;
use crate::ui::components::solve::SolvePanel;
use crate::ui::components::survey::SurveyPanel;
use crate::ui::components::target::TargetPanel;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// Where the high-contrast preference is kept.
const THEME_KEY: &str = "sharpfield.theme";

/// The scenario the page opens with: the one in its address, or the first demo.
fn initial_raw() -> RawScenario {
    browser::scenario_from_location().unwrap_or_else(|| demo::pasture_survey().to_raw())
}

/// The app.
#[function_component(App)]
pub fn app() -> Html {
    let state = use_reducer(|| State::new(initial_raw()));
    let dispatch = {
        let state = state.clone();
        Callback::from(move |action: Action| state.dispatch(action))
    };

    // The address always holds the current scenario, replaced in place while editing.
    {
        let writer = use_mut_ref(browser::AddressWriter::default);
        use_effect_with(state.raw.clone(), move |raw| {
            browser::AddressWriter::request(&writer, raw.clone())
        });
    }

    let snapshot: Rc<State> = Rc::new((*state).clone());

    // The chart is drawn on screen and on the printed sheet: compute it once per scenario.
    let chart = {
        let plan = snapshot.plan.clone();
        use_memo(state.raw.clone(), move |_| {
            let r = &plan.report;
            let crossings: Vec<f64> = r.envelope_changes.iter().map(|c| c.position_m).collect();
            chart::build(&plan.sweep, r.need_m, r.reach_m, &crossings, plan.scenario.units)
        })
    };
    let on_print = Callback::from(|_: ()| browser::print());
    // The link to this scenario and its QR code, shown on screen and printed.
    let link = browser::link_to(&state.raw);
    let qr = use_memo(link.clone(), |link| qr_svg(link));

    let report = &snapshot.plan.report;
    let units = snapshot.plan.scenario.units;

    let demos = demo::all();
    let demo_options: Vec<(AttrValue, AttrValue)> = std::iter::once(("".into(), "Open a demo…".into()))
        .chain(
            demos
                .iter()
                .enumerate()
                .map(|(i, d)| (i.to_string().into(), d.name.clone().into())),
        )
        .collect();
    let on_demo = {
        let dispatch = dispatch.clone();
        Callback::from(move |index: String| {
            if let Some(d) = index.parse::<usize>().ok().and_then(|i| demo::all().into_iter().nth(i)) {
                dispatch.emit(Action::Load(d.to_raw()));
            }
        })
    };
    let on_name = {
        let dispatch = dispatch.clone();
        Callback::from(move |e: InputEvent| {
            let input: HtmlInputElement = e.target_unchecked_into();
            dispatch.emit(Action::set("name", input.value()));
        })
    };
    let on_units = {
        let dispatch = dispatch.clone();
        Callback::from(move |units: String| dispatch.emit(Action::set("units", units)))
    };
    let contrast = use_state(|| browser::storage_get(THEME_KEY).ok().flatten().as_deref() == Some("contrast"));
    {
        let on = *contrast;
        use_effect_with(on, |on| browser::set_theme(if *on { "contrast" } else { "default" }));
    }
    let on_contrast = {
        let contrast = contrast.clone();
        Callback::from(move |_| {
            let next = !*contrast;
            if let Some(root) = web_sys::window()
                .and_then(|w| w.document())
                .and_then(|d| d.document_element())
            {
                let _ = root.set_attribute("data-theme", if next { "contrast" } else { "default" });
            }
            contrast.set(next);
        })
    };

    let name = snapshot.text("name");
    html! {
        <>
        <header class="top">
            <div class="brand">
                <h1>{ "Sharpfield" }</h1>
                <p class="tagline">{ "How high to fly or how far to stand, so your images show what you need." }</p>
            </div>
            <div class="tools">
                <Choice id="demo" label="Demos" options={demo_options} selected="" on_change={on_demo} />
                <Choice id="units" label="Units" options={vec![("metric".into(), "Metric".into()), ("imperial".into(), "Imperial".into())]}
                    selected={AttrValue::from(units.key())} on_change={on_units} />
                <button type="button" class="toggle" aria-pressed={contrast.to_string()} onclick={on_contrast}>{ "High contrast" }</button>
            </div>
        </header>
        <div class="summary" aria-live="polite">
            <span>{ if name.is_empty() { "Untitled scenario".to_string() } else { name.clone() } }</span>
            <a href="#results">{ format!("{} governs: {}", notes::limit_title(report.governing), format::length(report.limit_m, units)) }</a>
        </div>
        <main class="layout">
            <form class="inputs" onsubmit={Callback::from(|e: SubmitEvent| e.prevent_default())} aria-label="Scenario inputs">
                <div class="field">
                    <label for="in-name">{ "Scenario name" }</label>
                    <input id="in-name" type="text" value={name} oninput={on_name} maxlength="120" autocomplete="off" />
                    if let Some(error) = snapshot.error("name") { <span class="error" role="alert">{ error }</span> }
                </div>
                <CameraGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <LensGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <BandGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <GeometryGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <AirGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <MotionGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <NeedGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                <SurveyGroup state={snapshot.clone()} dispatch={dispatch.clone()} />
                if !report.ignored.is_empty() {
                    <p class="note">{ format!("Kept but not used (unknown keys in the link): {}", report.ignored.join(", ")) }</p>
                }
                { for report.errors.iter().filter(|e| !["name"].contains(&e.key.as_str()) && !crate::core::contract::inputs::input(&e.key).is_some_and(|i| i.is_number())).map(|e| html! {
                    <p class="error" role="alert" data-error-key={e.key.clone()}>{ e.message.clone() }</p>
                }) }
            </form>
            <div class="outputs">
                if snapshot.plan.scenario.name.ends_with("(demo)") {
                    <p class="intro">{ "A worked demo of invented places: change any input and watch which limit governs. “Demos” has another." }</p>
                }
                <Results state={snapshot.clone()} />
                <Cautions state={snapshot.clone()} />
                <LimitsChart state={snapshot.clone()} chart={chart.clone()} />
                <SolvePanel state={snapshot.clone()} />
                <TargetPanel state={snapshot.clone()} />
                <SurveyPanel state={snapshot.clone()} />
                <SharePanel state={snapshot.clone()} dispatch={dispatch.clone()} {on_print} link={link.clone()} qr={qr.clone()} />
            </div>
        </main>
        <PrintSheet state={snapshot.clone()} chart={chart.clone()} qr={qr.clone()} />
        <footer class="foot">
            <p>{ "Sharpfield estimates; it does not replace a test flight, local rules or licensed practice. Sources and limits: see the README." }</p>
        </footer>
        </>
    }
}
