//! The plan: a scenario with everything computed from it once — the engine's evaluation, the
//! sweep for the solves and the chart, the survey and its layout, the GeoJSON export and the
//! report — so that the page and the printed sheet share one computation per scenario.

use crate::core::contract::report::Report;
use crate::core::contract::scenario::{FieldError, RawScenario, Scenario};
use crate::core::formats::geojson::{survey_geojson_checked, ExportProblem};
use crate::core::physics::engine::{evaluate, Evaluation, Setup};
use crate::core::planning::solve::Sweep;
use crate::core::planning::survey::{layout, plan_survey, Layout, SurveyInputs};

/// A scenario with everything computed from it, for the page.
#[derive(Clone, Debug, PartialEq)]
pub struct Plan {
    pub scenario: Scenario,
    pub setup: Setup,
    pub evaluation: Evaluation,
    pub sweep: Sweep,
    /// What the survey was planned from.
    pub survey_inputs: SurveyInputs,
    /// The survey drawn to scale, when it has counts.
    pub layout: Option<Layout>,
    /// The survey as GeoJSON, or why it cannot be exported.
    pub geojson: Result<String, ExportProblem>,
    pub report: Report,
}

impl Plan {
    /// Validates raw text and computes the whole plan; never panics.
    pub fn from_raw(raw: &RawScenario) -> Plan {
        let (scenario, errors) = Scenario::from_raw(raw);
        Plan::build(scenario, errors)
    }

    /// Computes the whole plan for a validated scenario.
    pub fn build(scenario: Scenario, errors: Vec<FieldError>) -> Plan {
        let setup = scenario.setup();
        let evaluation = evaluate(&setup);
        let sweep = Sweep::new(setup, scenario.solve_axis());
        let survey_inputs = scenario.survey_inputs(evaluation.gsd_m);
        let survey = plan_survey(&survey_inputs);
        let layout = layout(&survey, &survey_inputs);
        let geojson = survey_geojson_checked(&survey_inputs, &survey, &scenario.name);
        let report = Report::new(&scenario, &setup, &evaluation, &sweep, &survey, errors);
        Plan {
            scenario,
            setup,
            evaluation,
            sweep,
            survey_inputs,
            layout,
            geojson,
            report,
        }
    }
}
