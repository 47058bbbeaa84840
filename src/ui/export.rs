//! Exports built off the first load: a web worker (the `sharpfield-export` bin, built by trunk
//! with a loader shim) turns a scenario's query into its GeoJSON, so the ellipsoid geodesics and
//! the GeoJSON writer are not in the page's first load. Messages are plain strings: the worker
//! says `ready` once it listens; the page then posts the query; the worker answers
//! `[true, geojson]` or `[false, the problem in words]`.

use crate::core::contract::scenario::Scenario;
use crate::core::formats::geojson::survey_geojson_checked;
use crate::core::planning::survey::plan_survey;
use std::cell::RefCell;
use wasm_bindgen::closure::Closure;
use wasm_bindgen::{JsCast, JsValue};

/// The worker's loader, unhashed so that the page can name it (trunk's `data-loader-shim`).
const LOADER: &str = "./sharpfield-export_loader.js";

/// The GeoJSON of a scenario's survey, or why it cannot be exported, in words.
fn geojson_for(query: &str) -> Result<String, String> {
    let (scenario, _) = Scenario::from_query(query);
    let inputs = scenario.planned_survey_inputs();
    let plan = plan_survey(&inputs);
    survey_geojson_checked(&inputs, &plan, &scenario.name).map_err(|p| p.message().to_string())
}

/// In the worker: answers every message with the export of the query it carries.
pub fn serve() {
    let scope: web_sys::DedicatedWorkerGlobalScope = js_sys::global().unchecked_into();
    let reply = scope.clone();
    let on_message = Closure::<dyn Fn(web_sys::MessageEvent)>::new(move |event: web_sys::MessageEvent| {
        let query = event.data().as_string().unwrap_or_default();
        let answer = geojson_for(&query);
        let ok = answer.is_ok();
        let text = answer.unwrap_or_else(|problem| problem);
        let _ = reply.post_message(&js_sys::Array::of2(&JsValue::from_bool(ok), &JsValue::from_str(&text)));
    });
    scope.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
    on_message.forget();
    // A message that arrives while the module is still loading finds no handler and is lost, so
    // the page waits for this word before it asks.
    let _ = scope.post_message(&JsValue::from_str(READY));
}

/// What the worker says once it listens.
const READY: &str = "ready";

thread_local! {
    /// The worker, started on the first request and kept for the next.
    static WORKER: RefCell<Option<web_sys::Worker>> = const { RefCell::new(None) };
    /// Whether it has said it listens.
    static LISTENING: std::cell::Cell<bool> = const { std::cell::Cell::new(false) };
    /// The handlers of the request in flight; the next request's replace (and drop) them.
    static HANDLERS: RefCell<Option<(MessageHandler, ErrorHandler)>> = const { RefCell::new(None) };
}

type MessageHandler = Closure<dyn Fn(web_sys::MessageEvent)>;
type ErrorHandler = Closure<dyn Fn(web_sys::Event)>;

/// In the page: asks the worker for the GeoJSON of `query` and calls `done` with it, or with why
/// it cannot be made (also when the worker cannot be started or fails).
pub fn geojson(query: &str, done: impl FnOnce(Result<String, String>) + 'static) {
    const FAILED: &str = "The export module could not be loaded; reload the page and try again.";
    let worker = WORKER.with(|w| {
        let mut w = w.borrow_mut();
        if w.is_none() {
            *w = web_sys::Worker::new(LOADER).ok();
        }
        w.clone()
    });
    let Some(worker) = worker else {
        done(Err(FAILED.to_string()));
        return;
    };
    let done = RefCell::new(Some(done));
    let finish = move |answer: Result<String, String>| {
        if let Some(done) = done.borrow_mut().take() {
            done(answer);
        }
    };
    let finish = std::rc::Rc::new(finish);
    let query = query.to_string();
    let on_answer = {
        let (finish, worker, query) = (finish.clone(), worker.clone(), query.clone());
        Closure::<dyn Fn(web_sys::MessageEvent)>::new(move |event: web_sys::MessageEvent| {
            let data = event.data();
            if data.as_string().as_deref() == Some(READY) {
                LISTENING.with(|l| l.set(true));
                let _ = worker.post_message(&JsValue::from_str(&query));
                return;
            }
            let data = js_sys::Array::from(&data);
            let text = data.get(1).as_string().unwrap_or_default();
            finish(if data.get(0).as_bool() == Some(true) {
                Ok(text)
            } else {
                Err(text)
            });
        })
    };
    let on_error = Closure::<dyn Fn(web_sys::Event)>::new(move |_| finish(Err(FAILED.to_string())));
    worker.set_onmessage(Some(on_answer.as_ref().unchecked_ref()));
    worker.set_onerror(Some(on_error.as_ref().unchecked_ref()));
    // One request at a time: each sets its own handlers, kept until the next replaces them.
    HANDLERS.with(|h| *h.borrow_mut() = Some((on_answer, on_error)));
    if LISTENING.with(|l| l.get()) {
        let _ = worker.post_message(&JsValue::from_str(&query));
    }
}
