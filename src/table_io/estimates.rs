//! Estimate rows as CSV: the columns `ebullio estimate --format csv` writes (and the demo's estimates.csv).

use super::non_finite::without_non_finite;
use crate::estimate::batch::{AtPressure, EstimateRow};
use crate::estimate::{terms, Numbers};
use crate::molecule::Molecule;

use std::fmt::Write as _;
use std::io::Write;

/// Writes one row's fields into the row buffer: numbers straight as digits, text quoted
/// as the csv crate quotes it (a field holding `,`, `"`, CR or LF goes in double quotes,
/// quotes doubled; `csv_text_matches_the_csv_crate` holds the two together). Numbers that
/// could not be computed are written empty, and text cells go through
/// [`without_non_finite`], so the output never holds `NaN` or `inf` text and needs no
/// cleaning pass afterwards.
struct Fields<'a> {
    line: &'a mut Vec<u8>,
    buf: &'a mut String,
    first: bool,
}

/// `s` as one CSV field (the csv crate's `QuoteStyle::Necessary` with its defaults); also
/// the fit batch's row writer.
pub(crate) fn push_csv_text(line: &mut Vec<u8>, s: &[u8]) {
    if s.iter().any(|&b| matches!(b, b',' | b'"' | b'\r' | b'\n')) {
        line.push(b'"');
        for &b in s {
            if b == b'"' {
                line.push(b'"');
            }
            line.push(b);
        }
        line.push(b'"');
    } else {
        line.extend_from_slice(s);
    }
}

/// Whether `s` goes into a cell as it is, in one scan: nothing to quote, and no `n`
/// followed by `a` or `f` (any case), which every `nan`, `inf` or `infinity` word holds
/// (what [`without_non_finite`] looks for before it looks at words).
fn plain_cell(s: &[u8]) -> bool {
    let mut after_n = false;
    for &b in s {
        let lower = b | 0x20;
        if matches!(b, b',' | b'"' | b'\r' | b'\n') || (after_n && matches!(lower, b'a' | b'f')) {
            return false;
        }
        after_n = lower == b'n';
    }
    true
}

impl Fields<'_> {
    fn sep(&mut self) {
        if !self.first {
            self.line.push(b',');
        }
        self.first = false;
    }

    fn text(&mut self, s: &str) {
        self.sep();
        if plain_cell(s.as_bytes()) {
            self.line.extend_from_slice(s.as_bytes());
        } else {
            push_csv_text(self.line, without_non_finite(s, "").as_bytes());
        }
    }

    fn num(&mut self, v: Option<f64>, digits: usize) {
        self.sep();
        if let Some(x) = v.filter(|x| x.is_finite()) {
            // digits, a point and a sign: never quoted
            super::decimal::push_fixed(self.line, x, digits);
        }
    }

    /// The text in the buffer as a text cell.
    fn buffered_text(&mut self) {
        self.sep();
        push_csv_text(self.line, without_non_finite(self.buf, "").as_bytes());
    }

    /// The text in the buffer as a text cell, when it is a formula of a molecule with
    /// carbon or a list of group ids with counts: letters, digits, `_ = ; + -` only, so
    /// never quoted, and no word of it is `nan` or `inf` (a Hill formula's words start
    /// with `C` or are a charge's digits; `group_ids_hold_no_non_finite_word` checks the
    /// ids; debug builds check both). Written as it is, what [`Fields::buffered_text`]
    /// would write.
    fn plain_buffered_text(&mut self) {
        debug_assert!(without_non_finite(self.buf, "") == self.buf.as_str());
        debug_assert!(!self
            .buf
            .bytes()
            .any(|b| matches!(b, b',' | b'"' | b'\r' | b'\n')));
        self.sep();
        self.line.extend_from_slice(self.buf.as_bytes());
    }

    fn end(&mut self) {
        self.line.push(b'\n');
    }
}

/// The rows as CSV text, one column `t_k_at_<p>_pa` per pressure in `ps` (Pa).
pub fn estimates_csv(rows: &[EstimateRow], ps: &[f64]) -> Result<String, csv::Error> {
    // About 200 bytes a row: sized once so the buffer is not regrown and copied.
    let mut bytes = Vec::with_capacity(1024 + 200 * rows.len());
    write_estimates_csv(&mut bytes, rows, ps)?;
    // Every field written was a &str, so the bytes are UTF-8; no lossy copy is needed.
    Ok(String::from_utf8(bytes)
        .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned()))
}

/// The rows as CSV streamed into `out` (what [`estimates_csv`] returns as text), through the
/// csv crate's buffer: no text of the whole table is built.
pub fn write_estimates_csv(
    mut out: impl Write,
    rows: &[EstimateRow],
    ps: &[f64],
) -> Result<(), csv::Error> {
    write_estimates_header(&mut out, ps)?;
    let mut w = EstimateRows::new(out);
    for r in rows {
        w.row(r, ps.len())?;
    }
    w.flush()
}

