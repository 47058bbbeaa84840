//! The saved scenarios of this browser behind one hook: [`use_library`] loads them from storage
//! once (keeping aside whatever cannot be read), holds them for the page, and is the only code that
//! writes them back ([`Saved::commit`]). Components change them through a [`LibraryHandle`], which
//! also carries the share panel's status line.

use crate::core::formats::library::{Library, ReadOutcome, SavedScenario};
use crate::ui::browser;
use std::rc::Rc;
use yew::prelude::*;

/// Where the saved scenarios live in the browser's storage.
const STORAGE_KEY: &str = "sharpfield.scenarios";
/// Prefix of the keys under which unreadable stored text is kept aside.
const KEPT_ASIDE_PREFIX: &str = "sharpfield.scenarios.kept-aside.";

/// The saved scenarios as held for the page, whether saving may overwrite storage, and what the
/// person has been told.
#[derive(Clone, Debug, PartialEq)]
struct Saved {
    library: Library,
    /// False when storage held something that could not be kept aside: never overwrite it then.
    writable: bool,
    /// What loading found wrong with storage; shown for as long as the page is open.
    messages: Vec<String>,
    /// The outcome of the last action (saved, copied, imported…).
    status: Option<String>,
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
                status: None,
            }
        }
    };
    let ReadOutcome {
        library,
        kept_aside,
        mut messages,
        newer_version,
    } = browser::read_library(&text);
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
        status: None,
    }
}

impl Saved {
    /// `library` as the new copy held for the page, written to storage when that is allowed; the
    /// status says how it went. The copy is kept either way, so nothing saved is lost before the
    /// page closes.
    fn commit(&self, library: Library, done: String) -> Saved {
        let status = if self.writable {
            match browser::storage_set(STORAGE_KEY, &library.to_json()) {
                Ok(()) => done,
                Err(problem) => {
                    format!("{problem} The change is kept until the page closes; export your scenarios to a file.")
                }
            }
        } else {
            format!("{done} (not stored: saving is off, see above; export to a file to keep it.)")
        };
        Saved {
            library,
            status: Some(status),
            ..self.clone()
        }
    }

    /// The same, with another status line.
    fn telling(&self, message: String) -> Saved {
        Saved {
            status: Some(message),
            ..self.clone()
        }
    }
}

/// A change to the saved scenarios, or only to the status line.
enum Change {
    Tell(String),
    /// Save a scenario (its URL query) under a name, made unique.
    Save {
        name: String,
        query: String,
    },
    Rename {
        id: String,
        name: String,
    },
    Duplicate(String),
    Delete(String),
    /// Add every readable scenario of an imported file's text.
    Import(String),
}

/// The name of the scenario with `id`, or empty.
fn name_of(library: &Library, id: &str) -> String {
    library.get(id).map(|s| s.name.clone()).unwrap_or_default()
}

/// Adds the scenarios of an imported file's text and says what came in.
fn import(library: &mut Library, text: &str) -> String {
    let outcome = browser::read_library(text);
    let added = library.merge(&outcome.library);
    // The storage wording of `outcome.messages` does not fit an import: nothing is kept aside
    // here, the file itself stays as it is.
    if outcome.newer_version {
        "This file comes from a newer version of Sharpfield; nothing was imported. Update the app to open it."
            .to_string()
    } else if outcome.kept_aside.is_empty() {
        format!("Imported {added} scenario(s).")
    } else {
        format!(
            "Imported {added} scenario(s). {} part(s) of the file could not be read and were not imported; the file itself is unchanged.",
            outcome.kept_aside.len()
        )
    }
}

/// Yew runs the reducer once per change, on the library as it is then, so two changes close
/// together (an import finishing after a save) cannot overwrite each other.
impl Reducible for Saved {
    type Action = Change;

    fn reduce(self: Rc<Self>, change: Change) -> Rc<Self> {
        let mut library = self.library.clone();
        let done = match change {
            Change::Tell(message) => return Rc::new(self.telling(message)),
            Change::Save { name, query } => {
                let id = library.insert(&name, &query, &browser::now_iso());
                format!("Saved as “{}”.", name_of(&library, &id))
            }
            Change::Rename { id, name } => {
                library.rename(&id, &name);
                format!("Renamed to “{}”.", name_of(&library, &id))
            }
            Change::Duplicate(id) => {
                let Some(copy) = library.duplicate(&id, &browser::now_iso()) else {
                    return self;
                };
                format!("Duplicated as “{}”.", name_of(&library, &copy))
            }
            Change::Delete(id) => {
                let name = name_of(&library, &id);
                library.delete(&id);
                format!("Deleted “{name}”.")
            }
            Change::Import(text) => import(&mut library, &text),
        };
        Rc::new(self.commit(library, done))
    }
}

/// The saved scenarios for the components that show and change them.
#[derive(Clone, PartialEq)]
pub struct LibraryHandle(UseReducerHandle<Saved>);

impl LibraryHandle {
    pub fn scenarios(&self) -> &[SavedScenario] {
        &self.0.library.scenarios
    }

    /// The whole library in its file format, for export.
    pub fn to_json(&self) -> String {
        self.0.library.to_json()
    }

    /// What loading found wrong with storage.
    pub fn messages(&self) -> &[String] {
        &self.0.messages
    }

    /// The outcome of the last action.
    pub fn status(&self) -> Option<&str> {
        self.0.status.as_deref()
    }

    /// Shows `message` in the status line.
    pub fn tell(&self, message: String) {
        self.0.dispatch(Change::Tell(message));
    }

    /// Saves the scenario with URL query `query` as `name` (made unique).
    pub fn save(&self, name: &str, query: &str) {
        self.0.dispatch(Change::Save {
            name: name.to_string(),
            query: query.to_string(),
        });
    }

    pub fn rename(&self, id: &str, name: &str) {
        self.0.dispatch(Change::Rename {
            id: id.to_string(),
            name: name.to_string(),
        });
    }

    pub fn duplicate(&self, id: &str) {
        self.0.dispatch(Change::Duplicate(id.to_string()));
    }

    pub fn delete(&self, id: &str) {
        self.0.dispatch(Change::Delete(id.to_string()));
    }

    /// Adds the scenarios of an imported file's text.
    pub fn import(&self, text: &str) {
        self.0.dispatch(Change::Import(text.to_string()));
    }
}

/// The saved scenarios, loaded from storage on the first render and held from then on.
#[hook]
pub fn use_library() -> LibraryHandle {
    LibraryHandle(use_reducer(load_saved))
}
