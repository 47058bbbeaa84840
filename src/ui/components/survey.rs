//! The survey panel: footprint, overlaps, lines, photos, speed limits, flight time, the layout
//! diagram and the GeoJSON export.

use crate::core::contract::scenario::Scenario;
use crate::core::planning::survey::Layout;
use crate::core::words::format;
use crate::ui::browser;
use crate::ui::export;
use crate::ui::field;
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

/// The layout drawn to scale: area, margin, flight lines with direction and order, first
/// footprints; written as text (see `ui::markup`).
pub fn diagram(layout: &Layout, units: crate::core::words::units::Units, id: &str) -> Html {
    let mut m = Markup::default();
    diagram_markup(&mut m, layout, units, id);
    m.html()
}

/// The layout's drawing written into `m`.
pub fn diagram_markup(m: &mut Markup, layout: &Layout, units: crate::core::words::units::Units, id: &str) {
    let b = layout.bounds;
    let size = b.width.max(b.height).max(1.0);
    let pad = 0.04 * size;
    let stroke = 0.004 * size;
    let font = 0.035 * size;
    let a = layout.area;
    let g = layout.margin;
    let rect = |class: &str, r: &crate::core::planning::survey::Rect, more: &str| {
        format!(
            r#"<rect class="{class}" x="{}" y="{}" width="{}" height="{}"{more} />"#,
            r.x, r.y, r.width, r.height
        )
    };
    let thin = format!(r#" stroke-width="{stroke}""#);
    m.tag(r#"<figure class="layout-figure">"#).tag(&format!(
        r#"<svg class="survey-map" viewBox="{} {} {} {}" role="img" preserveAspectRatio="xMidYMid meet" aria-label=""#,
        b.x - pad,
        b.y - pad,
        b.width + 2.0 * pad,
        b.height + 2.0 * pad
    ))
    .text(&format!(
        "Survey layout to scale: {} flight lines over an area {} by {}",
        layout.lines_total,
        format::length(a.width, units),
        format::length(a.height, units)
    ))
    .tag(&format!(
        r#""><defs><marker id="{id}-arrow" viewBox="0 0 10 10" refX="8" refY="5" markerWidth="5" markerHeight="5" orient="auto-start-reverse"><path d="M0 0 L10 5 L0 10 z" class="arrow-head" /></marker></defs>"#
    ))
    .tag(&rect(
        "margin",
        &g,
        &format!(r#"{thin} stroke-dasharray="{} {}""#, stroke * 5.0, stroke * 4.0),
    ))
    .tag(&rect("area", &a, &format!(r#" stroke-width="{}""#, stroke * 1.5)));
    for f in &layout.footprints {
        m.tag(&rect(&format!("footprint line-{}", f.line), &f.rect, &thin));
    }
    for l in &layout.lines {
        m.tag(&format!(
            r#"<g class="flight-line" data-line="{}"><line x1="{}" y1="{}" x2="{}" y2="{}" stroke-width="{stroke}" marker-end="url(#{id}-arrow)" /></g>"#,
            l.number, l.start.x, l.start.y, l.end.x, l.end.y
        ));
    }
    for w in layout.lines.windows(2) {
        m.tag(&format!(
            r#"<line class="turn" x1="{}" y1="{}" x2="{}" y2="{}" stroke-width="{stroke}" />"#,
            w[0].end.x, w[0].end.y, w[1].start.x, w[1].start.y
        ));
    }
    if let Some(f) = layout.lines.first() {
        m.tag(&format!(
            r#"<circle class="start" cx="{}" cy="{}" r="{}" /><text class="label" x="{}" y="{}" font-size="{font}">start, line 1</text>"#,
            f.start.x,
            f.start.y,
            stroke * 4.0,
            f.start.x + stroke * 6.0,
            f.start.y - stroke * 3.0
        ));
    }
    if let Some(l) = layout.lines.last() {
        m.tag(&format!(
            r#"<rect class="end" x="{}" y="{}" width="{2}" height="{2}" /><text class="label" x="{3}" y="{4}" font-size="{font}" text-anchor="end">end, line {5}</text>"#,
            l.end.x - stroke * 4.0,
            l.end.y - stroke * 4.0,
            stroke * 8.0,
            l.end.x - stroke * 6.0,
            l.end.y + font,
            l.number
        ));
    }
    m.tag("</svg><figcaption>").text(
        "To scale. Circle: start; square: end of the last line drawn; arrows: flying direction; shaded: the first photos and their overlaps; dashed: the margin full overlap needs, which each line's extra photos reach.",
    );
    if layout.lines_omitted > 0 {
        m.text(&format!(" {} more lines are not drawn.", layout.lines_omitted));
    }
    m.tag("</figcaption></figure>");
}

/// The figures and drawing of the survey over the boundary (`field`) as markup, laid out by the
/// boundary module for this plan; a note while it works; `None` without a boundary. Shared by the
/// survey panel and the printed sheet.
#[hook]
pub fn use_boundary(plan: &crate::core::contract::plan::Plan) -> Option<String> {
    let scenario = &plan.scenario;
    let drawn = use_state(|| None::<(String, Result<String, String>)>);
    let asked = if scenario.field.trim().is_empty() {
        String::new()
    } else {
        scenario.to_query()
    };
    {
        let drawn = drawn.clone();
        let layout = scenario.field_layout(&plan.report.survey);
        let (field, units) = (scenario.field.clone(), scenario.units);
        use_effect_with(asked.clone(), move |asked| {
            if !field.trim().is_empty() {
                let asked = asked.clone();
                field::plan(&field, &layout, units, move |result| drawn.set(Some((asked, result))));
            }
        });
    }
    match (&*drawn, asked.is_empty()) {
        (_, true) => None,
        (Some((key, Ok(markup))), _) if *key == asked => Some(markup.clone()),
        (Some((key, Err(problem))), _) if *key == asked => Some(format!(
            r#"<p class="error" role="alert" data-key="field_problem">{}</p>"#,
            crate::ui::markup::esc(problem)
        )),
        _ => Some(r#"<p class="note" data-field="pending">Laying out the lines over the boundary…</p>"#.to_string()),
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
    let problem = match (&ready, &*answer) {
        (Err(problem), _) => Some(problem.message().to_string()),
        (Ok(()), Some((asked, problem))) if asked == scenario => Some(problem.clone()),
        _ => None,
    };
    let boundary = use_boundary(plan);
    // The downloads: the rectangle's GeoJSON (the export module) and the boundary plan's GeoJSON,
    // KML and CSV (the boundary module, which draws their buttons); every button carries what it
    // downloads in `data-export`, and one listener on the panel hears them all.
    let on_click = {
        // The scenario as drawn; its link is written only when a download is asked for.
        let (answer, asked, gsd_m) = (answer.clone(), scenario.clone(), plan.evaluation.gsd_m);
        let layout = scenario.field_layout(s);
        Callback::from(move |e: MouseEvent| {
            let format = e
                .target_dyn_into::<web_sys::Element>()
                .and_then(|t| t.get_attribute("data-export"))
                .unwrap_or_default();
            let (extension, mime) = match format.as_str() {
                "area" | "geojson" => ("geojson", "application/geo+json"),
                "kml" => ("kml", "application/vnd.google-earth.kml+xml"),
                "csv" => ("csv", "text/csv"),
                _ => return,
            };
            let file = browser::file_name(&asked.name, extension);
            let (answer, scenario) = (answer.clone(), asked.clone());
            let done = move |result: Result<String, String>| match result {
                Ok(text) => {
                    browser::download(&file, mime, &text);
                    answer.set(None);
                }
                Err(problem) => answer.set(Some((scenario, problem))),
            };
            if format == "area" {
                // Built by the on-demand module, which loads the first time this is pressed.
                export::geojson(&asked.to_query(), done);
            } else {
                field::export(&asked.field, &layout, &format, &asked.name, asked.height_m, gsd_m, done);
            }
        })
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
    row(&mut m, "Extra photos beyond each end", |m| {
        count(m, "extra_photos_per_end", s.extra_photos_per_end);
        m.text(" (full overlap at the edges needs ")
            .figure("margin_along_m", s.margin_along_m, &len(s.margin_along_m))
            .text(" beyond the ends, ")
            .figure("margin_across_m", s.margin_across_m, &len(s.margin_across_m))
            .text(" beyond the sides)");
    });
    if let (Some(out), Some(back), Some(crab)) = (s.ground_speed_out_mps, s.ground_speed_back_mps, s.crab_deg) {
        row(&mut m, "Ground speed out / back in the wind", |m| {
            m.figure("ground_speed_out_mps", out, &spd(out))
                .text(" / ")
                .figure("ground_speed_back_mps", back, &spd(back))
                .text(", crab ")
                .figure("crab_deg", crab, &format!("{}°", format::significant(crab)));
        });
    }
    if let (Some(fine), Some(coarse), Some(front), Some(side)) =
        (s.gsd_min_m, s.gsd_max_m, s.front_min_pct, s.side_min_pct)
    {
        row(&mut m, "GSD over the relief", |m| {
            m.figure("gsd_min_m", fine, &len(fine))
                .text(" to ")
                .figure("gsd_max_m", coarse, &len(coarse));
        });
        row(&mut m, "Least overlap, front / side", |m| {
            let pct = |v: f64| format!("{} %", format::significant(v));
            m.figure("front_min_pct", front, &pct(front))
                .text(" / ")
                .figure("side_min_pct", side, &pct(side));
        });
    }
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
        <section class="panel" id="survey" aria-labelledby="survey-title" onclick={on_click}>
            <h2 id="survey-title">{ "Survey layout" }</h2>
            if let Some(b) = boundary {
                <div class="boundary">
                    <h3>{ "Over the boundary" }</h3>
                    { Html::from_html_unchecked(AttrValue::from(b)) }
                </div>
                <h3>{ "The rectangle (quick estimate)" }</h3>
            }
            { m.html() }
            if let Some(l) = &plan.layout { { diagram(l, units, "screen") } }
            <p class="export">
                <button type="button" data-export="area" disabled={ready.is_err()}>{ "Download flight lines (GeoJSON)" }</button>
                if let Some(problem) = problem { <span class="note">{ format!(" {problem}") }</span> }
            </p>
        </section>
    }
}
