//! Planning: the backward solves, the survey layout, the cautions, the light (exposure, the day,
//! the best settings) and the ground under a survey, on top of the physics.

pub mod cautions;
pub mod ground;
pub mod light;
pub mod solve;
pub mod survey;
