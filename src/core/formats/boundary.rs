//! Survey boundaries: the `field` key's text (WGS 84 `lon lat` points, `,` between points, `;`
//! between the rings of a polygon (the outer ring first, then its holes), `|` between polygons),
//! and boundary files read with the georust crates: GeoJSON (RFC 7946, the `geojson` crate) and
//! OGC KML (the `kml` crate). Every reader checks what it reads (rings of three points or more,
//! coordinates in range, no ring crossing itself or another, nothing across the 180° meridian, not
//! too many points) and answers with a [`BoundaryProblem`] that says what is wrong and where.
//!
//! Architecture invariant: no reader panics on any text; the readers run natively (the report)
//! and in an on-demand module, never in the page's first load.

use geo::algorithm::coordinate_position::{CoordPos, CoordinatePosition};
use geo::algorithm::line_intersection::{line_intersection, LineIntersection};
use geo::{Coord, Line};

/// The most points a boundary may have in all its rings: a field traced by hand or by a
/// receiver walked around it needs a few hundred; a file with more is likely a detailed map layer.
pub const MAX_POINTS: usize = 5_000;

/// The boundary's types live with its planning (the planning layer lies below this one).
pub use crate::core::planning::field::{Area, Boundary};

/// Where in a boundary a problem lies.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Place {
    /// The polygon, counted from 1.
    pub polygon: usize,
    /// The ring: 0 the outer ring, k the k-th hole.
    pub ring: usize,
}

/// What is wrong with a boundary, and where.
#[derive(Clone, Debug, PartialEq)]
pub enum BoundaryProblem {
    /// The text is not what the reader takes (with the reader's own words).
    NotReadable { format: &'static str, detail: String },
    /// The file holds no polygon (it names what it does hold, if anything).
    NoPolygon { found: String },
    /// A point is not two numbers (the `field` text).
    NotAPoint { place: Place, point: usize, text: String },
    /// A coordinate is out of range or not finite.
    OutOfRange {
        place: Place,
        point: usize,
        lon: f64,
        lat: f64,
    },
    /// A ring has fewer than three distinct points.
    TooFewPoints { place: Place },
    /// More than [`MAX_POINTS`] points in all.
    TooManyPoints { count: usize },
    /// A ring steps across the 180° meridian.
    CrossesAntimeridian { place: Place },
    /// A ring crosses itself.
    SelfIntersecting { place: Place },
    /// Rings of a polygon cross each other, or a hole lies outside its outer ring.
    RingsCross { polygon: usize },
}

/// "the outer ring of polygon 2", "hole 1 of polygon 1", "the outer ring".
fn place_words(place: Place, polygons: usize) -> String {
    let ring = match place.ring {
        0 => "the outer ring".to_string(),
        k => format!("hole {k}"),
    };
    if polygons > 1 || place.polygon > 1 {
        format!("{ring} of polygon {}", place.polygon)
    } else {
        ring
    }
}

impl BoundaryProblem {
    /// The problem in words, saying where it lies; `polygons` is how many the boundary has.
    pub fn message(&self) -> String {
        let words = |p: &Place| place_words(*p, 1);
        match self {
            BoundaryProblem::NotReadable { format, detail } => format!("This is not a {format} file the planner can read: {detail}."),
            BoundaryProblem::NoPolygon { found } => format!(
                "The file holds no polygon to survey ({found}); a boundary is a Polygon or MultiPolygon (GeoJSON) or a Polygon (KML)."
            ),
            BoundaryProblem::NotAPoint { place, point, text } => format!(
                "Point {point} of {} ('{text}') is not a longitude and a latitude: write each point as 'lon lat', points separated by commas.",
                words(place)
            ),
            BoundaryProblem::OutOfRange { place, point, lon, lat } => format!(
                "Point {point} of {} ({lon}, {lat}) is out of range: longitude from -180 to 180, latitude from -90 to 90 degrees (GeoJSON and KML write longitude first).",
                words(place)
            ),
            BoundaryProblem::TooFewPoints { place } => {
                format!("{} has fewer than three distinct points: it encloses no area.", capital(&words(place)))
            }
            BoundaryProblem::TooManyPoints { count } => format!(
                "The boundary has {count} points, more than the {MAX_POINTS} the planner takes: simplify it in the tool it came from."
            ),
            BoundaryProblem::CrossesAntimeridian { place } => format!(
                "{} crosses the 180° meridian; the planner takes areas on one side of it only.",
                capital(&words(place))
            ),
            BoundaryProblem::SelfIntersecting { place } => {
                format!("{} crosses itself: trace the boundary once around, without loops.", capital(&words(place)))
            }
            BoundaryProblem::RingsCross { polygon } => format!(
                "The rings of polygon {polygon} cross each other, or a hole lies outside the outer ring."
            ),
        }
    }
}

/// `text` with its first letter in capitals (ASCII: see DEVELOPERS.md on case tables).
fn capital(text: &str) -> String {
    let mut out = text.to_string();
    if let Some(first) = out.get_mut(0..1) {
        first.make_ascii_uppercase();
    }
    out
}

/// A ring without its closing point (the first repeated at the end), as the readers give it.
fn open_ring(mut ring: Vec<[f64; 2]>) -> Vec<[f64; 2]> {
    if ring.len() > 1 && ring.first() == ring.last() {
        ring.pop();
    }
    ring
}

impl Boundary {
    /// The `field` key's text: `lon lat` points joined by `,`, rings by `;`, polygons by `|`.
    pub fn to_text(&self) -> String {
        let ring = |r: &Vec<[f64; 2]>| {
            r.iter()
                .map(|p| format!("{} {}", p[0], p[1]))
                .collect::<Vec<_>>()
                .join(",")
        };
        self.areas
            .iter()
            .map(|a| {
                std::iter::once(&a.outer)
                    .chain(a.holes.iter())
                    .map(ring)
                    .collect::<Vec<_>>()
                    .join(";")
            })
            .collect::<Vec<_>>()
            .join("|")
    }

