//! The four limits side by side, the governing one in words, and what to change.

use crate::core::contract::inputs::{input, inputs_of};
use crate::core::physics::engine::Limit;
use crate::core::words::format;
use crate::core::words::notes;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the results panel.
#[derive(Properties, PartialEq, Clone)]
pub struct ResultsProps {
    pub state: Rc<State>,
}

/// The report field of each limit.
pub fn field_of(limit: Limit) -> &'static str {
    match limit {
        Limit::Sampling => "sampling_m",
        Limit::Diffraction => "diffraction_m",
        Limit::Turbulence => "turbulence_m",
        Limit::Motion => "motion_m",
    }
}

/// Labels of the invalid inputs that a report field depends on.
pub fn invalid_inputs(state: &State, field: &str) -> Vec<&'static str> {
    inputs_of(field)
        .into_iter()
        .filter(|k| state.error(k).is_some())
        .map(|k| input(k).map(|s| s.label).unwrap_or(k))
        .collect()
}

/// A displayed value tagged with its report field and SI value.
pub fn value(key: impl Into<AttrValue>, si: f64, text: String) -> Html {
    let key: AttrValue = key.into();
    html! { <span class="value" data-key={key} data-si={si.to_string()}>{ text }</span> }
}

/// What a limit's figure means, under it; the sampling limit names the GSD it is twice.
fn detail(limit: Limit, state: &State) -> Html {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let text = match limit {
        Limit::Sampling => {
            let along = if report.look_angle_deg > 1.0 {
                format!(
                    "; on the ground along the view {}",
                    format::length(report.gsd_ground_m, units)
                )
            } else {
                String::new()
            };
            return html! {
                <>{ "two pixels: GSD " }{ value("gsd_m", report.gsd_m, format::length(report.gsd_m, units)) }{ along }</>
            };
        }
        Limit::Diffraction => format!(
            "{} µrad at f/{}",
            format::significant(report.rayleigh_rad * 1e6),
            format::significant(state.plan.scenario.f_number)
        ),
        Limit::Turbulence => match report.r0_m {
            Some(r0) => format!(
                "r0 = {} along the path; {}",
                format::length(r0, units),
                if report.short_exposure {
                    "short exposure"
                } else {
                    "long exposure"
                }
            ),
            None => "no turbulence in this scenario".to_string(),
        },
        Limit::Motion => format!("{} pixels of smear", format::significant(report.motion_px)),
    };
    html! { { text } }
}

/// One limit's card: its figure, its share of the governing one, what it means and what it rests on.
fn limit_card(limit: Limit, state: &State) -> Html {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let key = field_of(limit);
    let v = state.plan.evaluation.limits.get(limit);
    let invalid = invalid_inputs(state, key);
    let is_gov = limit == report.governing;
    let share = if report.limit_m > 0.0 { v / report.limit_m } else { 0.0 };
    html! {
        <article class={classes!("limit", is_gov.then_some("governs"), (!invalid.is_empty()).then_some("stale"))} data-limit={limit.key()}>
            <h3>{ notes::limit_title(limit) }</h3>
            <p class="big">{ value(key, v, format::length(v, units)) }</p>
            <p class="tag">{ if is_gov { "GOVERNS".to_string() } else { format!("{} of the governing limit", format::percent(share)) } }</p>
            <p class="detail">{ detail(limit, state) }</p>
            <p class="meaning">{ notes::limit_meaning(limit) }</p>
            if !invalid.is_empty() {
                <p class="stale-tag">{ format!("uses a default: {}", invalid.join(", ")) }</p>
            }
            <svg class="bar" viewBox="0 0 100 6" preserveAspectRatio="none" aria-hidden="true"><rect class="track" width="100" height="6" /><rect class="fill" width={format!("{:.1}", (share * 100.0).clamp(0.0, 100.0))} height="6" /></svg>
        </article>
    }
}

/// The combined figure beside the four: the ground resolved distance through the whole chain.
fn combined_card(state: &State) -> Html {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let invalid = invalid_inputs(state, "grd_m");
    let ratio = if report.limit_m > 0.0 {
        report.grd_m / report.limit_m
    } else {
        1.0
    };
    html! {
        <article class={classes!("limit", "combined", (!invalid.is_empty()).then_some("stale"))} data-limit="grd">
            <h3>{ "All together (GRD)" }</h3>
            <p class="big">{ value("grd_m", report.grd_m, format::length(report.grd_m, units)) }</p>
            <p class="tag">{ if ratio <= 1.0005 { "equal to the governing limit".to_string() } else { format!("{} the governing limit", format::times(ratio)) } }</p>
            <p class="detail">
                { "along the motion " }{ value("grd_along_m", report.grd_along_m, format::length(report.grd_along_m, units)) }
                { ", across " }{ value("grd_across_m", report.grd_across_m, format::length(report.grd_across_m, units)) }
            </p>
            <p class="meaning">{ notes::GRD_MEANING }</p>
            if !invalid.is_empty() {
                <p class="stale-tag">{ format!("uses a default: {}", invalid.join(", ")) }</p>
            }
        </article>
    }
}

