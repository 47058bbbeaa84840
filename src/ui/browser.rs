//! Browser services: the address bar. Every call tolerates a browser that refuses it.

use crate::core::scenario::RawScenario;

/// The scenario in the page's address, if it carries one.
pub fn scenario_from_location() -> Option<RawScenario> {
    let search = web_sys::window()?.location().search().ok()?;
    let raw = RawScenario::from_query(&search);
    (!raw.pairs.is_empty()).then_some(raw)
}

/// Replaces the address's query with the scenario, without adding a history entry.
pub fn replace_location_query(raw: &RawScenario) {
    let Some(window) = web_sys::window() else { return };
    let Ok(history) = window.history() else { return };
    let path = window.location().pathname().unwrap_or_else(|_| "/".to_string());
    let url = format!("{path}?{}", raw.to_query());
    let _ = history.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&url));
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
    use wasm_bindgen::JsCast;
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
