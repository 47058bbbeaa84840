//! Surveys over a real boundary, off the first load: a web worker (the `sharpfield-field` bin,
//! built by trunk with a loader shim) reads the boundary text (`field`), lays out its lines and
//! photos with the georust crates and draws them, so that geo and geographiclib's polygon area
//! never reach the page's first load. The request carries the boundary text and the survey's
//! figures that the page has already worked out ([`FieldLayout`]); the answer is
//! `[true, html]` (the figures, tagged with their report fields, and the drawing) or
//! `[false, the problem in words]`.

use crate::core::formats::boundary::Boundary;
use crate::core::formats::field_export::{field_csv, field_geojson, field_kml, ExportFacts};
use crate::core::planning::field::{plan_field, suggest_headings, FieldLayout, FieldPlan};
use crate::core::words::format;
use crate::core::words::units::Units;
use crate::ui::markup::Markup;
use crate::ui::worker;
use wasm_bindgen::JsValue;

/// The worker's loader, unhashed so that the page can name it (trunk's `data-loader-shim`).
const LOADER: &str = "./sharpfield-field_loader.js";

/// The most photo centres drawn; the rest are counted.
const MAX_DRAWN_PHOTOS: usize = 3000;

/// The request's numbers, in order: heading, footprint across and along, base, spacing, extras,
/// speed (NaN: none), time per turn, usable time per battery (s), size of one photo, units.
fn request_numbers(layout: &FieldLayout, units: Units) -> [f64; 11] {
    [
        layout.heading_deg,
        layout.footprint_across_m,
        layout.footprint_along_m,
        layout.base_m,
        layout.line_spacing_m,
        layout.extra_photos_per_end as f64,
        layout.speed_mps.unwrap_or(f64::NAN),
        layout.turn_s,
        layout.endurance_s,
        layout.photo_mb,
        if units == Units::Imperial { 1.0 } else { 0.0 },
    ]
}

/// A round length near a quarter of `span`: 1, 2 or 5 times a power of ten.
fn scale_length(span: f64) -> f64 {
    let target = (span / 4.0).max(1e-3);
    let power = 10f64.powf(target.log10().floor());
    [5.0, 2.0, 1.0]
        .into_iter()
        .map(|k| k * power)
        .find(|l| *l <= target)
        .unwrap_or(power)
}

