//! Share, save and print: the link, a QR code of it, the saved scenarios, and the printed plan.
//!
//! In parts: [`link`] (copy, system share, print, QR code), [`saved`] (the saved-scenario list)
//! and [`file`] (export and import). The saved scenarios themselves are held by one hook,
//! [`library::use_library`], the only code that writes them to storage.

mod file;
mod library;
mod link;
mod saved;

use crate::core::formats::qr::QrSvg;
use crate::ui::state::{Action, State};
use file::LibraryFile;
use library::use_library;
use link::LinkActions;
use saved::SavedList;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the share panel.
#[derive(Properties, PartialEq, Clone)]
pub struct ShareProps {
    pub state: Rc<State>,
    pub dispatch: Callback<Action>,
    /// Opens the print dialog.
    pub on_print: Callback<()>,
    /// The scenario's link and its QR code, computed once by the app.
    pub link: AttrValue,
    pub qr: Rc<Option<QrSvg>>,
}

/// The share panel.
#[function_component(SharePanel)]
pub fn share_panel(props: &ShareProps) -> Html {
    let library = use_library();
    let on_status = {
        let library = library.clone();
        Callback::from(move |message: String| library.tell(message))
    };
    html! {
        <section class="panel" id="share" aria-labelledby="share-title">
            <h2 id="share-title">{ "Share, save and print" }</h2>
            <LinkActions link={props.link.clone()} qr={props.qr.clone()} name={props.state.plan.scenario.name.clone()}
                on_print={props.on_print.clone()} {on_status} />
            if let Some(message) = library.status() { <p class="status" role="status">{ message.to_string() }</p> }
            { for library.messages().iter().map(|m| html! { <p class="error" role="alert">{ m.clone() }</p> }) }
            <SavedList state={props.state.clone()} dispatch={props.dispatch.clone()} library={library.clone()} />
            <LibraryFile {library} />
        </section>
    }
}