    /// Reads the `field` key's text (also what a person pastes), then checks it.
    pub fn from_text(text: &str) -> Result<Boundary, BoundaryProblem> {
        let mut areas = Vec::new();
        for (p, polygon) in text.split('|').enumerate() {
            let mut rings = Vec::new();
            for (r, ring) in polygon.split(';').enumerate() {
                let place = Place {
                    polygon: p + 1,
                    ring: r,
                };
                let mut points = Vec::new();
                for (i, point) in ring.split(',').enumerate() {
                    let numbers: Vec<f64> = point.split_whitespace().filter_map(|n| n.parse().ok()).collect();
                    match (&numbers[..], point.split_whitespace().count()) {
                        ([lon, lat], 2) | ([lon, lat, _], 3) => points.push([*lon, *lat]),
                        _ => {
                            return Err(BoundaryProblem::NotAPoint {
                                place,
                                point: i + 1,
                                text: point.trim().chars().take(40).collect(),
                            })
                        }
                    }
                }
                rings.push(open_ring(points));
            }
            let mut rings = rings.into_iter();
            let outer = rings.next().unwrap_or_default();
            areas.push(Area {
                outer,
                holes: rings.collect(),
            });
        }
        Boundary { areas }.checked()
    }

    /// Checks the boundary: see the module's description.
    pub fn checked(mut self) -> Result<Boundary, BoundaryProblem> {
        // A point repeated at once (common in traced files) is one point.
        for area in &mut self.areas {
            for ring in std::iter::once(&mut area.outer).chain(area.holes.iter_mut()) {
                ring.dedup();
                *ring = open_ring(std::mem::take(ring));
            }
        }
        let count = self.point_count();
        if count > MAX_POINTS {
            return Err(BoundaryProblem::TooManyPoints { count });
        }
        if self.areas.is_empty() {
            return Err(BoundaryProblem::NoPolygon {
                found: "nothing".to_string(),
            });
        }
        for (p, area) in self.areas.iter().enumerate() {
            for (r, ring) in std::iter::once(&area.outer).chain(area.holes.iter()).enumerate() {
                let place = Place {
                    polygon: p + 1,
                    ring: r,
                };
                check_ring(ring, place)?;
            }
            check_rings(area, p + 1)?;
        }
        Ok(self)
    }
}

/// The segments of a closed ring, with their ring and place in it.
fn segments(ring: &[[f64; 2]], which: usize, out: &mut Vec<(usize, usize, Line<f64>)>) {
    let n = ring.len();
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        out.push((
            which,
            i,
            Line::new(Coord { x: a[0], y: a[1] }, Coord { x: b[0], y: b[1] }),
        ));
    }
}

