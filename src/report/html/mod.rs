//! The HTML report: one self-contained document (inline CSS and SVG, no scripts, no fonts or
//! anything else fetched from a network) that reads well on screen and prints cleanly.
//!
//! The document has a fixed order of our own design: a title block (project, date, layloft
//! version, any facts the caller adds), the verdict banner of the design check, the cautions
//! ([`crate::CAUTIONS`] always, then any the caller adds), the contents with a list of figures
//! and tables, and then the numbered sections. A section holds paragraphs, sub-headings,
//! figures (inline SVG, numbered through the document, each in
//! `<figure id="fig-ID" data-figure="ID">`), tables (numbered; a right-aligned column of a
//! [`Table`] is set as numbers), key–value facts, notes, warnings and links to side files
//! (relative paths, tagged by their extension).
//!
//! All text given to the builder is escaped. An SVG is inserted as given, less an XML
//! declaration or doctype before its `<svg>`: it must be a drawing made by layloft's own code.
//! The print stylesheet starts each numbered section on a new page, keeps figures and tables
//! whole, and sets the verdict black on white.
//!
//! # Example
//!
//! ```
//! use layloft::report::html::HtmlReport;
//! use layloft::report::{Align, Table, sig4, write_atomic};
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let mut report = HtmlReport::new("Test fan blade (invented)");
//! report.date("2026-12-01").verdict(true, ["minimum reserve factor 1.84 (demand >= 1.5)"]);
//! let mut stiffness = Table::new(&[("r (m)", Align::Right), ("EI flap (N·m²)", Align::Right)]);
//! stiffness.row(vec![sig4(0.45), sig4(1520.0)]);
//! report
//!     .section("Section properties")
//!     .paragraph("Stiffness in the chord frame through the elastic centre.")
//!     .figure("ei-flap", "Flapwise stiffness along the span.", "<svg viewBox=\"0 0 10 10\"></svg>")
//!     .table("Stiffness at the stations.", &stiffness)
//!     .link("sections.csv", "section properties at every station");
//! let html = report.render();
//! assert!(html.contains("data-figure=\"ei-flap\""));
//!
//! let dir = tempfile::tempdir().map_err(|e| layloft::Error::Write {
//!     path: "temporary folder".into(),
//!     source: e,
//! })?;
//! write_atomic(&dir.path().join("report.html"), html.as_bytes())?;
//! # Ok(())
//! # }
//! ```

mod render;
mod text;

pub use text::utc_date;

use crate::check::{DesignCheck, Status};
use crate::report::Table;

/// One HTML report under construction. Build it with the setters (each returns `&mut Self`),
/// add sections with [`HtmlReport::section`], then [`HtmlReport::render`] it.
#[derive(Debug, Clone)]
pub struct HtmlReport {
    title: String,
    subtitle: Option<String>,
    date: Option<String>,
    meta: Vec<(String, String)>,
    verdict: Verdict,
    verdict_warnings: Vec<String>,
    cautions: Vec<String>,
    sections: Vec<Section>,
}

/// The verdict banner.
#[derive(Debug, Clone, PartialEq)]
enum Verdict {
    /// No design check was run or none was demanded.
    NotChecked,
    /// The check's outcome with its lines; each line may carry its own outcome.
    Checked { passed: bool, lines: Vec<VerdictLine> },
}

/// A line of the verdict: its own outcome when known (PASS `Some(true)`), and the text.
type VerdictLine = (Option<bool>, String);

/// One numbered section of the report: its heading and its content in order.
#[derive(Debug, Clone)]
pub struct Section {
    title: String,
    blocks: Vec<Block>,
}

/// A piece of a section's content.
#[derive(Debug, Clone)]
enum Block {
    Paragraph(String),
    Heading(String),
    Figure { id: String, caption: String, svg: String },
    Table { caption: String, table: Table },
    Facts(Vec<(String, String)>),
    Note(String),
    Warning(String),
    Link { path: String, label: String },
}

impl HtmlReport {
    /// A report whose title (the project's name) heads the document and names the page.
    pub fn new(title: impl Into<String>) -> Self {
        HtmlReport {
            title: title.into(),
            subtitle: None,
            date: None,
            meta: Vec::new(),
            verdict: Verdict::NotChecked,
            verdict_warnings: Vec::new(),
            cautions: Vec::new(),
            sections: Vec::new(),
        }
    }

    /// A line under the title (e.g. the rotor in a few words).
    pub fn subtitle(&mut self, text: impl Into<String>) -> &mut Self {
        self.subtitle = Some(text.into());
        self
    }

    /// The date shown in the title block, as given (see [`utc_date`]). Without it the title
    /// block shows no date, which keeps a rendered report reproducible.
    pub fn date(&mut self, text: impl Into<String>) -> &mut Self {
        self.date = Some(text.into());
        self
    }

