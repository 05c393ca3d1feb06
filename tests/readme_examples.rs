//! README.md cannot drift: every example command it shows with its output is run
//! through the real binary and the output compared with the README text.
//!
//! An example is a fenced block whose first line is `$ ebullio ...` (output below
//! it), or a fenced block holding one `ebullio ...` command followed directly by a
//! fenced block of its output. The README block must appear in the output as
//! adjacent lines (output around it, such as source notes and cautions, may be
//! left out); in it, a line `...` stands for any number of lines and a line
//! ending in `...` for any line that starts with the text before it. Input files are taken from the repository (same relative path) or
//! from a README block introduced by a line ending in `` `NAME`: ``. A command
//! without `--format` runs with `--format table`, what a terminal shows.

use crate::support::{ebullio, repo, scratch};
use std::path::Path;

struct Block {
    /// Line (1-based) of the opening fence.
    line: usize,
    /// Text lines between the fences.
    body: Vec<String>,
    /// The prose line just before the fence (trimmed), if any.
    intro: String,
}

fn blocks(readme: &str) -> Vec<Block> {
    let mut out = Vec::new();
    let lines: Vec<&str> = readme.lines().collect();
    let mut i = 0;
    while i < lines.len() {
        if lines[i].starts_with("```") {
            let start = i;
            let mut body = Vec::new();
            i += 1;
            while i < lines.len() && !lines[i].starts_with("```") {
                body.push(lines[i].to_string());
                i += 1;
            }
            let intro = lines[..start]
                .iter()
                .rev()
                .find(|l| !l.trim().is_empty())
                .map_or(String::new(), |l| l.trim().to_string());
            out.push(Block {
                line: start + 1,
                body,
                intro,
            });
        }
        i += 1;
    }
    out
}

/// Split a shell command line: double and single quotes, backslash line joins.
fn words(cmd: &str) -> Vec<String> {
    let cmd = cmd.replace("\\\n", " ");
    let (mut out, mut cur, mut quote, mut any) = (Vec::new(), String::new(), None, false);
    for c in cmd.chars() {
        match (quote, c) {
            (None, '"' | '\'') => {
                quote = Some(c);
                any = true;
            }
            (Some(q), c) if c == q => quote = None,
            (None, c) if c.is_whitespace() => {
                if any {
                    out.push(std::mem::take(&mut cur));
                    any = false;
                }
            }
            (_, c) => {
                cur.push(c);
                any = true;
            }
        }
    }
    if any {
        out.push(cur);
    }
    out
}

struct Example {
    line: usize,
    command: String,
    expected: Vec<String>,
}

fn examples(readme: &str) -> Vec<Example> {
    let bs = blocks(readme);
    let mut out = Vec::new();
    for (k, b) in bs.iter().enumerate() {
        let first = b.body.first().map(String::as_str).unwrap_or("");
        if let Some(cmd) = first.strip_prefix("$ ") {
            if cmd.starts_with("ebullio ") {
                out.push(Example {
                    line: b.line,
                    command: cmd.to_string(),
                    expected: b.body[1..].to_vec(),
                });
            }
            continue;
        }
        // A lone `ebullio` command (continuation lines joined) whose output
        // block follows with nothing but a blank line between.
        let joined = b.body.join("\n");
        let is_one_command = first.starts_with("ebullio ")
            && b.body
                .iter()
                .enumerate()
                .all(|(i, l)| i + 1 == b.body.len() || l.trim_end().ends_with('\\'));
        let next = bs.get(k + 1);
        if is_one_command && next.is_some_and(|n| n.line == b.line + b.body.len() + 3) {
            out.push(Example {
                line: b.line,
                command: joined,
                expected: next.unwrap().body.clone(),
            });
        }
    }
    out
}

/// Is `expected` an excerpt of `actual`: its lines, in order and adjacent, somewhere
/// in the output (a README shows the part of the output it talks about, not the
/// source notes and cautions around it), with `...` lines as wildcards?
fn excerpt_of(expected: &[String], actual: &[&str]) -> bool {
    (0..=actual.len()).any(|start| runs_from(expected, &actual[start..]))
}

/// Does `actual` begin with the lines of `expected`?
fn runs_from(expected: &[String], actual: &[&str]) -> bool {
    let Some((e, rest)) = expected.split_first() else {
        return true;
    };
    let e = e.trim_end();
    if e.trim() == "..." {
        return (0..=actual.len()).any(|skip| runs_from(rest, &actual[skip..]));
    }
    let Some((a, more)) = actual.split_first() else {
        return false;
    };
    let a = a.trim_end();
    let same = match e.strip_suffix("...") {
        Some(prefix) => a.starts_with(prefix.trim_end()),
        None => a == e,
    };
    same && runs_from(rest, more)
}

