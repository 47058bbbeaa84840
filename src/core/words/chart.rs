//! Geometry of the chart of the four limits against height (or ground distance), computed in plain
//! Rust so it is tested natively; the UI only turns it into SVG elements.

use crate::core::physics::engine::{evaluate, Evaluation, Limit};
use crate::core::physics::target::Task;
use crate::core::planning::cautions::COMMON_HEIGHT_CAP_M;
use crate::core::planning::solve::{Axis, Sweep};
use crate::core::words::format::significant;
use crate::core::words::notes::{axis_noun, task_verb};
use crate::core::words::units::Units;
use crate::core::words::units::{METRES_PER_FOOT, METRES_PER_INCH};
use std::fmt::Write;

/// Size of the chart's view box and the margins around the plot area, in SVG user units.
pub const WIDTH: f64 = 640.0;
pub const HEIGHT: f64 = 360.0;
const LEFT: f64 = 64.0;
const RIGHT: f64 = 16.0;
const TOP: f64 = 16.0;
const BOTTOM: f64 = 48.0;
const SAMPLES: usize = 121;

/// One curve of the chart.
#[derive(Clone, Debug, PartialEq)]
pub struct Series {
    pub limit: Limit,
    /// SVG path data in view-box units.
    pub path: String,
    /// Where the curve's label sits (right end of the curve).
    pub label_x: f64,
    pub label_y: f64,
}

/// A tick on an axis: its position in view-box units and its label.
#[derive(Clone, Debug, PartialEq)]
pub struct Tick {
    pub at: f64,
    pub label: String,
}

/// A vertical marker (current position, height cap, crossovers) or horizontal one (the need).
#[derive(Clone, Debug, PartialEq)]
pub struct Marker {
    pub kind: &'static str,
    pub at: f64,
    pub label: String,
}

/// Everything the UI needs to draw the chart.
#[derive(Clone, Debug, PartialEq)]
pub struct Chart {
    pub plot_left: f64,
    pub plot_right: f64,
    pub plot_top: f64,
    pub plot_bottom: f64,
    pub x_title: String,
    pub y_title: String,
    pub series: Vec<Series>,
    pub envelope: String,
    /// The detail resolved through the whole chain (the GRD, coarser direction).
    pub grd: String,
    /// Where the GRD line's label sits, at its right end.
    pub grd_label_y: f64,
    pub x_ticks: Vec<Tick>,
    pub y_ticks: Vec<Tick>,
    /// Vertical markers along the x axis.
    pub x_markers: Vec<Marker>,
    /// Horizontal markers along the y axis.
    pub y_markers: Vec<Marker>,
    /// The largest x shown, in metres.
    pub x_max_m: f64,
    /// The evaluations the curves are drawn from, one per sample, kept for the next chart.
    samples: Vec<Evaluation>,
    /// The top of the y axis, in metres: with the same samples and the same top, the curves are
    /// the same and the next chart reuses their paths.
    y_max_m: f64,
}

/// A "nice" step (1, 2 or 5 × 10ⁿ) that splits `span` into about `count` parts.
fn nice_step(span: f64, count: f64) -> f64 {
    if !(span > 0.0 && span.is_finite() && count > 0.0) {
        return 1.0;
    }
    let raw = span / count;
    let power = 10f64.powf(raw.log10().floor());
    let fraction = raw / power;
    let nice = if fraction <= 1.0 {
        1.0
    } else if fraction <= 2.0 {
        2.0
    } else if fraction <= 5.0 {
        5.0
    } else {
        10.0
    };
    nice * power
}

/// A display unit for an axis: its name and how many metres one of it is.
fn axis_unit(max_m: f64, units: Units) -> (&'static str, f64) {
    match units {
        Units::Metric if max_m < 0.02 => ("mm", 0.001),
        Units::Metric if max_m < 2.0 => ("cm", 0.01),
        Units::Metric if max_m < 5000.0 => ("m", 1.0),
        Units::Metric => ("km", 1000.0),
        Units::Imperial if max_m < 3.0 * METRES_PER_FOOT => ("in", METRES_PER_INCH),
        Units::Imperial if max_m < 16_000.0 => ("ft", METRES_PER_FOOT),
        Units::Imperial => ("mi", 1609.344),
    }
}

/// Ticks every `step_m` from 0 to `max_m`, labelled in the display unit of `per` metres and mapped
/// by `to_px`; at most 20.
fn ticks(max_m: f64, step_m: f64, per: f64, to_px: impl Fn(f64) -> f64) -> Vec<Tick> {
    (0..20)
        .map(|i| f64::from(i) * step_m)
        .take_while(|v| *v <= max_m * (1.0 + 1e-9))
        .map(|v| Tick {
            at: to_px(v),
            label: significant(v / per),
        })
        .collect()
}

