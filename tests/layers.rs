//! The layer rule, checked: domain modules import nothing from the input/output or
//! application layers, and physical constants have one home in `units`.
//!
//! Layers (inner to outer): domain → input/output (`table_io`, `report`) → application
//! (`cli`, `demo`, in the binary). A module may import from its own layer or inner ones.
//! Every top-level module under `src/` must be listed here, so a new one is classified
//! when it is added.

use crate::support::repo;
use std::path::{Path, PathBuf};

/// Domain: numerics and data models, SI inside. Add a new domain module here.
const DOMAIN: &[&str] = &[
    "units",
    "finding",
    "vapor",
    "fit",
    "molecule",
    "estimate",
    "reference",
    "screen",
    "plan",
    "mixture",
    "boiling",
    "refit",
    "severity",
];
/// Input/output: files, tables, drawings and documents.
const INPUT_OUTPUT: &[&str] = &["table_io", "report"];
/// Application: the command line and the demo scenario (both in the binary).
const APPLICATION: &[&str] = &["cli", "demo"];
/// Crates only the application may use (the `cli` feature); polars lives in `table_io`.
const APPLICATION_CRATES: &[&str] = &[
    "clap",
    "clap_complete",
    "clap_mangen",
    "anyhow",
    "indicatif",
    "ctrlc",
];

fn rs_files(dir: &Path, out: &mut Vec<PathBuf>) {
    for e in std::fs::read_dir(dir).unwrap() {
        let p = e.unwrap().path();
        if p.is_dir() {
            rs_files(&p, out);
        } else if p.extension().is_some_and(|x| x == "rs") {
            out.push(p);
        }
    }
}

/// The files of a top-level module: `src/<m>.rs` or everything under `src/<m>/`.
fn module_files(m: &str) -> Vec<PathBuf> {
    let mut out = vec![];
    let file = repo(&format!("src/{m}.rs"));
    if file.exists() {
        out.push(file);
    }
    let dir = repo(&format!("src/{m}"));
    if dir.is_dir() {
        rs_files(&dir, &mut out);
    }
    out
}

/// Code without `//` comments (doc comments included: they may name outer layers).
fn code_lines(text: &str) -> impl Iterator<Item = (usize, &str)> {
    text.lines()
        .enumerate()
        .map(|(i, l)| (i + 1, l.split("//").next().unwrap_or("")))
}

/// Top-level modules named by `crate::` paths in `text`, including grouped
/// `use crate::{a::x, b}` forms, with the line they appear on.
fn crate_paths(text: &str) -> Vec<(usize, String)> {
    let mut out = vec![];
    let mut group: Option<(usize, i32)> = None; // (line, brace depth) inside `crate::{`
    for (n, line) in code_lines(text) {
        let mut rest = line;
        if let Some((_, depth)) = group.as_mut() {
            let (names, end) = scan_group(rest, depth);
            out.extend(names.into_iter().map(|m| (n, m)));
            if end {
                group = None;
            }
            continue;
        }
        while let Some(i) = rest.find("crate::") {
            rest = &rest[i + "crate::".len()..];
            if let Some(g) = rest.strip_prefix('{') {
                let mut depth = 1;
                let (names, end) = scan_group(g, &mut depth);
                out.extend(names.into_iter().map(|m| (n, m)));
                if !end {
                    group = Some((n, depth));
                }
                break;
            }
            let name: String = rest
                .chars()
                .take_while(|c| c.is_alphanumeric() || *c == '_')
                .collect();
            out.push((n, name));
        }
    }
    out
}

/// Names at depth 1 of a `{ … }` group (the first segment of each path); true once it closes.
fn scan_group(s: &str, depth: &mut i32) -> (Vec<String>, bool) {
    let mut names = vec![];
    let mut word = String::new();
    let mut at_start = *depth == 1;
    for c in s.chars() {
        match c {
            '{' => {
                *depth += 1;
                at_start = false;
            }
            '}' => {
                *depth -= 1;
                if *depth == 0 {
                    return (names, true);
                }
            }
            ',' if *depth == 1 => at_start = true,
            c if c.is_alphanumeric() || c == '_' => {
                if at_start {
                    word.push(c);
                }
            }
            _ => {
                if at_start && !word.is_empty() {
                    names.push(std::mem::take(&mut word));
                    at_start = false;
                }
            }
        }
    }
    if at_start && !word.is_empty() {
        names.push(word);
    }
    (names, false)
}

