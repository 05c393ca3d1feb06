//! One self-contained HTML report: inline CSS, inline SVG plots, every string escaped.
//!
//! A [`Report`] is a title, ordered [`Section`]s of [`Block`]s (paragraphs,
//! findings, tables, figures, lists), the cautions, and a footer with the tool
//! version and the exact command that produced it. [`Report::render`] writes
//! one HTML file that needs nothing else: no scripts, no external fonts,
//! styles or images. The style sheet prints well and marks severities with
//! words and border patterns, not colour alone, so a greyscale print keeps them.
//!
//! ```
//! use ebullio::report::html::{FindingRow, Report, Severity, Table};
//! let mut r = Report::new("Vapor-pressure fit <HV-12>");
//! r.section("Summary")
//!     .paragraph("One outlier & one extrapolation.")
//!     .findings(vec![FindingRow::new(Severity::Warning, "HV-12", "outlier-point", "Point 6 is far off.")]);
//! let mut t = Table::new(["quantity", "value"]);
//! t.row(["Tb/K", "456.2"]);
//! r.section("Constants").table(t);
//! let html = r.render();
//! assert!(html.contains("Vapor-pressure fit &lt;HV-12&gt;"));
//! assert!(html.contains("One outlier &amp; one extrapolation."));
//! assert!(!html.contains("<script"));
//! ```

use serde::Serialize;
use std::fmt::Write as _;

/// Escape text for HTML element content and double-quoted attribute values.
///
/// ```
/// assert_eq!(ebullio::report::html::escape(r#"<a href="x">&'"#), "&lt;a href=&quot;x&quot;&gt;&amp;&#39;");
/// ```
pub fn escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 8);
    for ch in s.chars() {
        match ch {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}

/// Severity of a finding: the same type the table screener uses.
pub use crate::screen::Severity;

/// One line of a report's findings table: the view of a
/// [`Finding`](crate::finding::Finding) (or of a row's several codes, or of a job that
/// failed) with its subject written out.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct FindingRow {
    /// Severity.
    pub severity: Severity,
    /// What it is about (compound, row, file).
    pub subject: String,
    /// Stable kebab-case code.
    pub code: String,
    /// One sentence a chemist understands.
    pub message: String,
}

impl FindingRow {
    /// A finding.
    pub fn new(
        severity: Severity,
        subject: impl Into<String>,
        code: impl Into<String>,
        message: impl Into<String>,
    ) -> Self {
        Self {
            severity,
            subject: subject.into(),
            code: code.into(),
            message: message.into(),
        }
    }

    /// The row showing `f`; `subject` names what the job was about, used when the
    /// finding is about the whole job.
    pub fn of(f: &crate::finding::Finding, subject: impl Into<String>) -> Self {
        let subject = if f.subject.is_whole() {
            subject.into()
        } else {
            f.subject.to_string()
        };
        Self::new(f.severity, subject, f.code.as_str(), f.message.clone())
    }
}

/// A table: headings and rows of text; a row may carry a severity (flagged rows).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Table {
    caption: Option<String>,
    headers: Vec<String>,
    rows: Vec<(Vec<String>, Option<Severity>)>,
}

impl Table {
    /// A table with these column headings.
    pub fn new<I, S>(headers: I) -> Self
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        Self {
            caption: None,
            headers: headers.into_iter().map(Into::into).collect(),
            rows: Vec::new(),
        }
    }

    /// Set a caption shown above the table.
    pub fn caption(mut self, text: impl Into<String>) -> Self {
        self.caption = Some(text.into());
        self
    }

    /// Add a plain row.
    pub fn row<I, S>(&mut self, cells: I) -> &mut Self
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        self.rows
            .push((cells.into_iter().map(Into::into).collect(), None));
        self
    }

    /// Add a row marked with a severity (shown with a label and a border pattern).
    pub fn flagged_row<I, S>(&mut self, cells: I, severity: Option<Severity>) -> &mut Self
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        self.rows
            .push((cells.into_iter().map(Into::into).collect(), severity));
        self
    }

    /// Number of rows.
    pub fn len(&self) -> usize {
        self.rows.len()
    }

    /// True when the table has no rows.
    pub fn is_empty(&self) -> bool {
        self.rows.is_empty()
    }
}

