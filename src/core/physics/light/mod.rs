//! Light and exposure: where the sun is, how much light reaches the ground, and what a camera makes
//! of it (the metered exposure time, the photoelectrons of a target and its background, their
//! contrast SNR). Pure functions in SI units; a solver for the best settings calls them.
//!
//! - `sun`: the sun's position (NREL SPA), its day (samples, sunrise, noon, sunset), glint.
//! - `daylight`: air mass and the daylight illuminance of a clear, partly cloudy or overcast sky.
//! - `exposure`: the ISO 2720 meter, the focal-plane exposure, electrons, noise and contrast SNR.

pub mod daylight;
pub mod exposure;
pub mod sun;
