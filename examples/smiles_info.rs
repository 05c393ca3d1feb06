//! Reads SMILES (one per line) on stdin and prints, per line, tab-separated:
//! the input, the molecular formula, heavy-atom hydrogen counts (input order,
//! comma-separated), the canonical SMILES, or `ERROR` and the message.
//! Used by `tests/smiles_crosscheck.py` to compare the reader with RDKit.

use std::io::{BufRead, Write};

fn main() {
    let stdin = std::io::stdin();
    let stdout = std::io::stdout();
    let mut out = std::io::BufWriter::new(stdout.lock());
    for line in stdin.lock().lines() {
        let Ok(line) = line else { break };
        let s = line.trim();
        if s.is_empty() {
            continue;
        }
        let r = match ebullio::molecule::parse_smiles(s) {
            Ok(m) => {
                let h: Vec<String> = m
                    .heavy_atom_hydrogens()
                    .iter()
                    .map(|(_, h)| h.to_string())
                    .collect();
                format!(
                    "{s}\t{}\t{}\t{}",
                    m.formula(),
                    h.join(","),
                    m.write_smiles()
                )
            }
            Err(e) => format!("{s}\tERROR\t{e}\t"),
        };
        if writeln!(out, "{r}").is_err() {
            break;
        }
    }
}
