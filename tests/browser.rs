#![cfg(target_arch = "wasm32")]
//! Component tests in a real browser (wasm-bindgen-test in headless Chromium): the app is mounted
//! in a fresh element and the DOM is read the way a person sees it. Expected figures come from the
//! core's report for the same scenario, so every `data-key` element must carry exactly the
//! report's value (same code, same machine: no tolerance).
//!
//! Run: `CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER=wasm-bindgen-test-runner
//! CHROMEDRIVER=/usr/bin/chromedriver cargo test --target wasm32-unknown-unknown --test browser`
//! (scripts/test does; webdriver.json holds Chromium's flags).

use serde_json::Value;
use sharpfield::core::contract::plan::Plan;
use sharpfield::core::contract::report::{report_for_query, Report};
use sharpfield::core::contract::scenario::RawScenario;
use sharpfield::core::formats::library::{Library, ReadOutcome, FORMAT_VERSION};
use sharpfield::core::presets::demo;
use sharpfield::ui::app::App;
use std::time::Duration;
use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{Element, HtmlInputElement, HtmlSelectElement};

wasm_bindgen_test_configure!(run_in_browser);

/// The app mounted in its own element; unmounted and removed when dropped.
struct Mounted {
    root: Element,
    handle: Option<yew::AppHandle<App>>,
}

impl Drop for Mounted {
    fn drop(&mut self) {
        if let Some(handle) = self.handle.take() {
            handle.destroy();
        }
        self.root.remove();
    }
}

fn document() -> web_sys::Document {
    web_sys::window().and_then(|w| w.document()).expect("a document")
}

/// Puts `query` in the page's address (the app reads its scenario from there), then mounts the
/// app and waits until its results are on screen.
async fn mount(query: &str) -> Mounted {
    let window = web_sys::window().expect("a window");
    let path = window.location().pathname().expect("a path");
    let url = if query.is_empty() {
        path
    } else {
        format!("{path}?{query}")
    };
    window
        .history()
        .expect("history")
        .replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&url))
        .expect("replaceState");
    let root = document().create_element("div").expect("a div");
    document()
        .body()
        .expect("a body")
        .append_child(&root)
        .expect("appended");
    let handle = yew::Renderer::<App>::with_root(root.clone()).render();
    let mounted = Mounted {
        root,
        handle: Some(handle),
    };
    wait_until("the results to render", || mounted.find("[data-key=limit_m]").is_some()).await;
    mounted
}

/// Waits (polling, up to 5 s) until `ready` holds; yew renders asynchronously after each event.
async fn wait_until(what: &str, mut ready: impl FnMut() -> bool) {
    for _ in 0..500 {
        if ready() {
            return;
        }
        yew::platform::time::sleep(Duration::from_millis(10)).await;
    }
    panic!("timed out waiting for {what}");
}

impl Mounted {
    /// Waits until the page has caught up with its scenario: panels out of view, the QR code and
    /// the printed sheet follow once typing pauses (`main[data-settled]`).
    async fn settled(&self) {
        wait_until("the page to settle", || {
            self.find("main[data-settled=\"true\"]").is_some()
        })
        .await;
    }

    fn find(&self, selector: &str) -> Option<Element> {
        self.root.query_selector(selector).ok().flatten()
    }

    fn get(&self, selector: &str) -> Element {
        self.find(selector).unwrap_or_else(|| panic!("no element {selector}"))
    }

    fn input(&self, id: &str) -> HtmlInputElement {
        self.get(&format!("#{id}")).dyn_into().expect("an input")
    }

    /// Every `[data-key]` element as (key, data-si), data-si `None` when absent.
    fn shown(&self) -> Vec<(String, Option<String>)> {
        let list = self.root.query_selector_all("[data-key]").expect("a selector");
        (0..list.length())
            .filter_map(|i| list.item(i)?.dyn_into::<Element>().ok())
            .map(|e| {
                (
                    e.get_attribute("data-key").unwrap_or_default(),
                    e.get_attribute("data-si"),
                )
            })
            .collect()
    }

    /// The error shown in the field of input `id`, if any.
    fn field_error(&self, id: &str) -> Option<String> {
        let input = self.get(&format!("#{id}"));
        let field = input.closest(".field").ok().flatten()?;
        field.query_selector(".error").ok().flatten()?.text_content()
    }

    /// Types `text` into input `id` as one input event.
    fn type_into(&self, id: &str, text: &str) {
        let input = self.input(id);
        input.set_value(text);
        fire(&input, "input");
    }

