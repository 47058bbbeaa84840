//! GeoJSON export of the survey (RFC 7946): the area as a polygon and each flight line as a line
//! string, in [longitude, latitude] order on WGS 84.
//!
//! Points are placed on the ellipsoid with the direct geodesic problem (GeographicLib, C. F. F.
//! Karney, "Algorithms for geodesics", J. Geodesy 87, 2013, through geographiclib-rs). The origin
//! is the area's first corner; the heading is the along-track direction (y) and +x runs across
//! the lines to the right of it (heading + 90°). A point (x, y) is reached by going x along the
//! geodesic that leaves the origin at heading + 90°, then y along the geodesic that leaves that
//! point at a right angle to the left of it. Three sides of the area and every flight line so have
//! exactly their planned lengths; on a curved surface the fourth side differs from the width by a
//! little (under a millimetre for a field of a few kilometres, centimetres at tens of kilometres).

use crate::core::planning::survey::{flies_forward, SurveyInputs, SurveyPlan};
use geographiclib_rs::{DirectGeodesic, Geodesic, InverseGeodesic};
use serde_json::{json, Map, Value};

/// The most flight lines written to one file; a plan with more is a mistake in the inputs, and the
/// area's properties say how many were left out.
const MAX_EXPORTED_LINES: u64 = 10_000;

/// Why a plan cannot be exported.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ExportProblem {
    /// The survey origin (latitude and longitude) is missing or not usable.
    NoOrigin,
    /// The area width or length is missing or not usable.
    NoArea,
    /// The area reaches a pole, where a longitude–latitude polygon does not describe it.
    NearPole,
    /// The area crosses the 180° meridian, which RFC 7946 §3.1.9 asks to be cut in two.
    CrossesAntimeridian,
    /// A computed coordinate was not a finite number.
    NotFinite,
}

impl ExportProblem {
    /// The problem in plain words, saying what to change.
    pub fn message(self) -> &'static str {
        match self {
            ExportProblem::NoOrigin => {
                "The map export needs the survey origin: give the latitude and longitude of the area's first corner (lat, lon)."
            }
            ExportProblem::NoArea => {
                "The map export needs the survey area: give its width across the lines (aw) and its length along them (al)."
            }
            ExportProblem::NearPole => {
                "The area reaches one of the poles, where a longitude–latitude outline cannot describe it; this export does not cover polar areas."
            }
            ExportProblem::CrossesAntimeridian => {
                "The area crosses the 180° meridian; GeoJSON asks for such shapes to be cut in two, which this export does not do yet."
            }
            ExportProblem::NotFinite => "The map export met a value that is not a finite number; check the inputs.",
        }
    }
}

/// A longitude difference brought into [−180°, 180°).
fn wrap180(degrees: f64) -> f64 {
    (degrees + 180.0).rem_euclid(360.0) - 180.0
}

/// An azimuth brought into [0°, 360°).
fn wrap360(degrees: f64) -> f64 {
    degrees.rem_euclid(360.0)
}

/// Twice the signed area of a ring of [longitude, latitude] positions in square degrees, by the
/// shoelace formula: positive when the ring runs counter-clockwise on a longitude–latitude plot,
/// as RFC 7946 §3.1.6 asks of an outer ring. The ring may be closed or open.
pub fn signed_area_deg2(ring: &[[f64; 2]]) -> f64 {
    let n = ring.len();
    if n < 3 {
        return 0.0;
    }
    (0..n)
        .map(|i| {
            let [x0, y0] = ring[i];
            let [x1, y1] = ring[(i + 1) % n];
            x0 * y1 - x1 * y0
        })
        .sum()
}

/// Reverses a ring that runs clockwise, so that it runs counter-clockwise (RFC 7946 §3.1.6);
/// a closed ring stays closed.
pub fn make_counter_clockwise(ring: &mut [[f64; 2]]) {
    if signed_area_deg2(ring) < 0.0 {
        ring.reverse();
    }
}

/// Local metres (x across the lines, y along them) placed on the ellipsoid.
struct Frame {
    geodesic: Geodesic,
    lat0: f64,
    lon0: f64,
    heading: f64,
}

