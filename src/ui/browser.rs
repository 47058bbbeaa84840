//! Browser services: the address bar. Every call tolerates a browser that refuses it.

use crate::core::contract::scenario::RawScenario;
use crate::core::formats::library::{JsonView, Library, ReadOutcome};
use wasm_bindgen::JsCast;

/// The scenario in the page's address, if it carries one.
pub fn scenario_from_location() -> Option<RawScenario> {
    let search = web_sys::window()?.location().search().ok()?;
    let raw = RawScenario::from_query(&search);
    (!raw.pairs.is_empty()).then_some(raw)
}

/// The full link to a scenario: this page's address with the scenario as its query.
pub fn link_to(raw: &RawScenario) -> String {
    let href = location_href();
    format!("{}?{}", href.split('?').next().unwrap_or_default(), raw.to_query())
}

/// Replaces the address's query with the scenario, without adding a history entry.
pub fn replace_location_query(raw: &RawScenario) {
    let Some(window) = web_sys::window() else { return };
    let Ok(history) = window.history() else { return };
    let path = window.location().pathname().unwrap_or_else(|_| "/".to_string());
    let url = format!("{path}?{}", raw.to_query());
    let _ = history.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&url));
}

/// Shortest time between two writes of the address while typing (ms).
const ADDRESS_INTERVAL_MS: f64 = 200.0;

/// Keeps the address in step with the scenario without rewriting it on every keystroke: every
/// rewrite makes the browser fetch and decode the page's icon again, which costs a frame. The
/// first change is written at once, later ones at most every [`ADDRESS_INTERVAL_MS`], and the
/// last one always.
#[derive(Default)]
pub struct AddressWriter {
    last_write_ms: f64,
    pending: Option<RawScenario>,
    timer: Option<gloo::timers::callback::Timeout>,
}

impl AddressWriter {
    /// Asks for the address to show `raw`.
    pub fn request(this: &std::rc::Rc<std::cell::RefCell<AddressWriter>>, raw: RawScenario) {
        let now = js_sys::Date::now();
        let mut writer = this.borrow_mut();
        let waited = now - writer.last_write_ms;
        if writer.timer.is_none() && waited >= ADDRESS_INTERVAL_MS {
            replace_location_query(&raw);
            writer.last_write_ms = now;
            return;
        }
        writer.pending = Some(raw);
        if writer.timer.is_none() {
            let delay = (ADDRESS_INTERVAL_MS - waited).clamp(0.0, ADDRESS_INTERVAL_MS) as u32;
            // A weak handle: when the page's component goes, the writer and its timer go with it,
            // so a write still pending never reaches the address afterwards.
            let handle = std::rc::Rc::downgrade(this);
            writer.timer = Some(gloo::timers::callback::Timeout::new(delay, move || {
                let Some(handle) = handle.upgrade() else {
                    return;
                };
                let mut writer = handle.borrow_mut();
                writer.timer = None;
                if let Some(raw) = writer.pending.take() {
                    replace_location_query(&raw);
                    writer.last_write_ms = js_sys::Date::now();
                }
            }));
        }
    }
}

/// A file name from a scenario name: letters, digits and dashes only.
pub fn file_name(name: &str, extension: &str) -> String {
    let stem: String = name
        .chars()
        .map(|c| {
            if c.is_ascii_alphanumeric() {
                c.to_ascii_lowercase()
            } else {
                '-'
            }
        })
        .collect::<String>()
        .split('-')
        .filter(|p| !p.is_empty())
        .collect::<Vec<_>>()
        .join("-");
    let stem = if stem.is_empty() {
        "sharpfield-scenario".to_string()
    } else {
        stem
    };
    format!("{stem}.{extension}")
}