/// Put every input the command names into `dir`: repository files at the same
/// relative path, or a file the README itself shows.
fn stage_inputs(dir: &Path, words: &[String], readme_blocks: &[Block]) -> Result<(), String> {
    for w in words.iter().skip(1).filter(|w| !w.starts_with('-')) {
        let src = repo(w);
        if src.is_file() && !w.contains("..") {
            let dst = dir.join(w);
            std::fs::create_dir_all(dst.parent().unwrap()).unwrap();
            std::fs::copy(&src, &dst).unwrap();
            continue;
        }
        let looks_like_file = w.ends_with(".csv") || w.ends_with(".parquet");
        if !looks_like_file {
            continue;
        }
        let shown = readme_blocks
            .iter()
            .find(|b| b.intro.ends_with(&format!("`{w}`:")));
        match shown {
            Some(b) => std::fs::write(dir.join(w), b.body.join("\n") + "\n").unwrap(),
            // An output file (e.g. `-o checked.csv`) needs no staging.
            None if is_output(words, w) => {}
            None => {
                return Err(format!(
                    "input '{w}' is neither in the repository nor shown in the README"
                ))
            }
        }
    }
    Ok(())
}

fn is_output(words: &[String], w: &str) -> bool {
    words
        .windows(2)
        .any(|p| matches!(p[0].as_str(), "-o" | "--output" | "--report" | "--plot") && p[1] == w)
}

/// Examples whose input the README does not show, with why they are not run.
const NOT_RUN: [(&str, &str); 2] = [
    (
        "ebullio fit runs.csv",
        "illustrates an error message; the README does not show the broken runs.csv",
    ),
    (
        "ebullio boil --from fit.json --pressure \"20 mbar\" --format table",
        "needs the fit.json that the previous example writes (each example runs in its own \
         folder); the same chain is asserted in tests/practitioner.rs",
    ),
];

#[test]
fn readme_examples_give_the_output_the_readme_shows() {
    let readme = std::fs::read_to_string(repo("README.md")).unwrap();
    let bs = blocks(&readme);
    let exs = examples(&readme);
    assert!(exs.len() >= 3, "found only {} README examples", exs.len());
    let mut failures = Vec::new();
    let mut run = 0;
    for ex in &exs {
        if NOT_RUN.iter().any(|(c, _)| ex.command == *c) {
            continue;
        }
        let w = words(&ex.command);
        let dir = scratch();
        if let Err(e) = stage_inputs(dir.path(), &w, &bs) {
            failures.push(format!("README line {}: {e}", ex.line));
            continue;
        }
        let run_with = |extra: &[&str]| {
            ebullio()
                .current_dir(dir.path())
                .args(&w[1..])
                .args(extra)
                .output()
                .unwrap()
        };
        // The README shows what a terminal shows: a table unless a format is named
        // (the binary writes JSON when its output is piped, as here). A command
        // that has no --format (its result goes to a file) runs as written.
        let mut out = run_with(&[]);
        if !w.iter().any(|x| x == "--format") {
            let table = run_with(&["--format", "table"]);
            let refused =
                String::from_utf8_lossy(&table.stderr).contains("unexpected argument '--format'");
            if !refused {
                out = table;
            }
        }
        run += 1;
        // The example shows stdout, or stderr when the command writes its result to a file.
        let stdout = String::from_utf8_lossy(&out.stdout).to_string();
        let stderr = String::from_utf8_lossy(&out.stderr).to_string();
        let shown = if stdout.trim().is_empty() {
            &stderr
        } else {
            &stdout
        };
        let actual: Vec<&str> = shown.lines().collect();
        if !excerpt_of(&ex.expected, &actual) {
            failures.push(format!(
                "README line {}: `{}` printed\n{}\n--- but the README shows ---\n{}",
                ex.line,
                ex.command,
                shown,
                ex.expected.join("\n")
            ));
        }
    }
    eprintln!("README examples run: {run} of {}", exs.len());
    assert!(failures.is_empty(), "{}", failures.join("\n\n"));
}

#[test]
fn wildcard_lines_match_what_they_should_and_nothing_else() {
    let e = |s: &str| s.lines().map(String::from).collect::<Vec<_>>();
    assert!(excerpt_of(&e("a\n...\nd"), &["a", "b", "c", "d"]));
    assert!(excerpt_of(&e("a\n...\nd"), &["a", "d"]));
    assert!(excerpt_of(&e("a lo..."), &["a long line"]));
    assert!(excerpt_of(&e("b\nc"), &["a", "b", "c", "d"]));
    assert!(!excerpt_of(&e("a\n...\nd"), &["a", "b", "c"]));
    assert!(!excerpt_of(&e("a\nb"), &["a", "c", "b"]));
    assert!(!excerpt_of(&e("b\nd"), &["a", "b", "c", "d"]));
    assert!(!excerpt_of(&e("7.66 .. 8.98"), &["7.66 .. 8.99"]));
    assert_eq!(
        words("ebullio fit \"my data.csv\" --at '20 mbar' \\\n  --x"),
        ["ebullio", "fit", "my data.csv", "--at", "20 mbar", "--x"]
    );
}