/// The largest x the chart shows: enough to see the current position, the reach and, for a
/// drone, the common 120 m height cap, rounded up to a nice number.
fn x_extent(axis: Axis, current: f64, reach: Option<f64>) -> f64 {
    let mut wanted = (current * 2.0).max(reach.unwrap_or(0.0) * 1.25);
    if axis == Axis::Height {
        wanted = wanted.max(COMMON_HEIGHT_CAP_M * 1.25);
    }
    let (lo, hi) = axis.domain();
    let wanted = wanted.clamp(lo * 10.0, hi);
    let step = nice_step(wanted, 5.0);
    ((wanted / step).ceil() * step).min(hi)
}

/// The vertical markers: where the plan is now, the common height cap, the crossovers and the
/// greatest reach, each within the plotted range.
fn x_markers(
    sweep: &Sweep,
    x_max: f64,
    crossings: &[f64],
    reach_m: Option<f64>,
    units: Units,
    to_x: impl Fn(f64) -> f64,
) -> Vec<Marker> {
    let mut markers = vec![Marker {
        kind: "current",
        at: to_x(sweep.current()),
        label: "now".to_string(),
    }];
    if sweep.axis == Axis::Height && COMMON_HEIGHT_CAP_M <= x_max {
        markers.push(Marker {
            kind: "cap",
            at: to_x(COMMON_HEIGHT_CAP_M),
            label: match units {
                Units::Metric => "120 m".to_string(),
                Units::Imperial => "400 ft".to_string(),
            },
        });
    }
    for &c in crossings.iter().filter(|&&c| c > 0.0 && c <= x_max) {
        markers.push(Marker {
            kind: "crossover",
            at: to_x(c),
            label: "crossover".to_string(),
        });
    }
    if let Some(r) = reach_m.filter(|&r| r <= x_max) {
        markers.push(Marker {
            kind: "reach",
            at: to_x(r),
            label: "greatest".to_string(),
        });
    }
    // Along the ground the target sinks below the horizon at a fixed distance for these heights.
    let g = sweep.base().geometry;
    let horizon = g
        .earth()
        .and_then(|earth| earth.max_visible_ground_m(g.height_m, g.target_height_m));
    if let Some(h) = horizon.filter(|&h| sweep.axis == Axis::GroundDistance && h <= x_max) {
        markers.push(Marker {
            kind: "horizon",
            at: to_x(h),
            label: "horizon".to_string(),
        });
    }
    markers
}

/// What the chart marks along its axis besides the current position and the height cap.
pub struct Marks<'a> {
    /// The required resolution, in the plane normal to the view.
    pub need_m: Option<f64>,
    /// The greatest reach for the need; it also helps choose the x range.
    pub reach_m: Option<f64>,
    /// Where the governing limit changes (m).
    pub crossings: &'a [f64],
    /// Each task's greatest height or range at 50 % (m).
    pub tasks: &'a [(Task, f64)],
}

/// Builds the chart for a sweep with its marks.
pub fn build(sweep: &Sweep, marks: &Marks, units: Units) -> Chart {
    build_after(sweep, marks, units, None)
}

