//! Exports of a survey over a boundary, in open formats that mapping tools read: GeoJSON
//! (RFC 7946: the boundary, the flight lines and the photo centres, with the plan's figures as
//! properties), OGC KML (the same, as placemarks) and CSV (one photo centre per row: latitude,
//! longitude, height, line, index). Written as text; read back in the tests by the georust
//! readers and a CSV reader from the registries.

use crate::core::formats::boundary::Boundary;
use crate::core::planning::field::FieldPlan;

/// What every export carries about the plan besides the geometry.
#[derive(Clone, Debug, PartialEq)]
pub struct ExportFacts<'a> {
    pub name: &'a str,
    /// Flight height above take-off, m.
    pub height_m: f64,
    pub gsd_m: f64,
    pub base_m: f64,
    pub line_spacing_m: f64,
}

/// A ring closed as RFC 7946 and KML write it (the first point repeated at the end).
fn closed(ring: &[[f64; 2]]) -> Vec<[f64; 2]> {
    let mut out = ring.to_vec();
    if let Some(first) = ring.first() {
        out.push(*first);
    }
    out
}

/// Twice the signed area in lon/lat (positive counter-clockwise).
fn signed_area(ring: &[[f64; 2]]) -> f64 {
    ring.iter()
        .zip(ring.iter().cycle().skip(1))
        .take(ring.len())
        .map(|(a, b)| a[0] * b[1] - b[0] * a[1])
        .sum()
}

/// A ring wound as RFC 7946 §3.1.6 asks: outer rings counter-clockwise, holes clockwise.
fn wound(ring: &[[f64; 2]], outer: bool) -> Vec<[f64; 2]> {
    let mut out = ring.to_vec();
    if (signed_area(&out) > 0.0) != outer {
        out.reverse();
    }
    closed(&out)
}

/// The plan as GeoJSON: a FeatureCollection of the boundary (a MultiPolygon with the plan's
/// figures), every flight stretch (a LineString with its line number) and every photo centre (a
/// Point with its line, index and trigger distance).
pub fn field_geojson(boundary: &Boundary, plan: &FieldPlan, facts: &ExportFacts) -> String {
    // Written as text (no JSON library: this runs in the boundary module, whose budget a JSON
    // writer would pass); the tests read it back with the geojson crate.
    let point = |p: &[f64; 2]| format!("[{},{}]", json_number(p[0]), json_number(p[1]));
    let ring = |r: &[[f64; 2]]| format!("[{}]", r.iter().map(point).collect::<Vec<_>>().join(","));
    let polygons: Vec<String> = boundary
        .areas
        .iter()
        .map(|a| {
            let rings: Vec<String> = std::iter::once(ring(&wound(&a.outer, true)))
                .chain(a.holes.iter().map(|h| ring(&wound(h, false))))
                .collect();
            format!("[{}]", rings.join(","))
        })
        .collect();
    let optional = |v: Option<f64>| v.map_or_else(|| "null".to_string(), json_number);
    let mut features = vec![format!(
        r#"{{"type":"Feature","geometry":{{"type":"MultiPolygon","coordinates":[{}]}},"properties":{{"kind":"boundary","name":{},"area_m2":{},"heading_deg":{},"height_m":{},"gsd_m":{},"base_m":{},"line_spacing_m":{},"lines":{},"photos":{},"path_length_m":{},"flight_time_s":{},"batteries":{},"storage_mb":{}}}}}"#,
        polygons.join(","),
        json_string(facts.name),
        json_number(plan.area_m2),
        json_number(plan.heading_deg),
        json_number(facts.height_m),
        json_number(facts.gsd_m),
        json_number(facts.base_m),
        json_number(facts.line_spacing_m),
        plan.lines,
        plan.photos,
        json_number(plan.path_length_m),
        optional(plan.flight_time_s),
        plan.batteries.map_or_else(|| "null".to_string(), |b| b.to_string()),
        optional(plan.storage_mb),
    )];
    features.extend(plan.stretches.iter().map(|s| {
        format!(
            r#"{{"type":"Feature","geometry":{{"type":"LineString","coordinates":{}}},"properties":{{"kind":"flight_line","line":{}}}}}"#,
            ring(&s.ends),
            s.line
        )
    }));
    features.extend(plan.photo_points.iter().map(|p| {
        format!(
            r#"{{"type":"Feature","geometry":{{"type":"Point","coordinates":{}}},"properties":{{"kind":"photo","line":{},"index":{},"trigger_m":{}}}}}"#,
            point(&[p.lon, p.lat]),
            p.line,
            p.index,
            json_number(p.trigger_m)
        )
    }));
    format!(r#"{{"type":"FeatureCollection","features":[{}]}}"#, features.join(","))
}

/// A number as JSON writes it (JSON has no NaN or infinity: null).
fn json_number(x: f64) -> String {
    if x.is_finite() {
        format!("{x}")
    } else {
        "null".to_string()
    }
}

/// A string as JSON writes it: quoted, with quotes, backslashes and control characters escaped.
fn json_string(text: &str) -> String {
    let mut out = String::from("\"");
    for c in text.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            c if (c as u32) < 0x20 => out.push_str(&format!("\\u{:04x}", c as u32)),
            c => out.push(c),
        }
    }
    out.push('"');
    out
}

