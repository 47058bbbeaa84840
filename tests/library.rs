//! Saved scenarios: the stored format reads back what it wrote, and nothing is dropped when the
//! stored text is corrupt, partial, older or newer.

use sharpfield::core::contract::scenario::Scenario;
use sharpfield::core::formats::library::{Library, FORMAT_VERSION};
use sharpfield::core::presets::demo;

fn library_of_demos() -> Library {
    let mut library = Library::default();
    for s in demo::all() {
        library.insert(&s.name, &s.to_query(), "2026-12-01T10:00:00.000Z");
    }
    library
}

#[test]
fn written_library_reads_back_identically_and_scenarios_survive() {
    let library = library_of_demos();
    let outcome = Library::read(&library.to_json());
    assert_eq!(outcome.library, library);
    assert!(outcome.kept_aside.is_empty() && outcome.messages.is_empty() && !outcome.newer_version);
    for (saved, original) in outcome.library.scenarios.iter().zip(demo::all()) {
        let (scenario, errors) = Scenario::from_query(&saved.query);
        assert!(errors.is_empty(), "{errors:?}");
        assert_eq!(scenario, original);
    }
}

#[test]
fn names_stay_unique_through_save_rename_duplicate_and_import() {
    let mut library = library_of_demos();
    let first = library.scenarios[0].clone();
    let again = library.insert(&first.name, &first.query, "");
    assert_eq!(
        library.get(&again).map(|s| s.name.as_str()),
        Some(format!("{} (2)", first.name).as_str())
    );
    let copy = library.duplicate(&first.id, "").expect("duplicate of an existing id");
    assert_eq!(
        library.get(&copy).map(|s| s.name.clone()),
        Some(format!("{} (copy)", first.name))
    );
    assert!(library.rename(&copy, "Hollow Creek, north paddock"));
    assert!(library.rename(&again, "Hollow Creek, north paddock"));
    assert_eq!(
        library.get(&again).map(|s| s.name.as_str()),
        Some("Hollow Creek, north paddock (2)")
    );
    assert!(!library.rename("no-such-id", "x"));
    let before = library.scenarios.len();
    let imported = library_of_demos();
    assert_eq!(library.merge(&imported), imported.scenarios.len());
    assert_eq!(library.scenarios.len(), before + imported.scenarios.len());
    let mut names: Vec<&str> = library.scenarios.iter().map(|s| s.name.as_str()).collect();
    names.sort_unstable();
    names.dedup();
    assert_eq!(names.len(), library.scenarios.len(), "names must stay unique");
    let mut ids: Vec<&str> = library.scenarios.iter().map(|s| s.id.as_str()).collect();
    ids.sort_unstable();
    ids.dedup();
    assert_eq!(ids.len(), library.scenarios.len(), "ids must stay unique");
    assert!(library.delete(&copy));
    assert!(!library.delete(&copy));
}

#[test]
fn corrupt_text_is_kept_aside_whole_and_reported() {
    for corrupt in [
        "{\"format\":\"sharpfield-scenarios\",\"version\":1,\"scenarios\":[",
        "not json at all",
        "42",
        "{\"version\":1}",
    ] {
        let outcome = Library::read(corrupt);
        assert!(outcome.library.scenarios.is_empty());
        assert_eq!(outcome.kept_aside, vec![corrupt.to_string()], "{corrupt}");
        assert!(!outcome.messages.is_empty(), "{corrupt}: the person must be told");
    }
}

#[test]
fn unreadable_entries_are_kept_aside_and_the_rest_load() {
    let text = r#"{"format":"sharpfield-scenarios","version":1,"scenarios":[
        {"id":"s1","name":"Good","query":"v=1&h=80","saved":"2026-01-01"},
        {"id":"s2","name":"No query here"},
        7,
        {"id":"s3","name":"Also good","query":"v=1&h=60"}]}"#;
    let outcome = Library::read(text);
    let names: Vec<&str> = outcome.library.scenarios.iter().map(|s| s.name.as_str()).collect();
    assert_eq!(names, ["Good", "Also good"]);
    assert_eq!(outcome.kept_aside.len(), 2);
    assert!(outcome.kept_aside[0].contains("No query here"));
    assert_eq!(outcome.messages.len(), 1);
}

#[test]
fn older_shapes_are_read_leniently_and_newer_versions_left_untouched() {
    // An older, looser shape: a bare list without a version.
    let older = r#"[{"name":"Old plan","query":"v=1&h=50"}]"#;
    let outcome = Library::read(older);
    assert_eq!(outcome.library.scenarios.len(), 1);
    assert!(!outcome.newer_version);
    // A newer format must not be rewritten by this version.
    let newer = format!(
        r#"{{"format":"sharpfield-scenarios","version":{},"scenarios":[]}}"#,
        FORMAT_VERSION + 1
    );
    let outcome = Library::read(&newer);
    assert!(outcome.newer_version);
    assert_eq!(outcome.kept_aside, vec![newer]);
    assert!(outcome.library.scenarios.is_empty());
}

#[test]
fn empty_storage_is_an_empty_library_without_messages() {
    let outcome = Library::read("");
    assert!(outcome.library.scenarios.is_empty() && outcome.messages.is_empty() && outcome.kept_aside.is_empty());
}