/// The header line of the estimate CSV, one column `t_k_at_<p>_pa` per pressure in `ps` (Pa).
pub fn write_estimates_header(out: impl Write, ps: &[f64]) -> Result<(), csv::Error> {
    let mut w = csv::Writer::from_writer(out);
    let mut head: Vec<String> = [
        "compound",
        "smiles",
        "formula",
        "tb_k",
        "tb_pi90_low_k",
        "tb_pi90_high_k",
        "tb_typical_error_k",
        "tb_joback_k",
        "tb_stein_brown_k",
        "tb_variant",
        "tm_k",
        "tc_k",
        "pc_bar",
        "vc_cm3_mol",
        "hf_kj_mol",
        "gf_kj_mol",
        "hvap_tb_kj_mol",
        "hfus_kj_mol",
        "omega",
        "groups",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect();
    for p in ps {
        head.push(format!("t_k_at_{}_pa", p));
    }
    head.push("anchored_tb_k".into());
    head.push("error".into());
    w.write_record(&head)?;
    w.flush()?;
    Ok(())
}

/// Estimate rows written one at a time below a header from [`write_estimates_header`]
/// (several writers may fill separate buffers that are then joined in order).
pub struct EstimateRows<W: Write> {
    out: W,
    line: Vec<u8>,
    buf: String,
}

/// Rows are handed to the writer in blocks of about this many bytes.
const BLOCK: usize = 64 * 1024;

/// What the estimate columns hold, from an [`Estimate`] or from [`Numbers`].
struct Values<'a> {
    smiles: &'a str,
    tb: [Option<f64>; 6],
    variant: &'static str,
    props: [Option<f64>; 9],
}

impl<W: Write> EstimateRows<W> {
    /// Rows into `out`.
    pub fn new(out: W) -> Self {
        EstimateRows {
            out,
            line: Vec::with_capacity(BLOCK + 4096),
            buf: String::with_capacity(64),
        }
    }

    fn fields(&mut self) -> Fields<'_> {
        Fields {
            line: &mut self.line,
            buf: &mut self.buf,
            first: true,
        }
    }

    /// The row is complete: hand a full block to the writer.
    fn done(&mut self) -> Result<(), csv::Error> {
        if self.line.len() >= BLOCK {
            self.out.write_all(&self.line)?;
            self.line.clear();
        }
        Ok(())
    }

    /// One row of `ebullio estimate`, `n_ps` boiling points at pressure wide.
    pub fn row(&mut self, r: &EstimateRow, n_ps: usize) -> Result<(), csv::Error> {
        let mut f = self.fields();
        f.text(r.compound.as_deref().unwrap_or_default());
        match &r.estimate {
            Some(e) => {
                f.estimate(
                    &Values {
                        smiles: e.smiles.as_deref().unwrap_or_default(),
                        tb: [
                            Some(e.tb_k),
                            Some(e.tb_pi90_low_k),
                            Some(e.tb_pi90_high_k),
                            Some(e.tb_typical_error_k),
                            e.tb_joback_k,
                            e.tb_stein_brown_k,
                        ],
                        variant: e.tb_variant.name(),
                        props: [
                            e.tm_k,
                            e.tc_k,
                            e.pc_bar,
                            e.vc_cm3_mol,
                            e.hf_kj_mol,
                            e.gf_kj_mol,
                            e.hvap_tb_kj_mol,
                            e.hfus_kj_mol,
                            e.omega,
                        ],
                    },
                    false,
                    |buf| buf.push_str(e.formula.as_deref().unwrap_or_default()),
                    |buf| {
                        for (i, (k, v)) in e.groups.iter().enumerate() {
                            let sep = if i == 0 { "" } else { ";" };
                            let _ = write!(buf, "{sep}{k}={v}");
                        }
                    },
                );
            }
            None => f.no_estimate(r.smiles_given.as_deref().unwrap_or_default()),
        }
        for k in 0..n_ps {
            f.num(r.at.get(k).and_then(|a| a.t_k), 2);
        }
        f.num(r.anchored.as_ref().map(|a| a.tb_k), 2);
        f.text(&r.error);
        f.end();
        self.done()
    }

    /// The row [`EstimateRows::row`] writes for an estimate without anchoring, from its
    /// numbers (`m` the molecule they came from, `at` the boiling points at pressure).
    pub fn numbers_row(
        &mut self,
        compound: &str,
        m: &Molecule,
        n: &Numbers,
        at: &[AtPressure],
    ) -> Result<(), csv::Error> {
        let mut f = self.fields();
        f.text(compound);
        let hw = n.half_width_k;
        f.estimate(
            &Values {
                smiles: m.smiles(),
                tb: [
                    Some(n.tb_k),
                    Some(n.tb_k - hw),
                    Some(n.tb_k + hw),
                    Some(hw / 1.645),
                    n.tb_joback_k,
                    n.tb_stein_brown_k(),
                ],
                variant: n.tb_variant.name(),
                props: [
                    n.tm_k,
                    n.tc_k,
                    n.pc_bar,
                    n.vc_cm3_mol,
                    n.hf_kj_mol,
                    n.gf_kj_mol,
                    n.hvap_tb_kj_mol,
                    n.hfus_kj_mol,
                    n.omega,
                ],
            },
            true,
            |buf| m.write_formula(buf),
            |buf| {
                for (k, (i, v)) in n.groups.iter_sorted().enumerate() {
                    if k > 0 {
                        buf.push(';');
                    }
                    buf.push_str(terms::IDS[i]);
                    buf.push('=');
                    crate::molecule::push_count(buf, v);
                }
            },
        );
        for a in at {
            f.num(a.t_k, 2);
        }
        f.num(None, 2);
        f.text("");
        f.end();
        self.done()
    }

    /// The row [`EstimateRows::row`] writes for a structure without an estimate.
    pub fn error_row(
        &mut self,
        compound: &str,
        smiles_given: &str,
        n_ps: usize,
        error: &str,
    ) -> Result<(), csv::Error> {
        let mut f = self.fields();
        f.text(compound);
        f.no_estimate(smiles_given);
        for _ in 0..n_ps + 1 {
            f.num(None, 2);
        }
        f.text(error);
        f.end();
        self.done()
    }

    /// Write out what is buffered.
    pub fn flush(&mut self) -> Result<(), csv::Error> {
        self.out.write_all(&self.line)?;
        self.line.clear();
        self.out.flush()?;
        Ok(())
    }

    /// The underlying writer, everything written out.
    pub fn into_inner(mut self) -> Result<W, csv::Error> {
        self.flush()?;
        Ok(self.out)
    }
}

