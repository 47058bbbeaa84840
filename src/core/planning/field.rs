//! A survey over a real boundary (any shape, with holes): flight lines at the chosen heading, each
//! flown where the ground within half a footprint of it lies inside the boundary (the margin that
//! full side overlap needs), split where a hole is wider than that strip; the extra photos beyond
//! each end; every photo centre in flying order with its trigger distance; counts, path, turns,
//! time, batteries and storage from that geometry; the area on the WGS 84 ellipsoid; and the
//! heading that needs the fewest lines and the one with the shortest path.
//!
//! The boundary is placed in local metres by an azimuthal equidistant projection about its first
//! point (geodesics on the ellipsoid, geographiclib-rs): for a field a few kilometres across the
//! distances are true to a few parts in a million. The strip test is a polygon intersection with
//! the georust `geo` crate.
//!
//! Architecture invariant: takes a checked [`Boundary`] and any layout figures; answers with
//! finite figures or a typed reason; never panics. Runs natively (the report) and in an on-demand
//! module, never in the page's first load.

use crate::core::planning::ground::{ceil_forgiving, photos_to_margin, positive};
use crate::core::planning::survey::SurveyPlan;
use geo::{BooleanOps, BoundingRect, Coord, LineString, MultiPolygon, Polygon};
use geographiclib_rs::{DirectGeodesic, Geodesic, InverseGeodesic, PolygonArea, Winding};

/// One polygon: the outer ring and the holes (areas to skip), each as (longitude, latitude) in
/// degrees, not closed (the first point is not repeated at the end). Read and checked by
/// `formats::boundary`.
#[derive(Clone, Debug, PartialEq)]
pub struct Area {
    pub outer: Vec<[f64; 2]>,
    pub holes: Vec<Vec<[f64; 2]>>,
}

/// A survey boundary: one polygon or more.
#[derive(Clone, Debug, PartialEq)]
pub struct Boundary {
    pub areas: Vec<Area>,
}

impl Boundary {
    /// Every point of every ring.
    pub fn point_count(&self) -> usize {
        self.areas
            .iter()
            .map(|a| a.outer.len() + a.holes.iter().map(Vec::len).sum::<usize>())
            .sum()
    }
}

impl Area {
    /// The area as a geo polygon in (longitude, latitude).
    pub fn polygon(&self) -> Polygon<f64> {
        let ring = |r: &Vec<[f64; 2]>| LineString::new(r.iter().map(|p| Coord { x: p[0], y: p[1] }).collect());
        Polygon::new(ring(&self.outer), self.holes.iter().map(ring).collect())
    }
}

impl Boundary {
    /// The boundary as a geo multipolygon in (longitude, latitude).
    pub fn multi_polygon(&self) -> MultiPolygon<f64> {
        MultiPolygon::new(self.areas.iter().map(Area::polygon).collect())
    }
}

/// The most lines a boundary plan lays out (as the rectangle's survey caps its count).
pub const MAX_FIELD_LINES: usize = 2_000;
/// The most photo centres a boundary plan lists.
pub const MAX_FIELD_PHOTOS: usize = 200_000;

/// What the boundary plan takes from the survey.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FieldLayout {
    /// Flight-line heading, degrees from north.
    pub heading_deg: f64,
    pub footprint_across_m: f64,
    pub footprint_along_m: f64,
    pub base_m: f64,
    pub line_spacing_m: f64,
    pub extra_photos_per_end: u64,
    /// The speed the time is counted at (the mean of a pair of legs in a wind); `None`: no time.
    pub speed_mps: Option<f64>,
    pub turn_s: f64,
    pub endurance_s: f64,
    pub photo_mb: f64,
}

impl FieldLayout {
    /// The layout of a survey plan flown at `heading_deg`, with its time settings.
    pub fn of(plan: &SurveyPlan, heading_deg: f64, turn_s: f64, endurance_min: f64, photo_mb: f64) -> FieldLayout {
        FieldLayout {
            heading_deg,
            footprint_across_m: plan.footprint_across_m,
            footprint_along_m: plan.footprint_along_m,
            base_m: plan.base_m,
            line_spacing_m: plan.line_spacing_m,
            // As the rectangle's plan counts them, also when it has no area of its own.
            extra_photos_per_end: photos_to_margin(plan.footprint_along_m, plan.base_m).unwrap_or(0),
            speed_mps: plan.time_speed_mps,
            turn_s,
            endurance_s: endurance_min * 60.0,
            photo_mb,
        }
    }
}

