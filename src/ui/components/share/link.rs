//! The scenario's link: copy it, hand it to the system share sheet, print the plan, or scan its
//! QR code.

use crate::core::formats::qr::QrSvg;
use crate::ui::browser;
use std::rc::Rc;
use yew::prelude::*;

/// Properties of the link actions.
#[derive(Properties, PartialEq, Clone)]
pub struct LinkProps {
    /// The scenario's link and its QR code, computed once by the app.
    pub link: AttrValue,
    pub qr: Rc<Option<QrSvg>>,
    /// The scenario's name, the title of a system share.
    pub name: AttrValue,
    /// Opens the print dialog.
    pub on_print: Callback<()>,
    /// Shows a line in the panel's status.
    pub on_status: Callback<String>,
}

/// Copy, share and print buttons beside the QR code.
#[function_component(LinkActions)]
pub fn link_actions(props: &LinkProps) -> Html {
    let on_copy = {
        let link = props.link.clone();
        let on_status = props.on_status.clone();
        Callback::from(move |_| {
            on_status.emit(if browser::copy_text(&link) {
                "Link copied.".to_string()
            } else {
                format!("Copy this link: {link}")
            });
        })
    };
    let on_share = {
        let link = props.link.clone();
        let name = props.name.clone();
        Callback::from(move |_| {
            browser::share_link(if name.is_empty() { "Sharpfield scenario" } else { &name }, &link);
        })
    };
    let on_print = props.on_print.reform(|_: MouseEvent| ());
    html! {
        <div class="share-row">
            <div class="share-actions">
                <button type="button" id="copy-link" onclick={on_copy}>{ "Copy link" }</button>
                if browser::can_share() { <button type="button" id="share-link" onclick={on_share}>{ "Share…" }</button> }
                <button type="button" id="print-plan" onclick={on_print}>{ "Print flight plan" }</button>
            </div>
            if let Some(qr) = &*props.qr {
                <figure class="qr">
                    <svg class="qr-code" viewBox={format!("0 0 {0} {0}", qr.size)} role="img" aria-label="QR code of this scenario's link" shape-rendering="crispEdges">
                        <rect width={qr.size.to_string()} height={qr.size.to_string()} class="qr-light" />
                        <path d={qr.path.clone()} class="qr-dark" />
                    </svg>
                    <figcaption>{ "Scan to open this scenario on another device." }</figcaption>
                </figure>
            }
        </div>
    }
}
