//! Surveys over a real boundary (issue 14): the area on the ellipsoid against a closed form, lines
//! and photos by hand for a square, an L shape and a square with a square hole, the exports read
//! back by independent readers (the geojson and kml crates, the csv crate), bad files refused with
//! their place, and every photo centre within the boundary plus its margin.

mod common;

use common::{close, plan};
use geo::{Distance, Euclidean, LineString, Point, Polygon};
use geographiclib_rs::{DirectGeodesic, Geodesic};
use proptest::prelude::*;
use sharpfield::core::formats::boundary::{
    read_file, read_geojson, read_kml, Area, Boundary, BoundaryProblem, MAX_POINTS,
};
use sharpfield::core::formats::field_export::{field_csv, field_geojson, field_kml, ExportFacts};
use sharpfield::core::planning::field::{area_m2, plan_field, suggest_headings, FieldLayout, FieldPlan};
use sharpfield::core::presets::demo::pasture_survey;

const LAT0: f64 = -36.85;
const LON0: f64 = 146.29;

/// (lon, lat) of the point `x` m east and `y` m north of the origin, along the geodesic.
fn at(x: f64, y: f64) -> [f64; 2] {
    let (lat, lon): (f64, f64) = Geodesic::wgs84().direct(LAT0, LON0, x.atan2(y).to_degrees(), x.hypot(y));
    [lon, lat]
}

fn ring(points: &[(f64, f64)]) -> Vec<[f64; 2]> {
    points.iter().map(|&(x, y)| at(x, y)).collect()
}

fn boundary(outer: &[(f64, f64)], holes: &[&[(f64, f64)]]) -> Boundary {
    Boundary {
        areas: vec![Area {
            outer: ring(outer),
            holes: holes.iter().map(|h| ring(h)).collect(),
        }],
    }
    .checked()
    .expect("a valid boundary")
}

/// The demo camera at 80 m (footprint 120 m across × 80 m along, 75 % / 65 %: base 20 m, spacing
/// 42 m, two extra photos beyond each end) flying north at 8 m/s, 10 s per turn.
fn layout(heading_deg: f64) -> FieldLayout {
    let s = pasture_survey();
    FieldLayout::of(
        &plan(&s),
        heading_deg,
        s.survey.turn_s,
        s.survey.endurance_min,
        s.survey.photo_mb,
    )
}

const SQUARE: [(f64, f64); 4] = [(0.0, 0.0), (400.0, 0.0), (400.0, 400.0), (0.0, 400.0)];

#[test]
fn the_demo_layout_is_the_one_worked_by_hand() {
    let l = layout(0.0);
    close(l.footprint_across_m, 120.0, 1e-9);
    close(l.footprint_along_m, 80.0, 1e-9);
    close(l.base_m, 20.0, 1e-9);
    close(l.line_spacing_m, 42.0, 1e-9);
    assert_eq!(l.extra_photos_per_end, 2);
}

#[test]
fn area_of_a_latitude_longitude_box_against_the_closed_form() {
    // The area between two parallels and two meridians on the WGS 84 ellipsoid is
    // (Δλ)·(a²/2)·[q(φ2) − q(φ1)] with q(φ) = (1 − e²)·[sin φ/(1 − e² sin² φ) − 1/(2e)·
    // ln((1 − e sin φ)/(1 + e sin φ))] (Snyder, "Map Projections — A Working Manual", USGS
    // Professional Paper 1395, 1987, eq. 3-12). The polygon's sides are geodesics, not parallels;
    // for a box 0.01° wide the two bulges nearly cancel, far inside the tolerance.
    let a: f64 = 6_378_137.0;
    let f: f64 = 1.0 / 298.257_223_563;
    let e2 = f * (2.0 - f);
    let e = e2.sqrt();
    let q = |phi: f64| {
        let s = phi.to_radians().sin();
        (1.0 - e2) * (s / (1.0 - e2 * s * s) - 1.0 / (2.0 * e) * ((1.0 - e * s) / (1.0 + e * s)).ln())
    };
    for (lat, lon, d) in [
        (45.0, 7.0, 0.01),
        (-36.85, 146.29, 0.02),
        (0.0, -60.0, 0.01),
        (60.0, 20.0, 0.005),
    ] {
        let b = Boundary {
            areas: vec![Area {
                outer: vec![[lon, lat], [lon + d, lat], [lon + d, lat + d], [lon, lat + d]],
                holes: vec![],
            }],
        };
        let expected = d.to_radians() * a * a / 2.0 * (q(lat + d) - q(lat));
        close(area_m2(&b), expected, 1e-6 * expected);
    }
}