/// A position on the ellipsoid, with its longitude kept continuous from the origin's.
#[derive(Clone, Copy)]
struct Place {
    lat: f64,
    lon: f64,
    /// The along-track azimuth at this place (heading direction), degrees.
    along_azimuth: f64,
}

impl Frame {
    /// The place x metres across the lines from the origin, on the geodesic that leaves the origin
    /// at heading + 90°.
    fn across(&self, x: f64) -> Place {
        let (lat, lon, azi): (f64, f64, f64) = self.geodesic.direct(self.lat0, self.lon0, self.heading + 90.0, x);
        Place {
            lat,
            lon: self.lon0 + wrap180(lon - self.lon0),
            // The across geodesic runs to the right of the track, so the track runs 90° to its left.
            along_azimuth: azi - 90.0,
        }
    }

    /// The place y metres along the track from `from`.
    fn along(&self, from: Place, y: f64) -> Place {
        let (lat, lon, azi): (f64, f64, f64) = self.geodesic.direct(from.lat, from.lon, from.along_azimuth, y);
        Place {
            lat,
            lon: self.lon0 + wrap180(lon - self.lon0),
            along_azimuth: azi,
        }
    }
}

impl Place {
    fn position(self) -> [f64; 2] {
        [self.lon, self.lat]
    }
}

/// The survey as a GeoJSON FeatureCollection (RFC 7946), or `None` when the origin or the area is
/// missing or the area cannot be drawn in longitude and latitude; [`survey_geojson_checked`]
/// says why.
pub fn survey_geojson(inputs: &SurveyInputs, plan: &SurveyPlan, name: &str) -> Option<String> {
    survey_geojson_checked(inputs, plan, name).ok()
}

/// Flight lines 1 to `count` as LineString features in flying order, each reaching `extension`
/// metres beyond both ends of the area (to the extra photos), each line's ends added to
/// `positions` for the checks that follow.
fn flight_lines(
    frame: &Frame,
    count: u64,
    spacing: f64,
    (length, extension): (f64, f64),
    positions: &mut Vec<[f64; 2]>,
) -> Vec<Value> {
    let mut features = Vec::new();
    for number in 1..=count {
        let edge = frame.across((number - 1) as f64 * spacing);
        let near = frame.along(edge, -extension);
        let far = frame.along(edge, length + extension);
        let forward = flies_forward(number);
        let (start, end, azimuth) = if forward {
            (near, far, near.along_azimuth)
        } else {
            (far, near, far.along_azimuth + 180.0)
        };
        positions.push(start.position());
        positions.push(end.position());
        features.push(json!({
            "type": "Feature",
            "geometry": {
                "type": "LineString",
                "coordinates": [start.position(), end.position()],
            },
            "properties": {
                "kind": "flight_line",
                "line": number,
                "direction": if forward { "forward" } else { "reverse" },
                "azimuth_deg": wrap360(azimuth),
            },
        }));
    }
    features
}

/// The survey area's properties: its name (when it has one), size, heading and the plan's figures.
fn area_properties(
    name: &str,
    width: f64,
    length: f64,
    heading: f64,
    plan: &SurveyPlan,
    lines_total: Option<u64>,
    lines_exported: u64,
) -> Map<String, Value> {
    let mut properties = Map::new();
    properties.insert("kind".into(), json!("survey_area"));
    if !name.is_empty() {
        properties.insert("name".into(), json!(name));
    }
    properties.insert("width_m".into(), json!(width));
    properties.insert("length_m".into(), json!(length));
    properties.insert("heading_deg".into(), json!(heading));
    properties.insert("line_spacing_m".into(), json!(plan.line_spacing_m));
    properties.insert("base_m".into(), json!(plan.base_m));
    properties.insert("lines".into(), json!(lines_total));
    properties.insert("lines_exported".into(), json!(lines_exported));
    properties
}

/// The origin and the area an export starts from.
struct Ready {
    lat0: f64,
    lon0: f64,
    width: f64,
    length: f64,
}

