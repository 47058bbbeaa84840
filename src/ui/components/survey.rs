//! The survey panel: footprint, overlaps, lines, photos, speed limits, flight time, the layout
//! diagram and the GeoJSON export.

use crate::core::contract::scenario::Scenario;
use crate::core::planning::survey::Layout;
use crate::core::words::format;
use crate::ui::browser;
use crate::ui::export;
use crate::ui::markup::Markup;
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the survey panel.
#[derive(Properties, PartialEq, Clone)]
pub struct SurveyProps {
    pub state: Rc<State>,
}

/// A figure that may be missing, tagged with its report field; missing, a dash.
fn maybe(m: &mut Markup, key: &str, v: Option<f64>, text: impl Fn(f64) -> String) {
    match v {
        Some(v) => m.figure(key, v, &text(v)),
        None => m.tag(&format!(
            r#"<span class="value missing" data-key="{key}" data-si="">—</span>"#
        )),
    };
}

/// A count that may be missing, tagged with its report field.
fn count(m: &mut Markup, key: &str, n: Option<u64>) {
    maybe(m, key, n.map(|n| n as f64), |n| format!("{n}"));
}

/// A labelled row of the figure list.
fn row(m: &mut Markup, label: &str, figure: impl FnOnce(&mut Markup)) {
    m.tag("<dt>").text(label).tag("</dt><dd>");
    figure(m);
    m.tag("</dd>");
}

/// The layout drawn to scale: area, flight lines with direction and order, first footprints.
pub fn diagram(layout: &Layout, units: crate::core::words::units::Units, id: &str) -> Html {
    let arrow_id = format!("{id}-arrow");
    let b = layout.bounds;
    let pad = 0.04 * b.width.max(b.height).max(1.0);
    let vb = format!(
        "{} {} {} {}",
        b.x - pad,
        b.y - pad,
        b.width + 2.0 * pad,
        b.height + 2.0 * pad
    );
    let stroke = 0.004 * b.width.max(b.height).max(1.0);
    let font = 0.035 * b.width.max(b.height).max(1.0);
    let a = layout.area;
    let first = layout.lines.first().copied();
    let last = layout.lines.last().copied();
    html! {
        <figure class="layout-figure">
            <svg class="survey-map" viewBox={vb} role="img" preserveAspectRatio="xMidYMid meet"
                aria-label={format!("Survey layout to scale: {} flight lines over an area {} by {}", layout.lines_total, format::length(a.width, units), format::length(a.height, units))}>
                <defs>
                    <marker id={arrow_id.clone()} viewBox="0 0 10 10" refX="8" refY="5" markerWidth="5" markerHeight="5" orient="auto-start-reverse">
                        <path d="M0 0 L10 5 L0 10 z" class="arrow-head" />
                    </marker>
                </defs>
                <rect class="area" x={a.x.to_string()} y={a.y.to_string()} width={a.width.to_string()} height={a.height.to_string()} stroke-width={(stroke * 1.5).to_string()} />
                { for layout.footprints.iter().map(|f| html! {
                    <rect class={classes!("footprint", format!("line-{}", f.line))} x={f.rect.x.to_string()} y={f.rect.y.to_string()}
                        width={f.rect.width.to_string()} height={f.rect.height.to_string()} stroke-width={stroke.to_string()} />
                }) }
                { for layout.lines.iter().map(|l| html! {
                    <g class="flight-line" data-line={l.number.to_string()}>
                        <line x1={l.start.x.to_string()} y1={l.start.y.to_string()} x2={l.end.x.to_string()} y2={l.end.y.to_string()}
                            stroke-width={stroke.to_string()} marker-end={format!("url(#{arrow_id})")} />
                    </g>
                }) }
                { for layout.lines.windows(2).map(|w| html! {
                    <line class="turn" x1={w[0].end.x.to_string()} y1={w[0].end.y.to_string()} x2={w[1].start.x.to_string()} y2={w[1].start.y.to_string()} stroke-width={stroke.to_string()} />
                }) }
                if let Some(f) = first {
                    <circle class="start" cx={f.start.x.to_string()} cy={f.start.y.to_string()} r={(stroke * 4.0).to_string()} />
                    <text class="label" x={(f.start.x + stroke * 6.0).to_string()} y={(f.start.y - stroke * 3.0).to_string()} font-size={font.to_string()}>{ "start, line 1" }</text>
                }
                if let Some(l) = last {
                    <rect class="end" x={(l.end.x - stroke * 4.0).to_string()} y={(l.end.y - stroke * 4.0).to_string()} width={(stroke * 8.0).to_string()} height={(stroke * 8.0).to_string()} />
                    <text class="label" x={(l.end.x - stroke * 6.0).to_string()} y={(l.end.y + font).to_string()} font-size={font.to_string()} text-anchor="end">{ format!("end, line {}", l.number) }</text>
                }
            </svg>
            <figcaption>
                { "To scale. Circle: start; square: end of the last line drawn; arrows: flying direction; shaded boxes: the first photos, showing the front and side overlaps." }
                if layout.lines_omitted > 0 { { format!(" {} more lines are not drawn.", layout.lines_omitted) } }
            </figcaption>
        </figure>
    }
}