fn rel(p: &Path) -> String {
    p.strip_prefix(repo("")).unwrap_or(p).display().to_string()
}

#[test]
fn every_top_level_module_is_in_a_layer() {
    let mut unlisted = vec![];
    for e in std::fs::read_dir(repo("src")).unwrap() {
        let p = e.unwrap().path();
        let name = p.file_stem().unwrap().to_string_lossy().to_string();
        if matches!(name.as_str(), "lib" | "main") {
            continue;
        }
        let listed = [DOMAIN, INPUT_OUTPUT, APPLICATION]
            .iter()
            .any(|l| l.contains(&name.as_str()));
        if !listed {
            unlisted.push(name);
        }
    }
    assert!(
        unlisted.is_empty(),
        "modules in no layer (add them to tests/layers.rs): {unlisted:?}"
    );
}

#[test]
fn domain_modules_import_no_outer_layer() {
    let outer: Vec<&str> = INPUT_OUTPUT.iter().chain(APPLICATION).copied().collect();
    let mut bad = vec![];
    for m in DOMAIN {
        for f in module_files(m) {
            let text = std::fs::read_to_string(&f).unwrap();
            for (line, name) in crate_paths(&text) {
                if outer.contains(&name.as_str()) {
                    bad.push(format!(
                        "{}:{line}: domain `{m}` uses crate::{name}",
                        rel(&f)
                    ));
                }
            }
            for (line, code) in code_lines(&text) {
                for c in APPLICATION_CRATES.iter().chain(&["polars"]) {
                    if code.contains(&format!("{c}::")) {
                        bad.push(format!("{}:{line}: domain `{m}` uses {c}", rel(&f)));
                    }
                }
            }
        }
    }
    assert!(bad.is_empty(), "layer rule broken:\n{}", bad.join("\n"));
}

#[test]
fn input_output_modules_import_no_application_code() {
    let mut bad = vec![];
    for m in INPUT_OUTPUT {
        for f in module_files(m) {
            let text = std::fs::read_to_string(&f).unwrap();
            for (line, name) in crate_paths(&text) {
                if APPLICATION.contains(&name.as_str()) {
                    bad.push(format!("{}:{line}: `{m}` uses crate::{name}", rel(&f)));
                }
            }
            for (line, code) in code_lines(&text) {
                for c in APPLICATION_CRATES {
                    if code.contains(&format!("{c}::")) {
                        bad.push(format!("{}:{line}: `{m}` uses {c}", rel(&f)));
                    }
                }
            }
        }
    }
    assert!(bad.is_empty(), "layer rule broken:\n{}", bad.join("\n"));
}

/// The library (`src/lib.rs` and all it declares) holds no application module.
#[test]
fn the_library_declares_no_application_module() {
    let lib = std::fs::read_to_string(repo("src/lib.rs")).unwrap();
    for (line, code) in code_lines(&lib) {
        for m in APPLICATION {
            assert!(
                !code.contains(&format!("mod {m};")),
                "src/lib.rs:{line} declares application module `{m}`"
            );
        }
    }
}

/// 273.15 (the Celsius offset) and 101 325 Pa (the atmosphere) are written once, in `units`.
#[test]
fn physical_constants_live_only_in_units() {
    let mut files = vec![];
    rs_files(&repo("src"), &mut files);
    let mut bad = vec![];
    for f in files.iter().filter(|f| !rel(f).starts_with("src/units")) {
        let text = std::fs::read_to_string(f).unwrap();
        for (line, code) in code_lines(&text) {
            if code.contains("273.15") {
                bad.push(format!(
                    "{}:{line}: bare 273.15 (use units::CELSIUS_OFFSET)",
                    rel(f)
                ));
            }
            if code.contains("const") && code.contains("101_325") {
                bad.push(format!(
                    "{}:{line}: a second atmosphere (use units::ATM_PA)",
                    rel(f)
                ));
            }
        }
    }
    assert!(bad.is_empty(), "{}", bad.join("\n"));
}

#[test]
fn the_path_scanner_sees_grouped_and_inline_paths() {
    let text = "use crate::{fit::X, table_io::{a, b}};\nlet x = crate::report::y(); // crate::cli\nuse crate::{\n    units::Q,\n    demo,\n};\n";
    let names: Vec<String> = crate_paths(text).into_iter().map(|(_, n)| n).collect();
    assert_eq!(names, ["fit", "table_io", "report", "units", "demo"]);
}
