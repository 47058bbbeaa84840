//! The four limits side by side, the governing one in words, and what to change.
//!
//! The panel is drawn on every keystroke. Its body is written as HTML text (`ui::markup`) and
//! rendered with `Html::from_html_unchecked`, much less code than the same elements in `html!`;
//! yew compares the text and replaces the body only when it differs. It holds no table (parsing
//! would add a tbody) and nothing interactive. The heading and the invalid-input note stay yew
//! elements, so that the note (`role="status"`) is updated in place and read out when it changes.

use crate::core::contract::inputs::{input, inputs_of};
use crate::core::physics::engine::Limit;
use crate::core::words::format;
use crate::core::words::notes;
use crate::ui::markup::Markup;
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

/// A paragraph saying which defaults a result uses, if any.
fn push_stale(m: &mut Markup, invalid: &[&str]) {
    if !invalid.is_empty() {
        m.tag("<p class=\"stale-tag\">uses a default: ")
            .text(&invalid.join(", "))
            .tag("</p>");
    }
}

/// What a limit's figure means, under it; the sampling limit names the GSD it is twice.
fn push_detail(m: &mut Markup, limit: Limit, state: &State) {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let text = match limit {
        Limit::Sampling => {
            m.tag("two pixels: GSD ");
            m.figure("gsd_m", report.gsd_m, &format::length(report.gsd_m, units));
            if report.look_angle_deg > 1.0 {
                format!(
                    "; on the ground along the view {}",
                    format::length(report.gsd_ground_m, units)
                )
            } else {
                String::new()
            }
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
    m.text(&text);
}

/// One limit's card: its figure, its share of the governing one, what it means and what it rests on.
fn push_limit_card(m: &mut Markup, limit: Limit, state: &State) {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let key = field_of(limit);
    let v = state.plan.evaluation.limits.get(limit);
    let invalid = invalid_inputs(state, key);
    let is_gov = limit == report.governing;
    let share = if report.limit_m > 0.0 { v / report.limit_m } else { 0.0 };
    m.tag("<article data-limit=\"")
        .tag(limit.key())
        .tag(if is_gov {
            "\" class=\"limit governs"
        } else {
            "\" class=\"limit"
        })
        .tag(if invalid.is_empty() { "\"><h3>" } else { " stale\"><h3>" })
        .text(notes::limit_title(limit))
        .tag("</h3><p class=\"big\">");
    m.figure(key, v, &format::length(v, units));
    m.tag("</p><p class=\"tag\">");
    if is_gov {
        m.tag("GOVERNS");
    } else {
        m.text(&format::percent(share)).tag(" of the governing limit");
    }
    m.tag("</p><p class=\"detail\">");
    push_detail(m, limit, state);
    m.tag("</p><p class=\"meaning\">")
        .text(notes::limit_meaning(limit))
        .tag("</p>");
    push_stale(m, &invalid);
    m.tag("<svg viewBox=\"0 0 100 6\" preserveAspectRatio=\"none\" aria-hidden=\"true\" class=\"bar\"><rect width=\"100\" height=\"6\" class=\"track\"></rect><rect width=\"")
        .text(&format!("{:.1}", (share * 100.0).clamp(0.0, 100.0)))
        .tag("\" height=\"6\" class=\"fill\"></rect></svg></article>");
}

/// The combined figure beside the four: the ground resolved distance through the whole chain.
fn push_combined_card(m: &mut Markup, state: &State) {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let invalid = invalid_inputs(state, "grd_m");
    let ratio = if report.limit_m > 0.0 {
        report.grd_m / report.limit_m
    } else {
        1.0
    };
    m.tag(if invalid.is_empty() {
        "<article data-limit=\"grd\" class=\"limit combined\">"
    } else {
        "<article data-limit=\"grd\" class=\"limit combined stale\">"
    })
    .tag("<h3>All together (GRD)</h3><p class=\"big\">");
    m.figure("grd_m", report.grd_m, &format::length(report.grd_m, units));
    m.tag("</p><p class=\"tag\">");
    if ratio <= 1.0005 {
        m.tag("equal to the governing limit");
    } else {
        m.text(&format::times(ratio)).tag(" the governing limit");
    }
    m.tag("</p><p class=\"detail\">along the motion ");
    m.figure(
        "grd_along_m",
        report.grd_along_m,
        &format::length(report.grd_along_m, units),
    );
    m.tag(", across ");
    m.figure(
        "grd_across_m",
        report.grd_across_m,
        &format::length(report.grd_across_m, units),
    );
    m.tag("</p><p class=\"meaning\">").text(notes::GRD_MEANING).tag("</p>");
    push_stale(m, &invalid);
    m.tag("</article>");
}

/// The predicted image quality: the GIQE-5 NIIRS with what its level lets a person make out, the
/// edge figures it rests on, and a short scale.
fn push_quality(m: &mut Markup, state: &State) {
    let report = &state.plan.report;
    let level = notes::niirs_level(report.niirs);
    m.tag("<div aria-labelledby=\"quality-title\" class=\"quality\"><h3 id=\"quality-title\">Predicted image quality</h3><p class=\"niirs\"><strong>NIIRS ");
    m.figure("niirs", report.niirs, &format!("{:.1}", report.niirs));
    m.tag("</strong> — ").text(report.niirs_reading).tag("</p>");
    if let Some(note) = &report.niirs_note {
        m.tag("<p data-key=\"niirs_note\" data-si=\"")
            .text(note)
            .tag("\" class=\"niirs-note\">")
            .text(note)
            .tag("</p>");
    }
    let edges: [(&str, &str, f64); 4] = [
        ("Edge sharpness (RER): along ", "rer_along", report.rer_along),
        (", across ", "rer_across", report.rer_across),
        (", weighted ", "rer", report.rer),
        ("; overshoot ", "overshoot", report.overshoot),
    ];
    m.tag("<p class=\"edges\">");
    for (words, key, v) in edges {
        m.tag(words);
        m.figure(key, v, &format!("{v:.2}"));
    }
    m.tag("; contrast SNR ");
    m.figure("snr", report.snr, &format::significant(report.snr));
    m.tag("</p><ol aria-label=\"What each NIIRS level shows\" reversed=\"reversed\" class=\"niirs-scale\">");
    for &(n, words) in notes::NIIRS_SCALE.iter().rev() {
        let here = Some(n) == level;
        let n = n.to_string();
        m.tag("<li value=\"")
            .tag(&n)
            .tag(if here { "\" class=\"here\"><b>" } else { "\"><b>" })
            .tag(&n)
            .tag("</b> ")
            .text(words)
            .tag("</li>");
    }
    m.tag("</ol></div>");
}

/// The panel's body after its heading and invalid-input note, as markup.
fn body(state: &State) -> Markup {
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    let governing = report.governing;
    let runner_up = notes::lower_first(notes::limit_title(report.runner_up));
    let mut m = Markup::default();
    m.tag("<p data-key=\"governing\" data-si=\"")
        .tag(governing.key())
        .tag("\" class=\"governing\"><strong>")
        .text(notes::limit_title(governing))
        .tag(" governs: </strong>");
    m.figure("limit_m", report.limit_m, &format::length(report.limit_m, units));
    if report.governing_margin > 1.0 {
        m.tag(", ")
            .text(&format::times(report.governing_margin))
            .tag(" the next limit, ");
    } else {
        m.tag(", level with ");
    }
    m.text(&runner_up).tag(".");
    m.tag("</p><p data-key=\"advice\" data-si=\"")
        .text(report.advice)
        .tag("\" class=\"advice\">To see finer detail: ")
        .text(report.advice)
        .tag("</p><div class=\"limits\">");
    for limit in Limit::ALL {
        push_limit_card(&mut m, limit, state);
    }
    push_combined_card(&mut m, state);
    m.tag("</div><dl class=\"figures\"><dt>Sampling ratio Q = λN/p</dt><dd>");
    m.figure("q", report.q, &format::significant(report.q));
    m.tag(" — ")
        .text(report.sampling_regime)
        .tag("</dd><dt>Detail resolved (coarser direction) and GSD ")
        .text(notes::plane(report.target_plane))
        .tag("</dt><dd>");
    m.figure(
        "detail_on_plane_m",
        report.detail_on_plane_m,
        &format::length(report.detail_on_plane_m, units),
    );
    m.tag(", GSD ");
    m.figure(
        "gsd_on_plane_m",
        report.gsd_on_plane_m,
        &format::length(report.gsd_on_plane_m, units),
    );
    m.tag("</dd><dt>Rytov variance of the path</dt><dd>");
    m.figure("rytov", report.rytov, &format::significant(report.rytov));
    m.tag(if report.rytov > 1.0 {
        " — strong scintillation: turbulence figures indicative"
    } else if report.rytov > 0.0 {
        " — weak scintillation (below 1)"
    } else {
        " — no turbulence in this scenario"
    })
    .tag("</dd><dt>Turbulence in one frame</dt><dd data-key=\"short_exposure\" data-si=\"")
    .tag(if report.short_exposure { "true" } else { "false" })
    .tag("\">")
    .text(notes::exposure_kind(report.short_exposure, report.r0_m.is_some()))
    .tag("</dd><dt>Ground-plane GSD along the view</dt><dd>");
    m.figure(
        "gsd_ground_m",
        report.gsd_ground_m,
        &format::length(report.gsd_ground_m, units),
    );
    m.tag("</dd><dt>Motion smear</dt><dd>");
    m.figure(
        "motion_px",
        report.motion_px,
        &(format::significant(report.motion_px) + " px"),
    );
    m.tag("</dd></dl>");
    push_quality(&mut m, state);
    m
}

/// The results panel.
#[function_component(Results)]
pub fn results(props: &ResultsProps) -> Html {
    let state = &props.state;
    let all_invalid = invalid_inputs(state, "limit_m");
    html! {
        <section class="panel" id="results" aria-labelledby="results-title">
            <h2 id="results-title">{ "What the images will resolve" }</h2>
            if !all_invalid.is_empty() {
                <p class="stale-note" role="status">{ format!("Some inputs are invalid ({}); their defaults are used until you fix them, so results marked “uses a default” may be wrong.", all_invalid.join(", ")) }</p>
            }
            { body(state).html() }
        </section>
    }
}
