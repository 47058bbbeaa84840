//! Share, save and print: the link, a QR code of it, the saved scenarios, and the printed plan.

use crate::core::contract::scenario::RawScenario;
use crate::core::formats::library::{Library, ReadOutcome};
use crate::core::formats::qr::QrSvg;
use crate::ui::browser;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// Where the saved scenarios live in the browser's storage.
pub const STORAGE_KEY: &str = "sharpfield.scenarios";
/// Prefix of the keys under which unreadable stored text is kept aside.
pub const KEPT_ASIDE_PREFIX: &str = "sharpfield.scenarios.kept-aside.";

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

/// The saved scenarios as loaded, and whether saving may overwrite storage.
#[derive(Clone, Debug, PartialEq)]
struct Saved {
    library: Library,
    /// False when storage held something that could not be kept aside: never overwrite it then.
    writable: bool,
    messages: Vec<String>,
}

/// Reads the library from storage, keeping aside whatever cannot be read.
fn load_saved() -> Saved {
    let text = match browser::storage_get(STORAGE_KEY) {
        Ok(text) => text.unwrap_or_default(),
        Err(message) => {
            return Saved {
                library: Library::default(),
                writable: false,
                messages: vec![format!(
                    "{message} Saved scenarios last only until the page closes; export them to a file."
                )],
            }
        }
    };
    let ReadOutcome {
        library,
        kept_aside,
        mut messages,
        newer_version,
    } = Library::read(&text);
    let mut writable = !newer_version;
    let stamp = browser::now_ms();
    for (i, aside) in kept_aside.iter().enumerate() {
        // Kept aside on an earlier visit: say where again, but do not add a copy per page load.
        if let Some(key) = browser::storage_find(KEPT_ASIDE_PREFIX, aside) {
            messages.push(format!("Kept aside in the browser's storage under “{key}”."));
            continue;
        }
        let key = format!("{KEPT_ASIDE_PREFIX}{stamp}.{i}");
        if let Err(problem) = browser::storage_set(&key, aside) {
            writable = false;
            messages.push(format!(
                "{problem} To protect what is stored, saving is off until this is resolved."
            ));
        } else {
            messages.push(format!("Kept aside in the browser's storage under “{key}”."));
        }
    }
    if newer_version {
        writable = false;
    }
    Saved {
        library,
        writable,
        messages,
    }
}

