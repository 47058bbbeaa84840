//! What a target will look like: Johnson criteria and the target transfer probability function.
//!
//! Sources: J. Johnson, "Analysis of image forming systems", Proc. Image Intensifier Symposium,
//! 1958 (AD220160) for the cycles; the TTPF form P = (N/N50)^E/(1 + (N/N50)^E),
//! E = 2.7 + 0.7·N/N50, as used in range-performance modelling (resolution-model §6).

use serde::Serialize;

/// A discrimination task.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Task {
    Detection,
    Orientation,
    Recognition,
    Identification,
}

impl Task {
    /// All tasks, easiest first.
    pub const ALL: [Task; 4] = [
        Task::Detection,
        Task::Orientation,
        Task::Recognition,
        Task::Identification,
    ];

    /// The report's word for the task (as serde writes it).
    pub fn key(self) -> &'static str {
        match self {
            Task::Detection => "detection",
            Task::Orientation => "orientation",
            Task::Recognition => "recognition",
            Task::Identification => "identification",
        }
    }

    /// Johnson's cycles across the critical dimension for a 50 % chance (Johnson 1958).
    pub fn n50(self) -> f64 {
        match self {
            Task::Detection => 1.0,
            Task::Orientation => 1.4,
            Task::Recognition => 4.0,
            Task::Identification => 6.4,
        }
    }
}

/// How the critical dimension of a target is taken, each with its own N50 set (resolution-model §6).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
pub enum CdModel {
    /// Johnson's one-dimensional criteria on the target's smaller dimension.
    #[serde(rename = "1d")]
    OneD,
    /// Two-dimensional models on √(visible area).
    #[default]
    #[serde(rename = "2d")]
    TwoD,
}

impl CdModel {
    /// Cycles across the critical dimension for a 50 % chance of `task`, or `None` where the model
    /// gives none. 1-D: Johnson (1958). 2-D: about 0.75, 3.0 and 6.0 (from memory; resolution-model
    /// §6), with no orientation figure.
    pub fn n50(self, task: Task) -> Option<f64> {
        match self {
            CdModel::OneD => Some(task.n50()),
            CdModel::TwoD => match task {
                Task::Detection => Some(0.75),
                Task::Orientation => None,
                Task::Recognition => Some(3.0),
                Task::Identification => Some(6.0),
            },
        }
    }
}

/// The ratio N/N50 at which the TTPF reaches `probability` (0 < p < 1), by bisection; 1 at 50 %.
pub fn ratio_for(probability: f64) -> f64 {
    if !(probability > 0.0 && probability < 1.0) {
        return f64::NAN;
    }
    let (mut lo, mut hi) = (0.0f64, 100.0f64);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if ttpf(mid) < probability {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

/// Target transfer probability function P(N/N50).
pub fn ttpf(cycles_ratio: f64) -> f64 {
    if cycles_ratio == f64::INFINITY {
        return 1.0;
    }
    if cycles_ratio.is_nan() || cycles_ratio <= 0.0 {
        return 0.0;
    }
    let e = 2.7 + 0.7 * cycles_ratio;
    let t = cycles_ratio.powf(e);
    if t.is_finite() {
        t / (1.0 + t)
    } else {
        1.0
    }
}

/// Resolvable cycles across a target: critical dimension / the resolvable period (the governing
/// limit, a separation of one kind for every limit; resolution-model §6).
pub fn cycles_across(critical_dimension_m: f64, limit_m: f64) -> f64 {
    if limit_m > 0.0 && critical_dimension_m > 0.0 {
        let n = critical_dimension_m / limit_m;
        if n.is_finite() {
            n
        } else {
            f64::MAX
        }
    } else if critical_dimension_m > 0.0 && limit_m == 0.0 {
        f64::MAX
    } else {
        // A negative or NaN limit says nothing about the detail: claim no cycles rather than
        // unbounded ones, so that no task is ever reported certain on a broken input.
        0.0
    }
}

/// The chance of each task for one target.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct TaskChance {
    pub task: Task,
    pub cycles_needed: f64,
    pub probability: f64,
}

/// The chances of each task that `model` rates, for a target of `critical_dimension_m` under a
/// resolvable period `limit_m`.
pub fn task_chances(critical_dimension_m: f64, limit_m: f64, model: CdModel) -> (f64, Vec<TaskChance>) {
    let n = cycles_across(critical_dimension_m, limit_m);
    let chances = Task::ALL
        .iter()
        .filter_map(|&task| {
            let n50 = model.n50(task)?;
            Some(TaskChance {
                task,
                cycles_needed: n50,
                probability: ttpf(n / n50),
            })
        })
        .collect();
    (n, chances)
}

/// What a viewer can make out of a person at a pixel density on the target, by the operational
/// levels of video surveillance (IEC 62676-4:2014; from memory, resolution-model §6).
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum PeopleLevel {
    /// 25 px/m: that a person is there.
    Detection,
    /// 62.5 px/m: what a person is doing, their clothing.
    Observation,
    /// 125 px/m: a person known to the viewer can be recognised.
    Recognition,
    /// 250 px/m: an unknown individual can be identified.
    Identification,
}

impl PeopleLevel {
    /// The levels, lowest first.
    pub const ALL: [PeopleLevel; 4] = [
        PeopleLevel::Detection,
        PeopleLevel::Observation,
        PeopleLevel::Recognition,
        PeopleLevel::Identification,
    ];

    /// Pixels per metre on the target that the level asks for (IEC 62676-4; from memory).
    pub fn px_per_m(self) -> f64 {
        match self {
            PeopleLevel::Detection => 25.0,
            PeopleLevel::Observation => 62.5,
            PeopleLevel::Recognition => 125.0,
            PeopleLevel::Identification => 250.0,
        }
    }
}

/// The highest level that `px_per_m` pixels per metre on the target reach, if any.
pub fn people_level(px_per_m: f64) -> Option<PeopleLevel> {
    PeopleLevel::ALL.into_iter().rev().find(|l| px_per_m >= l.px_per_m())
}