#[test]
fn area_of_antarctica_as_geographiclib_documents_it() {
    // GeographicLib's documentation (Python package, "Examples": the area of Antarctica) gives
    // perimeter 16831.067893 km and area 13662703.680020 km² for this polygon; recalled from
    // memory. It crosses the 180° meridian, so the boundary reader refuses it; the area routine
    // takes it as it is.
    let points = [
        (-63.1, -58.0),
        (-72.9, -74.0),
        (-71.9, -102.0),
        (-74.9, -102.0),
        (-74.3, -131.0),
        (-77.5, -163.0),
        (-77.4, 163.0),
        (-71.7, 172.0),
        (-65.9, 140.0),
        (-65.7, 113.0),
        (-66.6, 88.0),
        (-66.9, 59.0),
        (-69.8, 25.0),
        (-70.0, -4.0),
        (-71.0, -14.0),
        (-77.3, -33.0),
        (-77.9, -46.0),
        (-74.7, -61.0),
    ];
    let b = Boundary {
        areas: vec![Area {
            outer: points.iter().map(|&(lat, lon)| [lon, lat]).collect(),
            holes: vec![],
        }],
    };
    close(area_m2(&b), 13_662_703.680_020e6, 1e-9 * 13_662_703.680_020e6);
    assert!(matches!(b.checked(), Err(BoundaryProblem::CrossesAntimeridian { .. })));
}

#[test]
fn a_square_by_hand() {
    // 400 m × 400 m, lines north: ceil(400/42) + 1 = 11 lines at x = 0, 42, … 420 (the last within
    // half a footprint of the east side), each over the whole 400 m: ceil(400/20) + 1 = 21 photos
    // and 2 more beyond each end, 25. Each line flown 480 m (to its extra photos), 10 hops of
    // 42 m between lines: 5700 m, as the rectangle's plan counts it.
    let b = boundary(&SQUARE, &[]);
    let p = plan_field(&b, &layout(0.0)).unwrap();
    assert_eq!((p.lines, p.stretches.len(), p.photos, p.turns), (11, 11, 275, 10));
    close(p.path_length_m, 11.0 * 480.0 + 10.0 * 42.0, 1e-5);
    close(p.area_m2, 160_000.0, 1e-4);
    // Time at 8 m/s with 10 s per turn.
    close(p.flight_time_s.unwrap(), p.path_length_m / 8.0 + 100.0, 1e-9);
    // The rectangle's plan of the same area gives the same counts and path.
    let mut s = pasture_survey();
    s.survey.area_width_m = Some(400.0);
    s.survey.area_length_m = Some(400.0);
    let r = plan(&s);
    assert_eq!((r.lines, r.photos), (Some(11), Some(275)));
    close(r.path_length_m.unwrap(), p.path_length_m, 1e-5);
    // Photo centres in flying order with their trigger distances: line 1 from 40 m south of the
    // square, 20 m apart.
    let first = &p.photo_points[..3];
    assert!(first.iter().all(|q| q.line == 1));
    assert_eq!(first.iter().map(|q| q.index).collect::<Vec<_>>(), [1, 2, 3]);
    close(first[0].y_m, -40.0, 1e-6);
    close(first[2].trigger_m, 40.0, 1e-9);
    // Along the heading, the fewest lines fly north–south or east–west (a square: both 11).
    let (fewest, shortest) = suggest_headings(&b, &layout(0.0)).unwrap();
    assert_eq!(fewest.lines, 11);
    assert!(shortest.path_length_m <= p.path_length_m + 1e-6);
}

