//! Saved scenarios: the versioned format kept in the browser's storage and in exported files.
//!
//! The format is `{"format": "sharpfield-scenarios", "version": 1, "scenarios": [...]}`; each
//! scenario keeps its URL query, so a saved scenario is exactly a shareable link. Reading never
//! fails: entries that cannot be read are kept aside as text and reported, a file from a newer
//! version is left untouched, and older or looser shapes (a bare list) are read leniently.

use serde::{Deserialize, Serialize};
use serde_json::Value;

/// The `format` field of files this code writes.
const FORMAT_NAME: &str = "sharpfield-scenarios";
/// The version of the format this code writes.
pub const FORMAT_VERSION: u64 = 1;
/// Longest name kept for a saved scenario, in characters.
const NAME_MAX: usize = 120;

/// One saved scenario.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub struct SavedScenario {
    /// Unique within the library.
    pub id: String,
    pub name: String,
    /// The scenario as a URL query (the public contract).
    pub query: String,
    /// When it was saved (ISO 8601 text from the browser; shown, never parsed).
    #[serde(default)]
    pub saved: String,
}

/// The whole collection of saved scenarios.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Library {
    pub scenarios: Vec<SavedScenario>,
}

/// What reading stored or imported text gave.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct ReadOutcome {
    /// Every scenario that could be read.
    pub library: Library,
    /// Text that could not be read, to be kept aside, never dropped.
    pub kept_aside: Vec<String>,
    /// Plain messages for the person; empty when all went well.
    pub messages: Vec<String>,
    /// True when the text came from a newer version: it must not be overwritten.
    pub newer_version: bool,
}

#[derive(Serialize)]
struct FileOut<'a> {
    format: &'static str,
    version: u64,
    scenarios: &'a [SavedScenario],
}

fn clip(text: &str, max: usize) -> String {
    text.trim().chars().take(max).collect()
}

impl Library {
    /// Writes the library in the current format.
    pub fn to_json(&self) -> String {
        serde_json::to_string_pretty(&FileOut {
            format: FORMAT_NAME,
            version: FORMAT_VERSION,
            scenarios: &self.scenarios,
        })
        .unwrap_or_else(|_| format!("{{\"format\":\"{FORMAT_NAME}\",\"version\":{FORMAT_VERSION},\"scenarios\":[]}}"))
    }

    /// Reads stored or imported text; never fails (see [`ReadOutcome`]). The text is parsed by
    /// serde_json; the page passes the browser's own parser to [`Library::read_with`] instead.
    pub fn read(text: &str) -> ReadOutcome {
        Library::read_with(text, |text| {
            serde_json::from_str::<Value>(text).map_err(|e| e.to_string())
        })
    }

    /// Reads stored or imported text parsed by `parse` (into JSON values, or the parser's
    /// complaint in words); never fails (see [`ReadOutcome`]). `parse` is not called on blank text.
    pub fn read_with<J: JsonView>(text: &str, parse: impl FnOnce(&str) -> Result<J, String>) -> ReadOutcome {
        let mut out = ReadOutcome {
            library: Library::default(),
            kept_aside: Vec::new(),
            messages: Vec::new(),
            newer_version: false,
        };
        if text.trim().is_empty() {
            return out;
        }
        let value = match parse(text) {
            Ok(v) => v,
            Err(e) => {
                out.kept_aside.push(text.to_string());
                out.messages.push(format!(
                    "The saved scenarios could not be read ({e}); they were kept aside unchanged."
                ));
                return out;
            }
        };
        let entries = if let Some(items) = value.items() {
            items
        } else if value.is_object() {
            let version = value.member("version").and_then(|v| v.as_u64()).unwrap_or(0);
            if version > FORMAT_VERSION {
                out.newer_version = true;
                out.kept_aside.push(text.to_string());
                out.messages.push(format!(
                    "These saved scenarios come from a newer version of Sharpfield (format {version}); they were kept aside unchanged. Update the app to open them."
                ));
                return out;
            }
            match value.member("scenarios").and_then(|list| list.items()) {
                Some(items) => items,
                None => {
                    out.kept_aside.push(text.to_string());
                    out.messages
                        .push("The saved scenarios have no list of scenarios; the text was kept aside.".to_string());
                    return out;
                }
            }
        } else {
            out.kept_aside.push(text.to_string());
            out.messages
                .push("The saved scenarios are not in a known shape; the text was kept aside.".to_string());
            return out;
        };
        for entry in entries {
            match read_entry(&entry) {
                Some((name, query, saved)) => {
                    out.library.insert(&name, &query, &saved);
                }
                None => out.kept_aside.push(entry.to_json_text()),
            }
        }
        let unreadable = out.kept_aside.len();
        if unreadable > 0 {
            out.messages.push(format!(
                "{unreadable} saved scenario(s) could not be read; they were kept aside unchanged."
            ));
        }
        out
    }

