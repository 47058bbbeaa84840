//! The WebAssembly entry point: installs the panic notice and mounts the app.

#[cfg(target_arch = "wasm32")]
fn main() {
    sharpfield::ui::start();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("sharpfield is a browser app: serve it with the README's serve command, or run `cargo run --example report -- 'QUERY'` for the report.");
}
