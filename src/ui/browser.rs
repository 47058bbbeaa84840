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