#[test]
fn an_l_shape_by_hand() {
    // The square less its north-east quarter (200 × 200 m). Lines at x = 0 … 252 have ground of
    // the west half within 60 m: 400 m long, 25 photos each (7 lines); lines at 294 … 420 only
    // the south half: 200 m, ceil(200/20) + 1 + 4 = 15 photos (4 lines): 175 + 60 = 235 photos.
    // Path: 7 × 480 + 4 × 280 m flown, 9 hops of 42 m and one from (252, 440) to (294, 240).
    let b = boundary(
        &[
            (0.0, 0.0),
            (400.0, 0.0),
            (400.0, 200.0),
            (200.0, 200.0),
            (200.0, 400.0),
            (0.0, 400.0),
        ],
        &[],
    );
    let p = plan_field(&b, &layout(0.0)).unwrap();
    assert_eq!((p.lines, p.stretches.len(), p.photos), (11, 11, 235));
    close(
        p.path_length_m,
        7.0 * 480.0 + 4.0 * 280.0 + 9.0 * 42.0 + 42f64.hypot(200.0),
        1e-5,
    );
    close(p.area_m2, 120_000.0, 1e-4);
    // Flying east–west instead needs the same lines by symmetry; the bounding box would need
    // 275 photos.
    assert!(p.photos < 275);
}

#[test]
fn a_square_with_a_square_hole_by_hand() {
    // A 160 m hole in the middle (x and y from 120 to 280). Only the line at x = 210 has its whole
    // 120 m strip (150 … 270) inside the hole's width: it is flown as two stretches, 0 … 120 and
    // 280 … 400 with their extras (−40 … 160 and 240 … 440), 7 + 4 = 11 photos each, and the 80 m
    // between them flown without photos. 10 × 25 + 22 = 272 photos; the path as the square's.
    let hole: &[(f64, f64)] = &[(120.0, 120.0), (280.0, 120.0), (280.0, 280.0), (120.0, 280.0)];
    let b = boundary(&SQUARE, &[hole]);
    let p = plan_field(&b, &layout(0.0)).unwrap();
    assert_eq!((p.lines, p.stretches.len(), p.photos, p.turns), (11, 12, 272, 10));
    close(p.path_length_m, 10.0 * 480.0 + 2.0 * 200.0 + 80.0 + 10.0 * 42.0, 1e-5);
    close(p.area_m2, 160_000.0 - 25_600.0, 1e-4);
    // No photo centre of the split line lies in the hole's middle.
    let in_gap = |y: f64| y > 160.0 + 1e-6 && y < 240.0 - 1e-6;
    assert!(p.photo_points.iter().filter(|q| q.line == 6).all(|q| !in_gap(q.y_m)));
}

/// The square's plan and its exports.
fn exported() -> (Boundary, FieldPlan, ExportFacts<'static>) {
    let hole: &[(f64, f64)] = &[(120.0, 120.0), (280.0, 120.0), (280.0, 280.0), (120.0, 280.0)];
    let b = boundary(&SQUARE, &[hole]);
    let p = plan_field(&b, &layout(30.0)).unwrap();
    let facts = ExportFacts {
        // Quotes, a backslash, a new line and an ampersand: each format must escape its own.
        name: "Creek \"dam\" & paddock\\2\n",
        height_m: 80.0,
        gsd_m: 0.0219,
        base_m: 20.0,
        line_spacing_m: 42.0,
    };
    (b, p, facts)
}

