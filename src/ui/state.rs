//! The app's one state: the scenario's raw text and the plan computed from it.

use crate::core::contract::plan::Plan;
use crate::core::contract::scenario::RawScenario;
use std::rc::Rc;
use yew::Reducible;

/// What the page shows: the text as typed (kept even when invalid) and the plan computed from it.
#[derive(Clone, Debug)]
pub struct State {
    pub raw: RawScenario,
    pub plan: Rc<Plan>,
}

impl State {
    /// The state for a raw scenario.
    pub fn new(raw: RawScenario) -> State {
        let plan = Rc::new(Plan::from_raw(&raw));
        State { raw, plan }
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
        }
        if raw == self.raw {
            return self;
        }
        // A keystroke along the solve axis keeps the sweep and its solves.
        let plan = Rc::new(Plan::from_raw_after(&raw, &self.plan));
        Rc::new(State { raw, plan })
    }
}
