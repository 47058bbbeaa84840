//! Survey layout for a nadir camera (resolution-model §7). Being written: see issue 5.

use crate::core::engine::Evaluation;
use crate::core::scenario::Scenario;
use serde::Serialize;

/// The survey figures of a plan; field names are the report's.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SurveyPlan {
    pub footprint_across_m: f64,
    pub footprint_along_m: f64,
}

/// Lays out the survey for a scenario.
pub fn plan_survey(scenario: &Scenario, _evaluation: &Evaluation) -> SurveyPlan {
    let h = scenario.height_m;
    let f = scenario.focal_mm;
    SurveyPlan {
        footprint_across_m: scenario.sensor_width_mm * h / f,
        footprint_along_m: scenario.sensor_height_mm * h / f,
    }
}