/// Whether segments `i` and `j` of a ring of `n` share an end by being neighbours.
fn neighbours(i: usize, j: usize, n: usize) -> bool {
    i.abs_diff(j) == 1 || i.abs_diff(j) == n - 1
}

/// The polygon's rings against each other and themselves (geo's segment intersection): no ring
/// crosses or touches itself, no two rings meet, every hole lies inside the outer ring. A sweep
/// over the segments sorted by their least longitude keeps it near n log n.
fn check_rings(area: &Area, polygon: usize) -> Result<(), BoundaryProblem> {
    let rings: Vec<&Vec<[f64; 2]>> = std::iter::once(&area.outer).chain(area.holes.iter()).collect();
    let mut all = Vec::new();
    for (k, ring) in rings.iter().enumerate() {
        segments(ring, k, &mut all);
    }
    let min_x = |l: &Line<f64>| l.start.x.min(l.end.x);
    let max_x = |l: &Line<f64>| l.start.x.max(l.end.x);
    all.sort_unstable_by(|a, b| min_x(&a.2).total_cmp(&min_x(&b.2)));
    for (at, &(ring_a, i, a)) in all.iter().enumerate() {
        for &(ring_b, j, b) in all[at + 1..].iter() {
            if min_x(&b) > max_x(&a) {
                break;
            }
            let Some(meet) = line_intersection(a, b) else { continue };
            if ring_a == ring_b {
                let n = rings[ring_a].len();
                // Neighbours meet at their shared corner; anything more is a crossing.
                let touching_corner = matches!(meet, LineIntersection::SinglePoint { is_proper: false, .. });
                if neighbours(i, j, n) && touching_corner {
                    continue;
                }
                return Err(BoundaryProblem::SelfIntersecting {
                    place: Place { polygon, ring: ring_a },
                });
            }
            return Err(BoundaryProblem::RingsCross { polygon });
        }
    }
    let outer = Area {
        outer: area.outer.clone(),
        holes: vec![],
    }
    .polygon();
    for hole in &area.holes {
        let inside = hole
            .first()
            .is_some_and(|p| outer.coordinate_position(&Coord { x: p[0], y: p[1] }) == CoordPos::Inside);
        if !inside {
            return Err(BoundaryProblem::RingsCross { polygon });
        }
    }
    Ok(())
}

/// A ring's own checks: finite, in range, three distinct points, not across the 180° meridian.
fn check_ring(ring: &[[f64; 2]], place: Place) -> Result<(), BoundaryProblem> {
    for (i, &[lon, lat]) in ring.iter().enumerate() {
        if !(lon.is_finite() && lat.is_finite() && (-180.0..=180.0).contains(&lon) && (-90.0..=90.0).contains(&lat)) {
            return Err(BoundaryProblem::OutOfRange {
                place,
                point: i + 1,
                lon,
                lat,
            });
        }
    }
    let mut distinct: Vec<[f64; 2]> = Vec::new();
    for p in ring {
        if !distinct.contains(p) {
            distinct.push(*p);
        }
    }
    if distinct.len() < 3 {
        return Err(BoundaryProblem::TooFewPoints { place });
    }
    // A step of more than 180° in longitude is shorter the other way round: across the meridian.
    let closed = ring.iter().zip(ring.iter().cycle().skip(1));
    if closed.take(ring.len()).any(|(a, b)| (a[0] - b[0]).abs() > 180.0) {
        return Err(BoundaryProblem::CrossesAntimeridian { place });
    }
    Ok(())
}

