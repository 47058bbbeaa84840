//! The report's figures for a survey over a real boundary (`field`): read the boundary, plan its
//! lines, photos and time, and say what is wrong with it. Used by the report (the command line
//! and the tests) and the on-demand module, never by the page's first load: it brings the georust
//! crates.

use crate::core::contract::scenario::Scenario;
use crate::core::formats::boundary::Boundary;
use crate::core::planning::field::{plan_field, suggest_headings, FieldPlan, HeadingChoice};
use crate::core::planning::survey::SurveyPlan;
use serde::Serialize;

/// A heading and what flying it takes, as the report gives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct HeadingReport {
    pub heading_deg: f64,
    pub lines: usize,
    pub path_length_m: f64,
}

impl From<HeadingChoice> for HeadingReport {
    fn from(c: HeadingChoice) -> Self {
        HeadingReport {
            heading_deg: c.heading_deg,
            lines: c.lines,
            path_length_m: c.path_length_m,
        }
    }
}

/// One photo centre as the report gives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PointReport {
    pub lat: f64,
    pub lon: f64,
    pub line: usize,
    pub index: usize,
    pub trigger_m: f64,
}

/// The boundary's figures (url-and-report.md: `area_m2`, `photo_points`; the rest named
/// `field_…` beside the rectangle's figures).
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct FieldReport {
    pub area_m2: Option<f64>,
    pub field_heading_deg: f64,
    pub field_lines: Option<usize>,
    pub field_stretches: Option<usize>,
    pub field_photos: Option<usize>,
    pub field_path_length_m: Option<f64>,
    pub field_turns: Option<usize>,
    pub field_flight_time_s: Option<f64>,
    pub field_batteries: Option<u64>,
    pub field_storage_mb: Option<f64>,
    /// The heading that needs the fewest lines, and the one with the shortest path.
    pub heading_fewest_lines: Option<HeadingReport>,
    pub heading_shortest_path: Option<HeadingReport>,
    pub photo_points: Vec<PointReport>,
    /// Why the boundary cannot be read or planned, in words.
    pub field_problem: Option<String>,
}

/// The boundary and its plan for `scenario` with the survey `survey`; `None` without a boundary.
pub fn field_plan(scenario: &Scenario, survey: &SurveyPlan) -> Option<Result<(Boundary, FieldPlan), String>> {
    if scenario.field.trim().is_empty() {
        return None;
    }
    let boundary = match Boundary::from_text(&scenario.field) {
        Ok(b) => b,
        Err(problem) => return Some(Err(problem.message())),
    };
    let layout = scenario.field_layout(survey);
    Some(
        plan_field(&boundary, &layout)
            .map(|plan| (boundary, plan))
            .map_err(|p| p.message().to_string()),
    )
}

/// The report's boundary figures; `None` without a boundary.
pub fn field_report(scenario: &Scenario, survey: &SurveyPlan) -> Option<FieldReport> {
    let heading = scenario.survey.heading_deg;
    let empty = FieldReport {
        area_m2: None,
        field_heading_deg: heading,
        field_lines: None,
        field_stretches: None,
        field_photos: None,
        field_path_length_m: None,
        field_turns: None,
        field_flight_time_s: None,
        field_batteries: None,
        field_storage_mb: None,
        heading_fewest_lines: None,
        heading_shortest_path: None,
        photo_points: Vec::new(),
        field_problem: None,
    };
    Some(match field_plan(scenario, survey)? {
        Err(problem) => FieldReport {
            field_problem: Some(problem),
            ..empty
        },
        Ok((boundary, plan)) => {
            let suggested = suggest_headings(&boundary, &scenario.field_layout(survey));
            FieldReport {
                area_m2: Some(plan.area_m2),
                field_lines: Some(plan.lines),
                field_stretches: Some(plan.stretches.len()),
                field_photos: Some(plan.photos),
                field_path_length_m: Some(plan.path_length_m),
                field_turns: Some(plan.turns),
                field_flight_time_s: plan.flight_time_s,
                field_batteries: plan.batteries,
                field_storage_mb: plan.storage_mb,
                heading_fewest_lines: suggested.map(|s| s.0.into()),
                heading_shortest_path: suggested.map(|s| s.1.into()),
                photo_points: plan
                    .photo_points
                    .iter()
                    .map(|p| PointReport {
                        lat: p.lat,
                        lon: p.lon,
                        line: p.line,
                        index: p.index,
                        trigger_m: p.trigger_m,
                    })
                    .collect(),
                ..empty
            }
        }
    })
}
