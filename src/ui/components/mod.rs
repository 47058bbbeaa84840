//! One component per file; each reads the state it is given and dispatches actions.

pub mod cautions;
pub mod chart;
pub mod field;
pub mod form;
pub mod header;
pub mod inputs;
pub mod light;
pub mod name;
pub mod print;
pub mod results;
pub mod share;
pub mod solve;
pub mod survey;
pub mod target;
pub mod theme;