// ---------------------------------------------------------------------------------------------
// Files

/// A ring of GeoJSON positions as (lon, lat) pairs; a position with fewer than two numbers is NaN
/// (refused by the checks with its place).
fn geojson_ring(ring: &[::geojson::Position]) -> Vec<[f64; 2]> {
    let ring = ring
        .iter()
        .map(|p| match p.as_slice() {
            [lon, lat, ..] => [*lon, *lat],
            _ => [f64::NAN, f64::NAN],
        })
        .collect();
    open_ring(ring)
}

fn geojson_polygon(rings: &[Vec<::geojson::Position>]) -> Area {
    let mut rings = rings.iter().map(|r| geojson_ring(r));
    Area {
        outer: rings.next().unwrap_or_default(),
        holes: rings.collect(),
    }
}

/// The polygons of a GeoJSON geometry, and the names of what else it holds.
fn geojson_geometry(value: &::geojson::GeometryValue, areas: &mut Vec<Area>, other: &mut Vec<&'static str>) {
    use ::geojson::GeometryValue as G;
    match value {
        G::Polygon { coordinates } => areas.push(geojson_polygon(coordinates)),
        G::MultiPolygon { coordinates } => areas.extend(coordinates.iter().map(|p| geojson_polygon(p))),
        G::GeometryCollection { geometries } => {
            for g in geometries {
                geojson_geometry(&g.value, areas, other);
            }
        }
        g => other.push(g.type_name()),
    }
}

/// What was found instead of a polygon, in words.
fn found_words(other: &[&str]) -> String {
    if other.is_empty() {
        "no geometry".to_string()
    } else {
        let mut names: Vec<&str> = Vec::new();
        for o in other {
            if !names.contains(o) {
                names.push(o);
            }
        }
        format!("only {}", names.join(", "))
    }
}

/// Reads a GeoJSON text (a geometry, a feature or a feature collection): every Polygon and
/// MultiPolygon in it, other geometries ignored.
pub fn read_geojson(text: &str) -> Result<Boundary, BoundaryProblem> {
    let parsed: ::geojson::GeoJson = text
        .parse()
        .map_err(|e: ::geojson::Error| BoundaryProblem::NotReadable {
            format: "GeoJSON",
            detail: e.to_string(),
        })?;
    let (mut areas, mut other) = (Vec::new(), Vec::new());
    match &parsed {
        ::geojson::GeoJson::Geometry(g) => geojson_geometry(&g.value, &mut areas, &mut other),
        ::geojson::GeoJson::Feature(f) => {
            if let Some(g) = &f.geometry {
                geojson_geometry(&g.value, &mut areas, &mut other)
            }
        }
        ::geojson::GeoJson::FeatureCollection(c) => {
            for g in c.features.iter().filter_map(|f| f.geometry.as_ref()) {
                geojson_geometry(&g.value, &mut areas, &mut other);
            }
        }
    }
    if areas.is_empty() {
        return Err(BoundaryProblem::NoPolygon {
            found: found_words(&other),
        });
    }
    Boundary { areas }.checked()
}

fn kml_ring(ring: &::kml::types::LinearRing<f64>) -> Vec<[f64; 2]> {
    open_ring(ring.coords.iter().map(|c| [c.x, c.y]).collect())
}

