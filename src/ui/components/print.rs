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
use crate::ui::components::chart::chart_markup;
use crate::ui::components::survey::{diagram_markup, use_boundary};
use crate::ui::markup::Markup;
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
                "height {}, {view}{}; slant range {}{}",
                len(s.height_m),
                s.target_height_m
                    .filter(|t| *t > 0.0)
                    .map(|t| format!(", target {} tall", len(t)))
                    .unwrap_or_default(),
                len(r.slant_range_m),
                match (r.horizon_m, s.offset) {
                    (_, Offset::GroundDistance(g)) if g <= 0.0 => String::new(),
                    (Some(h), _) if !r.visible => format!("; horizon {}: the target is below it", len(h)),
                    (Some(h), _) => format!("; horizon {}", len(h)),
                    (None, _) => String::new(),
                }
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
    let mut rows = vec![
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
    ];
    // The wind's and the relief's rows only when they are given (the sheet stays on one page).
    if let (Some(out), Some(back), Some(crab)) = (
        survey.ground_speed_out_mps,
        survey.ground_speed_back_mps,
        survey.crab_deg,
    ) {
        rows.push((
            "Wind, ground speeds",
            format!(
                "{} from {}°: out {}, back {}, crab {}°",
                format::speed(s.survey.wind_mps, units),
                format::significant(s.survey.wind_from_deg),
                format::speed(out, units),
                format::speed(back, units),
                format::significant(crab)
            ),
        ));
    }
    if let (Some((low, high)), Some(fine), Some(coarse)) = (s.survey.relief_m, survey.gsd_min_m, survey.gsd_max_m) {
        rows.push((
            "Relief",
            format!(
                "ground {} to {}: GSD {} to {}, least overlap {} % front, {} % side",
                len(low),
                len(high),
                len(fine),
                len(coarse),
                format::significant(survey.front_min_pct.unwrap_or(f64::NAN)),
                format::significant(survey.side_min_pct.unwrap_or(f64::NAN))
            ),
        ));
    }
    rows
}

