//! The third on-demand module's entry point: a web worker that lays out a survey over a real
//! boundary and draws it (`ui::field::serve`). The page starts it when a boundary is given.

#[cfg(target_arch = "wasm32")]
fn main() {
    sharpfield::ui::field::serve();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("sharpfield-field is the page's boundary worker; it runs only in the browser.");
}
