//! Cautions shown beside every plan: aviation height and privacy. They inform; they never decide
//! that a flight is allowed (resolution-model §8).

use serde::Serialize;

/// Height above which many jurisdictions cap small unmanned aircraft: 120 m (about 400 ft),
/// e.g. US 14 CFR §107.51 and the EU open category of Regulation 2019/947.
pub const COMMON_HEIGHT_CAP_M: f64 = 120.0;

/// One caution with a stable code for tests and a sentence for people.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Caution {
    pub code: &'static str,
    pub text: String,
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
    let mut out = vec![Caution {
        code: "general",
        text: "This planner estimates image detail; it does not tell you that a flight or a camera \
               placement is allowed. Rules differ between countries and change: check the rules \
               where you work, and follow licensed practice."
            .to_string(),
    }];
    if inputs.height_m > COMMON_HEIGHT_CAP_M {
        let aircraft = if inputs.airborne {
            ""
        } else {
            " (if this camera is carried by an aircraft)"
        };
        out.push(Caution {
            code: "height",
            text: format!(
                "The height is above 120 m (400 ft){aircraft}. Many jurisdictions cap small unmanned \
                 aircraft at about that height above the ground and require the pilot to keep the \
                 aircraft in sight. Check local rules before planning this."
            ),
        });
    }
    if inputs.identifies_people {
        out.push(Caution {
            code: "privacy",
            text: "At this resolution a person in the images could be identified. In many \
                   jurisdictions such images are personal data: tell people nearby, avoid private \
                   spaces, keep only what the job needs, and check local privacy law."
                .to_string(),
        });
    }
    out
}