    /// A fresh id: one more than the largest numeric id in use.
    fn next_id(&self) -> String {
        let n = self
            .scenarios
            .iter()
            .filter_map(|s| s.id.strip_prefix('s').and_then(|d| d.parse::<u64>().ok()))
            .max()
            .unwrap_or(0);
        format!("s{}", n.saturating_add(1))
    }

    /// A name not yet used: `name`, else `name (2)`, `name (3)`…
    fn unique_name(&self, name: &str) -> String {
        let base = clip(name, NAME_MAX);
        let base = if base.is_empty() {
            "Untitled scenario".to_string()
        } else {
            base
        };
        if !self.scenarios.iter().any(|s| s.name == base) {
            return base;
        }
        (2..)
            .map(|i| format!("{base} ({i})"))
            .find(|candidate| !self.scenarios.iter().any(|s| &s.name == candidate))
            .unwrap_or(base)
    }

    /// Adds a scenario under a unique name and returns its id.
    pub fn insert(&mut self, name: &str, query: &str, saved: &str) -> String {
        let id = self.next_id();
        let name = self.unique_name(name);
        self.scenarios.push(SavedScenario {
            id: id.clone(),
            name,
            query: query.to_string(),
            saved: saved.to_string(),
        });
        id
    }

    /// The scenario with `id`.
    pub fn get(&self, id: &str) -> Option<&SavedScenario> {
        self.scenarios.iter().find(|s| s.id == id)
    }

    /// Renames a scenario (to a unique name); false when there is no such id.
    pub fn rename(&mut self, id: &str, name: &str) -> bool {
        let Some(index) = self.scenarios.iter().position(|s| s.id == id) else {
            return false;
        };
        let mut others = self.clone();
        others.scenarios.remove(index);
        let name = others.unique_name(name);
        self.scenarios[index].name = name;
        true
    }

    /// Copies a scenario under a new name; returns the copy's id.
    pub fn duplicate(&mut self, id: &str, saved: &str) -> Option<String> {
        let original = self.get(id)?.clone();
        Some(self.insert(&format!("{} (copy)", original.name), &original.query, saved))
    }

    /// Deletes a scenario; false when there is no such id.
    pub fn delete(&mut self, id: &str) -> bool {
        let before = self.scenarios.len();
        self.scenarios.retain(|s| s.id != id);
        self.scenarios.len() != before
    }

    /// Adds every scenario of `other` (imported), renaming where names collide; returns how many.
    pub fn merge(&mut self, other: &Library) -> usize {
        for s in &other.scenarios {
            self.insert(&s.name, &s.query, &s.saved);
        }
        other.scenarios.len()
    }
}

/// Reads one entry leniently: a name and a query are needed; an id is not kept (ids are local).
fn read_entry<J: JsonView>(entry: &J) -> Option<(String, String, String)> {
    if !entry.is_object() {
        return None;
    }
    let query = entry.member("query")?.as_str()?;
    let name = entry.member("name").and_then(|v| v.as_str());
    let saved = entry.member("saved").and_then(|v| v.as_str()).unwrap_or_default();
    Some((
        clip(name.as_deref().unwrap_or("Untitled scenario"), NAME_MAX),
        query,
        saved,
    ))
}

/// A parsed JSON value, as far as reading saved scenarios looks into one. serde_json's [`Value`]
/// is one ([`Library::read`], natively and in tests); the page implements it over the browser's
/// own `JSON.parse` (`ui::browser`), so that its first load carries no JSON parser.
pub trait JsonView: Sized {
    /// The elements, when this is an array.
    fn items(&self) -> Option<Vec<Self>>;
    /// Whether this is an object (not an array, not null).
    fn is_object(&self) -> bool;
    /// The member `key`, when this is an object that has it.
    fn member(&self, key: &str) -> Option<Self>;
    /// The text, when this is a string.
    fn as_str(&self) -> Option<String>;
    /// The number, when this is a whole number from 0 up.
    fn as_u64(&self) -> Option<u64>;
    /// This value as compact JSON text, to keep it aside.
    fn to_json_text(&self) -> String;
}

impl JsonView for Value {
    fn items(&self) -> Option<Vec<Value>> {
        self.as_array().cloned()
    }

    fn is_object(&self) -> bool {
        Value::is_object(self)
    }

    fn member(&self, key: &str) -> Option<Value> {
        self.as_object()?.get(key).cloned()
    }

    fn as_str(&self) -> Option<String> {
        Value::as_str(self).map(str::to_string)
    }

    fn as_u64(&self) -> Option<u64> {
        Value::as_u64(self)
    }

    fn to_json_text(&self) -> String {
        self.to_string()
    }
}
