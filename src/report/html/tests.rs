use super::*;
use crate::check::{Bound, CheckRow, Place, Quantity};
use crate::report::Align;

const SVG: &str = "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 4 4\"></svg>";

fn sample() -> HtmlReport {
    let mut r = HtmlReport::new("Fan <blade> & co");
    r.date("2026-12-01").meta("Input", "layups/x/blade.toml");
    let mut t = Table::new(&[("station", Align::Left), ("EA (MN)", Align::Right)]);
    t.row(vec!["root <1>".into(), "12.5".into()]);
    r.section("Stiffness")
        .paragraph("EI & GJ <along> the span")
        .figure("ei", "Flap stiffness. Chord frame.", SVG)
        .table("Section properties. At the stations.", &t)
        .link("sections.csv", "every station")
        .link("stl/core 1.stl", "core of cell 1")
        .note("a note")
        .warning("a warning");
    r.section("Modes").figure("ei", "Second figure with the same id.", SVG);
    r
}

#[test]
fn every_given_text_is_escaped() {
    let html = sample().render();
    for raw in ["<blade>", "<along>", "root <1>"] {
        assert!(!html.contains(raw), "{raw} left raw");
    }
    assert!(html.contains("Fan &lt;blade&gt; &amp; co"));
    assert!(html.contains("EI &amp; GJ &lt;along&gt; the span"));
    assert!(html.contains("<td>root &lt;1&gt;</td><td class=\"num\">12.5</td>"));
}

#[test]
fn the_standing_cautions_are_always_shown_before_the_sections() {
    let mut r = HtmlReport::new("x");
    r.caution("thin trailing edge between r = 0.80 m and the tip");
    let html = r.render();
    let cautions = html.find("id=\"cautions\"").unwrap();
    for c in crate::CAUTIONS {
        let at = html.find(&text::escape(c)).unwrap_or_else(|| panic!("missing caution {c}"));
        assert!(at > cautions);
    }
    assert!(html.contains("thin trailing edge"));
    let sample = sample().render();
    assert!(sample.find("id=\"cautions\"").unwrap() < sample.find("id=\"s1\"").unwrap());
}

#[test]
fn figures_and_tables_are_numbered_and_repeated_ids_made_unique() {
    let r = sample();
    assert_eq!(r.figure_ids(), ["ei", "ei-2"]);
    let html = r.render();
    assert!(html.contains("<figure id=\"fig-ei\" data-figure=\"ei\">"));
    assert!(html.contains("<figure id=\"fig-ei-2\" data-figure=\"ei-2\">"));
    assert!(html.contains("<span class=\"label\">Figure 2</span> Second figure"));
    assert!(html.contains("<table id=\"tab-1\">"));
    // The contents list the first sentence of each caption and link to the element.
    assert!(
        html.contains("<a href=\"#fig-ei\"><span class=\"num\">Figure 1</span> Flap stiffness</a>")
    );
    assert!(
        html.contains(
            "<a href=\"#tab-1\"><span class=\"num\">Table 1</span> Section properties</a>"
        )
    );
    assert!(html.contains("<a href=\"#s2\"><span class=\"num\">2</span> Modes</a>"));
}

#[test]
fn links_form_one_list_with_encoded_relative_paths() {
    let html = sample().render();
    assert_eq!(html.matches("<ul class=\"files\">").count(), 1);
    assert!(html.contains("<a href=\"stl/core%201.stl\">stl/core 1.stl</a>"));
    assert!(html.contains("<span class=\"kind\">CSV</span>"));
    let list = html.find("<ul class=\"files\">").unwrap();
    let note = html.find("box note").unwrap();
    assert!(html[list..note].contains("</ul>"), "the list closes before the note");
}

#[test]
fn an_xml_prolog_before_the_svg_is_dropped() {
    let mut r = HtmlReport::new("x");
    r.section("s").figure("a", "c", format!("<?xml version=\"1.0\"?>\n{SVG}"));
    let html = r.render();
    assert!(!html.contains("<?xml"));
    assert!(html.contains(SVG));
}

fn row(status_ok: bool) -> CheckRow {
    let found = if status_ok { Some(1.84) } else { Some(1.21) };
    CheckRow::new(
        "min_reserve_factor",
        "minimum reserve factor",
        1.5,
        Bound::AtLeast,
        found,
        Quantity::Ratio,
        Place::Named("r = 0.52 m, upper spar cap".into()),
    )
}

#[test]
fn the_verdict_follows_the_design_check() {
    let mut r = HtmlReport::new("x");
    r.design_check(&DesignCheck { rows: vec![row(true)] });
    let html = r.render();
    assert!(html.contains("class=\"verdict verdict-pass\""));
    assert!(html.contains(
        "<li class=\"ok\"><span class=\"tag\">PASS</span> minimum reserve factor: 1.840 (demand \
         &gt;= 1.500), r = 0.52 m, upper spar cap</li>"
    ));

    r.design_check(&DesignCheck { rows: vec![row(true), row(false)] });
    let html = r.render();
    assert!(html.contains("class=\"verdict verdict-fail\""));
    assert!(!html.contains("class=\"verdict verdict-pass\""));
    assert!(html.contains(
        "<li class=\"bad\"><span class=\"tag\">FAIL</span> minimum reserve factor: 1.210"
    ));

    r.design_check(&DesignCheck::default());
    assert!(r.render().contains("class=\"verdict verdict-none\""), "no criteria is not a pass");
    r.verdict(false, ["tip deflection 41 mm (limit 30 mm)"]);
    assert!(r.render().contains("<li>tip deflection 41 mm (limit 30 mm)</li>"));
}

#[test]
fn input_warnings_are_repeated_inside_the_verdict_banner() {
    // Issue 14 asks that a value legal but unusual be seen with the verdict it led to: the
    // warnings sit inside the banner's section, after its lines, and before the cautions.
    let mut r = HtmlReport::new("x");
    r.design_check(&DesignCheck { rows: vec![row(true)] });
    assert!(!r.render().contains("class=\"verdict-warnings\""), "no warnings, no list");
    r.verdict_warnings(["load factor 0.6 < 1 on case 'gust'"]);
    let html = r.render();
    let banner_end = html[html.find("id=\"verdict\"").unwrap()..].find("</section>").unwrap()
        + html.find("id=\"verdict\"").unwrap();
    let warning = html.find("load factor 0.6 &lt; 1 on case").expect("warning rendered, escaped");
    assert!(warning < banner_end, "the warning is inside the verdict banner");
    assert!(html.contains("With 1 input warning (unusual values"));
}

#[test]
fn the_document_is_self_contained() {
    let html = sample().render();
    assert!(html.starts_with("<!DOCTYPE html>"));
    assert!(!html.contains("<script"));
    assert!(!html.contains("<link"));
    assert!(!html.contains("@import"));
    assert!(!html.contains("url("));
    assert_eq!(html.matches("<style>").count(), 1);
    assert!(html.contains("@media print"));
    assert!(html.contains(&format!("version {}", env!("CARGO_PKG_VERSION"))));
}