/// One photo: where it is taken, on which line, in what order, and how far along the flight
/// from the first photo it is triggered.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PhotoPoint {
    pub lon: f64,
    pub lat: f64,
    /// In local metres: across the lines and along them (the layout's frame).
    pub x_m: f64,
    pub y_m: f64,
    /// The flight line (counted from 1 in flying order) and the photo's place on it (from 1).
    pub line: usize,
    pub index: usize,
    /// Distance flown from the first photo to this one, m.
    pub trigger_m: f64,
}

/// A flown stretch of a line, in local metres (x across, y along), in flying order.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Stretch {
    pub line: usize,
    pub x_m: f64,
    /// Where the stretch is entered and left (the extra photos included).
    pub from_y_m: f64,
    pub to_y_m: f64,
    /// Where it is entered and left as (longitude, latitude).
    pub ends: [[f64; 2]; 2],
}

/// The boundary plan.
#[derive(Clone, Debug, PartialEq)]
pub struct FieldPlan {
    /// The area inside the boundary (holes left out) on the WGS 84 ellipsoid, m².
    pub area_m2: f64,
    pub heading_deg: f64,
    /// Lines flown, and stretches (a line split by a hole is two).
    pub lines: usize,
    pub stretches: Vec<Stretch>,
    pub photos: usize,
    /// Distance flown: the stretches, the gaps over holes and the hops between lines.
    pub path_length_m: f64,
    /// Turns between lines.
    pub turns: usize,
    pub flight_time_s: Option<f64>,
    pub batteries: Option<u64>,
    pub storage_mb: Option<f64>,
    /// Every photo centre, in flying order.
    pub photo_points: Vec<PhotoPoint>,
    /// The boundary's rings in local metres (x across, y along), for drawing.
    pub rings_m: Vec<Vec<[f64; 2]>>,
}

/// Why the boundary cannot be planned.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FieldProblem {
    /// A footprint, the base or the spacing is not a positive number.
    Layout,
    /// More than [`MAX_FIELD_LINES`] lines or [`MAX_FIELD_PHOTOS`] photos.
    TooLarge,
    /// The boundary is too large for the local projection (over 100 km from its first point).
    TooWide,
}

impl FieldProblem {
    pub fn message(self) -> &'static str {
        match self {
            FieldProblem::Layout => {
                "The boundary cannot be laid out: the photo footprint, base or line spacing is zero."
            }
            FieldProblem::TooLarge => {
                "The boundary needs more lines or photos than the planner lays out: split it or fly higher."
            }
            FieldProblem::TooWide => {
                "The boundary reaches more than 100 km from its first point: split it into fields."
            }
        }
    }
}

/// The local frame: an azimuthal equidistant projection about `origin`, turned so that y runs
/// along the heading and x across it, to the right.
struct Frame {
    geodesic: Geodesic,
    lon0: f64,
    lat0: f64,
    heading: f64,
}

impl Frame {
    fn to_local(&self, lon: f64, lat: f64) -> [f64; 2] {
        let (s, azi, _, _): (f64, f64, f64, f64) = self.geodesic.inverse(self.lat0, self.lon0, lat, lon);
        let (sin, cos) = (azi - self.heading).to_radians().sin_cos();
        [s * sin, s * cos]
    }

    fn to_lon_lat(&self, x: f64, y: f64) -> [f64; 2] {
        let s = x.hypot(y);
        let azi = self.heading + x.atan2(y).to_degrees();
        let (lat, lon): (f64, f64) = self.geodesic.direct(self.lat0, self.lon0, azi, s);
        [lon, lat]
    }
}

/// The area of the boundary on the ellipsoid (holes subtracted), m².
pub fn area_m2(boundary: &Boundary) -> f64 {
    let geodesic = Geodesic::wgs84();
    let ring_area = |ring: &Vec<[f64; 2]>| {
        let mut polygon = PolygonArea::new(&geodesic, Winding::CounterClockwise);
        for p in ring {
            polygon.add_point(p[1], p[0]);
        }
        let (_, area, _) = polygon.compute(true);
        area.abs()
    };
    boundary
        .areas
        .iter()
        .map(|a| ring_area(&a.outer) - a.holes.iter().map(ring_area).sum::<f64>())
        .sum()
}

/// Plans the boundary at `layout.heading_deg`.
pub fn plan_field(boundary: &Boundary, layout: &FieldLayout) -> Result<FieldPlan, FieldProblem> {
    lay_out(boundary, layout, true)
}