#[test]
fn geojson_written_is_read_back_by_the_geojson_crate() {
    let (b, p, facts) = exported();
    let text = field_geojson(&b, &p, &facts);
    let collection: geojson::FeatureCollection = text.parse().expect("RFC 7946 FeatureCollection");
    let kind = |f: &geojson::Feature| f.property("kind").and_then(|v| v.as_str()).unwrap_or("").to_string();
    let count = |k: &str| collection.features.iter().filter(|f| kind(f) == k).count();
    assert_eq!(count("boundary"), 1);
    assert_eq!(count("flight_line"), p.stretches.len());
    assert_eq!(count("photo"), p.photos);
    let boundary = collection.features.iter().find(|f| kind(f) == "boundary").unwrap();
    assert_eq!(
        boundary.property("photos").and_then(|v| v.as_u64()),
        Some(p.photos as u64)
    );
    assert_eq!(
        boundary.property("name").and_then(|v| v.as_str()),
        Some("Creek \"dam\" & paddock\\2\n")
    );
    // The boundary reads back as it was (the reader takes the first polygon's rings).
    let again = read_geojson(&text).unwrap();
    assert_eq!(again.areas.len(), 1);
    assert_eq!(again.areas[0].outer.len(), 4);
    assert_eq!(again.areas[0].holes.len(), 1);
    close(area_m2(&again), p.area_m2, 1e-6);
    // Photo points carry their place in the plan.
    let photo = collection.features.iter().find(|f| kind(f) == "photo").unwrap();
    assert_eq!(photo.property("line").and_then(|v| v.as_u64()), Some(1));
    assert_eq!(photo.property("index").and_then(|v| v.as_u64()), Some(1));
}

#[test]
fn kml_written_is_read_back_by_the_kml_crate() {
    let (b, p, facts) = exported();
    let text = field_kml(&b, &p, &facts);
    let parsed: kml::Kml<f64> = text.parse().expect("KML the kml crate reads");
    // Count the placemarks by their geometry.
    fn walk(k: &kml::Kml<f64>, counts: &mut [usize; 3]) {
        match k {
            kml::Kml::KmlDocument(d) => d.elements.iter().for_each(|e| walk(e, counts)),
            kml::Kml::Document { elements, .. } => elements.iter().for_each(|e| walk(e, counts)),
            kml::Kml::Placemark(p) => match &p.geometry {
                Some(kml::types::Geometry::Polygon(_)) => counts[0] += 1,
                Some(kml::types::Geometry::LineString(_)) => counts[1] += 1,
                Some(kml::types::Geometry::Point(_)) => counts[2] += 1,
                _ => {}
            },
            _ => {}
        }
    }
    let mut counts = [0; 3];
    walk(&parsed, &mut counts);
    assert_eq!(counts, [1, p.stretches.len(), p.photos]);
    let again = read_kml(&text).unwrap();
    assert_eq!(again.areas[0].holes.len(), 1);
    close(area_m2(&again), p.area_m2, 1e-6);
}

#[test]
fn csv_written_is_read_back_by_the_csv_crate() {
    let (_, p, facts) = exported();
    let text = field_csv(&p, &facts);
    let mut reader = csv::Reader::from_reader(text.as_bytes());
    let headers = reader.headers().unwrap().clone();
    assert_eq!(
        headers.iter().collect::<Vec<_>>(),
        ["latitude", "longitude", "height_m", "line", "index", "trigger_m"]
    );
    let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.unwrap()).collect();
    assert_eq!(rows.len(), p.photos);
    for (row, point) in rows.iter().zip(&p.photo_points) {
        assert_eq!(row[0].parse::<f64>().unwrap(), point.lat);
        assert_eq!(row[1].parse::<f64>().unwrap(), point.lon);
        assert_eq!(row[2].parse::<f64>().unwrap(), 80.0);
        assert_eq!(row[3].parse::<usize>().unwrap(), point.line);
        assert_eq!(row[4].parse::<usize>().unwrap(), point.index);
    }
}

