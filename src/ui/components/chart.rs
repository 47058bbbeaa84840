//! The chart of the four limits, the governing envelope and the GRD against height or ground
//! distance, with the task ranges marked.

use crate::core::physics::engine::Limit;
use crate::core::words::chart::{Chart, HEIGHT, WIDTH};
use crate::core::words::notes;
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

/// The chart as an SVG element, used on screen and on the printed plan.
pub fn chart_svg(c: &Chart, title: &str) -> Html {
    let vb = format!("0 0 {WIDTH} {HEIGHT}");
    html! {
            <svg class="chart" viewBox={vb} role="img" aria-label={format!("{title}; the thick line is the governing envelope")} data-x-max={c.x_max_m.to_string()}>
                <rect class="plot-bg" x={c.plot_left.to_string()} y={c.plot_top.to_string()} width={(c.plot_right - c.plot_left).to_string()} height={(c.plot_bottom - c.plot_top).to_string()} />
                { for c.y_ticks.iter().map(|t| html! {
                    <g class="tick">
                        <line x1={c.plot_left.to_string()} x2={c.plot_right.to_string()} y1={t.at.to_string()} y2={t.at.to_string()} />
                        <text x={(c.plot_left - 6.0).to_string()} y={(t.at + 4.0).to_string()} text-anchor="end">{ t.label.clone() }</text>
                    </g>
                }) }
                { for c.x_ticks.iter().map(|t| html! {
                    <g class="tick">
                        <line x1={t.at.to_string()} x2={t.at.to_string()} y1={c.plot_top.to_string()} y2={c.plot_bottom.to_string()} />
                        <text x={t.at.to_string()} y={(c.plot_bottom + 16.0).to_string()} text-anchor="middle">{ t.label.clone() }</text>
                    </g>
                }) }
                <text class="axis-title" x={((c.plot_left + c.plot_right) / 2.0).to_string()} y={(HEIGHT - 8.0).to_string()} text-anchor="middle">{ c.x_title.clone() }</text>
                <text class="axis-title" transform={format!("translate(14 {}) rotate(-90)", (c.plot_top + c.plot_bottom) / 2.0)} text-anchor="middle">{ c.y_title.clone() }</text>
                <path class="envelope" d={c.envelope.clone()} />
                <g class="series grd">
                    <path d={c.grd.clone()} stroke-dasharray="1 3" />
                    <text x={(c.plot_right - 4.0).to_string()} y={c.grd_label_y.to_string()} text-anchor="end">{ "GRD" }</text>
                </g>
                { for c.series.iter().map(|s| html! {
                    <g class={classes!("series", s.limit.key())}>
                        <path d={s.path.clone()} stroke-dasharray={dash(s.limit)} />
                        <text x={s.label_x.to_string()} y={s.label_y.to_string()} text-anchor="end">{ s.limit.key() }</text>
                    </g>
                }) }
                { for c.x_markers.iter().map(|m| html! {
                    <g class={classes!("marker", m.kind)} data-marker={m.kind}>
                        <line x1={m.at.to_string()} x2={m.at.to_string()} y1={c.plot_top.to_string()} y2={c.plot_bottom.to_string()} />
                        // Task marks are labelled at the foot, clear of the other marks' labels at the top.
                        <text x={(m.at + 3.0).to_string()} y={(if m.kind == "task" { c.plot_bottom - 6.0 } else { c.plot_top + 12.0 }).to_string()}>{ m.label.clone() }</text>
                    </g>
                }) }
                { for c.y_markers.iter().map(|m| html! {
                    <g class={classes!("marker", m.kind)} data-marker={m.kind}>
                        <line x1={c.plot_left.to_string()} x2={c.plot_right.to_string()} y1={m.at.to_string()} y2={m.at.to_string()} />
                        <text x={(c.plot_left + 4.0).to_string()} y={(m.at - 4.0).to_string()}>{ m.label.clone() }</text>
                    </g>
                }) }
            </svg>
    }
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