/// Offers `contents` as a file download made in the page (a blob URL): nothing leaves the device.
pub fn download(file_name: &str, mime: &str, contents: &str) {
    let parts = js_sys::Array::of1(&wasm_bindgen::JsValue::from_str(contents));
    let options = web_sys::BlobPropertyBag::new();
    options.set_type(mime);
    let Ok(blob) = web_sys::Blob::new_with_str_sequence_and_options(&parts, &options) else {
        return;
    };
    let Ok(url) = web_sys::Url::create_object_url_with_blob(&blob) else {
        return;
    };
    let anchor = web_sys::window()
        .and_then(|w| w.document())
        .and_then(|d| d.create_element("a").ok())
        .and_then(|e| e.dyn_into::<web_sys::HtmlAnchorElement>().ok());
    if let Some(a) = anchor {
        a.set_href(&url);
        a.set_download(file_name);
        a.click();
    }
    let _ = web_sys::Url::revoke_object_url(&url);
}

/// The page's local storage, or a reason it cannot be used.
fn storage() -> Result<web_sys::Storage, String> {
    match web_sys::window().map(|w| w.local_storage()) {
        Some(Ok(Some(s))) => Ok(s),
        _ => Err("This browser does not let the page store data (private mode or storage turned off).".to_string()),
    }
}

/// Reads a stored text; `Ok(None)` when nothing is stored under `key`.
pub fn storage_get(key: &str) -> Result<Option<String>, String> {
    storage()?
        .get_item(key)
        .map_err(|_| "The browser refused to read stored data.".to_string())
}

/// The first stored key starting with `prefix` whose text is exactly `text`.
pub fn storage_find(prefix: &str, text: &str) -> Option<String> {
    let storage = storage().ok()?;
    (0..storage.length().ok()?)
        .filter_map(|i| storage.key(i).ok().flatten())
        .filter(|key| key.starts_with(prefix))
        .find(|key| storage.get_item(key).ok().flatten().as_deref() == Some(text))
}

/// Stores a text; the error says why it could not (full, disabled).
pub fn storage_set(key: &str, value: &str) -> Result<(), String> {
    storage()?
        .set_item(key, value)
        .map_err(|_| "The browser refused to store the data: its storage may be full.".to_string())
}

/// The current date and time as ISO 8601 text.
pub fn now_iso() -> String {
    String::from(js_sys::Date::new_0().to_iso_string())
}

/// Today's date in the person's own time zone as YYYY-MM-DD, for dating a printed plan.
pub fn local_date() -> String {
    let now = js_sys::Date::new_0();
    format!(
        "{:04}-{:02}-{:02}",
        now.get_full_year(),
        now.get_month() + 1,
        now.get_date()
    )
}

/// The device's local date and time to the minute with its UTC offset, as the `when` key takes it
/// (`2026-06-21T10:30+02:00`). The clock stays on the device.
pub fn now_local_iso() -> String {
    let now = js_sys::Date::new_0();
    // getTimezoneOffset is UTC minus local, in minutes.
    let offset = -(now.get_timezone_offset() as i32);
    let sign = if offset < 0 { '-' } else { '+' };
    format!(
        "{:04}-{:02}-{:02}T{:02}:{:02}{sign}{:02}:{:02}",
        now.get_full_year(),
        now.get_month() + 1,
        now.get_date(),
        now.get_hours(),
        now.get_minutes(),
        offset.unsigned_abs() / 60,
        offset.unsigned_abs() % 60
    )
}

/// The local calendar date of an ISO 8601 time, or empty when it cannot be read.
pub fn local_date_of(iso: &str) -> String {
    let date = js_sys::Date::new(&wasm_bindgen::JsValue::from_str(iso));
    if iso.is_empty() || date.get_time().is_nan() {
        return String::new();
    }
    format!(
        "{:04}-{:02}-{:02}",
        date.get_full_year(),
        date.get_month() + 1,
        date.get_date()
    )
}

/// Milliseconds since 1970, for unique storage keys.
pub fn now_ms() -> u64 {
    js_sys::Date::now() as u64
}

/// The page's full address.
pub fn location_href() -> String {
    web_sys::window()
        .and_then(|w| w.location().href().ok())
        .unwrap_or_default()
}

