//! The browser shell: yew components and browser services over the pure core.
//!
//! Invariant: no physics or planning here. Components read a [`crate::core::contract::plan::Plan`] and
//! dispatch [`state::Action`]s; browser services (URL, storage, printing) never panic when the
//! browser refuses them.

pub mod app;
pub mod aside;
mod browser;
mod components;
pub mod export;
pub mod field;
mod markup;
pub mod state;
mod worker;

use wasm_bindgen::JsCast;

/// Installs the panic notice and mounts the app on `#app`.
pub fn start() {
    install_panic_notice();
    browser::register_service_worker();
    let root = web_sys::window()
        .and_then(|w| w.document())
        .and_then(|d| d.get_element_by_id("app"));
    match root {
        Some(root) => {
            yew::Renderer::<app::App>::with_root(root).render();
        }
        None => {
            yew::Renderer::<app::App>::new().render();
        }
    }
    browser::link_print_style();
}

/// A panic in WebAssembly stops the app; instead of a frozen page, show the notice that
/// index.html carries (hidden) and log the message for whoever debugs it.
fn install_panic_notice() {
    std::panic::set_hook(Box::new(|info| {
        web_sys::console::error_1(&format!("Sharpfield stopped: {info}").into());
        let notice = web_sys::window()
            .and_then(|w| w.document())
            .and_then(|d| d.get_element_by_id("crash-notice"))
            .and_then(|e| e.dyn_into::<web_sys::HtmlElement>().ok());
        if let Some(notice) = notice {
            notice.set_hidden(false);
        }
    }));
}
