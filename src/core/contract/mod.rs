//! The contract: the scenario keys, validation, and the report (`shared/reference/url-and-report.md`).

pub mod report;
pub mod scenario;