/// Calls `navigator[object][method](arg)` or `navigator[method](arg)` when the browser has it;
/// false when it does not. Looked up at run time so older browsers simply lack the button.
fn call_navigator(object: Option<&str>, method: &str, arg: &wasm_bindgen::JsValue) -> bool {
    let Some(navigator) = web_sys::window().map(|w| w.navigator()) else {
        return false;
    };
    let target: wasm_bindgen::JsValue = match object {
        Some(name) => match js_sys::Reflect::get(&navigator, &name.into()) {
            Ok(v) if !v.is_undefined() && !v.is_null() => v,
            _ => return false,
        },
        None => navigator.into(),
    };
    let Ok(function) = js_sys::Reflect::get(&target, &method.into()) else {
        return false;
    };
    let Some(function) = function.dyn_ref::<js_sys::Function>() else {
        return false;
    };
    function.call1(&target, arg).is_ok()
}

/// Whether the browser offers the system share sheet.
pub fn can_share() -> bool {
    web_sys::window()
        .map(|w| js_sys::Reflect::has(&w.navigator(), &"share".into()).unwrap_or(false))
        .unwrap_or(false)
}

/// Opens the system share sheet with a link; false when there is none.
pub fn share_link(title: &str, url: &str) -> bool {
    let data = js_sys::Object::new();
    let _ = js_sys::Reflect::set(&data, &"title".into(), &title.into());
    let _ = js_sys::Reflect::set(&data, &"url".into(), &url.into());
    call_navigator(None, "share", &data.into())
}

/// Copies text to the clipboard; false when the browser has no clipboard access.
pub fn copy_text(text: &str) -> bool {
    call_navigator(Some("clipboard"), "writeText", &text.into())
}

/// Opens the browser's print dialog (the print style sheet lays out the one-page plan).
pub fn print() {
    if let Some(w) = web_sys::window() {
        let _ = w.print();
    }
}

/// Opens the print dialog once the page has caught up with its scenario (`main[data-settled]`:
/// the sheet, its QR code from the second module), looking every 50 ms for up to two seconds, then
/// prints in any case.
pub fn print_when_settled() {
    fn attempt(left: u32) {
        let settled = web_sys::window()
            .and_then(|w| w.document())
            .and_then(|d| d.query_selector("main[data-settled=\"true\"]").ok().flatten())
            .is_some();
        if settled || left == 0 {
            print();
        } else {
            gloo::timers::callback::Timeout::new(50, move || attempt(left - 1)).forget();
        }
    }
    gloo::timers::callback::Timeout::new(50, || attempt(40)).forget();
}

/// Links the print style sheet (`print.css`, for print only) once the page has started, so that
/// it is not part of the first load; nothing is lost if the browser refuses.
pub fn link_print_style() {
    let Some(document) = web_sys::window().and_then(|w| w.document()) else {
        return;
    };
    let (Ok(link), Some(head)) = (document.create_element("link"), document.head()) else {
        return;
    };
    for (name, value) in [("rel", "stylesheet"), ("media", "print"), ("href", "print.css")] {
        let _ = link.set_attribute(name, value);
    }
    let _ = head.append_child(&link);
}

/// Registers the service worker that keeps the app usable offline.
pub fn register_service_worker() {
    let Some(window) = web_sys::window() else { return };
    let navigator = window.navigator();
    if js_sys::Reflect::has(&navigator, &"serviceWorker".into()).unwrap_or(false) {
        let _ = navigator.service_worker().register("./sw.js");
    }
}

/// Applies a colour theme to the whole page (`default` or `contrast`).
pub fn set_theme(theme: &str) {
    if let Some(root) = web_sys::window()
        .and_then(|w| w.document())
        .and_then(|d| d.document_element())
    {
        let _ = root.set_attribute("data-theme", theme);
    }
}