/// Why an SVG was refused for inlining.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("SVG figure '{caption}' refused: it contains {what}, and a report must be self-contained and inert")]
pub struct SvgError {
    /// The figure's caption.
    pub caption: String,
    /// What was found.
    pub what: String,
}

/// An inline SVG figure with a caption.
#[derive(Debug, Clone, PartialEq)]
pub struct Figure {
    svg: String,
    caption: String,
}

impl Figure {
    /// Wrap an SVG document (e.g. from plotters) for inlining. The XML prolog
    /// is dropped; scripts, event handlers, foreign objects and any external
    /// reference are refused.
    pub fn new(svg: &str, caption: impl Into<String>) -> Result<Self, SvgError> {
        let caption = caption.into();
        let body = match svg.find("<svg") {
            Some(i) => &svg[i..],
            None => {
                return Err(SvgError {
                    caption,
                    what: "no <svg> element".into(),
                })
            }
        };
        let lower = body.to_ascii_lowercase();
        let banned = [
            ("<script", "a script"),
            ("<foreignobject", "a foreign object"),
            (" onload=", "an event handler"),
            (" onclick=", "an event handler"),
            ("href=\"http", "an external link"),
            ("href='http", "an external link"),
            ("url(http", "an external resource"),
            ("@import", "an external style sheet"),
            ("<image", "an embedded image"),
        ];
        for (needle, what) in banned {
            if lower.contains(needle) {
                return Err(SvgError {
                    caption,
                    what: what.into(),
                });
            }
        }
        Ok(Self {
            svg: body.trim_end().to_string(),
            caption,
        })
    }
}

/// One piece of content in a section.
#[derive(Debug, Clone, PartialEq)]
pub enum Block {
    /// A paragraph of text.
    Paragraph(String),
    /// A list of findings, worst first.
    Findings(Vec<FindingRow>),
    /// A table.
    Table(Table),
    /// An inline SVG figure.
    Figure(Figure),
    /// A bulleted list.
    List(Vec<String>),
    /// Label–value pairs (a definition list).
    Facts(Vec<(String, String)>),
    /// Preformatted text (a command, a formula).
    Code(String),
}

/// A section: heading, blocks, and subsections (one level deeper).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Section {
    heading: String,
    blocks: Vec<Block>,
    subsections: Vec<Section>,
}

impl Section {
    /// A section with this heading.
    pub fn new(heading: impl Into<String>) -> Self {
        Self {
            heading: heading.into(),
            ..Self::default()
        }
    }

    /// Add a paragraph.
    pub fn paragraph(&mut self, text: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Paragraph(text.into()));
        self
    }

    /// Add findings (sorted worst first, order otherwise kept).
    pub fn findings(&mut self, mut findings: Vec<FindingRow>) -> &mut Self {
        findings.sort_by_key(|f| std::cmp::Reverse(f.severity));
        self.blocks.push(Block::Findings(findings));
        self
    }

    /// Add a table.
    pub fn table(&mut self, table: Table) -> &mut Self {
        self.blocks.push(Block::Table(table));
        self
    }

    /// Add a figure.
    pub fn figure(&mut self, figure: Figure) -> &mut Self {
        self.blocks.push(Block::Figure(figure));
        self
    }

    /// Add a bulleted list.
    pub fn list<I, S>(&mut self, items: I) -> &mut Self
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        self.blocks
            .push(Block::List(items.into_iter().map(Into::into).collect()));
        self
    }

    /// Add label–value pairs.
    pub fn facts<I, K, V>(&mut self, pairs: I) -> &mut Self
    where
        I: IntoIterator<Item = (K, V)>,
        K: Into<String>,
        V: Into<String>,
    {
        self.blocks.push(Block::Facts(
            pairs
                .into_iter()
                .map(|(k, v)| (k.into(), v.into()))
                .collect(),
        ));
        self
    }

    /// Add preformatted text.
    pub fn code(&mut self, text: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Code(text.into()));
        self
    }

    /// Add a subsection and return it.
    pub fn subsection(&mut self, heading: impl Into<String>) -> &mut Section {
        self.subsections.push(Section::new(heading));
        let last = self.subsections.len() - 1;
        &mut self.subsections[last]
    }
}