    /// A fact for the title block after the date and version, e.g. ("Input", "blade.toml").
    pub fn meta(&mut self, label: impl Into<String>, value: impl Into<String>) -> &mut Self {
        self.meta.push((label.into(), value.into()));
        self
    }

    /// The verdict banner: PASS or FAIL with a short list of lines (the governing values).
    pub fn verdict<I, S>(&mut self, passed: bool, lines: I) -> &mut Self
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        let lines = lines.into_iter().map(|s| (None, s.into())).collect();
        self.verdict = Verdict::Checked { passed, lines };
        self
    }

    /// The verdict banner from the design check: one line per criterion with its own PASS or
    /// FAIL. A check without criteria gives the neutral "not checked" banner rather than a
    /// PASS, since nothing was demanded.
    pub fn design_check(&mut self, check: &DesignCheck) -> &mut Self {
        if check.rows.is_empty() {
            self.verdict = Verdict::NotChecked;
            return self;
        }
        let lines = check
            .rows
            .iter()
            .map(|row| {
                let found = crate::report::check::found_text(row);
                let place = match crate::report::check::place_text(&row.location) {
                    p if p.is_empty() => p,
                    p => format!(", {p}"),
                };
                let demand = crate::report::check::demand_text(row);
                let text = format!("{}: {found} (demand {demand}){place}", row.label);
                (Some(row.status == Status::Pass), text)
            })
            .collect();
        self.verdict = Verdict::Checked { passed: check.passed(), lines };
        self
    }

    /// Warnings repeated inside the verdict banner, after its lines: values of the input that
    /// are legal but unusual, so that the reader sees them with the verdict they led to.
    pub fn verdict_warnings<I, S>(&mut self, warnings: I) -> &mut Self
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        self.verdict_warnings = warnings.into_iter().map(Into::into).collect();
        self
    }

    /// A caution shown after the standing ones ([`crate::CAUTIONS`]), e.g. a warning of the
    /// analysis that the reader must not miss.
    pub fn caution(&mut self, text: impl Into<String>) -> &mut Self {
        self.cautions.push(text.into());
        self
    }

    /// Starts a new numbered section and returns it for its content.
    pub fn section(&mut self, title: impl Into<String>) -> &mut Section {
        self.sections.push(Section { title: title.into(), blocks: Vec::new() });
        let last = self.sections.len() - 1;
        &mut self.sections[last]
    }

    /// The `data-figure` value of every figure in document order, as rendered: the given id
    /// reduced to `a-z 0-9 - _`, with `-2`, `-3`, ... added to a repeated one. A test of a
    /// rendered report can look for each of these.
    pub fn figure_ids(&self) -> Vec<String> {
        render::resolve_figure_ids(&self.sections)
    }

    /// The whole document.
    pub fn render(&self) -> String {
        render::document(self)
    }
}

impl Section {
    /// A paragraph of plain text.
    pub fn paragraph(&mut self, text: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Paragraph(text.into()));
        self
    }

    /// A sub-heading inside the section.
    pub fn heading(&mut self, text: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Heading(text.into()));
        self
    }

    /// A figure: an SVG drawing of our own with a caption. `id` names it for links and tests
    /// (see [`HtmlReport::figure_ids`]); figures are numbered through the document. Axes of a
    /// plot must carry their quantity and unit inside the drawing.
    pub fn figure(
        &mut self,
        id: impl Into<String>,
        caption: impl Into<String>,
        svg: impl Into<String>,
    ) -> &mut Self {
        self.blocks.push(Block::Figure { id: id.into(), caption: caption.into(), svg: svg.into() });
        self
    }

    /// A table with a caption; headers carry units (as in [`Table`]), right-aligned columns
    /// are set as numbers. Tables are numbered through the document.
    pub fn table(&mut self, caption: impl Into<String>, table: &Table) -> &mut Self {
        self.blocks.push(Block::Table { caption: caption.into(), table: table.clone() });
        self
    }

    /// A short list of labelled values, e.g. ("Root flap moment", "1.25 kN·m").
    pub fn facts<I, K, V>(&mut self, items: I) -> &mut Self
    where
        I: IntoIterator<Item = (K, V)>,
        K: Into<String>,
        V: Into<String>,
    {
        let items = items.into_iter().map(|(k, v)| (k.into(), v.into())).collect();
        self.blocks.push(Block::Facts(items));
        self
    }

    /// A note: context the reader should know.
    pub fn note(&mut self, text: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Note(text.into()));
        self
    }

    /// A warning: a result that needs the reader's attention.
    pub fn warning(&mut self, text: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Warning(text.into()));
        self
    }

    /// A link to a side file written beside the report, by its path relative to the report
    /// (`sections.csv`, `stl/core-1.stl`), with what it holds. Consecutive links form one list.
    pub fn link(&mut self, path: impl Into<String>, label: impl Into<String>) -> &mut Self {
        self.blocks.push(Block::Link { path: path.into(), label: label.into() });
        self
    }
}

#[cfg(test)]
mod tests;