impl Fields<'_> {
    /// `plain`: the formula and groups texts are a molecule's (see
    /// [`Fields::plain_buffered_text`]).
    fn estimate(
        &mut self,
        v: &Values,
        plain: bool,
        formula: impl FnOnce(&mut String),
        groups: impl FnOnce(&mut String),
    ) {
        self.text(v.smiles);
        self.buf.clear();
        formula(self.buf);
        if plain {
            self.plain_buffered_text();
        } else {
            self.buffered_text();
        }
        for x in v.tb {
            self.num(x, 2);
        }
        self.text(v.variant);
        for (x, digits) in v.props.into_iter().zip([2, 2, 3, 1, 2, 2, 3, 3, 4]) {
            self.num(x, digits);
        }
        self.buf.clear();
        groups(self.buf);
        if plain {
            self.plain_buffered_text();
        } else {
            self.buffered_text();
        }
    }

    fn no_estimate(&mut self, smiles_given: &str) {
        self.text(smiles_given);
        for _ in 0..18 {
            self.text("");
        }
    }
}

#[cfg(test)]
mod tests {
    use super::push_csv_text;

    /// The groups cell is written without the non-finite pass (`plain_buffered_text`):
    /// no group id may hold a word `nan`, `inf` or `infinity`, nor a character that
    /// needs quoting.
    #[test]
    fn group_ids_hold_no_non_finite_word() {
        for id in crate::estimate::terms::IDS {
            let cell = format!("{id}=1;{id}=12");
            assert_eq!(super::without_non_finite(&cell, ""), cell.as_str(), "{id}");
            assert!(
                id.bytes().all(|b| b.is_ascii_alphanumeric() || b == b'_'),
                "{id}"
            );
        }
    }

    /// A cell written as it is by the one-scan check is what the non-finite pass and the
    /// quoting write.
    #[test]
    fn plain_cells_are_what_the_full_pass_writes() {
        for s in [
            "",
            "CCO",
            "c1ccncc1",
            "NaN",
            "x nan",
            "Inf",
            "-inf",
            "info",
            "Cn1cnc2",
            "N#N",
            "a,b",
            "say \"hi\"",
            "line\nbreak",
            "cr\r",
            "[Na+].[Cl-]",
            "nf",
            "NF",
            "n",
            "ná",
            "joback",
            "extended-groups-log",
            "CCN(CC)C(=O)c1ccccc1",
            "infinity",
        ] {
            let mut full = Vec::new();
            push_csv_text(&mut full, super::without_non_finite(s, "").as_bytes());
            if super::plain_cell(s.as_bytes()) {
                assert_eq!(full, s.as_bytes(), "{s}");
            }
        }
        assert!(super::plain_cell(b"CCOC(C)=O") && !super::plain_cell(b"CNaN"));
    }

    #[test]
    fn csv_text_matches_the_csv_crate() {
        let fields = [
            "",
            "CCO",
            "a,b",
            "say \"hi\"",
            "line\nbreak",
            "cr\rhere",
            "\"",
            ",",
            "é,ü",
            "x\r\n",
            "#comment",
            " spaced ",
            "tab\there",
            "N#N",
        ];
        let mut want = csv::Writer::from_writer(Vec::new());
        let mut got = Vec::new();
        for f in fields {
            want.write_record([f, "z"]).unwrap();
            push_csv_text(&mut got, f.as_bytes());
            got.extend_from_slice(b",z\n");
        }
        assert_eq!(
            String::from_utf8(got).unwrap(),
            String::from_utf8(want.into_inner().unwrap()).unwrap()
        );
    }
}
