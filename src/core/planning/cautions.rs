//! Cautions shown beside every plan: aviation height and privacy. They inform; they never decide
//! that a flight is allowed (resolution-model §8). The words layer words them.

/// Height above which many jurisdictions cap small unmanned aircraft: 120 m (about 400 ft),
/// e.g. US 14 CFR §107.51 and the EU open category of Regulation 2019/947.
pub const COMMON_HEIGHT_CAP_M: f64 = 120.0;

/// One caution.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Caution {
    /// Always present: the planner estimates, it never says a flight is allowed.
    General,
    /// Above [`COMMON_HEIGHT_CAP_M`]; `airborne` when the camera is carried by an aircraft.
    Height { airborne: bool },
    /// A person in the images could be identified.
    Privacy,
}

impl Caution {
    /// A stable code for tests, styling and the report.
    pub fn code(self) -> &'static str {
        match self {
            Caution::General => "general",
            Caution::Height { .. } => "height",
            Caution::Privacy => "privacy",
        }
    }
}

/// What the cautions depend on.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CautionInputs {
    pub height_m: f64,
    /// True when the camera is carried by an aircraft (a drone survey), false for a mast.
    pub airborne: bool,
    /// True when the plan resolves a person at Johnson identification level.
    pub identifies_people: bool,
}

/// The cautions for a plan; the general one is always present.
pub fn cautions(inputs: CautionInputs) -> Vec<Caution> {
    let mut out = vec![Caution::General];
    if inputs.height_m > COMMON_HEIGHT_CAP_M {
        out.push(Caution::Height {
            airborne: inputs.airborne,
        });
    }
    if inputs.identifies_people {
        out.push(Caution::Privacy);
    }
    out
}
