//! The root component: one state, the input groups, the results, and the browser effects.

use crate::core::contract::plan::Plan;
use crate::core::contract::scenario::RawScenario;
use crate::core::formats::qr::QrSvg;
use crate::core::presets::demo;
use crate::core::words::chart;
use crate::core::words::format;
use crate::core::words::notes;
use crate::ui::aside;
use crate::ui::browser;
use crate::ui::components::cautions::Cautions;
use crate::ui::components::chart::LimitsChart;
use crate::ui::components::form::ScenarioForm;
use crate::ui::components::header::Header;
use crate::ui::components::light::LightPanel;
use crate::ui::components::print::PrintSheet;
use crate::ui::components::results::Results;
use crate::ui::components::share::SharePanel;
use crate::ui::components::solve::SolvePanel;
use crate::ui::components::survey::SurveyPanel;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use wasm_bindgen::closure::Closure;
use wasm_bindgen::JsCast;
use yew::prelude::*;

/// The scenario the page opens with: the one in its address, or the first demo.
fn initial_raw() -> RawScenario {
    browser::scenario_from_location().unwrap_or_else(|| demo::pasture_survey().to_raw())
}

/// How long typing must pause before the QR code and the printed sheet follow the scenario (ms).
const SETTLE_MS: u32 = 250;

/// What is drawn once typing pauses rather than on every keystroke: the QR code (the costliest
/// drawing of a keystroke), the printed sheet (hidden on screen) and the panels out of view, for
/// one scenario.
#[derive(Clone, PartialEq)]
struct Settled {
    state: Rc<State>,
    chart: Rc<chart::Chart>,
    link: AttrValue,
}

impl Settled {
    fn of(state: &Rc<State>, chart: &Rc<chart::Chart>, link: &AttrValue) -> Settled {
        Settled {
            state: state.clone(),
            chart: chart.clone(),
            link: link.clone(),
        }
    }
}