/// Text made safe for XML.
fn xml(text: &str) -> String {
    text.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
}

/// `lon,lat` pairs as KML writes coordinates.
fn kml_coordinates(points: &[[f64; 2]]) -> String {
    points
        .iter()
        .map(|p| format!("{},{}", p[0], p[1]))
        .collect::<Vec<_>>()
        .join(" ")
}

/// The plan as OGC KML 2.2: the boundary as a Polygon placemark, each stretch as a LineString
/// placemark, each photo centre as a Point placemark (clamped to the ground: heights are the
/// plan's, above take-off, which KML cannot say).
pub fn field_kml(boundary: &Boundary, plan: &FieldPlan, facts: &ExportFacts) -> String {
    let mut out = String::from(
        "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<kml xmlns=\"http://www.opengis.net/kml/2.2\"><Document>",
    );
    out += &format!(
        "<name>{}</name>",
        xml(if facts.name.is_empty() { "Survey" } else { facts.name })
    );
    for (i, area) in boundary.areas.iter().enumerate() {
        out += &format!(
            "<Placemark><name>Boundary {}</name><description>{} lines, {} photos, heading {}°</description><Polygon><outerBoundaryIs><LinearRing><coordinates>{}</coordinates></LinearRing></outerBoundaryIs>",
            i + 1,
            plan.lines,
            plan.photos,
            plan.heading_deg,
            kml_coordinates(&wound(&area.outer, true))
        );
        for hole in &area.holes {
            out += &format!(
                "<innerBoundaryIs><LinearRing><coordinates>{}</coordinates></LinearRing></innerBoundaryIs>",
                kml_coordinates(&wound(hole, false))
            );
        }
        out += "</Polygon></Placemark>";
    }
    for s in &plan.stretches {
        out += &format!(
            "<Placemark><name>Line {}</name><LineString><coordinates>{}</coordinates></LineString></Placemark>",
            s.line,
            kml_coordinates(&s.ends)
        );
    }
    for p in &plan.photo_points {
        out += &format!(
            "<Placemark><name>{}.{}</name><Point><coordinates>{},{}</coordinates></Point></Placemark>",
            p.line, p.index, p.lon, p.lat
        );
    }
    out += "</Document></kml>\n";
    out
}

/// The photo centres as CSV with a header: latitude, longitude (WGS 84 degrees), height (m above
/// take-off), line, index (both counted from 1, in flying order), trigger distance (m).
pub fn field_csv(plan: &FieldPlan, facts: &ExportFacts) -> String {
    let mut out = String::from("latitude,longitude,height_m,line,index,trigger_m\n");
    for p in &plan.photo_points {
        out += &format!(
            "{},{},{},{},{},{}\n",
            p.lat, p.lon, facts.height_m, p.line, p.index, p.trigger_m
        );
    }
    out
}
