//! QR code of a scenario link, drawn locally: the symbol comes from the `qrcodegen` library
//! (Project Nayuki, an implementation of ISO/IEC 18004), and this module only turns its modules
//! into one SVG path.

use qrcodegen::{QrCode, QrCodeEcc};

/// Light modules kept around the symbol, as ISO/IEC 18004 asks.
pub const QUIET_ZONE: usize = 4;

/// A QR symbol as SVG: `size` modules square including the quiet zone, and a path of unit squares
/// for the dark modules.
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
    let mut path = String::with_capacity(n * n * 4);
    for y in 0..n {
        for x in 0..n {
            let dark = code.get_module(x as i32, y as i32);
            if dark {
                let (px, py) = (x + QUIET_ZONE, y + QUIET_ZONE);
                modules[py * size + px] = true;
                path.push_str(&format!("M{px} {py}h1v1h-1z"));
            }
        }
    }
    Some(QrSvg { size, path, modules })
}
