//! Planning: the backward solves, the survey layout, the cautions and the light (exposure, the
//! day, the best settings), on top of the physics.

pub mod cautions;
pub mod light;
pub mod solve;
pub mod survey;