/// The survey panel.
#[function_component(SurveyPanel)]
pub fn survey_panel(props: &SurveyProps) -> Html {
    let plan = &props.state.plan;
    let scenario = &plan.scenario;
    let s = &plan.report.survey;
    let units = scenario.units;
    let len = |v: f64| format::length(v, units);
    let spd = |v: f64| format::speed(v, units);
    let ready = plan.export_ready;
    // What the last export said, for the scenario it was asked for (a problem only the export finds).
    let answer = use_state(|| None::<(Scenario, String)>);
    let words = &plan.report.survey_words;
    let on_export = {
        let (answer, scenario) = (answer.clone(), scenario.clone());
        Callback::from(move |_| {
            let (answer, asked) = (answer.clone(), scenario.clone());
            let name = scenario.name.clone();
            // Built by the on-demand module, which loads the first time this is pressed.
            export::geojson(&scenario.to_query(), move |result| match result {
                Ok(json) => {
                    browser::download(&browser::file_name(&name, "geojson"), "application/geo+json", &json);
                    answer.set(None);
                }
                Err(problem) => answer.set(Some((asked, problem))),
            });
        })
    };
    let problem = match (&ready, &*answer) {
        (Err(problem), _) => Some(problem.message().to_string()),
        (Ok(()), Some((asked, problem))) if asked == scenario => Some(problem.clone()),
        _ => None,
    };
    let mut m = Markup::default();
    m.tag(r#"<dl class="figures">"#);
    row(&mut m, "Footprint of one photo", |m| {
        m.figure("footprint_across_m", s.footprint_across_m, &len(s.footprint_across_m))
            .text(" across × ")
            .figure("footprint_along_m", s.footprint_along_m, &len(s.footprint_along_m))
            .text(" along");
    });
    row(&mut m, "Base between photos", |m| {
        m.figure("base_m", s.base_m, &len(s.base_m));
    });
    row(&mut m, "Line spacing", |m| {
        m.figure("line_spacing_m", s.line_spacing_m, &len(s.line_spacing_m));
    });
    row(&mut m, "Trigger interval", |m| {
        maybe(m, "trigger_s", s.trigger_s, format::duration)
    });
    row(&mut m, "Flight lines", |m| count(m, "lines", s.lines));
    row(&mut m, "Photos per line / in total", |m| {
        count(m, "photos_per_line", s.photos_per_line);
        m.text(" / ");
        count(m, "photos", s.photos);
    });
    row(&mut m, "Path length", |m| {
        maybe(m, "path_length_m", s.path_length_m, len)
    });
    row(&mut m, "Flight time with turns", |m| {
        maybe(m, "flight_time_s", s.flight_time_s, format::duration)
    });
    row(&mut m, "Batteries", |m| count(m, "batteries", s.batteries));
    row(&mut m, "Storage", |m| {
        maybe(m, "storage_mb", s.storage_mb, |mb| {
            if mb >= 1000.0 {
                format!("{} GB", format::significant(mb / 1000.0))
            } else {
                format!("{} MB", format::significant(mb))
            }
        })
    });
    row(&mut m, "Fastest speed within the blur budget", |m| {
        maybe(m, "max_speed_blur_mps", s.max_speed_blur_mps, spd)
    });
    row(&mut m, "Fastest speed the photo interval allows", |m| {
        maybe(m, "max_speed_trigger_mps", s.max_speed_trigger_mps, spd)
    });
    m.tag("</dl>");
    if !words.speed_flags.is_empty() {
        m.tag(r#"<ul class="flags">"#);
        for f in &words.speed_flags {
            m.tag(&format!(r#"<li class="flag" data-flag="{}"><strong>"#, f.code))
                .text(&format!("Too fast ({}): ", f.code))
                .tag("</strong>")
                .text(&format!("{} {}", f.reason, f.change))
                .tag("</li>");
        }
        m.tag("</ul>");
    }
    m.tag(&format!(
        r#"<p class="guidance" data-overlap="{}">"#,
        words.overlap_guidance.code
    ))
    .text(&words.overlap_guidance.text)
    .tag("</p>");
    for n in &words.survey_notes {
        m.tag(r#"<p class="note">"#).text(n).tag("</p>");
    }
    html! {
        <section class="panel" id="survey" aria-labelledby="survey-title">
            <h2 id="survey-title">{ "Survey layout" }</h2>
            { m.html() }
            if let Some(l) = &plan.layout { { diagram(l, units, "screen") } }
            <p class="export">
                <button type="button" onclick={on_export} disabled={ready.is_err()}>{ "Download flight lines (GeoJSON)" }</button>
                if let Some(problem) = problem { <span class="note">{ format!(" {problem}") }</span> }
            </p>
        </section>
    }
}