/// The cautions every report that feeds a physical operation carries.
pub fn standard_cautions() -> Vec<String> {
    [
        "Estimates are not measurements: confirm any estimated boiling point or vapor pressure experimentally before relying on it.",
        "Vapors of most organic liquids are flammable: keep ignition sources away and vent vacuum pumps safely.",
        "Vacuum glassware can implode: inspect it for stars and scratches, shield it, and never use flat-bottomed flasks under vacuum.",
        "Heating under reduced pressure can bump: stir, heat gently and use a cold trap.",
        "Test ethers and other peroxide formers for peroxides before distilling, and never distill to dryness.",
        "Every number here that feeds a physical operation must be checked against local codes and reviewed by qualified process-safety staff.",
    ]
    .into_iter()
    .map(String::from)
    .collect()
}

/// A whole report.
#[derive(Debug, Clone, PartialEq)]
pub struct Report {
    title: String,
    subtitle: Option<String>,
    sections: Vec<Section>,
    cautions: Vec<String>,
    version: String,
    command_line: Option<String>,
}

impl Report {
    /// A report with this title, the standard cautions and this crate's version.
    pub fn new(title: impl Into<String>) -> Self {
        Self {
            title: title.into(),
            subtitle: None,
            sections: Vec::new(),
            cautions: standard_cautions(),
            version: format!("ebullio {}", env!("CARGO_PKG_VERSION")),
            command_line: None,
        }
    }

    /// A line under the title (what the data are, where they came from).
    pub fn subtitle(&mut self, text: impl Into<String>) -> &mut Self {
        self.subtitle = Some(text.into());
        self
    }

    /// The exact command line that produced the report (shown in the footer).
    pub fn command_line(&mut self, text: impl Into<String>) -> &mut Self {
        self.command_line = Some(text.into());
        self
    }

    /// Replace the cautions.
    pub fn cautions(&mut self, cautions: Vec<String>) -> &mut Self {
        self.cautions = cautions;
        self
    }

    /// Add a top-level section (in reading order) and return it.
    pub fn section(&mut self, heading: impl Into<String>) -> &mut Section {
        self.sections.push(Section::new(heading));
        let last = self.sections.len() - 1;
        &mut self.sections[last]
    }

    /// The number of inline figures in the whole report.
    pub fn figure_count(&self) -> usize {
        fn count(s: &Section) -> usize {
            s.blocks
                .iter()
                .filter(|b| matches!(b, Block::Figure(_)))
                .count()
                + s.subsections.iter().map(count).sum::<usize>()
        }
        self.sections.iter().map(count).sum()
    }