/// The predicted image quality: the GIQE-5 NIIRS with what its level lets a person make out, the
/// edge figures it rests on, and a short scale.
fn quality_block(state: &State) -> Html {
    let report = &state.plan.report;
    let level = notes::niirs_level(report.niirs);
    html! {
        <div class="quality" aria-labelledby="quality-title">
            <h3 id="quality-title">{ "Predicted image quality" }</h3>
            <p class="niirs">
                <strong>{ "NIIRS " }{ value("niirs", report.niirs, format!("{:.1}", report.niirs)) }</strong>
                { format!(" — {}", report.niirs_reading) }
            </p>
            if let Some(note) = &report.niirs_note {
                <p class="niirs-note" data-key="niirs_note" data-si={note.clone()}>{ note.clone() }</p>
            }
            <p class="edges">
                { "Edge sharpness (RER): along " }{ value("rer_along", report.rer_along, format!("{:.2}", report.rer_along)) }
                { ", across " }{ value("rer_across", report.rer_across, format!("{:.2}", report.rer_across)) }
                { ", weighted " }{ value("rer", report.rer, format!("{:.2}", report.rer)) }
                { "; overshoot " }{ value("overshoot", report.overshoot, format!("{:.2}", report.overshoot)) }
                { "; contrast SNR " }{ value("snr", report.snr, format::significant(report.snr)) }
            </p>
            <ol class="niirs-scale" reversed=true aria-label="What each NIIRS level shows">
                { for notes::NIIRS_SCALE.iter().rev().map(|&(n, words)| html! {
                    <li value={n.to_string()} class={classes!((Some(n) == level).then_some("here"))}><b>{ n }</b>{ format!(" {words}") }</li>
                }) }
            </ol>
        </div>
    }
}

/// The results panel.
#[function_component(Results)]
pub fn results(props: &ResultsProps) -> Html {
    let state = &props.state;
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let governing = report.governing;
    let runner_up = report.runner_up;
    let short = report.short_exposure;
    let turbulent = report.r0_m.is_some();
    let all_invalid = invalid_inputs(state, "limit_m");
    html! {
        <section class="panel" id="results" aria-labelledby="results-title">
            <h2 id="results-title">{ "What the images will resolve" }</h2>
            if !all_invalid.is_empty() {
                <p class="stale-note" role="status">{ format!("Some inputs are invalid ({}); their defaults are used until you fix them, so results marked “uses a default” may be wrong.", all_invalid.join(", ")) }</p>
            }
            <p class="governing" data-key="governing" data-si={governing.key()}>
                <strong>{ format!("{} governs: ", notes::limit_title(governing)) }</strong>
                { value("limit_m", report.limit_m, format::length(report.limit_m, units)) }
                if report.governing_margin > 1.0 {
                    { format!(", {} the next limit, {}.", format::times(report.governing_margin), notes::lower_first(notes::limit_title(runner_up))) }
                } else {
                    { format!(", level with {}.", notes::lower_first(notes::limit_title(runner_up))) }
                }
            </p>
            <p class="advice" data-key="advice" data-si={report.advice}>{ format!("To see finer detail: {}", report.advice) }</p>
            <div class="limits">
                { for Limit::ALL.iter().map(|&limit| limit_card(limit, state)) }
                { combined_card(state) }
            </div>
            <dl class="figures">
                <dt>{ "Sampling ratio Q = λN/p" }</dt>
                <dd>{ value("q", report.q, format::significant(report.q)) }{ format!(" — {}", report.sampling_regime) }</dd>
                <dt>{ format!("Detail resolved (coarser direction) and GSD {}", notes::plane(report.target_plane)) }</dt>
                <dd>{ value("detail_on_plane_m", report.detail_on_plane_m, format::length(report.detail_on_plane_m, units)) }{ ", GSD " }{ value("gsd_on_plane_m", report.gsd_on_plane_m, format::length(report.gsd_on_plane_m, units)) }</dd>
                <dt>{ "Rytov variance of the path" }</dt>
                <dd>{ value("rytov", report.rytov, format::significant(report.rytov)) }{ if report.rytov > 1.0 { " — strong scintillation: turbulence figures indicative" } else if report.rytov > 0.0 { " — weak scintillation (below 1)" } else { " — no turbulence in this scenario" } }</dd>
                <dt>{ "Turbulence in one frame" }</dt>
                <dd data-key="short_exposure" data-si={short.to_string()}>{ notes::exposure_kind(short, turbulent) }</dd>
                <dt>{ "Ground-plane GSD along the view" }</dt>
                <dd>{ value("gsd_ground_m", report.gsd_ground_m, format::length(report.gsd_ground_m, units)) }</dd>
                <dt>{ "Motion smear" }</dt>
                <dd>{ value("motion_px", report.motion_px, format!("{} px", format::significant(report.motion_px))) }</dd>
            </dl>
            { quality_block(state) }
        </section>
    }
}
