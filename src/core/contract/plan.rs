//! The plan: a scenario with everything computed from it once — the engine's evaluation, the
//! sweep for the solves and the chart, the survey and its layout, whether it can be exported, and the
//! report — so that the page and the printed sheet share one computation per scenario.

use crate::core::contract::report::{BestReport, Computed, DayReport, Report, SweepFigures};
use crate::core::contract::scenario::{FieldError, RawScenario, Scenario};
use crate::core::formats::geojson::{export_check, ExportProblem};
use crate::core::physics::engine::{evaluate, Evaluation, Setup};
use crate::core::physics::light::sun::{Spa, Sunlight};
use crate::core::planning::light::{best_settings, lit, plan_day, DaySample, Light};
use crate::core::planning::solve::{Axis, Sweep};
use crate::core::planning::survey::{layout, plan_survey, Layout, SurveyInputs};

/// A scenario with everything computed from it, for the page.
#[derive(Clone, Debug, PartialEq)]
pub struct Plan {
    pub scenario: Scenario,
    /// The light: the sun, the exposure time used and the SNR (the setup is lit by it).
    pub light: Light,
    pub setup: Setup,
    pub evaluation: Evaluation,
    pub sweep: Sweep,
    /// The backward solves on the sweep.
    pub sweep_figures: SweepFigures,
    /// What the survey was planned from.
    pub survey_inputs: SurveyInputs,
    /// The survey drawn to scale, when it has counts.
    pub layout: Option<Layout>,
    /// Whether the survey has what a GeoJSON export needs (the export itself is built on demand).
    pub export_ready: Result<(), ExportProblem>,
    pub report: Report,
}

impl Plan {
    /// Validates raw text and computes the whole plan; never panics.
    pub fn from_raw(raw: &RawScenario) -> Plan {
        Plan::from_raw_with(raw, &Spa)
    }

    /// [`Plan::from_raw`] with the sun from `sunlight` (the page's: told by its second module).
    pub fn from_raw_with(raw: &RawScenario, sunlight: &dyn Sunlight) -> Plan {
        let (scenario, errors) = Scenario::from_raw(raw);
        Plan::build_after(scenario, errors, None, sunlight)
    }

    /// Computes the whole plan for a validated scenario.
    pub fn build(scenario: Scenario, errors: Vec<FieldError>) -> Plan {
        Plan::build_after(scenario, errors, None, &Spa)
    }

    /// Validates raw text and computes the plan, keeping what `previous` computed that the change
    /// cannot have changed: moving along the solve axis (typing the height, or the ground
    /// distance) keeps the sweep, and with the same need and target its solves. The result equals
    /// [`Plan::from_raw`]'s (tests/plan.rs).
    pub fn from_raw_after(raw: &RawScenario, previous: &Plan) -> Plan {
        Plan::from_raw_after_with(raw, previous, &Spa)
    }

    /// [`Plan::from_raw_after`] with the sun from `sunlight`.
    pub fn from_raw_after_with(raw: &RawScenario, previous: &Plan, sunlight: &dyn Sunlight) -> Plan {
        let (scenario, errors) = Scenario::from_raw(raw);
        Plan::build_after(scenario, errors, Some(previous), sunlight)
    }

    fn build_after(
        scenario: Scenario,
        errors: Vec<FieldError>,
        previous: Option<&Plan>,
        sunlight: &dyn Sunlight,
    ) -> Plan {
        let light = scenario.light_with(sunlight);
        let setup = lit(&scenario.unlit_setup(), &light);
        let evaluation = evaluate(&setup);
        let axis = scenario.solve_axis();
        let (sweep, previous) = match previous.and_then(|p| p.sweep.moved_to(setup, axis).map(|sweep| (sweep, p))) {
            Some((sweep, p)) => (sweep, Some(p)),
            None => (Sweep::new(setup, axis), None),
        };
        let sweep_figures = match previous {
            Some(p)
                if p.scenario.need() == scenario.need()
                    && p.scenario.target_m == scenario.target_m
                    && p.scenario.cd_model == scenario.cd_model =>
            {
                p.sweep_figures.clone()
            }
            _ => SweepFigures::new(&scenario, &sweep),
        };
        let survey_inputs = scenario.survey_inputs(evaluation.gsd_m, light.exposure_s);
        let survey = plan_survey(&survey_inputs);
        let layout = layout(&survey, &survey_inputs);
        let export_ready = export_check(&survey_inputs);
        let report = Report::new(
            &scenario,
            &Computed {
                setup: &setup,
                evaluation: &evaluation,
                sweep: &sweep,
                figures: &sweep_figures,
                survey: &survey,
                light: &light,
            },
            errors,
        );
        Plan {
            scenario,
            light,
            setup,
            evaluation,
            sweep,
            sweep_figures,
            survey_inputs,
            layout,
            export_ready,
            report,
        }
    }
}

/// What a plan adds once typing pauses (the page) or at once (the report): the day's hours and the
/// best settings, each some hundreds of evaluations, too many for every keystroke.
#[derive(Clone, Debug, PartialEq)]
pub struct Extras {
    pub day: Option<DayReport>,
    /// The day's samples, for the page's timeline (empty without a day).
    pub day_samples: Vec<DaySample>,
    pub best: Option<BestReport>,
}

impl Plan {
    /// The day at the place and the best settings under this light (the sun by NREL's SPA).
    pub fn extras(&self) -> Extras {
        Extras::of(&self.scenario, &self.setup, self.sweep.axis)
    }
}

impl Extras {
    /// The day at the place and the best settings for `scenario`, lit as `setup` (its
    /// [`Scenario::setup`]), solving along `axis`: what the page's second module works out from a
    /// query alone, without the rest of the plan.
    pub fn of(scenario: &Scenario, setup: &Setup, axis: Axis) -> Extras {
        let inputs = scenario.light_inputs();
        let need = scenario.need();
        let day = plan_day(&inputs, setup, &need);
        let widest = scenario.widest_f_number.unwrap_or(scenario.f_number);
        let best = best_settings(&inputs, setup, widest, &need, axis).map(|b| BestReport::new(&b, scenario.units));
        Extras {
            day_samples: day.as_ref().map(|d| d.samples.clone()).unwrap_or_default(),
            day: day.as_ref().map(DayReport::new),
            best,
        }
    }
}