#[test]
fn bad_files_are_refused_with_what_is_wrong_and_where() {
    let polygon = |coords: &str| format!(r#"{{"type":"Polygon","coordinates":[{coords}]}}"#);
    // MAX_POINTS + 1 distinct points and the closing one.
    let many: Vec<String> = (0..=MAX_POINTS + 1)
        .map(|i| {
            let t = i as f64 / (MAX_POINTS + 1) as f64 * std::f64::consts::TAU;
            format!("[{},{}]", 146.0 + 0.01 * t.cos(), -36.0 + 0.01 * t.sin())
        })
        .collect();
    let cases: Vec<(String, String, &str)> = vec![
        ("a.geojson".into(), "{ not json".into(), "not a GeoJSON file"),
        ("a.geojson".into(), r#"{"type":"Point","coordinates":[146.3,-36.8]}"#.into(), "no polygon to survey (only Point)"),
        ("a.geojson".into(), polygon("[[146,-36],[146.01,-36.01],[146.01,-36],[146,-36.01],[146,-36]]"), "outer ring crosses itself"),
        ("a.geojson".into(), polygon("[[179.99,-36],[-179.99,-36],[-179.99,-36.01],[179.99,-36]]"), "crosses the 180° meridian"),
        ("a.geojson".into(), polygon("[[146,-36],[146.01,-96],[146.01,-36],[146,-36]]"), "Point 2 of the outer ring"),
        ("a.geojson".into(), polygon("[[146,-36],[146.01,-36],[146,-36]]"), "fewer than three distinct points"),
        ("a.geojson".into(), polygon(&format!("[{}]", many.join(","))), "more than the 5000"),
        ("a.kml".into(), "<kml><Document><Placemark>".into(), "not a KML file"),
        (
            "a.kml".into(),
            "<kml xmlns=\"http://www.opengis.net/kml/2.2\"><Placemark><Point><coordinates>146,-36</coordinates></Point></Placemark></kml>".into(),
            "no polygon to survey (only Point)",
        ),
        (
            "a.kml".into(),
            "<kml xmlns=\"http://www.opengis.net/kml/2.2\"><Placemark><Polygon><outerBoundaryIs><LinearRing><coordinates>146,-36 146.01,-36.01 146.01,-36 146,-36.01 146,-36</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark></kml>".into(),
            "outer ring crosses itself",
        ),
        ("pasted.txt".into(), "146 -36, 146.01 -36, north".into(), "Point 3 of the outer ring ('north')"),
        (
            "pasted.txt".into(),
            "146 -36,146.01 -36,146.01 -35.99,146 -35.99;146.02 -36,146.03 -36,146.03 -35.99".into(),
            "a hole lies outside the outer ring",
        ),
        (
            "pasted.txt".into(),
            "146 -36,146.01 -36,146.01 -35.99,146 -35.99;146.005 -35.995,146.02 -35.995,146.005 -35.994".into(),
            "rings of polygon 1 cross each other",
        ),
    ];
    for (name, text, expected) in cases {
        let message = read_file(&name, &text)
            .map(|_| String::new())
            .unwrap_or_else(|p| p.message());
        assert!(message.contains(expected), "{name} ({expected}): {message}");
    }
}

#[test]
fn a_multipolygon_with_a_hole_is_read_with_its_parts() {
    let text = r#"{"type":"FeatureCollection","features":[{"type":"Feature","properties":{},"geometry":{"type":"MultiPolygon","coordinates":[
        [[[146.0,-36.0],[146.01,-36.0],[146.01,-35.99],[146.0,-35.99],[146.0,-36.0]],[[146.004,-35.996],[146.004,-35.994],[146.006,-35.994],[146.006,-35.996],[146.004,-35.996]]],
        [[[146.02,-36.0],[146.03,-36.0],[146.03,-35.99],[146.02,-36.0]]]]}}]}"#;
    let b = read_geojson(text).unwrap();
    assert_eq!(b.areas.len(), 2);
    assert_eq!(b.areas[0].holes.len(), 1);
    // The `field` text carries both and reads back the same.
    assert_eq!(Boundary::from_text(&b.to_text()).unwrap(), b);
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    /// Every photo centre lies within the boundary grown by its margin: half a footprint across
    /// the lines and the extra photos' reach (two bases here) along them.
    #[test]
    fn every_photo_centre_lies_inside_the_boundary_plus_its_margin(
        radii in prop::collection::vec(60.0f64..700.0, 3..10),
        heading in 0.0f64..360.0,
    ) {
        // A star-shaped polygon: vertices at increasing angles, so the ring never crosses itself.
        let n = radii.len();
        let outer: Vec<(f64, f64)> = radii
            .iter()
            .enumerate()
            .map(|(i, r)| {
                let t = i as f64 / n as f64 * std::f64::consts::TAU;
                (r * t.sin(), r * t.cos())
            })
            .collect();
        let b = boundary(&outer, &[]);
        let l = layout(heading);
        let p = plan_field(&b, &l).unwrap();
        prop_assert!(p.photos > 0);
        let ring: Vec<(f64, f64)> = p.rings_m[0].iter().map(|q| (q[0], q[1])).collect();
        let shape = Polygon::new(LineString::from(ring), vec![]);
        let reach = (0.5 * l.footprint_across_m).hypot(l.extra_photos_per_end as f64 * l.base_m + l.base_m);
        for q in &p.photo_points {
            let d = Euclidean.distance(&Point::new(q.x_m, q.y_m), &shape);
            prop_assert!(d <= reach + 1e-6, "photo {}.{} lies {d} m from the boundary", q.line, q.index);
        }
    }
}