/// The app.
#[function_component(App)]
pub fn app() -> Html {
    let state = use_reducer(|| State::new(initial_raw()));
    // One dispatch callback for the page's life, so that components whose other props are
    // unchanged are not drawn again on a keystroke.
    let dispatch = {
        let dispatcher = state.dispatcher();
        (*use_memo((), move |_| {
            Callback::from(move |action: Action| dispatcher.dispatch(action))
        }))
        .clone()
    };

    // The address always holds the current scenario, replaced in place while editing.
    {
        let writer = use_mut_ref(browser::AddressWriter::default);
        use_effect_with(state.raw.clone(), move |raw| {
            browser::AddressWriter::request(&writer, raw.clone())
        });
    }

    let snapshot: Rc<State> = Rc::new((*state).clone());

    // The sun of a time and place is placed by the second module; the plan waits for it.
    {
        let dispatch = dispatch.clone();
        use_effect_with(snapshot.plan.light.pending, move |pending| {
            if let Some((unix_s, place)) = *pending {
                aside::sun(unix_s, place, move |answer| {
                    dispatch.emit(Action::Sun {
                        unix_s,
                        place,
                        position: answer.unwrap_or(None),
                    })
                });
            }
        });
    }

    // The chart is drawn on screen and on the printed sheet: compute it once per scenario, reusing
    // the last chart's samples when only the position along the axis moved.
    let last_chart = use_mut_ref(|| None::<(Rc<Plan>, Rc<chart::Chart>)>);
    let chart = {
        let plan = snapshot.plan.clone();
        let last_chart = last_chart.clone();
        // The plan follows the text and the sun.
        use_memo((state.raw.clone(), snapshot.plan.light.sun), move |_| {
            let r = &plan.report;
            let crossings: Vec<f64> = r.envelope_changes.iter().map(|c| c.position_m).collect();
            // The need is on the target's plane; the chart draws limits in the plane normal to the view.
            let tasks: Vec<_> = r.task_ranges.iter().filter_map(|t| Some((t.task, t.p50_m?))).collect();
            let previous = last_chart.borrow().clone();
            let built = Rc::new(chart::build_after(
                &plan.sweep,
                &chart::Marks {
                    need_m: r.need_m.map(|n| n / r.plane_stretch),
                    reach_m: r.reach_m,
                    crossings: &crossings,
                    tasks: &tasks,
                },
                plan.scenario.units,
                previous.as_ref().map(|(p, c)| (&p.sweep, &**c)),
            ));
            *last_chart.borrow_mut() = Some((plan.clone(), built.clone()));
            built
        })
    };
    let chart: Rc<chart::Chart> = (*chart).clone();
    // The link to this scenario. Its QR code and the printed sheet follow it once typing pauses:
    // at once for the first link, then SETTLE_MS after the last change, and at once before printing
    // (the print button, or the browser's own print command through `beforeprint`).
    let link: AttrValue = browser::link_to(&state.raw).into();
    let settled = use_state_eq(|| Settled::of(&snapshot, &chart, &link));
    let latest: Latest = use_mut_ref(|| None);
    *latest.borrow_mut() = Some((snapshot.clone(), chart.clone(), link.clone()));
    {
        let settled = settled.clone();
        let latest = latest.clone();
        use_effect_with((*snapshot).clone(), move |now| {
            let timer = (*settled.state != *now).then(|| {
                let settled = settled.clone();
                gloo::timers::callback::Timeout::new(SETTLE_MS, move || settle(&settled, &latest))
            });
            move || drop(timer)
        });
    }
    {
        let settled = settled.clone();
        let latest = latest.clone();
        use_effect_with((), move |_| {
            let listener = web_sys::window().map(|window| {
                gloo::events::EventListener::new(&window, "beforeprint", move |_| settle(&settled, &latest))
            });
            move || drop(listener)
        });
    }
    let on_print = {
        let settled = settled.clone();
        let now = snapshot.clone();
        Callback::from(move |_: ()| {
            if *settled.state == *now {
                browser::print();
            } else {
                // Draw the current sheet and code first; print once the page shows them.
                settle(&settled, &latest);
                browser::print_when_settled();
            }
        })
    };
    // The QR code of the settled link, drawn by the second module.
    let drawn_qr = use_state(|| (AttrValue::default(), Rc::new(None::<QrSvg>)));
    {
        let drawn_qr = drawn_qr.clone();
        use_effect_with(settled.link.clone(), move |link| {
            let link = link.clone();
            aside::qr(&link.clone(), move |qr| drawn_qr.set((link, Rc::new(qr))));
        });
    }
    let qr_ready = drawn_qr.0 == settled.link;
    let qr = if qr_ready { drawn_qr.1.clone() } else { Rc::new(None) };
    let caught_up = *settled.state == *snapshot && snapshot.plan.light.pending.is_none() && qr_ready;

    // Panels out of view show the settled scenario: a keystroke draws what a person can see, and
    // the rest follow once typing pauses, or at once when scrolled into view.
    let in_view = use_in_view(&settled.link);
    let live = |id: &str| in_view.as_ref().is_none_or(|ids| ids.iter().any(|v| v == id));
    let shown = |id: &str| {
        if live(id) {
            snapshot.clone()
        } else {
            settled.state.clone()
        }
    };
    let chart_shown = if live("chart") {
        chart.clone()
    } else {
        settled.chart.clone()
    };

    let report = &snapshot.plan.report;
    let units = snapshot.plan.scenario.units;

    let name = snapshot.text("name");
    html! {
        <>
        <Header {units} dispatch={dispatch.clone()} />
        <div class="summary" aria-live="polite">
            <span>{ if name.is_empty() { "Untitled scenario".to_string() } else { name } }</span>
            <a href="#results">{ format!("{} governs: {}", notes::limit_title(report.governing), format::length(report.limit_m, units)) }</a>
        </div>
        <main class="layout" data-settled={caught_up.to_string()}>
            <ScenarioForm state={snapshot.clone()} dispatch={dispatch.clone()} />
            <div class="outputs">
                if snapshot.plan.scenario.name.ends_with("(demo)") {
                    <p class="intro">{ "A worked demo of invented places: change any input and watch which limit governs. “Demos” has another." }</p>
                }
                <Results state={snapshot.clone()} />
                <Cautions state={shown("cautions")} />
                <LimitsChart state={shown("chart")} chart={chart_shown} />
                <SolvePanel state={shown("solve")} target={shown("target")} />
                <LightPanel state={shown("light")} dispatch={dispatch.clone()} />
                <SurveyPanel state={shown("survey")} />
                <SharePanel state={snapshot.clone()} dispatch={dispatch.clone()} {on_print} link={link.clone()} qr={qr.clone()} />
            </div>
        </main>
        <PrintSheet state={settled.state.clone()} chart={settled.chart.clone()} qr={qr.clone()} />
        <footer class="foot">
            <p>{ "Sharpfield estimates; it does not replace a test flight, local rules or licensed practice. Sources and limits: see the README." }</p>
        </footer>
        </>
    }
}

