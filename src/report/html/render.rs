//! Writing the report out as one HTML document.

use std::collections::HashMap;

use super::text::{element_id, escape, file_kind, relative_href};
use super::{Block, HtmlReport, Section, Verdict, VerdictLine};
use crate::report::{Align, Table};

const STYLE: &str = include_str!("style.css");

/// The figure ids as rendered, in document order (see `HtmlReport::figure_ids`).
pub(super) fn resolve_figure_ids(sections: &[Section]) -> Vec<String> {
    let mut seen: HashMap<String, usize> = HashMap::new();
    let mut ids = Vec::new();
    for block in sections.iter().flat_map(|s| &s.blocks) {
        if let Block::Figure { id, .. } = block {
            let base = element_id(id, "figure");
            let count = seen.entry(base.clone()).or_insert(0);
            *count += 1;
            ids.push(if *count == 1 { base } else { format!("{base}-{count}") });
        }
    }
    ids
}

/// Numbers given to figures and tables, and the ids figures carry.
struct Numbering {
    figure_ids: Vec<String>,
    figure: usize,
    table: usize,
}

pub(super) fn document(report: &HtmlReport) -> String {
    let mut out = String::with_capacity(16 * 1024);
    let title = escape(&report.title);
    out.push_str("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
    out.push_str("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
    out.push_str(&format!("<meta name=\"generator\" content=\"layloft {}\">\n", version()));
    out.push_str(&format!("<title>{title} · layloft report</title>\n"));
    out.push_str("<style>\n");
    out.push_str(STYLE);
    out.push_str("</style>\n</head>\n<body>\n");
    masthead(report, &mut out);
    verdict(&report.verdict, &report.verdict_warnings, &mut out);
    cautions(&report.cautions, &mut out);
    contents(&report.sections, &mut out);
    out.push_str("<main>\n");
    let mut numbering =
        Numbering { figure_ids: resolve_figure_ids(&report.sections), figure: 0, table: 0 };
    for (k, section) in report.sections.iter().enumerate() {
        section_body(k + 1, section, &mut numbering, &mut out);
    }
    out.push_str("</main>\n");
    let on = report.date.as_ref().map(|d| format!(" on {}", escape(d))).unwrap_or_default();
    out.push_str(&format!(
        "<footer>Made by layloft {}{on}. A design aid: results must be confirmed by test and \
         reviewed by a qualified engineer.</footer>\n",
        version()
    ));
    out.push_str("</body>\n</html>\n");
    out
}

fn version() -> &'static str {
    env!("CARGO_PKG_VERSION")
}

fn masthead(report: &HtmlReport, out: &mut String) {
    out.push_str(
        "<header class=\"masthead\">\n<p class=\"kicker\">layloft · blade design report</p>\n",
    );
    out.push_str(&format!("<h1>{}</h1>\n", escape(&report.title)));
    if let Some(sub) = &report.subtitle {
        out.push_str(&format!("<p class=\"subtitle\">{}</p>\n", escape(sub)));
    }
    let mut facts: Vec<(String, String)> = Vec::new();
    if let Some(date) = &report.date {
        facts.push(("Date".into(), date.clone()));
    }
    facts.push(("layloft".into(), format!("version {}", version())));
    facts.extend(report.meta.iter().cloned());
    out.push_str("<dl class=\"meta\">\n");
    for (k, v) in &facts {
        out.push_str(&format!("<div><dt>{}</dt><dd>{}</dd></div>\n", escape(k), escape(v)));
    }
    out.push_str("</dl>\n</header>\n");
}

fn verdict(verdict: &Verdict, warnings: &[String], out: &mut String) {
    let no_lines: &[VerdictLine] = &[];
    let (class, mark, head, lines) = match verdict {
        Verdict::NotChecked => (
            "none",
            "NOT CHECKED",
            "No design check was made: the project sets no criteria.",
            no_lines,
        ),
        Verdict::Checked { passed: true, lines } => {
            ("pass", "PASS", "The design meets every criterion of its check.", lines.as_slice())
        }
        Verdict::Checked { passed: false, lines } => {
            ("fail", "FAIL", "The design does not meet its check.", lines.as_slice())
        }
    };
    out.push_str(&format!(
        "<section class=\"verdict verdict-{class}\" id=\"verdict\" aria-label=\"Design check \
         verdict\">\n<p class=\"verdict-mark\">{mark}</p>\n<div class=\"verdict-body\">\n\
         <p class=\"verdict-head\">{head}</p>\n"
    ));
    if !lines.is_empty() {
        out.push_str("<ul>\n");
        for (status, text) in lines {
            let (cls, tag) = match status {
                Some(true) => (" class=\"ok\"", "<span class=\"tag\">PASS</span> "),
                Some(false) => (" class=\"bad\"", "<span class=\"tag\">FAIL</span> "),
                None => ("", ""),
            };
            out.push_str(&format!("<li{cls}>{tag}{}</li>\n", escape(text)));
        }
        out.push_str("</ul>\n");
    }
    if !warnings.is_empty() {
        out.push_str(&format!(
            "<p class=\"verdict-warnings-head\">With {} input warning{} (unusual values, check \
             them):</p>\n<ul class=\"verdict-warnings\">\n",
            warnings.len(),
            if warnings.len() == 1 { "" } else { "s" }
        ));
        for w in warnings {
            out.push_str(&format!("<li class=\"warn\">{}</li>\n", escape(w)));
        }
        out.push_str("</ul>\n");
    }
    out.push_str("</div>\n</section>\n");
}

fn cautions(extra: &[String], out: &mut String) {
    out.push_str("<aside class=\"cautions\" id=\"cautions\">\n<h2>Cautions</h2>\n<ul>\n");
    for c in crate::CAUTIONS.iter().map(|c| c.to_string()).chain(extra.iter().cloned()) {
        out.push_str(&format!("<li>{}</li>\n", escape(&c)));
    }
    out.push_str("</ul>\n</aside>\n");
}

fn contents(sections: &[Section], out: &mut String) {
    if sections.is_empty() {
        return;
    }
    out.push_str(
        "<nav class=\"contents\" aria-label=\"Contents\">\n<div>\n<h2>Contents</h2>\n<ol>\n",
    );
    for (k, s) in sections.iter().enumerate() {
        out.push_str(&format!(
            "<li><a href=\"#s{n}\"><span class=\"num\">{n}</span> {}</a></li>\n",
            escape(&s.title),
            n = k + 1
        ));
    }
    out.push_str("</ol>\n</div>\n");
    let ids = resolve_figure_ids(sections);
    let mut figures = Vec::new();
    let mut tables = Vec::new();
    for block in sections.iter().flat_map(|s| &s.blocks) {
        match block {
            Block::Figure { caption, .. } => {
                let id = &ids[figures.len()];
                figures.push(format!(
                    "<li><a href=\"#fig-{id}\"><span class=\"num\">Figure {}</span> {}</a></li>\n",
                    figures.len() + 1,
                    escape(short_caption(caption))
                ));
            }
            Block::Table { caption, .. } => tables.push(format!(
                "<li><a href=\"#tab-{n}\"><span class=\"num\">Table {n}</span> {}</a></li>\n",
                escape(short_caption(caption)),
                n = tables.len() + 1
            )),
            _ => {}
        }
    }
    for (head, items) in [("Figures", figures), ("Tables", tables)] {
        if !items.is_empty() {
            out.push_str(&format!("<div>\n<h2>{head}</h2>\n<ol class=\"plain\">\n"));
            items.iter().for_each(|i| out.push_str(i));
            out.push_str("</ol>\n</div>\n");
        }
    }
    out.push_str("</nav>\n");
}

/// A caption's first sentence, for the lists of figures and tables.
fn short_caption(caption: &str) -> &str {
    match caption.find(". ") {
        Some(end) => &caption[..end],
        None => caption.trim_end_matches('.'),
    }
}

fn section_body(n: usize, section: &Section, numbering: &mut Numbering, out: &mut String) {
    out.push_str(&format!(
        "<section class=\"part\" id=\"s{n}\">\n<h2><span class=\"num\">{n}</span> {}</h2>\n",
        escape(&section.title)
    ));
    let mut in_links = false;
    for block in &section.blocks {
        let is_link = matches!(block, Block::Link { .. });
        if in_links && !is_link {
            out.push_str("</ul>\n");
        } else if !in_links && is_link {
            out.push_str("<ul class=\"files\">\n");
        }
        in_links = is_link;
        match block {
            Block::Paragraph(t) => out.push_str(&format!("<p>{}</p>\n", escape(t))),
            Block::Heading(t) => out.push_str(&format!("<h3>{}</h3>\n", escape(t))),
            Block::Figure { caption, svg, .. } => {
                let id = &numbering.figure_ids[numbering.figure];
                numbering.figure += 1;
                out.push_str(&format!(
                    "<figure id=\"fig-{id}\" data-figure=\"{id}\">\n{}\n<figcaption><span \
                     class=\"label\">Figure {}</span> {}</figcaption>\n</figure>\n",
                    strip_prolog(svg),
                    numbering.figure,
                    escape(caption)
                ));
            }
            Block::Table { caption, table } => {
                numbering.table += 1;
                html_table(numbering.table, caption, table, out);
            }
            Block::Facts(items) => {
                out.push_str("<dl class=\"facts\">\n");
                for (k, v) in items {
                    out.push_str(&format!(
                        "<div><dt>{}</dt><dd>{}</dd></div>\n",
                        escape(k),
                        escape(v)
                    ));
                }
                out.push_str("</dl>\n");
            }
            Block::Note(t) => out.push_str(&format!(
                "<div class=\"box note\"><p><span class=\"label\">Note</span> {}</p></div>\n",
                escape(t)
            )),
            Block::Warning(t) => out.push_str(&format!(
                "<div class=\"box warning\" role=\"note\"><p><span class=\"label\">Warning</span> \
                 {}</p></div>\n",
                escape(t)
            )),
            Block::Link { path, label } => out.push_str(&format!(
                "<li><span class=\"kind\">{}</span> <a href=\"{}\">{}</a> <span \
                 class=\"what\">{}</span></li>\n",
                escape(&file_kind(path)),
                escape(&relative_href(path)),
                escape(path),
                escape(label)
            )),
        }
    }
    if in_links {
        out.push_str("</ul>\n");
    }
    out.push_str("</section>\n");
}

fn html_table(n: usize, caption: &str, table: &Table, out: &mut String) {
    let class = |a: Align| if a == Align::Right { " class=\"num\"" } else { "" };
    out.push_str(&format!(
        "<div class=\"table-wrap\">\n<table id=\"tab-{n}\">\n<caption><span class=\"label\">Table \
         {n}</span> {}</caption>\n<thead>\n<tr>",
        escape(caption)
    ));
    for (h, a) in table.headers() {
        out.push_str(&format!("<th scope=\"col\"{}>{}</th>", class(*a), escape(h)));
    }
    out.push_str("</tr>\n</thead>\n<tbody>\n");
    for row in table.rows() {
        out.push_str("<tr>");
        for (cell, (_, a)) in row.iter().zip(table.headers()) {
            out.push_str(&format!("<td{}>{}</td>", class(*a), escape(cell)));
        }
        out.push_str("</tr>\n");
    }
    out.push_str("</tbody>\n</table>\n</div>\n");
}

/// The SVG from its `<svg` on: an XML declaration, doctype or comment before it is dropped (they
/// are not allowed inside an HTML body).
fn strip_prolog(svg: &str) -> &str {
    match svg.find("<svg") {
        Some(start) => &svg[start..],
        None => svg.trim(),
    }
}
