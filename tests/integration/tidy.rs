//! Tidy checks that `cargo test` enforces: every source file starts with a
//! module doc comment, and no stub macros are shipped.

use std::path::{Path, PathBuf};

fn rust_files(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in std::fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.is_dir() {
            rust_files(&path, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
}

fn sources() -> Vec<PathBuf> {
    let mut files = Vec::new();
    rust_files(
        &Path::new(env!("CARGO_MANIFEST_DIR")).join("src"),
        &mut files,
    );
    files.sort();
    files
}

#[test]
fn every_module_starts_with_a_doc_comment() {
    let missing: Vec<_> = sources()
        .into_iter()
        .filter(|p| {
            let text = std::fs::read_to_string(p).unwrap();
            !text.trim_start().starts_with("//!")
        })
        .collect();
    assert!(
        missing.is_empty(),
        "files without a //! header: {missing:?}"
    );
}

#[test]
fn no_stubs_are_shipped() {
    let stub_words = [concat!("todo", "!("), concat!("unimplemented", "!(")];
    let found: Vec<_> = sources()
        .into_iter()
        .filter(|p| {
            let text = std::fs::read_to_string(p).unwrap();
            stub_words.iter().any(|w| text.contains(w))
        })
        .collect();
    assert!(found.is_empty(), "stub macros in: {found:?}");
}
