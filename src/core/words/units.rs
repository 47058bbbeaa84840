//! Units for people: the metric or imperial choice, the conversion factors, and the unit a field
//! is typed in. The engine and the link stay SI; only the words layer knows feet and miles.

use crate::core::words::format::{format_number, significant};
use serde::Serialize;

/// Metres in one international foot (exact by definition, 1959).
pub(crate) const METRES_PER_FOOT: f64 = 0.3048;
/// Metres in one inch.
pub(crate) const METRES_PER_INCH: f64 = 0.0254;
/// Metres in one statute mile.
pub(crate) const METRES_PER_MILE: f64 = 1609.344;
/// Square metres in one international acre.
pub(crate) const SQUARE_METRES_PER_ACRE: f64 = 4_046.856_422_4;

/// Display units; the URL and the engine stay SI either way.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Units {
    #[default]
    Metric,
    Imperial,
}

impl Units {
    /// Both, in the order the contract lists them.
    pub const ALL: [Units; 2] = [Units::Metric, Units::Imperial];

    /// The contract's word.
    pub const fn key(self) -> &'static str {
        match self {
            Units::Metric => "metric",
            Units::Imperial => "imperial",
        }
    }
}

/// The unit a person types a field in when it differs from the contract's (imperial display):
/// `per_si` of it make one of the contract's unit (m or m/s).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct EntryUnit {
    pub unit: &'static str,
    pub per_si: f64,
}

/// Feet per metre (international foot, exact by definition).
pub const FEET: EntryUnit = EntryUnit {
    unit: "ft",
    per_si: 1.0 / METRES_PER_FOOT,
};
/// Inches per metre.
pub const INCHES: EntryUnit = EntryUnit {
    unit: "in",
    per_si: 1.0 / METRES_PER_INCH,
};
/// Miles per hour in one metre per second.
pub const MPH: EntryUnit = EntryUnit {
    unit: "mph",
    per_si: 3600.0 / METRES_PER_MILE,
};

/// `x` rounded to `n` significant figures (1 to 17).
fn figures(x: f64, n: usize) -> f64 {
    let decimals = n.clamp(1, 17) - 1;
    format!("{x:.decimals$e}").parse().unwrap_or(x)
}

/// The text a field shows for the contract's text `si_text`: converted to six significant figures
/// when it reads as a number, as it is otherwise (an invalid entry stays visible as typed).
pub fn to_entry_text(si_text: &str, unit: EntryUnit) -> String {
    match si_text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() => format_number(figures(v * unit.per_si, 6)),
        _ => si_text.to_string(),
    }
}

/// The contract's text for what a person typed in `unit`: converted (to ten significant figures,
/// so that no conversion noise such as 79.85760000000001 reaches the link) when it reads as a
/// number, as typed otherwise, so that validation names the problem.
pub fn from_entry_text(text: &str, unit: EntryUnit) -> String {
    match text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() => format_number(figures(v / unit.per_si, 10)),
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

/// An accepted range given in the contract's unit, in the unit it is typed in, e.g.
/// "from 0.328 to 65600 ft".
pub fn entry_range(min: f64, max: f64, unit: EntryUnit) -> String {
    format!(
        "from {} to {} {}",
        significant(min * unit.per_si),
        significant(max * unit.per_si),
        unit.unit
    )
}