fn kml_geometry(geometry: &::kml::types::Geometry<f64>, areas: &mut Vec<Area>, other: &mut Vec<&'static str>) {
    use ::kml::types::Geometry as G;
    match geometry {
        G::Polygon(p) => areas.push(Area {
            outer: kml_ring(&p.outer),
            holes: p.inner.iter().map(kml_ring).collect(),
        }),
        G::MultiGeometry(m) => {
            for g in &m.geometries {
                kml_geometry(g, areas, other);
            }
        }
        G::Point(_) => other.push("Point"),
        G::LineString(_) => other.push("LineString"),
        G::LinearRing(_) => other.push("LinearRing"),
        _ => other.push("Model"),
    }
}

fn kml_element(element: &::kml::Kml<f64>, areas: &mut Vec<Area>, other: &mut Vec<&'static str>) {
    use ::kml::Kml as K;
    match element {
        K::KmlDocument(d) => d.elements.iter().for_each(|e| kml_element(e, areas, other)),
        K::Document { elements, .. } => elements.iter().for_each(|e| kml_element(e, areas, other)),
        K::Folder(f) => f.elements.iter().for_each(|e| kml_element(e, areas, other)),
        K::Placemark(p) => {
            if let Some(g) = &p.geometry {
                kml_geometry(g, areas, other)
            }
        }
        K::Polygon(p) => kml_geometry(&::kml::types::Geometry::Polygon(p.clone()), areas, other),
        K::MultiGeometry(m) => kml_geometry(&::kml::types::Geometry::MultiGeometry(m.clone()), areas, other),
        K::Point(_) => other.push("Point"),
        K::LineString(_) => other.push("LineString"),
        _ => {}
    }
}

/// Checks that `text` is well-formed XML (every element closed, in order), saying where it is
/// not: the kml crate does not return on some truncated files.
fn well_formed(text: &str) -> Result<(), String> {
    use quick_xml::events::Event;
    let mut reader = quick_xml::Reader::from_str(text);
    let mut open: usize = 0;
    loop {
        match reader.read_event() {
            Ok(Event::Start(_)) => open += 1,
            Ok(Event::End(_)) => open = open.saturating_sub(1),
            Ok(Event::Eof) if open == 0 => return Ok(()),
            Ok(Event::Eof) => return Err(format!("{open} element(s) are not closed at the end of the file")),
            Ok(_) => {}
            Err(e) => return Err(format!("{e} (at byte {})", reader.error_position())),
        }
    }
}

/// Reads an OGC KML text: every Polygon in it (in placemarks, folders, documents and multi
/// geometries), other geometries ignored.
pub fn read_kml(text: &str) -> Result<Boundary, BoundaryProblem> {
    well_formed(text).map_err(|detail| BoundaryProblem::NotReadable { format: "KML", detail })?;
    let parsed: ::kml::Kml<f64> = text.parse().map_err(|e: ::kml::Error| BoundaryProblem::NotReadable {
        format: "KML",
        detail: e.to_string(),
    })?;
    let (mut areas, mut other) = (Vec::new(), Vec::new());
    kml_element(&parsed, &mut areas, &mut other);
    if areas.is_empty() {
        return Err(BoundaryProblem::NoPolygon {
            found: found_words(&other),
        });
    }
    Boundary { areas }.checked()
}

/// Reads a boundary file by its name's ending (`.geojson`/`.json`, `.kml`), or, without one, by
/// its first character (`{` GeoJSON, `<` KML), or as pasted `lon lat` points.
pub fn read_file(name: &str, text: &str) -> Result<Boundary, BoundaryProblem> {
    let name = name.to_ascii_lowercase();
    let start = text.trim_start().chars().next();
    if name.ends_with(".kml") || (!name.ends_with("json") && start == Some('<')) {
        read_kml(text)
    } else if name.ends_with("json") || start == Some('{') {
        read_geojson(text)
    } else {
        Boundary::from_text(text.trim())
    }
}
