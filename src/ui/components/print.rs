//! The one-page flight plan for paper (A4 and US Letter). Hidden on screen; the print style sheet
//! shows it alone. Built from the same plan as the screen, laid out for paper.

use crate::core::contract::plan::Plan;
use crate::core::contract::scenario::{AirModel, Offset};
use crate::core::formats::qr::QrSvg;
use crate::core::physics::engine::Limit;
use crate::core::words::chart::Chart;
use crate::core::words::format;
use crate::core::words::light::{exposure_time, light_source, snr_source};
use crate::core::words::notes;
use crate::ui::browser;
use crate::ui::components::chart::chart_svg;
use crate::ui::components::survey::diagram;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the printed plan.
#[derive(Properties, PartialEq, Clone)]
pub struct PrintProps {
    pub state: Rc<State>,
    /// The chart's geometry, shared with the screen.
    pub chart: Rc<Chart>,
    /// The QR code of the scenario's link, shared with the screen.
    pub qr: Rc<Option<QrSvg>>,
}

fn air_words(air: AirModel, cn2: f64) -> String {
    match air {
        AirModel::None => "turbulence left out".to_string(),
        AirModel::Hv57 => "Hufnagel–Valley 5/7".to_string(),
        AirModel::SlcDay => "SLC day".to_string(),
        AirModel::SlcNight => "SLC night".to_string(),
        AirModel::Power => format!("near-ground power law, Cn² {cn2:e} m^-2/3 at 1 m"),
    }
}

/// The scenario's inputs in words, one row per group.
fn input_rows(plan: &Plan) -> Vec<(&'static str, String)> {
    let s = &plan.scenario;
    let r = &plan.report;
    let units = s.units;
    let len = |m: f64| format::length(m, units);
    let view = match s.offset {
        Offset::GroundDistance(g) if g > 0.0 => format!("target {} away on the ground", len(g)),
        Offset::GroundDistance(_) => "straight down".to_string(),
        Offset::Tilt(t) => format!("tilted {}° from straight down", format::significant(t)),
    };
    let mut rows = vec![
        (
            "Camera",
            format!(
                "{} × {} mm sensor, {} × {} pixels, pitch {} µm, fill {}",
                format::significant(s.sensor_width_mm),
                format::significant(s.sensor_height_mm),
                s.cols,
                s.rows,
                format::significant(r.pitch_m * 1e6),
                format::percent(s.fill)
            ),
        ),
        (
            "Lens",
            format!(
                "{} mm at f/{}; obscuration {}, wavefront error {} waves",
                format::significant(s.focal_mm),
                format::significant(s.f_number),
                format::significant(s.obscuration),
                format::significant(s.wfe_waves)
            ),
        ),
        (
            "Band",
            format!(
                "{} nm; contrast SNR {}",
                format::significant(s.wavelength_nm),
                format::significant(r.snr)
            ),
        ),
        (
            "Geometry",
            format!(
                "height {}, {view}; slant range {}",
                len(s.height_m),
                len(r.slant_range_m)
            ),
        ),
        ("Air", air_words(s.air, s.cn2_at_1m)),
    ];
    // The light's row only when the scenario says something about the light (the sheet stays on
    // one page for the longest scenarios without it).
    if s.when.is_some() || s.lux.is_some() || s.auto_exposure {
        rows.push((
            "Light",
            format!(
                "{}; {}; exposure {} ({}), ISO {}, contrast SNR {} ({})",
                s.when
                    .map(|t| crate::core::formats::when::write_when(&t))
                    .unwrap_or_else(|| "no date and time".to_string()),
                match r.illuminance_lx {
                    Some(lux) => format!("{} lx {}", format::significant(lux), light_source(r.light_source)),
                    None => "light not known".to_string(),
                },
                exposure_time(r.exposure_s),
                if r.metered { "metered" } else { "as typed" },
                format::significant(s.iso),
                format::significant(r.snr),
                snr_source(r.snr_source)
            ),
        ));
    }
    rows.push((
        "Motion",
        format!(
            "{}, exposure {} s, jitter {} µrad",
            format::speed(s.speed_mps, units),
            format::significant(s.shutter_s),
            format::significant(s.jitter_urad)
        ),
    ));
    rows
}

/// The survey's figures, one row each.
fn survey_rows(plan: &Plan) -> Vec<(&'static str, String)> {
    let s = &plan.scenario;
    let survey = &plan.report.survey;
    let units = s.units;
    let len = |m: f64| format::length(m, units);
    let or_dash = |v: Option<String>| v.unwrap_or_else(|| "—".into());
    let count = |n: Option<u64>| or_dash(n.map(|n| n.to_string()));
    let speed = |v: Option<f64>| or_dash(v.map(|v| format::speed(v, units)));
    vec![
        (
            "Footprint",
            format!("{} × {}", len(survey.footprint_across_m), len(survey.footprint_along_m)),
        ),
        (
            "Overlaps",
            format!(
                "{} % front, {} % side",
                format::significant(s.survey.front_overlap_pct),
                format::significant(s.survey.side_overlap_pct)
            ),
        ),
        (
            "Base, line spacing",
            format!("{}, {}", len(survey.base_m), len(survey.line_spacing_m)),
        ),
        ("Trigger interval", or_dash(survey.trigger_s.map(format::duration))),
        (
            "Lines, photos",
            format!("{}, {}", count(survey.lines), count(survey.photos)),
        ),
        (
            "Flight time, batteries",
            format!(
                "{}, {}",
                or_dash(survey.flight_time_s.map(format::duration)),
                count(survey.batteries)
            ),
        ),
        (
            "Speed limits",
            format!(
                "blur {}, interval {}",
                speed(survey.max_speed_blur_mps),
                speed(survey.max_speed_trigger_mps)
            ),
        ),
    ]
}

