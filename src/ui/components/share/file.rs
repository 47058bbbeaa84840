//! The library file: export every saved scenario to a JSON file, or import one.

use super::library::LibraryHandle;
use crate::ui::browser;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// Properties of the export and import buttons.
#[derive(Properties, PartialEq, Clone)]
pub struct LibraryFileProps {
    pub library: LibraryHandle,
}

/// Export and import of the saved scenarios.
#[function_component(LibraryFile)]
pub fn library_file(props: &LibraryFileProps) -> Html {
    // The file being read; dropping the reader would cancel it.
    let reader = use_mut_ref(|| Option::<gloo::file::callbacks::FileReader>::None);
    let on_export = {
        let library = props.library.clone();
        Callback::from(move |_| {
            browser::download("sharpfield-scenarios.json", "application/json", &library.to_json());
        })
    };
    let on_import = {
        let library = props.library.clone();
        Callback::from(move |e: Event| {
            let input: HtmlInputElement = e.target_unchecked_into();
            let library = library.clone();
            let task = browser::read_chosen_file(
                &input,
                Box::new(move |_, text| match text {
                    Some(text) => library.import(&text),
                    None => library.tell("The file could not be read.".to_string()),
                }),
            );
            if task.is_some() {
                *reader.borrow_mut() = task;
            }
        })
    };
    html! {
        <div class="library-actions">
            <button type="button" id="export-scenarios" onclick={on_export}>{ "Export all to a file" }</button>
            <label class="file-label" for="import-scenarios">{ "Import from a file" }</label>
            <input id="import-scenarios" type="file" accept=".json,application/json" onchange={on_import} />
        </div>
    }
}
