//! The core's layers (DEVELOPERS.md, "Layers"): each folder under `src/core` may import only the
//! layers below it, so there is no import cycle and the physics never learns about links, words or
//! files. This test reads every `crate::core::…` path in the core's sources and fails on one that
//! reaches up or sideways.

use std::fs;
use std::path::{Path, PathBuf};

/// The layers from the bottom up; a file may import its own layer and the ones before it.
const LAYERS: &[&str] = &["physics", "planning", "words", "formats", "contract", "presets"];

/// Every `.rs` file under `dir`.
fn sources(dir: &Path) -> Vec<PathBuf> {
    let mut out = Vec::new();
    for entry in fs::read_dir(dir).expect("src/core is readable").flatten() {
        let path = entry.path();
        if path.is_dir() {
            out.extend(sources(&path));
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
    out.sort();
    out
}

/// The layer a path under `src/core` belongs to (`None` for `src/core/mod.rs`).
fn layer_of_file(core: &Path, file: &Path) -> Option<&'static str> {
    let first = file.strip_prefix(core).ok()?.components().next()?;
    let name = first.as_os_str().to_str()?;
    LAYERS.iter().copied().find(|l| *l == name)
}

/// The layers named by `crate::core::LAYER` anywhere in `text` (uses, paths in code and types).
fn imported_layers(text: &str) -> Vec<(usize, String)> {
    let mut out = Vec::new();
    for (number, line) in text.lines().enumerate() {
        let code = line.split("//").next().unwrap_or("");
        let mut rest = code;
        while let Some(at) = rest.find("crate::core::") {
            rest = &rest[at + "crate::core::".len()..];
            let name: String = rest.chars().take_while(|c| c.is_alphanumeric() || *c == '_').collect();
            out.push((number + 1, name));
        }
        // `super::super::` would also climb out of a layer; the core uses absolute paths only.
        if code.contains("super::super") {
            out.push((number + 1, "super::super".to_string()));
        }
    }
    out
}

#[test]
fn every_core_file_imports_only_its_own_layer_and_those_below() {
    let core = Path::new(env!("CARGO_MANIFEST_DIR")).join("src/core");
    let files = sources(&core);
    assert!(files.len() > 10, "found the core's sources ({})", files.len());
    let mut problems = Vec::new();
    for file in &files {
        let text = fs::read_to_string(file).expect("a source file is readable");
        let Some(own) = layer_of_file(&core, file) else {
            // src/core/mod.rs only declares the layers.
            assert!(
                file.ends_with("core/mod.rs"),
                "{} sits outside every layer folder",
                file.display()
            );
            continue;
        };
        let own_rank = LAYERS.iter().position(|l| *l == own).unwrap_or(0);
        for (line, imported) in imported_layers(&text) {
            match LAYERS.iter().position(|l| *l == imported) {
                Some(rank) if rank <= own_rank => {}
                Some(_) => problems.push(format!(
                    "{}:{line}: the {own} layer imports the {imported} layer above it",
                    file.display()
                )),
                None => problems.push(format!(
                    "{}:{line}: `{imported}` is not a layer ({})",
                    file.display(),
                    LAYERS.join(", ")
                )),
            }
        }
    }
    assert!(
        problems.is_empty(),
        "imports against the layers:\n{}",
        problems.join("\n")
    );
}

#[test]
fn the_core_never_names_the_browser_crates() {
    // DEVELOPERS.md invariant: the core knows nothing about the browser.
    let core = Path::new(env!("CARGO_MANIFEST_DIR")).join("src/core");
    let mut problems = Vec::new();
    for file in sources(&core) {
        let text = fs::read_to_string(&file).expect("a source file is readable");
        for (number, line) in text.lines().enumerate() {
            let code = line.split("//").next().unwrap_or("");
            for crate_name in ["yew", "web_sys", "gloo", "wasm_bindgen", "js_sys", "crate::ui"] {
                if code.contains(&format!("{crate_name}::")) {
                    problems.push(format!("{}:{}: names {crate_name}", file.display(), number + 1));
                }
            }
        }
    }
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}

#[test]
fn the_scan_catches_an_upward_import() {
    // A negative control for the scanner itself: a physics file naming the contract is caught,
    // a doc comment naming it is not.
    let text = "use crate::core::contract::scenario::Scenario;\n/// see crate::core::words\nfn f() {}\n";
    let found = imported_layers(text);
    assert_eq!(found, vec![(1, "contract".to_string())]);
}
