//! Numbers for people: lengths, speeds and times in sensible units, metric or imperial.
//! The engine and the URL stay SI; only this module knows feet and miles.

use crate::core::contract::scenario::Units;

/// Metres in one international foot (exact by definition, 1959).
pub const METRES_PER_FOOT: f64 = 0.3048;
/// Metres in one inch.
pub const METRES_PER_INCH: f64 = 0.0254;
/// Metres in one statute mile.
pub const METRES_PER_MILE: f64 = 1609.344;

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
            let acres = square_metres / 4_046.856_422_4;
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

/// The unit a person types a field in when it differs from the contract's (imperial display):
/// `per_si` of it make one of the contract's unit (m or m/s).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct EntryUnit {
    pub unit: &'static str,
    pub per_si: f64,
}

/// Feet per metre and inches per metre (international foot and inch, exact by definition).
const FEET: EntryUnit = EntryUnit {
    unit: "ft",
    per_si: 1.0 / METRES_PER_FOOT,
};
const INCHES: EntryUnit = EntryUnit {
    unit: "in",
    per_si: 1.0 / METRES_PER_INCH,
};
const MPH: EntryUnit = EntryUnit {
    unit: "mph",
    per_si: 3600.0 / METRES_PER_MILE,
};

/// The unit a field is typed in: the contract's own in metric, feet, inches or mph in imperial.
pub fn entry_unit(key: &str, units: Units) -> Option<EntryUnit> {
    match (units, key) {
        (Units::Metric, _) => None,
        (Units::Imperial, "h" | "gd" | "aw" | "al" | "tdim") => Some(FEET),
        (Units::Imperial, "need") => Some(INCHES),
        (Units::Imperial, "speed") => Some(MPH),
        _ => None,
    }
}

/// `x` rounded to `n` significant figures (1 to 17).
fn figures(x: f64, n: usize) -> f64 {
    let decimals = n.clamp(1, 17) - 1;
    format!("{x:.decimals$e}").parse().unwrap_or(x)
}

/// The text a field shows for the contract's text `si_text`: converted to six significant figures
/// when it reads as a number, as it is otherwise (an invalid entry stays visible as typed).
pub fn to_entry_text(si_text: &str, unit: EntryUnit) -> String {
    match si_text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() => crate::core::contract::scenario::format_number(figures(v * unit.per_si, 6)),
        _ => si_text.to_string(),
    }
}

/// The contract's text for what a person typed in `unit`: converted (to ten significant figures,
/// so that no conversion noise such as 79.85760000000001 reaches the link) when it reads as a
/// number, as typed otherwise, so that validation names the problem.
pub fn from_entry_text(text: &str, unit: EntryUnit) -> String {
    match text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() => crate::core::contract::scenario::format_number(figures(v / unit.per_si, 10)),
        _ => text.to_string(),
    }
}

/// Whether the text a field shows stands for the contract's text `si_text` (to the six figures a
/// field shows), so that a field is not overwritten while its text still means the same value.
pub fn entry_matches(shown: &str, si_text: &str, unit: EntryUnit) -> bool {
    let typed = from_entry_text(shown, unit);
    if typed == si_text {
        return true;
    }
    match (typed.trim().parse::<f64>(), si_text.trim().parse::<f64>()) {
        (Ok(a), Ok(b)) => (a - b).abs() <= 1e-5 * b.abs(),
        _ => false,
    }
}

/// The accepted range of a key in the unit it is typed in, e.g. "from 0.328 to 65600 ft".
pub fn entry_range(spec: &crate::core::contract::scenario::NumberSpec, unit: EntryUnit) -> String {
    format!(
        "from {} to {} {}",
        significant(spec.min * unit.per_si),
        significant(spec.max * unit.per_si),
        unit.unit
    )
}
