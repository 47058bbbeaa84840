//! Planning: the backward solves, the survey layout and the cautions, on top of the physics.

pub mod cautions;
pub mod ground;
pub mod solve;
pub mod survey;
