//! The contract: the table of inputs, the scenario and its validation, and the report
//! (`shared/reference/url-and-report.md`).

pub mod inputs;
pub mod report;
pub mod scenario;
