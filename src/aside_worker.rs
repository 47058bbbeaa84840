//! The second on-demand module's entry point: a web worker that places the sun, draws QR codes and
//! works out the day's good hours and the best settings (`ui::aside::serve`). The page starts it
//! once its first figures are shown.

#[cfg(target_arch = "wasm32")]
fn main() {
    sharpfield::ui::aside::serve();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("sharpfield-aside is the page's second worker; it runs only in the browser.");
}
