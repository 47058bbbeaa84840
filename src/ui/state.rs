//! The app's one state: the scenario's raw text and the plan computed from it.

use crate::core::contract::plan::Plan;
use crate::core::contract::scenario::RawScenario;
use crate::core::physics::light::sun::{Place, SunPosition, Sunlight};
use std::rc::Rc;
use yew::Reducible;

/// What the page shows: the text as typed (kept even when invalid), the plan computed from it, and
/// the suns the second module has placed for it.
#[derive(Clone, Debug)]
pub struct State {
    pub raw: RawScenario,
    pub plan: Rc<Plan>,
    pub suns: Rc<Suns>,
}

/// The suns the page's second module has placed (`ui::aside`), newest last: the page plans with
/// these, and the light waits for the sun of any other instant or place (`Light::pending`).
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Suns(Vec<(f64, Place, Option<SunPosition>)>);

/// The suns kept: a person moves the time back and forth over a few values.
const SUNS_KEPT: usize = 64;

impl Sunlight for Suns {
    fn sun_at(&self, unix_s: f64, place: Place) -> Option<Option<SunPosition>> {
        self.0
            .iter()
            .rev()
            .find(|(t, p, _)| *t == unix_s && *p == place)
            .map(|(_, _, sun)| *sun)
    }
}

impl State {
    /// The state for a raw scenario.
    pub fn new(raw: RawScenario) -> State {
        let suns = Rc::new(Suns::default());
        let plan = Rc::new(Plan::from_raw_with(&raw, &*suns));
        State { raw, plan, suns }
    }

    /// The raw text of `key`, or empty.
    pub fn text(&self, key: &str) -> String {
        self.raw.get(key).unwrap_or_default().to_string()
    }

    /// The error message for `key`, if its value was rejected.
    pub fn error(&self, key: &str) -> Option<String> {
        self.plan
            .report
            .errors
            .iter()
            .find(|e| e.key == key)
            .map(|e| e.message.clone())
    }
}

/// Two states are equal when they hold the same text and the same computed plan (the same `Rc`):
/// a plan is computed once per change of text, so comparing pointers is enough, and it keeps the
/// props check of every component that takes the state cheap on each keystroke (a deep comparison
/// would walk the sweep's tables).
impl PartialEq for State {
    fn eq(&self, other: &State) -> bool {
        Rc::ptr_eq(&self.plan, &other.plan) && self.raw == other.raw
    }
}

/// Everything that changes the scenario.
#[derive(Clone, Debug, PartialEq)]
pub enum Action {
    /// Set keys to values, in place.
    Set(Vec<(String, String)>),
    /// Remove a key.
    Remove(String),
    /// Set keys and remove others in one step (switching between ground distance and tilt).
    SetAndRemove(Vec<(String, String)>, Vec<String>),
    /// Replace the whole scenario (a demo, a saved scenario, an opened link).
    Load(RawScenario),
    /// The sun at an instant and place, as the second module placed it.
    Sun {
        unix_s: f64,
        place: Place,
        position: Option<SunPosition>,
    },
}

impl Action {
    /// Sets one key.
    pub fn set(key: &str, value: impl Into<String>) -> Action {
        Action::Set(vec![(key.to_string(), value.into())])
    }
}

impl Reducible for State {
    type Action = Action;

    fn reduce(self: Rc<Self>, action: Action) -> Rc<Self> {
        let mut raw = self.raw.clone();
        let mut suns = self.suns.clone();
        match action {
            Action::Set(pairs) => {
                for (k, v) in pairs {
                    raw.set(&k, &v);
                }
            }
            Action::Remove(key) => raw.remove(&key),
            Action::SetAndRemove(pairs, removed) => {
                for key in removed {
                    raw.remove(&key);
                }
                for (k, v) in pairs {
                    raw.set(&k, &v);
                }
            }
            Action::Load(new_raw) => raw = new_raw,
            Action::Sun {
                unix_s,
                place,
                position,
            } => {
                let mut told = (*self.suns).clone();
                if told.0.len() >= SUNS_KEPT {
                    told.0.remove(0);
                }
                told.0.push((unix_s, place, position));
                suns = Rc::new(told);
                // A sun for an instant the plan no longer waits for is only kept.
                if self.plan.light.pending != Some((unix_s, place)) {
                    return Rc::new(State {
                        raw,
                        plan: self.plan.clone(),
                        suns,
                    });
                }
                let plan = Rc::new(Plan::from_raw_after_with(&raw, &self.plan, &*suns));
                return Rc::new(State { raw, plan, suns });
            }
        }
        if raw == self.raw {
            return self;
        }
        // A keystroke along the solve axis keeps the sweep and its solves.
        let plan = Rc::new(Plan::from_raw_after_with(&raw, &self.plan, &*suns));
        Rc::new(State { raw, plan, suns })
    }
}