    /// Render the self-contained HTML document.
    pub fn render(&self) -> String {
        let mut h = String::with_capacity(64 * 1024);
        h.push_str("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
        h.push_str("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        let _ = writeln!(h, "<title>{}</title>", escape(&self.title));
        let _ = writeln!(
            h,
            "<style>\n{}{CSS}</style>\n</head>\n<body>",
            super::palette::css_custom_properties()
        );
        let _ = writeln!(h, "<header>\n<h1>{}</h1>", escape(&self.title));
        if let Some(s) = &self.subtitle {
            let _ = writeln!(h, "<p class=\"subtitle\">{}</p>", escape(s));
        }
        h.push_str("</header>\n");
        if self.sections.len() > 1 {
            h.push_str("<nav><p>Contents</p><ol>\n");
            for (i, s) in self.sections.iter().enumerate() {
                let _ = writeln!(
                    h,
                    "<li><a href=\"#s{}\">{}</a></li>",
                    i + 1,
                    escape(&s.heading)
                );
            }
            h.push_str("<li><a href=\"#cautions\">Cautions</a></li>\n</ol></nav>\n");
        }
        h.push_str("<main>\n");
        for (i, s) in self.sections.iter().enumerate() {
            render_section(&mut h, s, &format!("s{}", i + 1), 2);
        }
        if !self.cautions.is_empty() {
            h.push_str("<section id=\"cautions\" class=\"cautions\">\n<h2>Cautions</h2>\n<ul>\n");
            for c in &self.cautions {
                let _ = writeln!(h, "<li>{}</li>", escape(c));
            }
            h.push_str("</ul>\n</section>\n");
        }
        h.push_str("</main>\n<footer>\n");
        let _ = writeln!(h, "<p>Produced by {}.</p>", escape(&self.version));
        if let Some(c) = &self.command_line {
            let _ = writeln!(h, "<p>Command:</p>\n<pre>{}</pre>", escape(c));
        }
        h.push_str("</footer>\n</body>\n</html>\n");
        h
    }
}

fn render_section(h: &mut String, s: &Section, id: &str, level: usize) {
    let level = level.min(6);
    let _ = writeln!(h, "<section id=\"{}\">", escape(id));
    let _ = writeln!(h, "<h{level}>{}</h{level}>", escape(&s.heading));
    for b in &s.blocks {
        render_block(h, b);
    }
    for (i, sub) in s.subsections.iter().enumerate() {
        render_section(h, sub, &format!("{id}-{}", i + 1), level + 1);
    }
    h.push_str("</section>\n");
}

fn render_block(h: &mut String, b: &Block) {
    match b {
        Block::Paragraph(t) => {
            let _ = writeln!(h, "<p>{}</p>", escape(t));
        }
        Block::Findings(fs) => {
            if fs.is_empty() {
                h.push_str("<p class=\"none\">No findings.</p>\n");
                return;
            }
            h.push_str("<ul class=\"findings\">\n");
            for f in fs {
                let sev = f.severity.as_str();
                let _ = writeln!(
                    h,
                    "<li class=\"sev-{sev}\"><span class=\"badge\">{sev}</span> <strong>{}</strong> <code>{}</code> {}</li>",
                    escape(&f.subject),
                    escape(&f.code),
                    escape(&f.message)
                );
            }
            h.push_str("</ul>\n");
        }
        Block::Table(t) => render_table(h, t),
        Block::Figure(f) => {
            let _ = writeln!(
                h,
                "<figure>\n{}\n<figcaption>{}</figcaption>\n</figure>",
                f.svg,
                escape(&f.caption)
            );
        }
        Block::List(items) => {
            h.push_str("<ul>\n");
            for i in items {
                let _ = writeln!(h, "<li>{}</li>", escape(i));
            }
            h.push_str("</ul>\n");
        }
        Block::Facts(pairs) => {
            h.push_str("<dl>\n");
            for (k, v) in pairs {
                let _ = writeln!(h, "<dt>{}</dt><dd>{}</dd>", escape(k), escape(v));
            }
            h.push_str("</dl>\n");
        }
        Block::Code(t) => {
            let _ = writeln!(h, "<pre>{}</pre>", escape(t));
        }
    }
}

fn render_table(h: &mut String, t: &Table) {
    h.push_str("<div class=\"table\"><table>\n");
    if let Some(c) = &t.caption {
        let _ = writeln!(h, "<caption>{}</caption>", escape(c));
    }
    let flagged = t.rows.iter().any(|(_, s)| s.is_some());
    h.push_str("<thead><tr>");
    if flagged {
        h.push_str("<th>severity</th>");
    }
    for c in &t.headers {
        let _ = write!(h, "<th>{}</th>", escape(c));
    }
    h.push_str("</tr></thead>\n<tbody>\n");
    for (cells, sev) in &t.rows {
        match sev {
            Some(s) => {
                let _ = write!(h, "<tr class=\"sev-{0}\"><td>{0}</td>", s.as_str());
            }
            None if flagged => h.push_str("<tr><td></td>"),
            None => h.push_str("<tr>"),
        }
        for c in cells {
            let _ = write!(h, "<td>{}</td>", escape(c));
        }
        h.push_str("</tr>\n");
    }
    h.push_str("</tbody></table></div>\n");
}

/// Quote a command line for display, the way a POSIX shell would read it back.
///
/// ```
/// let args = ["ebullio", "fit", "my data.csv", "--constants", "log10,mmHg,degC"].map(String::from);
/// assert_eq!(ebullio::report::html::shell_line(&args), "ebullio fit 'my data.csv' --constants log10,mmHg,degC");
/// ```
pub fn shell_line(args: &[String]) -> String {
    args.iter()
        .map(|a| {
            let plain = !a.is_empty()
                && a.chars().all(|c| {
                    c.is_ascii_alphanumeric()
                        || matches!(c, '-' | '_' | '.' | '/' | ',' | '=' | ':' | '+')
                });
            if plain {
                a.clone()
            } else {
                format!("'{}'", a.replace('\'', "'\\''"))
            }
        })
        .collect::<Vec<_>>()
        .join(" ")
}

/// The style sheet: system fonts only, print-friendly. Colours only through the
/// palette's custom properties (`var(--ink)`, ...; see [`super::palette`]);
/// severities differ by border pattern too, so they survive greyscale printing.
const CSS: &str = r#"
:root { color-scheme: light; }
body { font-family: system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif;
  color: var(--ink); background: var(--paper); max-width: 60rem; margin: 0 auto; padding: 1.5rem; line-height: 1.45; }
header { border-bottom: 3px solid var(--series-1); margin-bottom: 1rem; }
h1 { font-size: 1.7rem; margin: 0 0 0.3rem 0; }
h2 { font-size: 1.35rem; border-bottom: 1px solid var(--rule); padding-bottom: 0.15rem; margin-top: 2rem; }
h3 { font-size: 1.12rem; margin-top: 1.5rem; }
h4 { font-size: 1rem; }
.subtitle { color: var(--ink-soft); margin-top: 0; }
nav { border: 1px solid var(--rule); padding: 0.3rem 1rem; margin: 1rem 0; }
nav p { margin: 0.3rem 0; font-weight: bold; }
nav ol { margin: 0.2rem 0 0.5rem 0; }
a { color: var(--series-1); }
code, pre { font-family: ui-monospace, "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: 0.9em; }
pre { background: var(--shade); border: 1px solid var(--grid); padding: 0.5rem; white-space: pre-wrap; word-break: break-all; }
.table { overflow-x: auto; }
table { border-collapse: collapse; margin: 0.6rem 0 1rem 0; font-size: 0.9rem; }
caption { text-align: left; font-weight: bold; padding: 0.2rem 0; }
th, td { border: 1px solid var(--rule); padding: 0.2rem 0.45rem; text-align: left; vertical-align: top; }
th { background: var(--shade); }
tr.sev-error td { background: var(--shade-deep); font-weight: bold; }
tr.sev-error td:first-child { border-left: 4px double var(--series-2); }
tr.sev-warning td { background: var(--shade); }
tr.sev-warning td:first-child { border-left: 4px dashed var(--series-5); }
ul.findings { list-style: none; padding-left: 0; }
ul.findings li { margin: 0.35rem 0; padding: 0.3rem 0.5rem; border-left: 4px solid var(--rule); }
ul.findings li.sev-error { border-left: 6px double var(--series-2); background: var(--shade-deep); }
ul.findings li.sev-warning { border-left: 4px dashed var(--series-5); background: var(--shade); }
ul.findings li.sev-info { border-left: 2px dotted var(--ink); }
.badge { display: inline-block; min-width: 4.5em; font-size: 0.75rem; text-transform: uppercase;
  border: 1px solid var(--ink); padding: 0 0.3rem; text-align: center; background: var(--paper); }
.sev-error .badge { background: var(--series-2); border-color: var(--series-2); color: var(--paper); }
.sev-warning .badge { border: 1px dashed var(--ink); }
figure { margin: 1rem 0; }
figure svg { max-width: 100%; height: auto; border: 1px solid var(--grid); background: var(--paper); }
figcaption { font-size: 0.9rem; color: var(--ink-soft); }
dl { display: grid; grid-template-columns: max-content auto; gap: 0.15rem 1rem; }
dt { font-weight: bold; }
dd { margin: 0; }
.cautions { border: 2px solid var(--ink); padding: 0 1rem 0.5rem 1rem; margin-top: 2rem; }
.none { color: var(--ink-soft); font-style: italic; }
footer { border-top: 1px solid var(--rule); margin-top: 2rem; font-size: 0.85rem; color: var(--ink-soft); }
@media print {
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  nav { display: none; }
  figure, table, .cautions, ul.findings li { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
  a { text-decoration: none; color: var(--ink); }
}
"#;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_string_is_escaped() {
        let evil = "<script>alert(1)</script>";
        let mut r = Report::new(evil);
        r.subtitle(evil).command_line(evil);
        let s = r.section(evil);
        s.paragraph(evil)
            .list([evil])
            .facts([(evil, evil)])
            .code(evil)
            .findings(vec![FindingRow::new(Severity::Error, evil, evil, evil)]);
        let mut t = Table::new([evil]).caption(evil);
        t.flagged_row([evil], Some(Severity::Warning));
        s.table(t);
        s.subsection(evil).paragraph(evil);
        let html = r.render();
        assert!(!html.contains("<script"), "{html}");
        assert!(html.matches("&lt;script&gt;").count() >= 12);
    }

    #[test]
    fn figure_refuses_external_references_and_scripts() {
        let ok = Figure::new(
            "<?xml version=\"1.0\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\"><rect/></svg>",
            "c",
        )
        .unwrap();
        assert!(ok.svg.starts_with("<svg"));
        for bad in [
            "<svg><script>x</script></svg>",
            "<svg><a href=\"https://example.org\">x</a></svg>",
            "<svg><style>@import 'a.css';</style></svg>",
            "<svg><rect style=\"fill:url(http://x/y)\"/></svg>",
            "<svg><image href=\"a.png\"/></svg>",
            "no svg here",
        ] {
            assert!(Figure::new(bad, "c").is_err(), "{bad}");
        }
    }

    #[test]
    fn findings_are_sorted_worst_first_and_labelled_in_words() {
        let mut r = Report::new("t");
        r.section("Summary").findings(vec![
            FindingRow::new(Severity::Info, "a", "x-info", "i"),
            FindingRow::new(Severity::Error, "b", "x-error", "e"),
            FindingRow::new(Severity::Warning, "c", "x-warning", "w"),
        ]);
        let html = r.render();
        let e = html.find("x-error").unwrap();
        let w = html.find("x-warning").unwrap();
        let i = html.find("x-info").unwrap();
        assert!(e < w && w < i);
        assert!(html.contains("<span class=\"badge\">error</span>"));
    }

    #[test]
    fn cautions_and_footer_are_present() {
        let mut r = Report::new("t");
        r.command_line("ebullio demo --output x");
        let html = r.render();
        assert!(html.contains("never distill to dryness"));
        assert!(html.contains(env!("CARGO_PKG_VERSION")));
        assert!(html.contains("ebullio demo --output x"));
    }

    #[test]
    fn shell_line_quotes_what_a_shell_would_split() {
        let a = ["x", "a b", "it's", ""].map(String::from);
        assert_eq!(shell_line(&a), "x 'a b' 'it'\\''s' ''");
    }
}
