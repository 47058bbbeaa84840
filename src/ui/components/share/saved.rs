//! The saved-scenario list: save the current scenario, and open, rename, duplicate or delete a
//! saved one.

use super::library::LibraryHandle;
use crate::core::contract::scenario::RawScenario;
use crate::core::formats::library::SavedScenario;
use crate::ui::browser;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// The scenario being renamed (its id) and the new name typed so far.
type Renaming = Option<(String, String)>;

/// Properties of the saved-scenario list.
#[derive(Properties, PartialEq, Clone)]
pub struct SavedListProps {
    pub state: Rc<State>,
    pub dispatch: Callback<Action>,
    pub library: LibraryHandle,
}

/// The save form and the list of saved scenarios.
#[function_component(SavedList)]
pub fn saved_list(props: &SavedListProps) -> Html {
    let save_name = use_state(String::new);
    // At most one row is renamed, and one asks to confirm its deletion, at a time.
    let renaming = use_state(|| Renaming::None);
    let confirm_delete = use_state(|| Option::<String>::None);

    let state = &props.state;
    let on_save_name = {
        let save_name = save_name.clone();
        Callback::from(move |e: InputEvent| save_name.set(e.target_unchecked_into::<HtmlInputElement>().value()))
    };
    let on_save = {
        let library = props.library.clone();
        let save_name = save_name.clone();
        let query = state.raw.to_query();
        let default_name = state.plan.scenario.name.clone();
        Callback::from(move |e: SubmitEvent| {
            e.prevent_default();
            let wanted = if save_name.trim().is_empty() {
                &default_name
            } else {
                &*save_name
            };
            library.save(wanted, &query);
            save_name.set(String::new());
        })
    };
    let scenarios = props.library.scenarios();
    html! {
        <>
            <h3>{ "Saved scenarios" }</h3>
            <form class="save-form" onsubmit={on_save}>
                <label for="save-name">{ "Save the current scenario as" }</label>
                <input id="save-name" type="text" maxlength="120" placeholder={state.plan.scenario.name.clone()} value={(*save_name).clone()} oninput={on_save_name} />
                <button type="submit" id="save-scenario">{ "Save" }</button>
            </form>
            if scenarios.is_empty() {
                <p class="note">{ "Nothing saved yet. Saved scenarios stay in this browser; export them to move them to another device." }</p>
            } else {
                <ul class="saved-list">
                    { for scenarios.iter().map(|s| html! {
                        <SavedRow scenario={s.clone()} library={props.library.clone()} dispatch={props.dispatch.clone()}
                            renaming={renaming.clone()} confirm_delete={confirm_delete.clone()} />
                    }) }
                </ul>
            }
        </>
    }
}

/// Properties of one saved scenario's row.
#[derive(Properties, PartialEq, Clone)]
pub struct SavedRowProps {
    pub scenario: SavedScenario,
    pub library: LibraryHandle,
    pub dispatch: Callback<Action>,
    /// The list's rename in progress, if any.
    pub renaming: UseStateHandle<Renaming>,
    /// The id of the scenario whose deletion awaits confirmation, if any.
    pub confirm_delete: UseStateHandle<Option<String>>,
}

/// One saved scenario: its name and date (or the rename form), and its actions.
#[function_component(SavedRow)]
pub fn saved_row(props: &SavedRowProps) -> Html {
    let s = &props.scenario;
    let id = s.id.clone();
    let renaming = &props.renaming;
    let confirm_delete = &props.confirm_delete;

    let on_open = {
        let dispatch = props.dispatch.clone();
        let library = props.library.clone();
        let query = s.query.clone();
        let name = s.name.clone();
        Callback::from(move |_| {
            dispatch.emit(Action::Load(RawScenario::from_query(&query)));
            library.tell(format!("Opened “{name}”."));
        })
    };
    let on_duplicate = {
        let library = props.library.clone();
        let id = id.clone();
        Callback::from(move |_| library.duplicate(&id))
    };
    let on_delete = {
        let library = props.library.clone();
        let confirm_delete = confirm_delete.clone();
        let id = id.clone();
        Callback::from(move |_| {
            if confirm_delete.as_deref() == Some(id.as_str()) {
                confirm_delete.set(None);
                library.delete(&id);
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
    let editing = renaming.as_ref().is_some_and(|(rid, _)| *rid == id);
    let confirming = confirm_delete.as_deref() == Some(id.as_str());
    html! {
        <li class="saved" data-saved-id={id.clone()}>
            if editing {
                <RenameForm id={id.clone()} library={props.library.clone()} renaming={renaming.clone()} />
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
}

/// Properties of the rename form of one row.
#[derive(Properties, PartialEq, Clone)]
pub struct RenameProps {
    /// The id of the scenario being renamed.
    pub id: AttrValue,
    pub library: LibraryHandle,
    pub renaming: UseStateHandle<Renaming>,
}

/// The new name of a saved scenario, typed in place of its name.
#[function_component(RenameForm)]
pub fn rename_form(props: &RenameProps) -> Html {
    let id = props.id.to_string();
    let renaming = &props.renaming;
    // The name typed so far; every keystroke renders again, so submitting takes the latest.
    let text = renaming.as_ref().map(|(_, t)| t.clone()).unwrap_or_default();
    let on_rename = {
        let library = props.library.clone();
        let renaming = renaming.clone();
        let id = id.clone();
        let text = text.clone();
        Callback::from(move |e: SubmitEvent| {
            e.prevent_default();
            renaming.set(None);
            library.rename(&id, &text);
        })
    };
    let on_text = {
        let renaming = renaming.clone();
        let id = id.clone();
        Callback::from(move |e: InputEvent| {
            renaming.set(Some((
                id.clone(),
                e.target_unchecked_into::<HtmlInputElement>().value(),
            )))
        })
    };
    let input_id = format!("rename-{id}");
    html! {
        <form class="rename" onsubmit={on_rename}>
            <label class="sr-only" for={input_id.clone()}>{ "New name" }</label>
            <input id={input_id} type="text" value={text} maxlength="120" oninput={on_text} />
            <button type="submit">{ "Rename" }</button>
        </form>
    }
}
