//! The contract: the table of inputs, the scenario and its validation, the report
//! (`shared/reference/url-and-report.md`), and the plan that computes it all once per scenario.

pub mod field;
pub mod inputs;
pub mod plan;
pub mod report;
pub mod scenario;
