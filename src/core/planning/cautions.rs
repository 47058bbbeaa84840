//! Cautions shown beside every plan: aviation height and privacy. They inform; they never decide
//! that a flight is allowed (resolution-model §8). The words layer words them.

use crate::core::physics::target::{people_level, PeopleLevel};

/// Height above which many jurisdictions cap small unmanned aircraft: 120 m (about 400 ft),
/// e.g. US 14 CFR §107.51 and the EU open category of Regulation 2019/947.
pub const COMMON_HEIGHT_CAP_M: f64 = 120.0;

/// One caution.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Caution {
    /// Always present: the planner estimates, it never says a flight is allowed.
    General,
    /// Above [`COMMON_HEIGHT_CAP_M`]; `airborne` when the camera is carried by an aircraft.
    Height { airborne: bool },
    /// The path is in strong scintillation (Rytov variance above 1): the turbulence figures are
    /// indicative only.
    Scintillation { rytov: f64 },
    /// At `px_per_m` on the target a person could be recognised (or identified, by `level`).
    Privacy { px_per_m: f64, level: PeopleLevel },
    /// The target, `distance_m` away along the ground, lies below the horizon, which for these
    /// heights is `horizon_m` away: it is not in view.
    BeyondHorizon { distance_m: f64, horizon_m: f64 },
}

impl Caution {
    /// A stable code for tests, styling and the report.
    pub fn code(self) -> &'static str {
        match self {
            Caution::General => "general",
            Caution::Height { .. } => "height",
            Caution::Privacy { .. } => "privacy",
            Caution::Scintillation { .. } => "scintillation",
            Caution::BeyondHorizon { .. } => "horizon",
        }
    }
}

/// What the cautions depend on.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CautionInputs {
    pub height_m: f64,
    /// True when the camera is carried by an aircraft (a drone survey), false for a mast.
    pub airborne: bool,
    /// Pixels per metre on the target (1/GSD).
    pub px_per_m: f64,
    /// The path's Rytov variance.
    pub rytov: f64,
    /// When the target is below the horizon: its ground distance and the horizon's.
    pub beyond_horizon: Option<(f64, f64)>,
}

/// The cautions for a plan; the general one is always present.
pub fn cautions(inputs: CautionInputs) -> Vec<Caution> {
    let mut out = vec![Caution::General];
    if let Some((distance_m, horizon_m)) = inputs.beyond_horizon {
        out.push(Caution::BeyondHorizon { distance_m, horizon_m });
    }
    if inputs.height_m > COMMON_HEIGHT_CAP_M {
        out.push(Caution::Height {
            airborne: inputs.airborne,
        });
    }
    if inputs.rytov > 1.0 {
        out.push(Caution::Scintillation { rytov: inputs.rytov });
    }
    // From the level at which a person known to the viewer can be recognised (IEC 62676-4).
    if let Some(level) = people_level(inputs.px_per_m).filter(|l| *l >= PeopleLevel::Recognition) {
        out.push(Caution::Privacy {
            px_per_m: inputs.px_per_m,
            level,
        });
    }
    out
}