    /// Picks option `value` of select `id`.
    fn choose(&self, id: &str, value: &str) {
        let select: HtmlSelectElement = self.get(&format!("#{id}")).dyn_into().expect("a select");
        select.set_value(value);
        fire(&select, "change");
    }
}

fn fire(target: &web_sys::EventTarget, kind: &str) {
    let init = web_sys::EventInit::new();
    init.set_bubbles(true);
    let event = web_sys::Event::new_with_event_init_dict(kind, &init).expect("an event");
    target.dispatch_event(&event).expect("dispatched");
}

/// The page address's query, without `?`.
fn address_query() -> String {
    let search = web_sys::window()
        .expect("a window")
        .location()
        .search()
        .expect("a query");
    search.trim_start_matches('?').to_string()
}

/// Asserts that every `data-key` element carries the report's value, in SI, as the report has it,
/// once the page has settled (panels out of view follow the scenario after typing pauses, so a
/// read before that could see the one before).
async fn assert_shows(mounted: &Mounted, report: &Report) {
    mounted.settled().await;
    let fields = serde_json::to_value(report).expect("report as JSON");
    let shown = mounted.shown();
    assert!(shown.len() >= 10, "only {} figures shown", shown.len());
    for (key, si) in shown {
        // A nested figure is named by its path into the report: `task_ranges.2.p50_m`.
        let want = key
            .split('.')
            .try_fold(&fields, |v, part| match v {
                Value::Array(items) => part.parse::<usize>().ok().and_then(|i| items.get(i)),
                _ => v.get(part),
            })
            .unwrap_or_else(|| panic!("{key} is shown but is not a report field"));
        let Some(si) = si else {
            panic!("{key} is shown without data-si (the contract asks for it on every result)");
        };
        match want {
            Value::Number(n) => {
                let got: f64 = si
                    .parse()
                    .unwrap_or_else(|_| panic!("{key}: data-si {si:?} is not a number"));
                assert_eq!(Some(got), n.as_f64(), "{key}");
            }
            Value::Null => assert_eq!(si, "", "{key} is null in the report"),
            Value::String(s) => assert_eq!(&si, s, "{key}"),
            // A yes/no field is shown as `true` or `false`.
            Value::Bool(b) => assert_eq!(si, b.to_string(), "{key}"),
            other => panic!("{key}: report field {other} is neither a number, a word nor a yes/no"),
        }
    }
}

fn report_of(raw: &RawScenario) -> Report {
    Plan::from_raw(raw).report
}

#[wasm_bindgen_test]
async fn opened_without_a_scenario_the_app_shows_the_demo_and_its_report() {
    let app = mount("").await;
    let raw = demo::pasture_survey().to_raw();
    assert_eq!(app.input("in-name").value(), raw.get("name").unwrap_or_default());
    assert_shows(&app, &report_of(&raw)).await;
    for key in [
        "limit_m",
        "gsd_m",
        "diffraction_m",
        "turbulence_m",
        "motion_m",
        "governing",
    ] {
        assert!(app.shown().iter().any(|(k, _)| k == key), "{key} not shown");
    }
    // The demo is written into the address, so the page can be shared as it opened.
    wait_until("the demo in the address", || {
        RawScenario::from_query(&address_query()) == raw
    })
    .await;
}

#[wasm_bindgen_test]
async fn a_scenario_in_the_address_is_shown_with_its_report() {
    let query = "v=1&sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&wl=550&h=8&gd=1500&air=hv57&speed=0&shutter=0.002&need=0.1";
    let app = mount(query).await;
    assert_eq!(app.input("in-gd").value(), "1500");
    assert_shows(&app, &report_for_query(query)).await;
}

#[wasm_bindgen_test]
async fn typing_a_bad_value_shows_its_message_beside_the_field_and_keeps_the_rest() {
    let app = mount("").await;
    assert_eq!(app.field_error("in-focal"), None);
    app.type_into("in-focal", "abc");
    wait_until("the focal error", || app.field_error("in-focal").is_some()).await;

    let mut raw = demo::pasture_survey().to_raw();
    raw.set("focal", "abc");
    let report = report_of(&raw);
    let expected = report
        .errors
        .iter()
        .find(|e| e.key == "focal")
        .expect("the report rejects focal=abc");
    assert_eq!(app.field_error("in-focal").as_deref(), Some(expected.message.as_str()));
    assert!(expected.message.contains("from 0.5 to 5000 mm"), "{}", expected.message);
    assert_eq!(app.input("in-focal").value(), "abc");
    assert_eq!(
        app.input("in-focal").get_attribute("aria-invalid").as_deref(),
        Some("true")
    );
    assert_shows(&app, &report).await;

    app.type_into("in-focal", "24");
    wait_until("the focal error to clear", || app.field_error("in-focal").is_none()).await;
    raw.set("focal", "24");
    assert_shows(&app, &report_of(&raw)).await;
}

