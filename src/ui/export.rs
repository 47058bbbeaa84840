//! Exports built off the first load: a web worker (the `sharpfield-export` bin, built by trunk
//! with a loader shim) turns a scenario's query into its GeoJSON, so the ellipsoid geodesics and
//! the GeoJSON writer are not in the page's first load. The request is `[query]`; the answer
//! `[true, geojson]` or `[false, the problem in words]` (`ui::worker` carries them).

use crate::core::contract::scenario::Scenario;
use crate::core::formats::geojson::survey_geojson_checked;
use crate::core::planning::survey::plan_survey;
use crate::ui::worker;
use wasm_bindgen::JsValue;

/// The worker's loader, unhashed so that the page can name it (trunk's `data-loader-shim`).
const LOADER: &str = "./sharpfield-export_loader.js";

/// The GeoJSON of a scenario's survey, or why it cannot be exported, in words.
fn geojson_for(query: &str) -> Result<String, String> {
    let (scenario, _) = Scenario::from_query(query);
    let inputs = scenario.planned_survey_inputs();
    let plan = plan_survey(&inputs);
    survey_geojson_checked(&inputs, &plan, &scenario.name).map_err(|p| p.message().to_string())
}

/// In the worker: answers every request with the export of the query it carries.
pub fn serve() {
    worker::serve(|request| worker::text_answer(geojson_for(&request.get(0).as_string().unwrap_or_default())));
}

/// In the page: asks the worker for the GeoJSON of `query` and calls `done` with it, or with why
/// it cannot be made (also when the worker cannot be started or fails).
pub fn geojson(query: &str, done: impl FnOnce(Result<String, String>) + 'static) {
    worker::ask_text(LOADER, &[JsValue::from_str(query)], done);
}