/// The share panel.
#[function_component(SharePanel)]
pub fn share_panel(props: &ShareProps) -> Html {
    let saved = use_state(load_saved);
    let status = use_state(|| Option::<String>::None);
    let save_name = use_state(String::new);
    let renaming = use_state(|| Option::<(String, String)>::None);
    let confirm_delete = use_state(|| Option::<String>::None);

    let state = &props.state;
    let link = props.link.to_string();
    let qr = props.qr.clone();

    // Writes the library and reports the outcome; the in-memory copy is kept either way.
    let commit = {
        let saved = saved.clone();
        let status = status.clone();
        move |library: Library, done: String| {
            let mut next = (*saved).clone();
            next.library = library;
            let message = if next.writable {
                match browser::storage_set(STORAGE_KEY, &next.library.to_json()) {
                    Ok(()) => done,
                    Err(problem) => {
                        format!("{problem} The change is kept until the page closes; export your scenarios to a file.")
                    }
                }
            } else {
                format!("{done} (not stored: saving is off, see above; export to a file to keep it.)")
            };
            saved.set(next);
            status.set(Some(message));
        }
    };

    let on_copy = {
        let link = link.clone();
        let status = status.clone();
        Callback::from(move |_| {
            let ok = browser::copy_text(&link);
            status.set(Some(if ok {
                "Link copied.".to_string()
            } else {
                format!("Copy this link: {link}")
            }));
        })
    };
    let on_share = {
        let link = link.clone();
        let name = state.plan.scenario.name.clone();
        Callback::from(move |_| {
            browser::share_link(if name.is_empty() { "Sharpfield scenario" } else { &name }, &link);
        })
    };
    let on_print = props.on_print.reform(|_: MouseEvent| ());
    let on_save_name = {
        let save_name = save_name.clone();
        Callback::from(move |e: InputEvent| save_name.set(e.target_unchecked_into::<HtmlInputElement>().value()))
    };
    let on_save = {
        let saved = saved.clone();
        let commit = commit.clone();
        let save_name = save_name.clone();
        let query = state.raw.to_query();
        let default_name = state.plan.scenario.name.clone();
        Callback::from(move |e: SubmitEvent| {
            e.prevent_default();
            let mut library = saved.library.clone();
            let wanted = if save_name.trim().is_empty() {
                default_name.clone()
            } else {
                (*save_name).clone()
            };
            let id = library.insert(&wanted, &query, &browser::now_iso());
            let name = library.get(&id).map(|s| s.name.clone()).unwrap_or_default();
            commit(library, format!("Saved as “{name}”."));
            save_name.set(String::new());
        })
    };
    let on_export = {
        let saved = saved.clone();
        Callback::from(move |_| {
            browser::download(
                "sharpfield-scenarios.json",
                "application/json",
                &saved.library.to_json(),
            );
        })
    };
    let on_import = {
        let saved = saved.clone();
        let commit = commit.clone();
        let status = status.clone();
        let reader = use_mut_ref(|| Option::<gloo::file::callbacks::FileReader>::None);
        Callback::from(move |e: Event| {
            let input: HtmlInputElement = e.target_unchecked_into();
            let Some(file) = input.files().and_then(|files| files.get(0)) else {
                return;
            };
            let file = gloo::file::File::from(file);
            let saved = saved.clone();
            let commit = commit.clone();
            let status = status.clone();
            let task = gloo::file::callbacks::read_as_text(&file, move |result| match result {
                Ok(text) => {
                    let outcome = Library::read(&text);
                    let mut library = saved.library.clone();
                    let added = library.merge(&outcome.library);
                    // The storage wording of `outcome.messages` does not fit an import: nothing is
                    // kept aside here, the file itself stays as it is.
                    let message = if outcome.newer_version {
                        "This file comes from a newer version of Sharpfield; nothing was imported. Update the app to open it.".to_string()
                    } else if outcome.kept_aside.is_empty() {
                        format!("Imported {added} scenario(s).")
                    } else {
                        format!(
                            "Imported {added} scenario(s). {} part(s) of the file could not be read and were not imported; the file itself is unchanged.",
                            outcome.kept_aside.len()
                        )
                    };
                    commit(library, message);
                }
                Err(_) => status.set(Some("The file could not be read.".to_string())),
            });
            *reader.borrow_mut() = Some(task);
            input.set_value("");
        })
    };

    let rows = saved.library.scenarios.iter().map(|s| {
        let id = s.id.clone();
        let on_open = {
            let dispatch = props.dispatch.clone();
            let query = s.query.clone();
            let status = status.clone();
            let name = s.name.clone();
            Callback::from(move |_| {
                dispatch.emit(Action::Load(RawScenario::from_query(&query)));
                status.set(Some(format!("Opened “{name}”.")));
            })
        };
        let on_duplicate = {
            let saved = saved.clone();
            let commit = commit.clone();
            let id = id.clone();
            Callback::from(move |_| {
                let mut library = saved.library.clone();
                if let Some(copy) = library.duplicate(&id, &browser::now_iso()) {
                    let name = library.get(&copy).map(|s| s.name.clone()).unwrap_or_default();
                    commit(library, format!("Duplicated as “{name}”."));
                }
            })
        };
        let on_delete = {
            let saved = saved.clone();
            let commit = commit.clone();
            let confirm_delete = confirm_delete.clone();
            let id = id.clone();
            Callback::from(move |_| {
                if confirm_delete.as_deref() == Some(id.as_str()) {
                    let mut library = saved.library.clone();
                    let name = library.get(&id).map(|s| s.name.clone()).unwrap_or_default();
                    library.delete(&id);
                    confirm_delete.set(None);
                    commit(library, format!("Deleted “{name}”."));
                } else {
                    confirm_delete.set(Some(id.clone()));
                }
            })
        };
        let on_rename_start = {
            let renaming = renaming.clone();
            let id = id.clone();
            let name = s.name.clone();
            Callback::from(move |_| renaming.set(Some((id.clone(), name.clone()))))
        };
        let editing = renaming.as_ref().filter(|(rid, _)| *rid == id).map(|(_, text)| text.clone());
        let confirming = confirm_delete.as_deref() == Some(id.as_str());
        html! {
            <li class="saved" data-saved-id={id.clone()}>
                if let Some(text) = editing {
                    <form class="rename" onsubmit={{
                        let saved = saved.clone();
                        let commit = commit.clone();
                        let renaming = renaming.clone();
                        let id = id.clone();
                        Callback::from(move |e: SubmitEvent| {
                            e.prevent_default();
                            let mut library = saved.library.clone();
                            let new_name = renaming.as_ref().map(|(_, t)| t.clone()).unwrap_or_default();
                            library.rename(&id, &new_name);
                            let name = library.get(&id).map(|s| s.name.clone()).unwrap_or_default();
                            renaming.set(None);
                            commit(library, format!("Renamed to “{name}”."));
                        })
                    }}>
                        <label class="sr-only" for={format!("rename-{id}")}>{ "New name" }</label>
                        <input id={format!("rename-{id}")} type="text" value={text} maxlength="120" oninput={{
                            let renaming = renaming.clone();
                            let id = id.clone();
                            Callback::from(move |e: InputEvent| renaming.set(Some((id.clone(), e.target_unchecked_into::<HtmlInputElement>().value()))))
                        }} />
                        <button type="submit">{ "Rename" }</button>
                    </form>
                } else {
                    <span class="saved-name">{ s.name.clone() }</span>
                    <span class="saved-date">{ browser::local_date_of(&s.saved) }</span>
                }
                <span class="saved-actions">
                    <button type="button" class="open" onclick={on_open}>{ "Open" }</button>
                    <button type="button" class="rename-start" onclick={on_rename_start}>{ "Rename" }</button>
                    <button type="button" class="duplicate" onclick={on_duplicate}>{ "Duplicate" }</button>
                    <button type="button" class={classes!("delete", confirming.then_some("confirming"))} onclick={on_delete}>
                        { if confirming { "Confirm delete" } else { "Delete" } }
                    </button>
                </span>
            </li>
        }
    });

    html! {
        <section class="panel" id="share" aria-labelledby="share-title">
            <h2 id="share-title">{ "Share, save and print" }</h2>
            <div class="share-row">
                <div class="share-actions">
                    <button type="button" id="copy-link" onclick={on_copy}>{ "Copy link" }</button>
                    if browser::can_share() { <button type="button" id="share-link" onclick={on_share}>{ "Share…" }</button> }
                    <button type="button" id="print-plan" onclick={on_print}>{ "Print flight plan" }</button>
                </div>
                if let Some(qr) = &*qr {
                    <figure class="qr">
                        <svg class="qr-code" viewBox={format!("0 0 {0} {0}", qr.size)} role="img" aria-label="QR code of this scenario's link" shape-rendering="crispEdges">
                            <rect width={qr.size.to_string()} height={qr.size.to_string()} class="qr-light" />
                            <path d={qr.path.clone()} class="qr-dark" />
                        </svg>
                        <figcaption>{ "Scan to open this scenario on another device." }</figcaption>
                    </figure>
                }
            </div>
            if let Some(message) = &*status { <p class="status" role="status">{ message.clone() }</p> }
            { for saved.messages.iter().map(|m| html! { <p class="error" role="alert">{ m.clone() }</p> }) }
            <h3>{ "Saved scenarios" }</h3>
            <form class="save-form" onsubmit={on_save}>
                <label for="save-name">{ "Save the current scenario as" }</label>
                <input id="save-name" type="text" maxlength="120" placeholder={state.plan.scenario.name.clone()} value={(*save_name).clone()} oninput={on_save_name} />
                <button type="submit" id="save-scenario">{ "Save" }</button>
            </form>
            if saved.library.scenarios.is_empty() {
                <p class="note">{ "Nothing saved yet. Saved scenarios stay in this browser; export them to move them to another device." }</p>
            } else {
                <ul class="saved-list">{ for rows }</ul>
            }
            <div class="library-actions">
                <button type="button" id="export-scenarios" onclick={on_export}>{ "Export all to a file" }</button>
                <label class="file-label" for="import-scenarios">{ "Import from a file" }</label>
                <input id="import-scenarios" type="file" accept=".json,application/json" onchange={on_import} />
            </div>
        </section>
    }
}