/// [`build`], reusing the samples of `previous` (a chart and the sweep it was drawn for) when the
/// new sweep has the same table and the axis spans as far: then only the marks move. The result
/// equals [`build`]'s.
pub fn build_after(sweep: &Sweep, marks: &Marks, units: Units, previous: Option<(&Sweep, &Chart)>) -> Chart {
    let (need_m, reach_m, crossings) = (marks.need_m, marks.reach_m, marks.crossings);
    let axis = sweep.axis;
    let x_max = x_extent(axis, sweep.current(), reach_m);
    let xs: Vec<f64> = (1..=SAMPLES).map(|i| x_max * i as f64 / SAMPLES as f64).collect();
    let kept = previous.filter(|(old_sweep, old_chart)| {
        old_chart.x_max_m.to_bits() == x_max.to_bits() && old_sweep.keeps_table_for(&sweep.base(), axis)
    });
    let evaluations: Vec<Evaluation> = match kept {
        Some((_, old_chart)) => old_chart.samples.clone(),
        None => xs.iter().map(|&x| evaluate(&sweep.setup_at(x))).collect(),
    };

    let envelope_max = evaluations
        .iter()
        .map(|e| e.limit_m.max(e.resolved_m))
        .fold(0.0, f64::max);
    let y_wanted = envelope_max.max(need_m.unwrap_or(0.0) * 1.2).max(1e-6);
    let (y_unit, y_per) = axis_unit(y_wanted, units);
    let y_step = nice_step(y_wanted / y_per, 5.0) * y_per;
    let y_max = (y_wanted / y_step).ceil() * y_step;

    let plot_right = WIDTH - RIGHT;
    let plot_bottom = HEIGHT - BOTTOM;
    let to_x = |m: f64| LEFT + (plot_right - LEFT) * (m / x_max).clamp(0.0, 1.0);
    let to_y = |m: f64| plot_bottom - (plot_bottom - TOP) * (m / y_max).clamp(0.0, 1.05);

    let path = |values: &mut dyn Iterator<Item = f64>| -> String {
        let mut d = String::with_capacity(SAMPLES * 14);
        for (i, (x, y)) in xs.iter().zip(values).enumerate() {
            d.push(if i == 0 { 'M' } else { 'L' });
            push_tenths(&mut d, to_x(*x));
            d.push(' ');
            push_tenths(&mut d, to_y(y));
        }
        d
    };

    // The same samples on the same axes draw the same curves: keep their paths (a keystroke
    // along the axis moves only the marks).
    let same_curves = kept
        .map(|(_, old_chart)| old_chart)
        .filter(|old_chart| old_chart.y_max_m.to_bits() == y_max.to_bits());
    let (series, envelope, grd) = match same_curves {
        Some(old_chart) => (
            old_chart.series.clone(),
            old_chart.envelope.clone(),
            old_chart.grd.clone(),
        ),
        None => (
            Limit::ALL
                .iter()
                .filter(|&&limit| evaluations.iter().any(|e| e.limits.get(limit) > 0.0))
                .map(|&limit| {
                    let last = evaluations.last().map(|e| e.limits.get(limit)).unwrap_or(0.0);
                    Series {
                        limit,
                        path: path(&mut evaluations.iter().map(|e| e.limits.get(limit))),
                        label_x: plot_right - 4.0,
                        label_y: to_y(last) - 4.0,
                    }
                })
                .collect(),
            path(&mut evaluations.iter().map(|e| e.limit_m)),
            path(&mut evaluations.iter().map(|e| e.resolved_m)),
        ),
    };

    let (x_unit, x_per) = axis_unit(x_max, units);
    let x_ticks = ticks(x_max, nice_step(x_max / x_per, 5.0) * x_per, x_per, to_x);
    let y_ticks = ticks(y_max, y_step, y_per, to_y);

    let mut x_markers = x_markers(sweep, x_max, crossings, reach_m, units, to_x);
    for &(task, at) in marks.tasks.iter().filter(|(_, at)| *at > 0.0 && *at <= x_max) {
        x_markers.push(Marker {
            kind: "task",
            at: to_x(at),
            label: format!("{} 50 %", task_verb(task)),
        });
    }
    let y_markers = need_m
        .map(|n| {
            vec![Marker {
                kind: "need",
                at: to_y(n),
                label: "need".to_string(),
            }]
        })
        .unwrap_or_default();

    Chart {
        plot_left: LEFT,
        plot_right,
        plot_top: TOP,
        plot_bottom,
        x_title: format!("{} ({x_unit})", capitalise(axis_noun(axis))),
        y_title: format!("Smallest detail ({y_unit})"),
        series,
        envelope,
        grd,
        grd_label_y: to_y(evaluations.last().map_or(0.0, |e| e.resolved_m)) + 12.0,
        x_ticks,
        y_ticks,
        x_markers,
        y_markers,
        x_max_m: x_max,
        samples: evaluations,
        y_max_m: y_max,
    }
}

/// Appends `v` with one decimal (view-box units are finite and small): the chart's paths hold
/// hundreds of numbers, and this is several times quicker than `format!("{:.1}")`. Halves round
/// away from zero.
fn push_tenths(d: &mut String, v: f64) {
    let tenths = (v * 10.0).round();
    let tenths = if tenths.is_finite() {
        tenths.clamp(-1e12, 1e12) as i64
    } else {
        0
    };
    if tenths < 0 {
        d.push('-');
    }
    // Whole numbers are written by the standard library's integer formatting, which is quick; it
    // is the float formatting that is slow.
    let magnitude = tenths.unsigned_abs();
    let _ = write!(d, "{}.{}", magnitude / 10, magnitude % 10);
}

fn capitalise(text: &str) -> String {
    let mut chars = text.chars();
    match chars.next() {
        Some(c) => std::iter::once(c.to_ascii_uppercase()).chain(chars).collect(),
        None => String::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::push_tenths;

    /// The quick path numbers read as the standard library's `{:.1}` does, away from exact halves
    /// (where `{:.1}` rounds to even on the binary value and this rounds away from zero).
    #[test]
    fn tenths_match_the_standard_formatting() {
        let mut values = vec![
            0.0,
            0.04,
            0.06,
            1.0,
            9.96,
            10.0,
            63.99,
            624.0,
            359.94,
            -0.3,
            -12.34,
            1e9 + 0.2,
        ];
        values.extend((0..20_000).map(|i| f64::from(i) * 0.0317 - 3.0));
        for v in values {
            if ((v * 10.0).fract().abs() - 0.5).abs() < 1e-6 {
                continue;
            }
            let mut quick = String::new();
            push_tenths(&mut quick, v);
            let standard = format!("{v:.1}");
            let standard = if standard == "-0.0" {
                "0.0".to_string()
            } else {
                standard
            };
            assert_eq!(quick, standard, "{v}");
        }
        let mut odd = String::new();
        push_tenths(&mut odd, f64::NAN);
        assert_eq!(odd, "0.0");
    }
}
