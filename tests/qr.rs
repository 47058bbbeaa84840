//! The QR code of a scenario link, checked by decoding it with an independent decoder: `rqrr`
//! (a Rust port of the quirc QR decoder), which shares no code with the encoder we use
//! (`qrcodegen`, Project Nayuki).

use sharpfield::core::formats::qr::{qr_svg, QUIET_ZONE};
use sharpfield::core::presets::demo;

/// Renders the module grid at `scale` pixels per module and decodes it with rqrr.
fn decode(modules: &[bool], size: usize, scale: usize) -> Vec<String> {
    let px = size * scale;
    let mut image = rqrr::PreparedImage::prepare_from_greyscale(px, px, |x, y| {
        if modules[(y / scale) * size + x / scale] {
            0
        } else {
            255
        }
    });
    image
        .detect_grids()
        .into_iter()
        .filter_map(|grid| grid.decode().ok().map(|(_, text)| text))
        .collect()
}

fn check_round_trip(text: &str) {
    let qr = qr_svg(text).expect("a link of this length fits a QR code");
    assert_eq!(qr.modules.len(), qr.size * qr.size);
    // ISO/IEC 18004: version v has 4v + 17 modules a side; the quiet zone adds 4 on each side.
    let symbol = qr.size - 2 * QUIET_ZONE;
    assert_eq!((symbol - 17) % 4, 0, "symbol size {symbol} is not 4v + 17");
    // Decode what the SVG path paints, not the encoder's own grid.
    let mut grid = vec![false; qr.size * qr.size];
    for (x, y) in painted(&qr.path) {
        grid[y * qr.size + x] = true;
    }
    assert_eq!(decode(&grid, qr.size, 4), vec![text.to_string()]);
}

#[test]
fn demo_links_decode_back_to_the_same_link() {
    for scenario in demo::all() {
        check_round_trip(&format!("http://127.0.0.1:8080/?{}", scenario.to_query()));
    }
}

#[test]
fn short_and_unicode_texts_decode_back() {
    check_round_trip("https://example.org/?v=1");
    check_round_trip("http://127.0.0.1:8080/?v=1&name=Feld%20%C3%BCber%20dem%20Bach");
}

/// The modules the SVG path paints: each `M{x} {y}h{run}v1h-{run}z` covers `run` modules of row y.
fn painted(path: &str) -> Vec<(usize, usize)> {
    let mut out = Vec::new();
    for piece in path.split('M').filter(|p| !p.is_empty()) {
        let (corner, rest) = piece.split_once('h').expect("a run starts with h");
        let (x, y) = corner.split_once(' ').expect("x and y");
        let (x, y): (usize, usize) = (x.parse().expect("x"), y.parse().expect("y"));
        let run: usize = rest.split('v').next().and_then(|r| r.parse().ok()).expect("run length");
        assert_eq!(rest, format!("{run}v1h-{run}z"), "a run is a one-module-high rectangle");
        out.extend((x..x + run).map(|px| (px, y)));
    }
    out
}

#[test]
fn svg_path_paints_exactly_the_dark_modules() {
    let qr = qr_svg("http://127.0.0.1:8080/?v=1&h=80").expect("fits");
    let mut drawn = painted(&qr.path);
    drawn.sort_by_key(|&(x, y)| (y, x));
    let dark: Vec<(usize, usize)> = (0..qr.size * qr.size)
        .filter(|i| qr.modules[*i])
        .map(|i| (i % qr.size, i / qr.size))
        .collect();
    assert_eq!(drawn, dark);
    // The quiet zone stays light on every side.
    let inside = QUIET_ZONE..qr.size - QUIET_ZONE;
    assert!(drawn.iter().all(|(x, y)| inside.contains(x) && inside.contains(y)));
}

#[test]
fn text_too_long_for_any_version_gives_none_not_a_panic() {
    // Version 40 at medium error correction holds 2331 bytes (ISO/IEC 18004 Table 7).
    assert!(qr_svg(&"x".repeat(2331)).is_some());
    assert!(qr_svg(&"x".repeat(5000)).is_none());
}