/// [`plan_field`]; with `place` false the photo centres and stretch ends are left unplaced on the
/// ellipsoid (NaN longitude and latitude): the heading search needs only the counts and the path,
/// and placing every photo by a geodesic for each heading tried would be most of its work.
fn lay_out(boundary: &Boundary, layout: &FieldLayout, place: bool) -> Result<FieldPlan, FieldProblem> {
    let to_lon_lat = |frame: &Frame, x: f64, y: f64| {
        if place {
            frame.to_lon_lat(x, y)
        } else {
            [f64::NAN; 2]
        }
    };
    let usable = |x: f64| positive(x).is_some();
    let steps = [
        layout.footprint_across_m,
        layout.footprint_along_m,
        layout.base_m,
        layout.line_spacing_m,
    ];
    if !steps.iter().all(|x| usable(*x)) || !layout.heading_deg.is_finite() {
        return Err(FieldProblem::Layout);
    }
    let first = boundary
        .areas
        .first()
        .and_then(|a| a.outer.first())
        .copied()
        .ok_or(FieldProblem::Layout)?;
    let frame = Frame {
        geodesic: Geodesic::wgs84(),
        lon0: first[0],
        lat0: first[1],
        heading: layout.heading_deg,
    };
    let mut rings_m = Vec::new();
    let mut polygons = Vec::new();
    for area in &boundary.areas {
        let mut ring = |r: &Vec<[f64; 2]>| -> Result<LineString<f64>, FieldProblem> {
            let local: Vec<[f64; 2]> = r.iter().map(|p| frame.to_local(p[0], p[1])).collect();
            if local.iter().flatten().any(|v| !v.is_finite() || v.abs() > 100_000.0) {
                return Err(FieldProblem::TooWide);
            }
            let line = LineString::new(local.iter().map(|p| Coord { x: p[0], y: p[1] }).collect());
            rings_m.push(local);
            Ok(line)
        };
        let outer = ring(&area.outer)?;
        let holes = area.holes.iter().map(&mut ring).collect::<Result<Vec<_>, _>>()?;
        polygons.push(Polygon::new(outer, holes));
    }
    let shape = MultiPolygon::new(polygons);
    let bounds = shape.bounding_rect().ok_or(FieldProblem::Layout)?;
    let (x_min, x_max) = (bounds.min().x, bounds.max().x);
    let (y_min, y_max) = (bounds.min().y - 1.0, bounds.max().y + 1.0);
    let spacing = layout.line_spacing_m;
    let count = ceil_forgiving((x_max - x_min) / spacing) + 1.0;
    if count.is_nan() || count > MAX_FIELD_LINES as f64 {
        return Err(FieldProblem::TooLarge);
    }
    let half_across = 0.5 * layout.footprint_across_m;
    let base = layout.base_m;
    let extras = layout.extra_photos_per_end as f64;
    let extension = extras * base;

    // Each line's stretches along y: the y extents of the boundary within half a footprint of it,
    // merged where they overlap once the extra photos are added.
    let mut lines: Vec<(f64, Vec<(f64, f64)>)> = Vec::new();
    for k in 0..count as usize {
        let x = x_min + k as f64 * spacing;
        let strip = Polygon::new(
            LineString::new(vec![
                Coord {
                    x: x - half_across,
                    y: y_min,
                },
                Coord {
                    x: x + half_across,
                    y: y_min,
                },
                Coord {
                    x: x + half_across,
                    y: y_max,
                },
                Coord {
                    x: x - half_across,
                    y: y_max,
                },
            ]),
            vec![],
        );
        let pieces = shape.intersection(&MultiPolygon::new(vec![strip]));
        let mut spans: Vec<(f64, f64)> = pieces
            .0
            .iter()
            .filter_map(|p| p.bounding_rect())
            .filter(|r| r.height() > 0.0 || r.width() > 0.0)
            .map(|r| (r.min().y - extension, r.max().y + extension))
            .collect();
        crate::core::physics::sort_short(&mut spans, |a, b| a.0 < b.0);
        let mut merged: Vec<(f64, f64)> = Vec::new();
        for (lo, hi) in spans {
            match merged.last_mut() {
                Some(last) if lo <= last.1 => last.1 = last.1.max(hi),
                _ => merged.push((lo, hi)),
            }
        }
        if !merged.is_empty() {
            lines.push((x, merged));
        }
    }

    // Fly the lines in a serpentine: the first along the heading, the next back, and so on.
    let mut stretches = Vec::new();
    let mut photo_points = Vec::new();
    let mut path = 0.0;
    let mut at: Option<[f64; 2]> = None;
    for (n, (x, spans)) in lines.iter().enumerate() {
        let forward = n % 2 == 0;
        let ordered: Vec<(f64, f64)> = if forward {
            spans.clone()
        } else {
            spans.iter().rev().map(|&(lo, hi)| (hi, lo)).collect()
        };
        let mut index = 0;
        for (from, to) in ordered {
            if let Some(p) = at {
                path += (p[0] - x).hypot(p[1] - from);
            }
            let length = (to - from).abs();
            let direction = if forward { 1.0 } else { -1.0 };
            // Stations between the area's ends (ceil(length/B) + 1, less the extras' span) and the
            // extras: from the stretch's entry, a base apart.
            let inner = (length - 2.0 * extension).max(0.0);
            let photos = ceil_forgiving(inner / base) + 1.0 + 2.0 * extras;
            if photo_points.len() as f64 + photos > MAX_FIELD_PHOTOS as f64 {
                return Err(FieldProblem::TooLarge);
            }
            for i in 0..photos as usize {
                let y = from + direction * i as f64 * base;
                index += 1;
                let [lon, lat] = to_lon_lat(&frame, *x, y);
                photo_points.push(PhotoPoint {
                    lon,
                    lat,
                    x_m: *x,
                    y_m: y,
                    line: n + 1,
                    index,
                    trigger_m: path + i as f64 * base,
                });
            }
            let flown = length.max((photos - 1.0) * base);
            path += flown;
            let end = from + direction * flown;
            stretches.push(Stretch {
                line: n + 1,
                x_m: *x,
                from_y_m: from,
                to_y_m: end,
                ends: [to_lon_lat(&frame, *x, from), to_lon_lat(&frame, *x, end)],
            });
            at = Some([*x, end]);
        }
    }
    let turns = lines.len().saturating_sub(1);
    let flight_time_s = layout
        .speed_mps
        .filter(|v| usable(*v))
        .map(|v| path / v + turns as f64 * layout.turn_s.max(0.0))
        .filter(|t| t.is_finite());
    let batteries = match flight_time_s {
        Some(t) if usable(layout.endurance_s) => Some(ceil_forgiving(t / layout.endurance_s).max(1.0) as u64),
        _ => None,
    };
    let storage_mb =
        (layout.photo_mb.is_finite() && layout.photo_mb >= 0.0).then_some(photo_points.len() as f64 * layout.photo_mb);
    Ok(FieldPlan {
        area_m2: area_m2(boundary),
        heading_deg: layout.heading_deg,
        lines: lines.len(),
        stretches,
        photos: photo_points.len(),
        path_length_m: path,
        turns,
        flight_time_s,
        batteries,
        storage_mb,
        photo_points,
        rings_m,
    })
}

