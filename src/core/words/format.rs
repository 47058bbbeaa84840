//! Numbers as text: for people (lengths, speeds and times in sensible units, metric or
//! imperial) and for the link (the shortest text that reads back exactly).

use crate::core::words::units::{Units, METRES_PER_FOOT, METRES_PER_INCH, METRES_PER_MILE, SQUARE_METRES_PER_ACRE};

/// Formats a number as the URL writes it: whole numbers without a decimal point, very small or
/// very large ones in exponent form, the rest in the shortest decimal that reads back exactly.
pub fn format_number(x: f64) -> String {
    if !x.is_finite() {
        return "0".to_string();
    }
    let a = x.abs();
    if x.fract() == 0.0 && a < 1e15 {
        format!("{}", x as i64)
    } else if a != 0.0 && !(1e-4..1e15).contains(&a) {
        format!("{x:e}")
    } else {
        format!("{x}")
    }
}

/// A number with three significant figures, without a trailing ".0".
pub fn significant(x: f64) -> String {
    if !x.is_finite() {
        return "—".to_string();
    }
    if x == 0.0 {
        return "0".to_string();
    }
    let magnitude = x.abs().log10().floor() as i32;
    let decimals = (2 - magnitude).clamp(0, 6) as usize;
    let text = format!("{x:.decimals$}");
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        text
    }
}

/// A length in the unit a person would use for its size.
pub fn length(metres: f64, units: Units) -> String {
    if !metres.is_finite() {
        return "—".to_string();
    }
    let a = metres.abs();
    match units {
        Units::Metric => {
            if a == 0.0 {
                "0 m".to_string()
            } else if a < 0.01 {
                format!("{} mm", significant(metres * 1000.0))
            } else if a < 1.0 {
                format!("{} cm", significant(metres * 100.0))
            } else if a < 1000.0 {
                format!("{} m", significant(metres))
            } else {
                format!("{} km", significant(metres / 1000.0))
            }
        }
        Units::Imperial => {
            let feet = metres / METRES_PER_FOOT;
            if a == 0.0 {
                "0 ft".to_string()
            } else if feet.abs() < 1.0 {
                format!("{} in", significant(metres / METRES_PER_INCH))
            } else if a < METRES_PER_MILE {
                format!("{} ft", significant(feet))
            } else {
                format!("{} mi", significant(metres / METRES_PER_MILE))
            }
        }
    }
}

/// A speed in m/s (metric) or mph (imperial), with km/h beside m/s.
pub fn speed(mps: f64, units: Units) -> String {
    match units {
        Units::Metric => format!("{} m/s ({} km/h)", significant(mps), significant(mps * 3.6)),
        Units::Imperial => format!("{} mph", significant(mps / METRES_PER_MILE * 3600.0)),
    }
}

/// A duration in s, min or h.
pub fn duration(seconds: f64) -> String {
    if !seconds.is_finite() {
        return "—".to_string();
    }
    if seconds < 60.0 {
        format!("{} s", significant(seconds))
    } else if seconds < 3600.0 {
        format!("{} min", significant(seconds / 60.0))
    } else {
        format!("{} h", significant(seconds / 3600.0))
    }
}

/// An area in m², ha or km² (metric), ft² or acres (imperial).
pub fn area(square_metres: f64, units: Units) -> String {
    match units {
        Units::Metric if square_metres < 10_000.0 => format!("{} m²", significant(square_metres)),
        Units::Metric if square_metres < 1e6 => format!("{} ha", significant(square_metres / 1e4)),
        Units::Metric => format!("{} km²", significant(square_metres / 1e6)),
        Units::Imperial => {
            let acres = square_metres / SQUARE_METRES_PER_ACRE;
            if acres < 1.0 {
                format!(
                    "{} ft²",
                    significant(square_metres / (METRES_PER_FOOT * METRES_PER_FOOT))
                )
            } else {
                format!("{} acres", significant(acres))
            }
        }
    }
}

/// A ratio as "1.3×".
pub fn times(ratio: f64) -> String {
    format!("{}×", significant(ratio))
}

/// A chance as a whole percentage.
pub fn percent(probability: f64) -> String {
    format!("{:.0} %", (probability * 100.0).clamp(0.0, 100.0))
}
