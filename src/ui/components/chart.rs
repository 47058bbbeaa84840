//! The chart of the four limits, the governing envelope and the GRD against height or ground
//! distance, with the task ranges marked.

use crate::core::physics::engine::Limit;
use crate::core::words::chart::{Chart, HEIGHT, WIDTH};
use crate::core::words::notes;
use crate::ui::markup::{esc, Markup};
use crate::ui::state::State;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the chart.
#[derive(Properties, PartialEq, Clone)]
pub struct ChartProps {
    pub state: Rc<State>,
    /// The chart's geometry, computed once per scenario by the app.
    pub chart: Rc<Chart>,
}

/// Line style per limit: told apart by dash pattern and label, not by colour alone.
fn dash(limit: Limit) -> &'static str {
    match limit {
        Limit::Sampling => "none",
        Limit::Diffraction => "8 4",
        Limit::Turbulence => "2 4",
        Limit::Motion => "12 4 2 4",
    }
}

/// The chart as an SVG element, used on screen and on the printed plan; written as text (see
/// `ui::markup`).
pub fn chart_svg(c: &Chart, title: &str) -> Html {
    let mut m = Markup::default();
    chart_markup(&mut m, c, title);
    m.html()
}

/// The chart's SVG written into `m`.
pub fn chart_markup(m: &mut Markup, c: &Chart, title: &str) {
    let (left, right, top, bottom) = (c.plot_left, c.plot_right, c.plot_top, c.plot_bottom);
    m.tag(&format!(r#"<svg class="chart" viewBox="0 0 {WIDTH} {HEIGHT}" role="img" aria-label=""#))
        .text(title)
        .tag(&format!(
            r#"; the thick line is the governing envelope" data-x-max="{}"><rect class="plot-bg" x="{left}" y="{top}" width="{}" height="{}" />"#,
            c.x_max_m,
            right - left,
            bottom - top
        ));
    for t in &c.y_ticks {
        m.tag(&format!(
            r#"<g class="tick"><line x1="{left}" x2="{right}" y1="{0}" y2="{0}" /><text x="{1}" y="{2}" text-anchor="end">"#,
            t.at,
            left - 6.0,
            t.at + 4.0
        ))
        .text(&t.label)
        .tag("</text></g>");
    }
    for t in &c.x_ticks {
        m.tag(&format!(
            r#"<g class="tick"><line x1="{0}" x2="{0}" y1="{top}" y2="{bottom}" /><text x="{0}" y="{1}" text-anchor="middle">"#,
            t.at,
            bottom + 16.0
        ))
        .text(&t.label)
        .tag("</text></g>");
    }
    m.tag(&format!(
        r#"<text class="axis-title" x="{}" y="{}" text-anchor="middle">"#,
        (left + right) / 2.0,
        HEIGHT - 8.0
    ))
    .text(&c.x_title)
    .tag(&format!(
        r#"</text><text class="axis-title" transform="translate(14 {}) rotate(-90)" text-anchor="middle">"#,
        (top + bottom) / 2.0
    ))
    .text(&c.y_title)
    .tag("</text>")
    .tag(&format!(
        r#"<path class="envelope" d="{}" /><g class="series grd"><path d="{}" stroke-dasharray="1 3" /><text x="{}" y="{}" text-anchor="end">GRD</text></g>"#,
        esc(&c.envelope),
        esc(&c.grd),
        right - 4.0,
        c.grd_label_y
    ));
    for s in &c.series {
        m.tag(&format!(
            r#"<g class="series {0}"><path d="{1}" stroke-dasharray="{2}" /><text x="{3}" y="{4}" text-anchor="end">{0}</text></g>"#,
            s.limit.key(),
            esc(&s.path),
            dash(s.limit),
            s.label_x,
            s.label_y
        ));
    }
    for k in &c.x_markers {
        // Task marks are labelled at the foot, clear of the other marks' labels at the top.
        let y = if k.kind == "task" { bottom - 6.0 } else { top + 12.0 };
        m.tag(&format!(
            r#"<g class="marker {0}" data-marker="{0}"><line x1="{1}" x2="{1}" y1="{top}" y2="{bottom}" /><text x="{2}" y="{y}">"#,
            k.kind,
            k.at,
            k.at + 3.0
        ))
        .text(&k.label)
        .tag("</text></g>");
    }
    for k in &c.y_markers {
        m.tag(&format!(
            r#"<g class="marker {0}" data-marker="{0}"><line x1="{left}" x2="{right}" y1="{1}" y2="{1}" /><text x="{2}" y="{3}">"#,
            k.kind,
            k.at,
            left + 4.0,
            k.at - 4.0
        ))
        .text(&k.label)
        .tag("</text></g>");
    }
    m.tag("</svg>");
}

/// The chart panel.
#[function_component(LimitsChart)]
pub fn limits_chart(props: &ChartProps) -> Html {
    let plan = &props.state.plan;
    let c = &props.chart;
    let title = format!("The four limits against {}", notes::axis_noun(plan.sweep.axis));
    html! {
        <section class="panel" id="chart" aria-labelledby="chart-title">
            <h2 id="chart-title">{ title.clone() }</h2>
            { chart_svg(c, &title) }
            <p class="legend">
                { "Solid: sampling · long dashes: diffraction · dots: turbulence · dash-dot: motion · thick line: the governing envelope · fine dots: the detail resolved with all the blurs together (GRD, coarser direction). Vertical lines: the current " }
                { notes::axis_noun(plan.sweep.axis) }{ ", the 120 m (400 ft) height many rules cap drones at, where the governing limit changes, and the greatest " }{ notes::axis_noun(plan.sweep.axis) }{ " meeting the need and each task at a 50 % chance; along the ground, dash-dot: the horizon." }
            </p>
        </section>
    }
}