#[wasm_bindgen_test]
async fn a_field_keeps_an_unfinished_number_while_typing() {
    let app = mount("").await;
    app.type_into("in-focal", "1.");
    let mut raw = demo::pasture_survey().to_raw();
    raw.set("focal", "1.");
    let report = report_of(&raw);
    let aperture = report.aperture_m.to_string();
    wait_until("the aperture for focal 1.", || {
        app.find("[data-key=aperture_m]")
            .and_then(|e| e.get_attribute("data-si"))
            == Some(aperture.clone())
    })
    .await;
    assert_eq!(app.input("in-focal").value(), "1.");
    assert_eq!(app.field_error("in-focal"), None);
    // The address follows after the render, in an effect.
    wait_until("the address to carry focal=1.", || {
        RawScenario::from_query(&address_query()).get("focal") == Some("1.")
    })
    .await;
    assert_shows(&app, &report).await;
}

#[wasm_bindgen_test]
async fn choosing_a_sensor_format_fills_the_camera_fields() {
    let app = mount("").await;
    app.choose("camera-preset", "full-frame");
    wait_until("the sensor width", || app.input("in-sw").value() == "35.9").await;
    let mut raw = demo::pasture_survey().to_raw();
    for (key, value) in [("sw", "35.9"), ("sh", "24"), ("cols", "8192"), ("rows", "5464")] {
        assert_eq!(app.input(&format!("in-{key}")).value(), value, "{key}");
        raw.set(key, value);
    }
    assert_shows(&app, &report_of(&raw)).await;
}

/// Saved-scenario text read as the page reads it: the browser's own `JSON.parse`, seen through
/// the core's `JsonView` (the page carries no JSON parser of its own).
fn read_with_the_browser(text: &str) -> ReadOutcome {
    Library::read_with(text, |text| {
        js_sys::JSON::parse(text).map_err(|_| "not JSON".to_string())
    })
}

#[wasm_bindgen_test]
fn the_browser_parser_reads_saved_scenarios_as_serde_json_does() {
    let mut library = Library::default();
    for s in demo::all() {
        library.insert(&s.name, &s.to_query(), "2026-12-01T10:00:00.000Z");
    }
    let written = library.to_json();
    let newer = format!(
        r#"{{"format":"sharpfield-scenarios","version":{},"scenarios":[]}}"#,
        FORMAT_VERSION + 1
    );
    for text in [
        written.as_str(),
        "",
        "  \n",
        r#"[{"name":"Old plan","query":"v=1&h=50"},{"nonsense":true},42,{"query":"h=5"},{"name":7,"query":"h=6","saved":"x"}]"#,
        r#"{"format":"sharpfield-scenarios","version":1,"scenarios":[{"id":"s9","name":"Good","query":"v=1&h=80","saved":"2026-01-01"},{"name":"No query"},null,"text"]}"#,
        r#"{"version":1}"#,
        r#"{"scenarios":{"name":"not a list"}}"#,
        "42",
        r#""a string""#,
        newer.as_str(),
    ] {
        let serde = Library::read(text);
        let browser = read_with_the_browser(text);
        assert_eq!(browser, serde, "{text}");
    }
    // The lenient reading of the version: a whole number past this version is newer, whatever
    // its size, and nothing else is.
    assert!(read_with_the_browser(r#"{"version":1e300,"scenarios":[]}"#).newer_version);
    assert!(!read_with_the_browser(r#"{"version":-3,"scenarios":[]}"#).newer_version);
    assert!(!read_with_the_browser(r#"{"version":"9","scenarios":[]}"#).newer_version);
    // Text that is no JSON: kept aside whole, and the person is told.
    for corrupt in [
        "not json at all [",
        r#"{"format":"sharpfield-scenarios","version":1,"scenarios":["#,
    ] {
        let outcome = read_with_the_browser(corrupt);
        assert!(outcome.library.scenarios.is_empty());
        assert_eq!(outcome.kept_aside, vec![corrupt.to_string()]);
        assert_eq!(outcome.messages.len(), 1, "{corrupt}");
    }
}