/// A heading and what flying it takes.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct HeadingChoice {
    pub heading_deg: f64,
    pub lines: usize,
    pub path_length_m: f64,
}

/// The headings that need the fewest lines (the shorter path among equals) and the shortest path
/// (the fewer lines among equals), trying every 5° and the direction of every outer edge.
pub fn suggest_headings(boundary: &Boundary, layout: &FieldLayout) -> Option<(HeadingChoice, HeadingChoice)> {
    let mut headings: Vec<f64> = (0..36).map(|k| k as f64 * 5.0).collect();
    let geodesic = Geodesic::wgs84();
    for area in &boundary.areas {
        for (a, b) in area
            .outer
            .iter()
            .zip(area.outer.iter().cycle().skip(1))
            .take(area.outer.len())
        {
            let (_, azi, _, _): (f64, f64, f64, f64) = geodesic.inverse(a[1], a[0], b[1], b[0]);
            if azi.is_finite() {
                headings.push(azi.rem_euclid(180.0));
            }
        }
    }
    let mut fewest: Option<HeadingChoice> = None;
    let mut shortest: Option<HeadingChoice> = None;
    for heading_deg in headings {
        let Ok(plan) = lay_out(boundary, &FieldLayout { heading_deg, ..*layout }, false) else {
            continue;
        };
        let choice = HeadingChoice {
            heading_deg,
            lines: plan.lines,
            path_length_m: plan.path_length_m,
        };
        let better_lines = |c: &HeadingChoice| (choice.lines, choice.path_length_m) < (c.lines, c.path_length_m);
        let better_path = |c: &HeadingChoice| (choice.path_length_m, choice.lines) < (c.path_length_m, c.lines);
        if fewest.as_ref().is_none_or(better_lines) {
            fewest = Some(choice);
        }
        if shortest.as_ref().is_none_or(better_path) {
            shortest = Some(choice);
        }
    }
    fewest.zip(shortest)
}