/// The scenario, chart and link last drawn on the page, for the QR code and the sheet to follow.
type Latest = Rc<std::cell::RefCell<Option<(Rc<State>, Rc<chart::Chart>, AttrValue)>>>;

/// Brings the QR code and the printed sheet up to the latest scenario (no new drawing when they
/// already show it: the state is compared with `use_state_eq`).
fn settle(settled: &UseStateHandle<Settled>, latest: &Latest) {
    if let Some((state, chart, link)) = latest.borrow().as_ref() {
        settled.set(Settled::of(state, chart, link));
    }
}

/// The output panels whose drawing may wait while they are out of view.
const DEFERRABLE: [&str; 6] = ["cautions", "chart", "solve", "target", "light", "survey"];

/// The ids of the deferrable panels now in the viewport (`None` until the browser has said, and
/// where it cannot: then every panel is drawn live). The panels are looked up again whenever the
/// settled scenario changes, in case one was drawn anew.
#[hook]
fn use_in_view(settled_link: &AttrValue) -> Option<Vec<String>> {
    let in_view = use_state_eq(|| None::<Vec<String>>);
    let observer = use_mut_ref(|| None::<(web_sys::IntersectionObserver, Closure<dyn Fn(js_sys::Array)>)>);
    {
        let (in_view, observer) = (in_view.clone(), observer.clone());
        use_effect_with(settled_link.clone(), move |_| {
            let mut slot = observer.borrow_mut();
            if slot.is_none() {
                // Whether each of DEFERRABLE is in view, in that order.
                let seen = Rc::new(std::cell::RefCell::new([false; DEFERRABLE.len()]));
                let on_change = Closure::<dyn Fn(js_sys::Array)>::new(move |entries: js_sys::Array| {
                    let mut seen = seen.borrow_mut();
                    for entry in entries.iter() {
                        let entry: web_sys::IntersectionObserverEntry = entry.unchecked_into();
                        let id = entry.target().id();
                        if let Some(at) = DEFERRABLE.iter().position(|d| *d == id) {
                            seen[at] = entry.is_intersecting();
                        }
                    }
                    let ids = DEFERRABLE.iter().zip(seen.iter()).filter(|(_, s)| **s);
                    in_view.set(Some(ids.map(|(id, _)| id.to_string()).collect()));
                });
                if let Ok(made) = web_sys::IntersectionObserver::new(on_change.as_ref().unchecked_ref()) {
                    *slot = Some((made, on_change));
                }
            }
            if let (Some((observer, _)), Some(document)) = (slot.as_ref(), web_sys::window().and_then(|w| w.document()))
            {
                for id in DEFERRABLE {
                    if let Some(panel) = document.get_element_by_id(id) {
                        observer.observe(&panel);
                    }
                }
            }
        });
    }
    (*in_view).clone()
}
