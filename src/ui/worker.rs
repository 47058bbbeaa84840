//! The page's on-demand modules: each is a web worker built by trunk (a `bin` with a loader shim),
//! started on its first request and kept. Messages are JS arrays: the page posts
//! `[id, ...request]`, the worker answers `[id, ...answer]`; before that, the worker says `ready`
//! once it listens (a message that arrives while its module is still loading finds no handler and
//! is lost, so the page queues requests until then).

use std::cell::RefCell;
use wasm_bindgen::closure::Closure;
use wasm_bindgen::{JsCast, JsValue};

/// What a worker says once it listens.
const READY: &str = "ready";

type Done = Box<dyn FnOnce(Result<js_sys::Array, String>)>;

/// One running worker: its requests waiting to be sent, and those waiting for an answer.
struct Running {
    loader: &'static str,
    worker: web_sys::Worker,
    listening: bool,
    queued: Vec<js_sys::Array>,
    /// Requests sent, by id, waiting for their answer (a few at most: a list is enough).
    waiting: Vec<(u32, Done)>,
    next_id: u32,
    _on_message: Closure<dyn Fn(web_sys::MessageEvent)>,
    _on_error: Closure<dyn Fn(web_sys::Event)>,
}

thread_local! {
    static RUNNING: RefCell<Vec<Running>> = const { RefCell::new(Vec::new()) };
}

/// Why there is no answer: the module could not be started, or failed.
const FAILED: &str = "A part of the planner could not be loaded; reload the page and try again.";

/// Asks the worker behind `loader` (started now if it is not running) for `request` and calls
/// `done` with its answer, or with why there is none (the worker could not start, or failed: then
/// every request waiting on it is answered so, and the next one starts it anew).
pub fn ask(loader: &'static str, request: &[JsValue], done: impl FnOnce(Result<js_sys::Array, String>) + 'static) {
    ask_boxed(loader, request, Box::new(done));
}

/// [`ask`] with the answer's receiver boxed: one copy of this code, whatever the receivers.
fn ask_boxed(loader: &'static str, request: &[JsValue], done: Done) {
    let started = RUNNING.with(|r| r.borrow().iter().any(|w| w.loader == loader)) || start(loader);
    if !started {
        done(Err(FAILED.to_string()));
        return;
    }
    RUNNING.with(|r| {
        let mut running = r.borrow_mut();
        let Some(w) = running.iter_mut().find(|w| w.loader == loader) else {
            return;
        };
        let id = w.next_id;
        w.next_id = w.next_id.wrapping_add(1);
        let message = js_sys::Array::of1(&JsValue::from(id));
        for part in request {
            message.push(part);
        }
        w.waiting.push((id, done));
        if w.listening {
            let _ = w.worker.post_message(&message);
        } else {
            w.queued.push(message);
        }
    });
}

/// [`ask`] of a worker that answers `[true, text]` or `[false, the problem in words]`
/// ([`text_answer`]): `done` gets the text or the problem.
pub fn ask_text(loader: &'static str, request: &[JsValue], done: impl FnOnce(Result<String, String>) + 'static) {
    ask_text_boxed(loader, request, Box::new(done));
}

/// [`ask_text`] with the receiver boxed: one copy of this code, whatever the receivers.
fn ask_text_boxed(loader: &'static str, request: &[JsValue], done: Box<dyn FnOnce(Result<String, String>)>) {
    ask(loader, request, move |answer| {
        done(answer.and_then(|data| {
            let text = data.get(1).as_string().unwrap_or_default();
            if data.get(0).as_bool() == Some(true) {
                Ok(text)
            } else {
                Err(text)
            }
        }))
    });
}

/// In a worker: the answer `[true, text]` or `[false, the problem in words]` that [`ask_text`]
/// reads.
pub fn text_answer(result: Result<String, String>) -> js_sys::Array {
    let ok = result.is_ok();
    let text = result.unwrap_or_else(|problem| problem);
    js_sys::Array::of2(&JsValue::from_bool(ok), &JsValue::from_str(&text))
}

/// Starts the worker behind `loader`; false when the browser refuses.
fn start(loader: &'static str) -> bool {
    let Ok(worker) = web_sys::Worker::new(loader) else {
        return false;
    };
    let on_message = Closure::<dyn Fn(web_sys::MessageEvent)>::new(move |event: web_sys::MessageEvent| {
        let data = event.data();
        if data.as_string().as_deref() == Some(READY) {
            listening(loader);
            return;
        }
        let answer = js_sys::Array::from(&data);
        let id = answer.shift().as_f64().map_or(u32::MAX, |id| id as u32);
        let done = RUNNING.with(|r| {
            r.borrow_mut().iter_mut().find(|w| w.loader == loader).and_then(|w| {
                let at = w.waiting.iter().position(|(waiting, _)| *waiting == id)?;
                Some(w.waiting.swap_remove(at).1)
            })
        });
        if let Some(done) = done {
            done(Ok(answer));
        }
    });
    let on_error = Closure::<dyn Fn(web_sys::Event)>::new(move |_| stop(loader));
    worker.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
    worker.set_onerror(Some(on_error.as_ref().unchecked_ref()));
    RUNNING.with(|r| {
        r.borrow_mut().push(Running {
            loader,
            worker,
            listening: false,
            queued: Vec::new(),
            waiting: Vec::new(),
            next_id: 0,
            _on_message: on_message,
            _on_error: on_error,
        })
    });
    true
}

/// The worker listens: sends what was queued.
fn listening(loader: &'static str) {
    RUNNING.with(|r| {
        if let Some(w) = r.borrow_mut().iter_mut().find(|w| w.loader == loader) {
            w.listening = true;
            for message in w.queued.drain(..) {
                let _ = w.worker.post_message(&message);
            }
        }
    });
}

/// The worker failed: it is dropped, and every request waiting on it is told.
fn stop(loader: &'static str) {
    let stopped = RUNNING.with(|r| {
        let mut running = r.borrow_mut();
        let at = running.iter().position(|w| w.loader == loader)?;
        Some(running.remove(at))
    });
    if let Some(w) = stopped {
        w.worker.terminate();
        for (_, done) in w.waiting {
            done(Err(FAILED.to_string()));
        }
    }
}

/// In a worker: answers every request with `answer` and says it listens.
pub fn serve(answer: fn(&js_sys::Array) -> js_sys::Array) {
    let scope: web_sys::DedicatedWorkerGlobalScope = js_sys::global().unchecked_into();
    let reply = scope.clone();
    let on_message = Closure::<dyn Fn(web_sys::MessageEvent)>::new(move |event: web_sys::MessageEvent| {
        let request = js_sys::Array::from(&event.data());
        let id = request.shift();
        let out = answer(&request);
        out.unshift(&id);
        let _ = reply.post_message(&out);
    });
    scope.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
    on_message.forget();
    let _ = scope.post_message(&JsValue::from_str(READY));
}
