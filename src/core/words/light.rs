//! Light in words: clock times in the scenario's own offset, exposure times as a photographer
//! writes them, the light's notes, and why the best settings are best.

use crate::core::physics::light::sun::CivilTime;
use crate::core::planning::light::{LightNote, LightSource, SnrSource, Trade, GLINT_WARN_DEG, LOW_SUN_DEG};
use crate::core::words::format::{length, significant};
use crate::core::words::notes::{limit_title, lower_first};
use crate::core::words::units::Units;
use serde::Serialize;

/// The local clock time (HH:MM) of a UTC instant at `offset_minutes`, rounded to the minute.
pub fn clock(unix_s: f64, offset_minutes: i32) -> String {
    match CivilTime::from_unix_s((unix_s / 60.0).round() * 60.0, offset_minutes) {
        Some(t) => format!("{:02}:{:02}", t.hour, t.minute),
        None => "—".to_string(),
    }
}

/// An exposure time as a photographer writes it: 1/500 s below half a second, else seconds.
pub fn exposure_time(seconds: f64) -> String {
    if !(seconds.is_finite() && seconds > 0.0) {
        return "—".to_string();
    }
    if seconds < 0.5 {
        format!("1/{} s", significant(1.0 / seconds))
    } else {
        format!("{} s", significant(seconds))
    }
}

/// Where the light comes from, in words.
pub fn light_source(source: LightSource) -> &'static str {
    match source {
        LightSource::Typed => "typed in",
        LightSource::Sun => "from the sun and the sky",
        LightSource::Unknown => "not known",
    }
}

/// Where the SNR comes from, in words.
pub fn snr_source(source: SnrSource) -> &'static str {
    match source {
        SnrSource::Typed => "typed in",
        SnrSource::Light => "from the light",
        SnrSource::Assumed => "assumed for a well-lit scene",
    }
}

/// A light note as the report gives it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct LightNoteWords {
    /// `place`, `placing`, `night`, `low-sun`, `glare`, `no-light`, `overexposed`, `longest`, `clipped` or
    /// `thermal`.
    pub code: &'static str,
    pub text: String,
}

/// A light note in words.
pub fn light_note(note: &LightNote) -> LightNoteWords {
    let (code, text) = match *note {
        LightNote::SunNeedsTimeAndPlace => (
            "place",
            "The sun needs a place as well as the date and time: give the latitude and longitude.".to_string(),
        ),
        LightNote::SunPending => (
            "placing",
            "Placing the sun for this date, time and place; the light follows in a moment.".to_string(),
        ),
        LightNote::SunDown { elevation_deg } => (
            "night",
            format!(
                "The sun is {}° below the horizon: twilight or night. The daylight model gives no light then; \
                 type the illuminance if you have it. Flying in the dark needs lights and, in many places, \
                 permission.",
                significant(-elevation_deg)
            ),
        ),
        LightNote::LowSun { elevation_deg } => (
            "low-sun",
            format!(
                "The sun is only {}° high (below {}°): shadows are long (over {} times an object's height) and hide detail.",
                significant(elevation_deg),
                significant(LOW_SUN_DEG),
                significant(1.0 / elevation_deg.to_radians().tan())
            ),
        ),
        LightNote::Glare { angle_deg } => (
            "glare",
            format!(
                "The view is {}° from the sun's mirror direction (within {}°): water, glass and wet roofs may \
                 throw glare into the image.",
                significant(angle_deg),
                significant(GLINT_WARN_DEG)
            ),
        ),
        LightNote::NothingToMeter => (
            "no-light",
            "Metering needs light: give a date, time and place, or the illuminance. The typed exposure time is used."
                .to_string(),
        ),
        LightNote::Overexposed { wanted_s } => (
            "overexposed",
            format!(
                "The meter wants {}, shorter than the camera's {}: the frame is overexposed. Stop down or lower the ISO.",
                exposure_time(wanted_s),
                exposure_time(crate::core::planning::light::SHORTEST_EXPOSURE_S)
            ),
        ),
        LightNote::LongestExposure { wanted_s } => (
            "longest",
            format!(
                "The meter wants {}, longer than it sets: the frame is underexposed.",
                exposure_time(wanted_s)
            ),
        ),
        LightNote::Clipped => (
            "clipped",
            "The bright target fills the pixels' full well at this ISO and exposure: highlights clip.".to_string(),
        ),
        LightNote::Thermal => (
            "thermal",
            "A thermal band: the daylight and photoelectron models do not apply; the SNR is the typed or assumed one."
                .to_string(),
        ),
    };
    LightNoteWords { code, text }
}

/// What a step away from the best setting does, in words: "f/8: 3.1 cm, motion governs, SNR 41".
pub fn trade(label: &str, trade: &Trade, units: Units) -> String {
    format!(
        "{label}: {} resolved, {} governs, SNR {}",
        length(trade.resolved_m, units),
        lower_first(limit_title(trade.governing)),
        significant(trade.snr)
    )
}
