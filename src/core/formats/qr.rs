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
pub fn qr_svg(text: &str) -> Option<QrSvg> {
    let code = QrCode::encode_text(text, QrCodeEcc::Medium).ok()?;
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
