//! GeoJSON export (RFC 7946): the geodesic library against GeographicLib's published checks, then
//! the exported area and lines against the plan, measured back on the ellipsoid.

use geographiclib_rs::{DirectGeodesic, Geodesic, InverseGeodesic};
mod common;

use common::{close, inputs, plan};
use proptest::prelude::*;
use serde_json::Value;
use sharpfield::core::contract::scenario::Scenario;
use sharpfield::core::formats::geojson::{
    make_counter_clockwise, signed_area_deg2, survey_geojson, survey_geojson_checked, ExportProblem,
};
use sharpfield::core::planning::survey::SurveySettings;
use sharpfield::core::presets::demo::pasture_survey;

fn export(scenario: &Scenario) -> Value {
    let text = survey_geojson(&inputs(scenario), &plan(scenario), &scenario.name).expect("origin and area are given");
    serde_json::from_str(&text).expect("the export is JSON")
}

/// The demo camera over an area of `width` × `length` m whose first corner is at `lat`, `lon`.
fn field_at(lat: f64, lon: f64, heading: f64, width: f64, length: f64) -> Scenario {
    Scenario {
        survey: SurveySettings {
            latitude_deg: Some(lat),
            longitude_deg: Some(lon),
            heading_deg: heading,
            area_width_m: Some(width),
            area_length_m: Some(length),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    }
}

/// The [longitude, latitude] positions of a GeoJSON coordinate array.
fn positions(coordinates: &Value) -> Vec<[f64; 2]> {
    coordinates
        .as_array()
        .expect("an array of positions")
        .iter()
        .map(|p| {
            let p = p.as_array().expect("a position");
            assert_eq!(p.len(), 2, "positions are [longitude, latitude]");
            [p[0].as_f64().unwrap(), p[1].as_f64().unwrap()]
        })
        .collect()
}

/// The outer ring of the area polygon, the first feature.
fn area_ring(collection: &Value) -> Vec<[f64; 2]> {
    let area = &collection["features"][0];
    assert_eq!(area["geometry"]["type"], "Polygon");
    let rings = area["geometry"]["coordinates"].as_array().unwrap();
    assert_eq!(rings.len(), 1, "one outer ring, no holes");
    positions(&rings[0])
}

/// The geodesic distance between two [longitude, latitude] positions, metres.
fn distance(a: [f64; 2], b: [f64; 2]) -> f64 {
    Geodesic::wgs84().inverse(a[1], a[0], b[1], b[0])
}

/// The initial azimuth from a to b, degrees in [0, 360).
fn azimuth(a: [f64; 2], b: [f64; 2]) -> f64 {
    let (azi1, _azi2, _a12): (f64, f64, f64) = Geodesic::wgs84().inverse(a[1], a[0], b[1], b[0]);
    azi1.rem_euclid(360.0)
}

fn angle_between(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(360.0);
    d.min(360.0 - d)
}

#[test]
fn geographiclib_direct_problem_geodsolve1() {
    // Source: GeographicLib's own test suite (C. F. F. Karney; geodtest.c and test_geodesic.py,
    // "GeodSolve1"), the JFK-to-Paris example of the GeodSolve manual: from 40.63972222° N,
    // 73.77888889° W at azimuth 53.5° for 5850 km → 49.01467° N, 2.56106° E, azimuth 111.62947°,
    // checked there to ±0.5e-5°.
    let (lat2, lon2, azi2): (f64, f64, f64) = Geodesic::wgs84().direct(40.63972222, -73.77888889, 53.5, 5850e3);
    close(lat2, 49.01467, 0.5e-5);
    close(lon2, 2.56106, 0.5e-5);
    close(azi2, 111.62947, 0.5e-5);
}

#[test]
// The published values are quoted digit for digit, beyond what an f64 holds, so that they can be
// compared with the source by eye.
#[allow(clippy::excessive_precision)]
fn geographiclib_direct_problem_reference_case() {
    // Source: GeographicLib's test suite, first of its reference cases (testcases[0] in geodtest.c
    // and test_geodesic.py; Karney's GeodTest data): lat1, lon1, azi1, s12 → lat2, lon2, azi2.
    let (lat2, lon2, azi2): (f64, f64, f64) =
        Geodesic::wgs84().direct(35.60777, -139.44815, 111.098748429560326, 8935244.5604818305);
    close(lat2, -11.17491, 1e-12);
    close(lon2, -69.95921, 1e-12);
    close(azi2, 129.289270889708762, 1e-12);
}

#[test]
fn geographiclib_rs_documented_example() {
    // Source: geographiclib-rs 0.2.7 documentation, DirectGeodesic ("the point 10000 km NE of
    // JFK"): from 40.64° N, 73.78° W at azimuth 45° for 10 000 km → 32.621100463725796° N,
    // 49.052487092959836° E, azimuth 140.4059858768007°.
    let (lat2, lon2, azi2): (f64, f64, f64) = Geodesic::wgs84().direct(40.64, -73.78, 45.0, 10e6);
    close(lat2, 32.621100463725796, 1e-12);
    close(lon2, 49.052487092959836, 1e-12);
    close(azi2, 140.4059858768007, 1e-12);
}

#[test]
fn demo_export_is_a_feature_collection_in_lon_lat_order() {
    // RFC 7946 §3.3 (FeatureCollection), §3.1.1 (position = [longitude, latitude]).
    let s = pasture_survey();
    let v = export(&s);
    assert_eq!(v["type"], "FeatureCollection");
    let ring = area_ring(&v);
    // The first corner is the origin, longitude first.
    close(ring[0][0], s.survey.longitude_deg.unwrap(), 1e-12);
    close(ring[0][1], s.survey.latitude_deg.unwrap(), 1e-12);
    // Closed (RFC 7946 §3.1.6: first and last positions equivalent), four corners.
    assert_eq!(ring.len(), 5);
    assert_eq!(ring[0], ring[4]);
    assert!(signed_area_deg2(&ring) > 0.0, "the outer ring runs counter-clockwise");
    let features = v["features"].as_array().unwrap();
    assert_eq!(features.len() as u64, 1 + plan(&s).lines.unwrap());
}

#[test]
fn corners_measure_the_area_on_the_ellipsoid() {
    // The exported corners, measured back with the inverse problem, give the area's width and
    // length within 1 mm; the sides leave the origin at the heading and at heading + 90°.
    for (lat, lon) in [
        (-36.8512, 146.2934),
        (51.5, -0.12),
        (0.0, 0.0),
        (-60.0, -70.0),
        (70.0, 20.0),
    ] {
        for heading in [0.0, 37.0, 90.0, 180.0, 271.5, 359.9] {
            for (width, length) in [(400.0, 600.0), (2000.0, 3000.0), (1.0, 1.0)] {
                let s = field_at(lat, lon, heading, width, length);
                let ring = area_ring(&export(&s));
                let case = format!("{lat},{lon} heading {heading}, {width} × {length}");
                assert!(signed_area_deg2(&ring) > 0.0, "{case}: clockwise");
                assert_eq!(ring[0], ring[4], "{case}: not closed");
                // The ring runs first corner → across → far corner → along, or the reverse of it
                // if it had to be turned; both visit the same corners.
                let [a, b, c, d] = [ring[0], ring[1], ring[2], ring[3]];
                close(distance(a, b), width, 1e-3);
                close(distance(b, c), length, 1e-3);
                close(distance(c, d), width, 1e-3);
                close(distance(d, a), length, 1e-3);
                if width > 1.0 {
                    assert!(angle_between(azimuth(a, b), heading + 90.0) < 1e-6, "{case}");
                    assert!(angle_between(azimuth(a, d), heading) < 1e-6, "{case}");
                }
            }
        }
    }
}

#[test]
fn flight_lines_follow_the_plan() {
    let s = pasture_survey();
    let p = plan(&s);
    let v = export(&s);
    let lines: Vec<&Value> = v["features"].as_array().unwrap()[1..].iter().collect();
    assert_eq!(lines.len() as u64, p.lines.unwrap());
    let mut starts = Vec::new();
    for (i, line) in lines.iter().enumerate() {
        let number = i as u64 + 1;
        assert_eq!(line["geometry"]["type"], "LineString");
        assert_eq!(line["properties"]["line"], number);
        let forward = number % 2 == 1;
        assert_eq!(
            line["properties"]["direction"],
            if forward { "forward" } else { "reverse" }
        );
        let ends = positions(&line["geometry"]["coordinates"]);
        assert_eq!(ends.len(), 2);
        // Each line is as long as the area and reaches its extra photos, two bases (40 m) beyond
        // each end.
        assert_eq!(p.extra_photos_per_end, Some(2));
        close(distance(ends[0], ends[1]), 600.0 + 2.0 * 40.0, 1e-3);
        // Flown north (heading 0) on odd lines, south on even ones. Each line leaves the base
        // geodesic at a right angle, so its azimuth differs from the heading by the convergence
        // of the meridians, about Δλ·sin φ: 0.001° at line 5 here, well inside 0.01°.
        let flown = azimuth(ends[0], ends[1]);
        let expected = if forward { 0.0 } else { 180.0 };
        assert!(angle_between(flown, expected) < 0.01, "line {number} flown at {flown}");
        let stated = line["properties"]["azimuth_deg"].as_f64().unwrap();
        assert!(angle_between(stated, flown) < 1e-6);
        starts.push(if forward { ends[0] } else { ends[1] });
    }
    // Neighbouring lines lie one spacing apart, line 2 to the right (east) of line 1.
    for pair in starts.windows(2) {
        close(distance(pair[0], pair[1]), p.line_spacing_m, 1e-3);
    }
    assert!(starts[1][0] > starts[0][0]);
}

#[test]
fn missing_origin_or_area_gives_none_with_a_reason() {
    let cases = [
        (
            Scenario {
                survey: SurveySettings {
                    latitude_deg: None,
                    ..pasture_survey().survey
                },
                ..pasture_survey()
            },
            ExportProblem::NoOrigin,
        ),
        (
            Scenario {
                survey: SurveySettings {
                    longitude_deg: None,
                    ..pasture_survey().survey
                },
                ..pasture_survey()
            },
            ExportProblem::NoOrigin,
        ),
        (
            Scenario {
                survey: SurveySettings {
                    latitude_deg: Some(f64::NAN),
                    ..pasture_survey().survey
                },
                ..pasture_survey()
            },
            ExportProblem::NoOrigin,
        ),
        (
            Scenario {
                survey: SurveySettings {
                    area_width_m: None,
                    ..pasture_survey().survey
                },
                ..pasture_survey()
            },
            ExportProblem::NoArea,
        ),
        (
            Scenario {
                survey: SurveySettings {
                    area_length_m: None,
                    ..pasture_survey().survey
                },
                ..pasture_survey()
            },
            ExportProblem::NoArea,
        ),
        (
            Scenario {
                survey: SurveySettings {
                    area_length_m: Some(-5.0),
                    ..pasture_survey().survey
                },
                ..pasture_survey()
            },
            ExportProblem::NoArea,
        ),
    ];
    for (s, problem) in cases {
        let p = plan(&s);
        assert_eq!(survey_geojson(&inputs(&s), &p, &s.name), None);
        assert_eq!(survey_geojson_checked(&inputs(&s), &p, &s.name), Err(problem));
        assert!(problem.message().contains("give"));
    }
}

#[test]
fn areas_the_export_cannot_draw_are_refused() {
    // Across the 180° meridian (RFC 7946 §3.1.9 asks for such shapes to be cut).
    let s = Scenario {
        survey: SurveySettings {
            latitude_deg: Some(-17.0),
            longitude_deg: Some(179.9999),
            heading_deg: 0.0,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    assert_eq!(
        survey_geojson_checked(&inputs(&s), &plan(&s), &s.name),
        Err(ExportProblem::CrossesAntimeridian)
    );
    // Westward from just east of it.
    let s = Scenario {
        survey: SurveySettings {
            longitude_deg: Some(-179.9999),
            heading_deg: 180.0,
            ..s.survey
        },
        ..s
    };
    assert_eq!(
        survey_geojson_checked(&inputs(&s), &plan(&s), &s.name),
        Err(ExportProblem::CrossesAntimeridian)
    );
    // A 100 km square at 89° N reaches the pole, 111 km away.
    let s = Scenario {
        survey: SurveySettings {
            latitude_deg: Some(89.0),
            area_width_m: Some(100_000.0),
            area_length_m: Some(100_000.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    assert_eq!(
        survey_geojson_checked(&inputs(&s), &plan(&s), &s.name),
        Err(ExportProblem::NearPole)
    );
    // The same field at 89° N is fine.
    let s = Scenario {
        survey: SurveySettings {
            latitude_deg: Some(89.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    assert!(survey_geojson(&inputs(&s), &plan(&s), &s.name).is_some());
}

#[test]
fn a_clockwise_ring_is_turned() {
    // Shoelace sign (RFC 7946 §3.1.6 orientation): the unit square counter-clockwise has twice
    // its area, +2; clockwise, −2.
    let ccw = [[0.0, 0.0], [1.0, 0.0], [1.0, 1.0], [0.0, 1.0], [0.0, 0.0]];
    close(signed_area_deg2(&ccw), 2.0, 1e-15);
    let mut cw = ccw;
    cw.reverse();
    close(signed_area_deg2(&cw), -2.0, 1e-15);
    make_counter_clockwise(&mut cw);
    assert_eq!(cw, ccw);
    let mut already = ccw;
    make_counter_clockwise(&mut already);
    assert_eq!(already, ccw);
}

#[test]
fn the_scenario_name_is_escaped_by_the_json_writer() {
    let s = Scenario {
        name: "Field \"B\" <north>\n".to_string(),
        ..pasture_survey()
    };
    let v = export(&s);
    assert_eq!(v["features"][0]["properties"]["name"], "Field \"B\" <north>\n");
}

proptest! {
    // Any origin, heading and area within the contract's ranges: the export never panics, and
    // when it answers, the ring is closed, counter-clockwise and finite.
    #[test]
    fn export_is_sound_everywhere(
        lat in -89.0f64..=89.0,
        lon in -180.0f64..=180.0,
        heading in 0.0f64..=360.0,
        width in prop_oneof![Just(1.0), Just(100_000.0), 1.0f64..100_000.0],
        length in prop_oneof![Just(1.0), Just(100_000.0), 1.0f64..100_000.0],
        h in prop_oneof![Just(80.0), 20.0f64..2000.0],
    ) {
        let s = Scenario {
            height_m: h,
            ..field_at(lat, lon, heading, width, length)
        };
        let p = plan(&s);
        match survey_geojson_checked(&inputs(&s), &p, &s.name) {
            Ok(text) => {
                let v: Value = serde_json::from_str(&text).unwrap();
                let ring = area_ring(&v);
                prop_assert_eq!(ring[0], ring[4]);
                prop_assert!(signed_area_deg2(&ring) > 0.0);
                prop_assert!(ring.iter().flatten().all(|x| x.is_finite()));
                prop_assert!(ring.iter().all(|p| (-180.0..=180.0).contains(&p[0]) && (-90.0..=90.0).contains(&p[1])));
                prop_assert!(!text.contains("null") || p.lines.is_none());
            }
            Err(problem) => prop_assert!(matches!(problem, ExportProblem::NearPole | ExportProblem::CrossesAntimeridian)),
        }
    }
}