/// Asks the device for its position (the browser asks the person first); `done` gets
/// (latitude, longitude) in degrees or a message. False when the browser has no geolocation.
/// The position stays in the page: it only fills the survey origin.
pub fn current_position(done: impl Fn(Result<(f64, f64), String>) + 'static) -> bool {
    use wasm_bindgen::closure::Closure;
    let Some(navigator) = web_sys::window().map(|w| w.navigator()) else {
        return false;
    };
    let Ok(geolocation) = js_sys::Reflect::get(&navigator, &"geolocation".into()) else {
        return false;
    };
    if geolocation.is_undefined() || geolocation.is_null() {
        return false;
    }
    let Ok(method) = js_sys::Reflect::get(&geolocation, &"getCurrentPosition".into()) else {
        return false;
    };
    let Some(method) = method.dyn_ref::<js_sys::Function>() else {
        return false;
    };
    let done = std::rc::Rc::new(done);
    let on_error = {
        let done = done.clone();
        Closure::once_into_js(move |error: wasm_bindgen::JsValue| {
            let reason = js_sys::Reflect::get(&error, &"message".into())
                .ok()
                .and_then(|m| m.as_string())
                .unwrap_or_default();
            done(Err(format!(
                "The device's position is not available ({reason}); type the origin instead."
            )));
        })
    };
    let on_success = Closure::once_into_js(move |position: wasm_bindgen::JsValue| {
        let coords = js_sys::Reflect::get(&position, &"coords".into()).unwrap_or(wasm_bindgen::JsValue::UNDEFINED);
        let read = |name: &str| {
            js_sys::Reflect::get(&coords, &name.into())
                .ok()
                .and_then(|v| v.as_f64())
        };
        match (read("latitude"), read("longitude")) {
            (Some(lat), Some(lon)) if lat.is_finite() && lon.is_finite() => done(Ok((lat, lon))),
            _ => done(Err(
                "The device gave no usable position; type the origin instead.".to_string()
            )),
        }
    });
    method.call2(&geolocation, &on_success, &on_error).is_ok()
}

/// Reads stored or imported saved-scenario text with the browser's own JSON parser, so that the
/// page carries no JSON parser of its own; the reading itself is the core's (`Library::read_with`).
pub fn read_library(text: &str) -> ReadOutcome {
    Library::read_with(text, |text| {
        js_sys::JSON::parse(text).map_err(|error| {
            error
                .dyn_ref::<js_sys::Error>()
                .map(|e| String::from(e.message()))
                .unwrap_or_else(|| "not JSON".to_string())
        })
    })
}

/// A value from `JSON.parse`, seen the way the core reads saved scenarios.
impl JsonView for wasm_bindgen::JsValue {
    fn items(&self) -> Option<Vec<wasm_bindgen::JsValue>> {
        js_sys::Array::is_array(self).then(|| self.unchecked_ref::<js_sys::Array>().to_vec())
    }

    fn is_object(&self) -> bool {
        wasm_bindgen::JsValue::is_object(self) && !js_sys::Array::is_array(self)
    }

    fn member(&self, key: &str) -> Option<wasm_bindgen::JsValue> {
        if !JsonView::is_object(self) {
            return None;
        }
        js_sys::Reflect::get(self, &key.into())
            .ok()
            .filter(|v| !v.is_undefined())
    }

    fn as_str(&self) -> Option<String> {
        self.as_string()
    }

    fn as_u64(&self) -> Option<u64> {
        // Saturating: a whole number past u64 is still a version newer than this one.
        self.as_f64()
            .filter(|n| *n >= 0.0 && n.fract() == 0.0)
            .map(|n| n as u64)
    }

    fn to_json_text(&self) -> String {
        js_sys::JSON::stringify(self)
            .ok()
            .and_then(|s| s.as_string())
            .unwrap_or_default()
    }
}

/// Reads the first file a file input holds as text and calls `done` with it (`None` when it
/// cannot be read), then empties the input so that the same file can be chosen again. The reader
/// returned must be kept until it answers: dropping it cancels the reading. One copy of gloo's
/// reader serves every file input.
pub fn read_chosen_file(
    input: &web_sys::HtmlInputElement,
    done: Box<dyn FnOnce(String, Option<String>)>,
) -> Option<gloo::file::callbacks::FileReader> {
    let file = gloo::file::File::from(input.files()?.get(0)?);
    let name = file.name();
    input.set_value("");
    Some(gloo::file::callbacks::read_as_text(&file, move |text| {
        done(name, text.ok())
    }))
}
