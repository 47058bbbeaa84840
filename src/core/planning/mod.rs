//! Planning: the backward solves, the survey layout, the cautions, the light (exposure, the day,
//! the best settings), the ground under a survey and surveys over a real boundary, on top of the physics.

pub mod cautions;
pub mod field;
pub mod ground;
pub mod light;
pub mod solve;
pub mod survey;
