//! QR code of a scenario link, drawn locally: the symbol comes from the `qrcodegen` library
//! (Project Nayuki, an implementation of ISO/IEC 18004), and this module only turns its modules
//! into one SVG path.

use qrcodegen::{QrCode, QrCodeEcc};
use std::fmt::Write;

/// Light modules kept around the symbol, as ISO/IEC 18004 asks.
pub const QUIET_ZONE: usize = 4;

/// A QR symbol as SVG: `size` modules square including the quiet zone, and a path of one-module-high
/// rectangles covering exactly the dark modules.
#[derive(Clone, Debug, PartialEq)]
pub struct QrSvg {
    pub size: usize,
    pub path: String,
    /// The dark modules as a grid (row-major, quiet zone included), for tests and other renderers.
    pub modules: Vec<bool>,
}

/// Encodes `text` with medium error correction; `None` when it is too long for any QR version.
///
/// The text is encoded as bytes. For a link this is the symbol `QrCode::encode_text` would make
/// (a link holds `?` and lowercase letters, outside the numeric and alphanumeric modes, so the
/// text mode also chooses bytes), and the page carries no numeric or alphanumeric encoder
/// (1.6 kB gzipped of the first load).
pub fn qr_svg(text: &str) -> Option<QrSvg> {
    let code = QrCode::encode_binary(text.as_bytes(), QrCodeEcc::Medium).ok()?;
    let n = usize::try_from(code.size()).ok()?;
    let size = n + 2 * QUIET_ZONE;
    let mut modules = vec![false; size * size];
    let mut path = String::with_capacity(n * n);
    for y in 0..n {
        // One rectangle per horizontal run of dark modules keeps the path short.
        let mut x = 0;
        while x < n {
            if !code.get_module(x as i32, y as i32) {
                x += 1;
                continue;
            }
            let start = x;
            while x < n && code.get_module(x as i32, y as i32) {
                modules[(y + QUIET_ZONE) * size + x + QUIET_ZONE] = true;
                x += 1;
            }
            let run = x - start;
            let _ = write!(path, "M{} {}h{run}v1h-{run}z", start + QUIET_ZONE, y + QUIET_ZONE);
        }
    }
    Some(QrSvg { size, path, modules })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Byte mode gives a link the very symbol the text mode would (the demo links are checked in
    /// tests/qr.rs by decoding).
    #[test]
    fn links_encode_as_the_text_mode_would() {
        for link in [
            "http://127.0.0.1:8080/?v=1&name=Hollow+Creek&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&h=80",
            "https://example.org/sharpfield/?v=1&h=120&gd=0&units=imperial",
            "HTTPS://EXAMPLE.ORG/?V=1",
            "http://127.0.0.1:8080/?v=1&name=Feld%20%C3%BCber%20dem%20Bach",
        ] {
            let text = QrCode::encode_text(link, QrCodeEcc::Medium).ok();
            let bytes = QrCode::encode_binary(link.as_bytes(), QrCodeEcc::Medium).ok();
            assert!(text.is_some() && text == bytes, "{link}");
        }
    }
}
