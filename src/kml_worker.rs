//! A boundary-file module's entry point: a web worker that reads KML boundaries
//! (`ui::field::serve_read`). The page starts it when a person imports such a file.

#[cfg(target_arch = "wasm32")]
fn main() {
    sharpfield::ui::field::serve_read(sharpfield::core::formats::boundary::read_kml);
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("sharpfield-kml is the page's KML boundary reader; it runs only in the browser.");
}
