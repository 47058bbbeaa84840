//! The survey panel: footprint and layout.

use crate::core::format;
use crate::ui::components::results::value;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the survey panel.
#[derive(Properties, PartialEq, Clone)]
pub struct SurveyProps {
    pub state: Rc<State>,
}

/// The survey panel.
#[function_component(SurveyPanel)]
pub fn survey_panel(props: &SurveyProps) -> Html {
    let plan = &props.state.plan;
    let s = &plan.report.survey;
    let units = plan.scenario.units;
    html! {
        <section class="panel" id="survey" aria-labelledby="survey-title">
            <h2 id="survey-title">{ "Survey layout" }</h2>
            <dl class="figures">
                <dt>{ "Footprint across the lines" }</dt><dd>{ value("footprint_across_m", s.footprint_across_m, format::length(s.footprint_across_m, units)) }</dd>
                <dt>{ "Footprint along the lines" }</dt><dd>{ value("footprint_along_m", s.footprint_along_m, format::length(s.footprint_along_m, units)) }</dd>
            </dl>
        </section>
    }
}