/// Whether a survey has what an export needs (an origin and an area), without computing it: the
/// problems that only the geodesics find (a pole, the 180° meridian) come with the export itself.
pub fn export_check(inputs: &SurveyInputs) -> Result<(), ExportProblem> {
    export_ready(inputs).map(|_| ())
}

fn export_ready(inputs: &SurveyInputs) -> Result<Ready, ExportProblem> {
    let lat0 = inputs.settings.latitude_deg.filter(|v| v.is_finite() && v.abs() < 90.0);
    let lon0 = inputs.settings.longitude_deg.filter(|v| v.is_finite());
    let (Some(lat0), Some(lon0)) = (lat0, lon0) else {
        return Err(ExportProblem::NoOrigin);
    };
    let usable = |v: Option<f64>| v.filter(|x| x.is_finite() && *x > 0.0);
    let (Some(width), Some(length)) = (
        usable(inputs.settings.area_width_m),
        usable(inputs.settings.area_length_m),
    ) else {
        return Err(ExportProblem::NoArea);
    };
    Ok(Ready {
        lat0,
        lon0: wrap180(lon0),
        width,
        length,
    })
}

/// The survey as a GeoJSON FeatureCollection (RFC 7946): the area polygon (one counter-clockwise
/// outer ring) and each flight line as a LineString in flying order, with the line number and
/// direction as properties. Lines are left out when the plan has no line count.
pub fn survey_geojson_checked(inputs: &SurveyInputs, plan: &SurveyPlan, name: &str) -> Result<String, ExportProblem> {
    let Ready {
        lat0,
        lon0,
        width,
        length,
    } = export_ready(inputs)?;
    let heading = if inputs.settings.heading_deg.is_finite() {
        wrap360(inputs.settings.heading_deg)
    } else {
        0.0
    };
    let frame = Frame {
        geodesic: Geodesic::wgs84(),
        lat0,
        lon0,
        heading,
    };

    let spacing = plan.line_spacing_m;
    let lines_total = plan.lines.filter(|_| spacing.is_finite() && spacing > 0.0);
    let lines_exported = lines_total.map_or(0, |n| n.min(MAX_EXPORTED_LINES));

    // Nothing drawn lies farther from the origin than the diagonal of the area widened to the last
    // line; if a pole is as near as that, the area may hold or touch it.
    let reach_x = width.max(lines_exported.saturating_sub(1) as f64 * spacing.max(0.0));
    // The lines reach their extra photos beyond both ends.
    let extension = plan.extra_photos_per_end.map_or(0.0, |e| e as f64 * plan.base_m);
    let extension = if extension.is_finite() { extension } else { 0.0 };
    let reach = reach_x.hypot(length + extension) + extension;
    let pole = 90f64.copysign(lat0);
    let pole_distance: f64 = frame.geodesic.inverse(lat0, lon0, pole, lon0);
    if pole_distance.is_nan() || pole_distance <= reach * 1.01 + 1.0 {
        return Err(ExportProblem::NearPole);
    }

    let a = frame.across(0.0);
    let b = frame.across(width);
    let c = frame.along(b, length);
    let d = frame.along(a, length);
    let mut ring = vec![a.position(), b.position(), c.position(), d.position(), a.position()];
    make_counter_clockwise(&mut ring);

    let mut features: Vec<Value> = Vec::new();
    let mut positions: Vec<[f64; 2]> = ring.clone();
    let line_features = flight_lines(&frame, lines_exported, spacing, (length, extension), &mut positions);

    if positions.iter().flatten().any(|v| !v.is_finite()) {
        return Err(ExportProblem::NotFinite);
    }
    if positions.iter().any(|p| !(-180.0..=180.0).contains(&p[0])) {
        return Err(ExportProblem::CrossesAntimeridian);
    }

    let area_properties = area_properties(name, width, length, heading, plan, lines_total, lines_exported);
    features.push(json!({
        "type": "Feature",
        "geometry": {
            "type": "Polygon",
            "coordinates": [ring],
        },
        "properties": Value::Object(area_properties),
    }));
    features.extend(line_features);

    let collection = json!({
        "type": "FeatureCollection",
        "features": features,
    });
    serde_json::to_string(&collection).map_err(|_| ExportProblem::NotFinite)
}