/// The boundary's figures and its drawing to scale (lines up the page along the heading), with a
/// scale bar and a north arrow.
fn draw(
    plan: &FieldPlan,
    suggested: Option<(
        crate::core::planning::field::HeadingChoice,
        crate::core::planning::field::HeadingChoice,
    )>,
    units: Units,
) -> String {
    let len = |m: f64| format::length(m, units);
    let mut m = Markup::default();
    m.tag(r#"<dl class="figures field-figures">"#);
    let row = |m: &mut Markup, label: &str, key: &str, si: f64, text: String| {
        m.tag("<dt>")
            .text(label)
            .tag("</dt><dd>")
            .figure(key, si, &text)
            .tag("</dd>");
    };
    row(
        &mut m,
        "Area inside the boundary",
        "area_m2",
        plan.area_m2,
        format::area(plan.area_m2, units),
    );
    row(
        &mut m,
        "Flight lines over the boundary",
        "field_lines",
        plan.lines as f64,
        plan.lines.to_string(),
    );
    row(
        &mut m,
        "Photos over the boundary",
        "field_photos",
        plan.photos as f64,
        plan.photos.to_string(),
    );
    row(
        &mut m,
        "Path over the boundary",
        "field_path_length_m",
        plan.path_length_m,
        len(plan.path_length_m),
    );
    row(
        &mut m,
        "Turns",
        "field_turns",
        plan.turns as f64,
        plan.turns.to_string(),
    );
    if let Some(t) = plan.flight_time_s {
        row(
            &mut m,
            "Flight time over the boundary",
            "field_flight_time_s",
            t,
            format::duration(t),
        );
    }
    if let Some(b) = plan.batteries {
        row(
            &mut m,
            "Batteries over the boundary",
            "field_batteries",
            b as f64,
            b.to_string(),
        );
    }
    if let Some(mb) = plan.storage_mb {
        let text = if mb >= 1000.0 {
            format!("{} GB", format::significant(mb / 1000.0))
        } else {
            format!("{} MB", format::significant(mb))
        };
        row(&mut m, "Storage over the boundary", "field_storage_mb", mb, text);
    }
    m.tag("</dl>");
    if let Some((fewest, shortest)) = suggested {
        m.tag(r#"<p class="note" data-key="heading_fewest_lines">"#)
            .text(&format!(
                "Fewest lines: heading {}° ({} lines, {}). Shortest path: heading {}° ({} lines, {}).",
                format::significant(fewest.heading_deg),
                fewest.lines,
                len(fewest.path_length_m),
                format::significant(shortest.heading_deg),
                shortest.lines,
                len(shortest.path_length_m)
            ));
        m.tag("</p>");
    }
    // The drawing: x across the lines to the right, y along them up the page.
    let points = plan.rings_m.iter().flatten().map(|p| (p[0], p[1]));
    let more = plan.photo_points.iter().map(|p| (p.x_m, p.y_m));
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for (x, y) in points.chain(more) {
        x0 = x0.min(x);
        x1 = x1.max(x);
        y0 = y0.min(y);
        y1 = y1.max(y);
    }
    if !(x0.is_finite() && x1.is_finite() && y0.is_finite() && y1.is_finite()) {
        return m.into_string();
    }
    let size = (x1 - x0).max(y1 - y0).max(1.0);
    let pad = 0.08 * size;
    let stroke = 0.004 * size;
    m.tag(&format!(
        r#"<figure class="layout-figure"><svg class="survey-map field-map" viewBox="{} {} {} {}" role="img" aria-label="The boundary to scale with its flight lines and photo centres">"#,
        x0 - pad,
        -y1 - pad,
        x1 - x0 + 2.0 * pad,
        y1 - y0 + 2.0 * pad
    ));
    let mut d = String::new();
    for ring in &plan.rings_m {
        for (i, p) in ring.iter().enumerate() {
            d += &format!("{}{} {} ", if i == 0 { 'M' } else { 'L' }, p[0], -p[1]);
        }
        d += "Z ";
    }
    m.tag(&format!(
        r#"<path class="area" d="{d}" fill-rule="evenodd" stroke-width="{}" />"#,
        stroke * 1.5
    ));
    for s in &plan.stretches {
        m.tag(&format!(
            r#"<line class="field-line" data-line="{}" x1="{}" y1="{}" x2="{}" y2="{}" stroke-width="{stroke}" />"#,
            s.line, s.x_m, -s.from_y_m, s.x_m, -s.to_y_m
        ));
    }
    for p in plan.photo_points.iter().take(MAX_DRAWN_PHOTOS) {
        m.tag(&format!(
            r#"<circle class="photo" cx="{}" cy="{}" r="{}" />"#,
            p.x_m,
            -p.y_m,
            stroke * 1.2
        ));
    }
    // Scale bar in the lower left; north arrow in the upper left, turned from the heading.
    let bar = scale_length(x1 - x0);
    let (bx, by) = (x0, -y0 + pad * 0.6);
    m.tag(&format!(
        r#"<g class="scale-bar"><line x1="{bx}" y1="{by}" x2="{}" y2="{by}" stroke-width="{}" /><text class="label" x="{bx}" y="{}" font-size="{}">"#,
        bx + bar,
        stroke * 2.0,
        by - stroke * 3.0,
        0.035 * size
    ))
    .text(&len(bar))
    .tag("</text></g>");
    let h = plan.heading_deg.to_radians();
    let (nx, ny) = (-h.sin(), -h.cos());
    let arrow = 0.08 * size;
    let (ax, ay) = (x0 + arrow * 0.5, -y1 + arrow * 1.2);
    m.tag(&format!(
        r#"<g class="north"><line x1="{ax}" y1="{ay}" x2="{}" y2="{}" stroke-width="{}" /><text class="label" x="{}" y="{}" font-size="{}">N</text></g>"#,
        ax + nx * arrow,
        ay + ny * arrow,
        stroke * 1.5,
        ax + nx * arrow * 1.3,
        ay + ny * arrow * 1.3,
        0.04 * size
    ));
    m.tag("</svg><figcaption>").text(&format!(
        "To scale, the lines up the page (heading {}°). Outline: the boundary; lines: flown stretches; dots: photo centres{}.",
        format::significant(plan.heading_deg),
        if plan.photo_points.len() > MAX_DRAWN_PHOTOS {
            format!(" (the first {MAX_DRAWN_PHOTOS} drawn)")
        } else {
            String::new()
        }
    ));
    m.tag("</figcaption></figure>");
    m.tag(r#"<p class="export">Download the plan over the boundary: <button type="button" data-export="geojson">GeoJSON</button> <button type="button" data-export="kml">KML</button> <button type="button" data-export="csv">Photo centres (CSV)</button></p>"#);
    m.into_string()
}

/// The answer to one request: the figures and drawing, or the problem in words.
fn answer(field: &str, numbers: &[f64], export: Option<(&str, &str, f64, f64)>) -> Result<String, String> {
    let n = |i: usize| numbers.get(i).copied().unwrap_or(f64::NAN);
    let layout = FieldLayout {
        heading_deg: n(0),
        footprint_across_m: n(1),
        footprint_along_m: n(2),
        base_m: n(3),
        line_spacing_m: n(4),
        extra_photos_per_end: if n(5).is_finite() && n(5) >= 0.0 {
            n(5) as u64
        } else {
            0
        },
        speed_mps: Some(n(6)).filter(|v| v.is_finite()),
        turn_s: n(7),
        endurance_s: n(8),
        photo_mb: n(9),
    };
    let units = if n(10) == 1.0 { Units::Imperial } else { Units::Metric };
    let boundary = Boundary::from_text(field).map_err(|p| p.message())?;
    let plan = plan_field(&boundary, &layout).map_err(|p| p.message().to_string())?;
    if let Some((format, name, height_m, gsd_m)) = export {
        let facts = ExportFacts {
            name,
            height_m,
            gsd_m,
            base_m: layout.base_m,
            line_spacing_m: layout.line_spacing_m,
        };
        return Ok(match format {
            "kml" => field_kml(&boundary, &plan, &facts),
            "csv" => field_csv(&plan, &facts),
            _ => field_geojson(&boundary, &plan, &facts),
        });
    }
    let suggested = suggest_headings(&boundary, &layout);
    Ok(draw(&plan, suggested, units))
}

/// In the worker: answers every request.
pub fn serve() {
    worker::serve(|request| {
        let field = request.get(0).as_string().unwrap_or_default();
        let numbers: Vec<f64> = (1..12).map(|i| request.get(i).as_f64().unwrap_or(f64::NAN)).collect();
        let text = |i: u32| request.get(i).as_string().unwrap_or_default();
        let (format, name) = (text(12), text(13));
        let export = (!format.is_empty()).then(|| {
            let n = |i: u32| request.get(i).as_f64().unwrap_or(f64::NAN);
            (format.as_str(), name.as_str(), n(14), n(15))
        });
        if export.is_some() {
            return worker::text_answer(answer(&field, &numbers, export));
        }
        // The survey panel and the printed sheet ask for the same drawing when they show the same
        // plan: the last one is kept and given again rather than laid out twice.
        let key: Vec<u64> = numbers.iter().map(|v| v.to_bits()).collect();
        let kept = LAST_DRAWING.with(|last| {
            let last = last.borrow();
            last.as_ref()
                .filter(|(f, k, _)| *f == field && *k == key)
                .map(|(_, _, drawn)| drawn.clone())
        });
        let drawn = kept.unwrap_or_else(|| {
            let drawn = answer(&field, &numbers, None);
            LAST_DRAWING.with(|last| *last.borrow_mut() = Some((field, key, drawn.clone())));
            drawn
        });
        worker::text_answer(drawn)
    });
}

/// A drawing request: the boundary text, the layout's numbers as bits, and the answer.
type Drawn = (String, Vec<u64>, Result<String, String>);

thread_local! {
    static LAST_DRAWING: std::cell::RefCell<Option<Drawn>> = const { std::cell::RefCell::new(None) };
}

/// In the page: asks the worker to lay out `field` with `layout` and calls `done` with the
/// markup, or with why it cannot (also when the worker cannot be started).
pub fn plan(field: &str, layout: &FieldLayout, units: Units, done: impl FnOnce(Result<String, String>) + 'static) {
    let mut request = vec![JsValue::from_str(field)];
    request.extend(request_numbers(layout, units).iter().map(|v| JsValue::from_f64(*v)));
    worker::ask_text(LOADER, &request, done);
}

/// In the page: asks the worker for the boundary plan of `field` as a file, `format` `geojson`,
/// `kml` or `csv` (photo centres), named `name`, flown `height_m` above take-off with GSD `gsd_m`.
#[allow(clippy::too_many_arguments)]
pub fn export(
    field: &str,
    layout: &FieldLayout,
    format: &str,
    name: &str,
    height_m: f64,
    gsd_m: f64,
    done: impl FnOnce(Result<String, String>) + 'static,
) {
    let mut request = vec![JsValue::from_str(field)];
    request.extend(
        request_numbers(layout, Units::Metric)
            .iter()
            .map(|v| JsValue::from_f64(*v)),
    );
    request.extend([format.into(), name.into(), height_m.into(), gsd_m.into()]);
    worker::ask_text(LOADER, &request, done);
}

/// The boundary-file modules' loaders: the GeoJSON and the KML reader each in a worker of its own
/// (together they weigh more than a module's budget).
const GEOJSON_LOADER: &str = "./sharpfield-geojson_loader.js";
const KML_LOADER: &str = "./sharpfield-kml_loader.js";

/// In a file-reading worker: answers `[text]` with `[true, the field text]` or `[false, what is
/// wrong and where]`, reading with `read`.
pub fn serve_read(read: fn(&str) -> Result<Boundary, crate::core::formats::boundary::BoundaryProblem>) {
    // A function pointer cannot be captured by `serve`'s plain function; keep it in the worker's
    // one thread.
    READER.with(|r| r.set(Some(read)));
    worker::serve(|request| {
        let text = request.get(0).as_string().unwrap_or_default();
        let read = READER.with(|r| r.get());
        let result = match read {
            Some(read) => read(&text).map(|b| b.to_text()).map_err(|p| p.message()),
            None => Err("No reader.".to_string()),
        };
        worker::text_answer(result)
    });
}

type Reader = fn(&str) -> Result<Boundary, crate::core::formats::boundary::BoundaryProblem>;

thread_local! {
    static READER: std::cell::Cell<Option<Reader>> = const { std::cell::Cell::new(None) };
}

/// In the page: reads a boundary file into the `field` text (a `.kml` name with the KML reader,
/// anything else with the GeoJSON one), or says what is wrong with it.
pub fn read(name: &str, text: &str, done: impl FnOnce(Result<String, String>) + 'static) {
    let loader = if name.to_ascii_lowercase().ends_with(".kml") {
        KML_LOADER
    } else {
        GEOJSON_LOADER
    };
    worker::ask_text(loader, &[JsValue::from_str(text)], done);
}