#[test]
fn every_cut_of_a_boundary_file_is_answered() {
    // A file cut short (a download that stopped, a paste that missed its end) is refused or read,
    // never a hang or a crash: every prefix of a small KML and GeoJSON boundary.
    let kml = "<?xml version=\"1.0\"?><kml xmlns=\"http://www.opengis.net/kml/2.2\"><Document><Placemark><name>Dam &amp; creek</name><Polygon><outerBoundaryIs><LinearRing><coordinates>146,-36 146.01,-36 146.01,-35.99 146,-35.99 146,-36</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark></Document></kml>";
    let geojson = r#"{"type":"Feature","properties":{"name":"Dam"},"geometry":{"type":"Polygon","coordinates":[[[146,-36],[146.01,-36],[146.01,-35.99],[146,-35.99],[146,-36]]]}}"#;
    for (name, text) in [
        ("a.kml", kml),
        ("a.geojson", geojson),
        ("pasted", "146 -36,146.01 -36,146.01 -35.99"),
    ] {
        for end in (0..=text.len()).filter(|&i| text.is_char_boundary(i)) {
            let read = read_file(name, &text[..end]);
            if end == text.len() {
                assert!(read.is_ok(), "{name}: {:?}", read.err().map(|p| p.message()));
            } else if let Err(problem) = read {
                assert!(!problem.message().is_empty());
            }
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// Any text at all is read or refused with a message, never a crash.
    #[test]
    fn any_text_is_answered(text in ".{0,300}", kind in 0usize..3) {
        let name = ["a.kml", "a.geojson", "pasted"][kind];
        if let Err(problem) = read_file(name, &text) {
            prop_assert!(!problem.message().is_empty());
        }
    }
}

#[test]
fn a_point_repeated_at_once_is_one_point() {
    // Traced files often repeat a point; the ring is the same ring (and no crossing).
    let b = Boundary::from_text("146 -36,146.01 -36,146.01 -36,146.01 -35.99,146 -35.99,146 -36").unwrap();
    assert_eq!(b.areas[0].outer.len(), 4);
}