/// The resolution's rows: the four limits, the governing one marked, then all of them together and
/// the predicted NIIRS; and the class of each row.
fn resolution_rows(plan: &Plan) -> (Vec<(&'static str, String)>, Vec<Option<&'static str>>) {
    let r = &plan.report;
    let len = |m: f64| format::length(m, plan.scenario.units);
    let mut rows = Vec::new();
    let mut classes = Vec::new();
    for &l in Limit::ALL.iter() {
        let governs = l == r.governing;
        rows.push((
            notes::limit_title(l),
            format!(
                "{}{}",
                len(plan.evaluation.limits.get(l)),
                if governs { " — governs" } else { "" }
            ),
        ));
        classes.push(governs.then_some("governs"));
    }
    rows.push((
        "All together (GRD)",
        if r.grd_along_m > r.grd_across_m * 1.0005 {
            format!("{}; along the motion {}", len(r.grd_m), len(r.grd_along_m))
        } else {
            len(r.grd_m)
        },
    ));
    classes.push(Some("combined"));
    rows.push((
        "Predicted NIIRS (GIQE 5)",
        format!(
            "{:.1}{}",
            r.niirs,
            if r.niirs_note.is_some() { " (indicative)" } else { "" }
        ),
    ));
    (rows, classes)
}

/// Labelled rows as a table written into `m`; `classes` gives the class of each row it names.
fn rows_table(m: &mut Markup, rows: &[(&'static str, String)], classes: &[Option<&'static str>]) {
    m.tag("<table class=\"print-table\"><tbody>");
    for (i, (k, v)) in rows.iter().enumerate() {
        match classes.get(i).copied().flatten() {
            Some(class) => m.tag(&format!("<tr class=\"{class}\"><th>")),
            None => m.tag("<tr><th>"),
        };
        m.text(k).tag("</th><td>").text(v).tag("</td></tr>");
    }
    m.tag("</tbody></table>");
}

/// The sheet's head: title, the scenario's name, the date printed and the QR code of its link.
fn head(m: &mut Markup, name: &str, date: &str, qr: Option<&QrSvg>) {
    m.tag("<header class=\"print-head\"><div><h1>Flight plan — Sharpfield</h1><p class=\"print-name\">")
        .text(if name.is_empty() { "Untitled scenario" } else { name })
        .tag("</p><p>Printed ")
        .text(date)
        .tag(". Values are estimates; check them in the field.</p></div>");
    if let Some(qr) = qr {
        let size = qr.size.to_string();
        m.tag("<svg viewBox=\"0 0 ")
            .tag(&size)
            .tag(" ")
            .tag(&size)
            .tag("\" shape-rendering=\"crispEdges\" class=\"print-qr\"><rect width=\"")
            .tag(&size)
            .tag("\" height=\"")
            .tag(&size)
            .tag("\" class=\"qr-light\"></rect><path d=\"")
            .text(&qr.path)
            .tag("\" class=\"qr-dark\"></path></svg>");
    }
    m.tag("</header>");
}

/// The fields a person fills in by hand.
const SIGN_OFF: &str = "<h2>Sign-off</h2><div class=\"signoff\">\
    <p>Pilot / operator<span class=\"blank\"></span></p>\
    <p>Date and time<span class=\"blank\"></span></p>\
    <p>Site, airspace and permissions checked<span class=\"blank\"></span></p>\
    <p>People nearby informed<span class=\"blank\"></span></p>\
    <p>Signature<span class=\"blank\"></span></p></div>";

/// The printed plan, written as HTML text (`ui::markup`), which costs far less code than yew
/// elements; the chart and the survey's drawing are the screen's own.
#[function_component(PrintSheet)]
pub fn print_sheet(props: &PrintProps) -> Html {
    let plan = &props.state.plan;
    let s = &plan.scenario;
    let r = &plan.report;
    let units = s.units;
    // The local date: the UTC date of `now_iso` is a day off for much of the day away from UTC.
    let date = browser::local_date();
    let reach = match (notes::need_text(&s.need(), units), r.reach) {
        (Some(need_text), Some(reach)) => notes::reach(&reach, plan.sweep.axis, &need_text, units),
        _ => match props.state.error("need") {
            Some(message) => format!("The required resolution was rejected: {message}"),
            None => "No required resolution was set.".to_string(),
        },
    };
    let (resolution, classes) = resolution_rows(plan);
    let boundary = use_boundary(plan);
    let mut m = Markup::default();
    m.tag(r#"<section class="print-sheet" aria-hidden="true">"#);
    head(&mut m, &s.name, &date, props.qr.as_ref().as_ref());
    m.tag(r#"<div class="print-grid"><div><h2>Inputs</h2>"#);
    rows_table(&mut m, &input_rows(plan), &[]);
    m.tag("<h2>Resolution</h2>");
    rows_table(&mut m, &resolution, &classes);
    m.tag("</div><div>");
    chart_markup(&mut m, &props.chart, "The four limits");
    m.tag("</div></div><p>")
        .text(&format!(
            "{} governs at {}. {}",
            notes::limit_title(r.governing),
            format::length(r.limit_m, units),
            r.advice
        ))
        .tag("</p><p>")
        .text(&reach)
        .tag(r#"</p><div class="print-grid"><div><h2>Survey</h2>"#);
    rows_table(&mut m, &survey_rows(plan), &[]);
    m.tag(r#"</div><div class="print-diagram">"#);
    // Over a real boundary, its drawing and figures; otherwise the rectangle's diagram.
    match &boundary {
        Some(b) => {
            m.tag(b);
        }
        None => {
            if let Some(l) = &plan.layout {
                diagram_markup(&mut m, l, units, "print");
            }
        }
    }
    m.tag("</div></div><h2>Cautions</h2><ul class=\"print-cautions\">");
    for c in &r.cautions {
        m.tag("<li>").text(&c.text).tag("</li>");
    }
    for n in &r.light_notes {
        m.tag("<li>").text(&n.text).tag("</li>");
    }
    // What the survey warns of, in short (the screen says why at length): a speed too fast for
    // the blur or the camera, overlap lost over the relief.
    let flags = &r.survey_words.speed_flags;
    if let Some(slowest) = flags.iter().map(|f| f.limit_mps).reduce(f64::min) {
        let codes: Vec<&str> = flags.iter().map(|f| f.code).collect();
        m.tag("<li>")
            .text(&format!(
                "Too fast ({}): fly at {} or less.",
                codes.join(", "),
                format::speed(slowest, units)
            ))
            .tag("</li>");
    }
    let survey = &r.survey;
    let warned = survey.relief.as_ref().is_some_and(|p| !p.notes.is_empty());
    if let (true, Some(front), Some(side), Some(height)) = (
        warned,
        survey.front_min_pct,
        survey.side_min_pct,
        survey.relief_height_m,
    ) {
        m.tag("<li>")
            .text(&format!(
                "Over the highest ground the overlaps fall to {} % front, {} % side: fly at {} above take-off to keep those planned.",
                format::significant(front),
                format::significant(side),
                format::length(height, units)
            ))
            .tag("</li>");
    }
    m.tag("</ul>").tag(SIGN_OFF).tag("</section>");
    m.html()
}
