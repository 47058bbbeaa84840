//! Sharpfield: a ground-resolution planner for camera drones and fixed field cameras.
//!
//! `core` is the pure engine and planner, tested natively; `ui` is the browser shell, built only
//! for wasm32. See DEVELOPERS.md for the code map and the invariants.

pub mod core;

#[cfg(target_arch = "wasm32")]
pub mod ui;