/// Labelled rows as a table.
fn rows_table(rows: &[(&'static str, String)]) -> Html {
    html! {
        <table class="print-table">
            { for rows.iter().map(|(k, v)| html! { <tr><th>{ *k }</th><td>{ v.clone() }</td></tr> }) }
        </table>
    }
}

/// The printed plan.
#[function_component(PrintSheet)]
pub fn print_sheet(props: &PrintProps) -> Html {
    let plan = &props.state.plan;
    let s = &plan.scenario;
    let r = &plan.report;
    let units = s.units;
    let len = |m: f64| format::length(m, units);
    // The local date: the UTC date of `now_iso` is a day off for much of the day away from UTC.
    let date = browser::local_date();
    let c = &props.chart;
    let qr = &props.qr;
    let inputs = input_rows(plan);
    let reach = match (notes::need_text(&s.need(), units), r.reach) {
        (Some(need_text), Some(reach)) => notes::reach(&reach, plan.sweep.axis, &need_text, units),
        _ => match props.state.error("need") {
            Some(message) => format!("The required resolution was rejected: {message}"),
            None => "No required resolution was set.".to_string(),
        },
    };
    let diagram_html = plan
        .layout
        .as_ref()
        .map(|l| diagram(l, units, "print"))
        .unwrap_or_default();
    html! {
        <section class="print-sheet" aria-hidden="true">
            <header class="print-head">
                <div>
                    <h1>{ "Flight plan — Sharpfield" }</h1>
                    <p class="print-name">{ if s.name.is_empty() { "Untitled scenario".to_string() } else { s.name.clone() } }</p>
                    <p>{ format!("Printed {date}. Values are estimates; check them in the field.") }</p>
                </div>
                if let Some(qr) = &**qr {
                    <svg class="print-qr" viewBox={format!("0 0 {0} {0}", qr.size)} shape-rendering="crispEdges">
                        <rect width={qr.size.to_string()} height={qr.size.to_string()} class="qr-light" />
                        <path d={qr.path.clone()} class="qr-dark" />
                    </svg>
                }
            </header>
            <div class="print-grid">
                <div>
                    <h2>{ "Inputs" }</h2>
                    { rows_table(&inputs) }
                    <h2>{ "Resolution" }</h2>
                    <table class="print-table">
                        { for Limit::ALL.iter().map(|&l| html! {
                            <tr class={classes!((l == r.governing).then_some("governs"))}>
                                <th>{ notes::limit_title(l) }</th>
                                <td>{ len(plan.evaluation.limits.get(l)) }{ if l == r.governing { " — governs" } else { "" } }</td>
                            </tr>
                        }) }
                        <tr class="combined">
                            <th>{ "All together (GRD)" }</th>
                            <td>{ if r.grd_along_m > r.grd_across_m * 1.0005 { format!("{}; along the motion {}", len(r.grd_m), len(r.grd_along_m)) } else { len(r.grd_m) } }</td>
                        </tr>
                        <tr>
                            <th>{ "Predicted NIIRS (GIQE 5)" }</th>
                            <td>{ format!("{:.1}{}", r.niirs, if r.niirs_note.is_some() { " (indicative)" } else { "" }) }</td>
                        </tr>
                    </table>
                </div>
                <div>{ chart_svg(c, "The four limits") }</div>
            </div>
            <p>{ format!("{} governs at {}. {}", notes::limit_title(r.governing), len(r.limit_m), r.advice) }</p>
            <p>{ reach }</p>
            <div class="print-grid">
                <div>
                    <h2>{ "Survey" }</h2>
                    { rows_table(&survey_rows(plan)) }
                </div>
                <div class="print-diagram">{ diagram_html }</div>
            </div>
            <h2>{ "Cautions" }</h2>
            <ul class="print-cautions">
                { for r.cautions.iter().map(|c| html! { <li>{ c.text.clone() }</li> }) }
                { for r.light_notes.iter().map(|n| html! { <li>{ n.text.clone() }</li> }) }
            </ul>
            <h2>{ "Sign-off" }</h2>
            <div class="signoff">
                <p>{ "Pilot / operator" }<span class="blank"></span></p>
                <p>{ "Date and time" }<span class="blank"></span></p>
                <p>{ "Site, airspace and permissions checked" }<span class="blank"></span></p>
                <p>{ "People nearby informed" }<span class="blank"></span></p>
                <p>{ "Signature" }<span class="blank"></span></p>
            </div>
        </section>
    }
}
