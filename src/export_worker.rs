//! The on-demand module's entry point: a web worker that answers export requests
//! (`ui::export::serve`). Loaded by the page the first time a person asks for an export.

#[cfg(target_arch = "wasm32")]
fn main() {
    sharpfield::ui::export::serve();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("sharpfield-export is the page's export worker; it runs only in the browser.");
}
