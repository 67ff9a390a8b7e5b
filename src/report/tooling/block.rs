//! The tooling summary as a block of the HTML report.

use super::{CASTING_CAUTION, DRAIN_CAUTION, ToolingReport};
use crate::report::table::sig4;

impl ToolingReport<'_> {
    /// What became of the files of an earlier run, as lines (empty when nothing was there).
    pub(super) fn stale_lines(&self) -> Vec<String> {
        let st = self.stale;
        let mut lines = Vec::new();
        if !st.remove.is_empty() {
            lines.push(format!(
                "removed {} file(s) of the earlier run that the new set no longer holds (listed in \
                 its manifest, unchanged since): {}",
                st.remove.len(),
                st.remove.join(", ")
            ));
        }
        for (file, why) in &st.kept {
            lines.push(format!(
                "{file}: of the earlier run, not in the new set, left in place ({why})"
            ));
        }
        if let Some(why) = &st.unreadable {
            lines.push(format!("the earlier manifest cannot be used, no old file removed: {why}"));
        }
        lines
    }

    /// The summary as a block of the HTML report: the tables of [`ToolingReport::to_text`] with
    /// its masses, melting check and undercuts as paragraphs, warnings and notes.
    pub fn to_block(&self) -> crate::report::ReportBlock {
        let mut masses = String::new();
        self.masses_text(&mut masses);
        let mut melt = String::new();
        self.melt_text(&mut melt);
        // The terminal text wraps long items onto lines indented further: join them back, and
        // leave out the standing caution, which the report shows at its top.
        let lines = |text: &str| -> Vec<String> {
            let mut items: Vec<String> = Vec::new();
            for raw in text.lines().filter(|l| !l.trim().is_empty()) {
                match items.last_mut() {
                    Some(last) if raw.starts_with("    ") => {
                        last.push(' ');
                        last.push_str(raw.trim());
                    }
                    _ => items.push(raw.trim().to_string()),
                }
            }
            items.retain(|l| !l.starts_with('!'));
            items
        };
        let mut block = crate::report::ReportBlock::default();
        block.paragraphs.push(format!(
            "{}; chordal tolerance {} {}. Parts in the rotor frame at pitch {:.1}°.",
            self.format,
            self.small(self.tooling.params.tolerance),
            self.unit().symbol(),
            self.tooling.pitch.deg()
        ));
        let (parts, boxes) = self.parts_tables();
        block
            .tables
            .push(("Parts: volume and mass of the nominal part, area as written.".into(), parts));
        block.tables.push(("Bounding boxes as written, rotor frame.".into(), boxes));
        block.paragraphs.extend(lines(&masses).into_iter().skip(1));
        block.tables.push((
            "Where the last core ends at the thin trailing edge.".into(),
            self.core_ends_table(),
        ));
        block.tables.push((
            "Mould parts: pull direction, least draft and undercut.".into(),
            self.moulds_table(),
        ));
        block.tables.push((
            "Mould parts in their machining frames: p_rotor = origin + X x + Y y + Z z (axes and \
             origin in the rotor frame); the back face lies on z = 0."
                .into(),
            self.machining_table(),
        ));
        if !self.tooling.prints.is_empty()
            || !self.tooling.unprinted.is_empty()
            || !self.tooling.print_dropped.is_empty()
        {
            block.tables.push((
                "Core prints and drain ports: the section, the length beyond the shell, the \
                 print's volume beyond the core's end, the drain point (rotor frame) and the \
                 depth of alloy that cannot run into the print."
                    .into(),
                self.prints_table(),
            ));
            block.paragraphs.extend(self.summary.drain_orientation.iter().map(ToString::to_string));
            for f in &self.summary.drain_findings {
                if f.passed == Some(false) {
                    block.warnings.push(format!("draining: {}", f.note));
                } else {
                    block.notes.push(format!("passed: {}", f.note));
                }
            }
            block.notes.push(DRAIN_CAUTION.to_string());
        }
        if !self.tooling.casting.is_empty() {
            block.tables.push((
                "Core casting moulds: alloy to melt (cavity, sprue and vent), shrinkage, up when \
                 pouring, the sprue's and the vent's axis from the cavity to the top face \
                 (rotor frame), how far the cavity's highest point lies above the vent's foot, \
                 and the number of parts."
                    .into(),
                self.casting_table(),
            ));
            block.notes.push(CASTING_CAUTION.to_string());
        }
        block.notes.extend(self.tooling.casting_notes.iter().map(ToString::to_string));
        block.notes.extend(self.stale_lines());
        for l in lines(&melt) {
            if l.starts_with("FAIL") {
                block.warnings.push(format!("core alloy: {}", l.trim_start_matches("FAIL").trim()));
            } else {
                block.notes.push(match l.strip_prefix("ok ") {
                    Some(rest) => format!("passed: {}", rest.trim()),
                    None => l,
                });
            }
        }
        for h in self.tooling.mould_halves() {
            if !h.undercuts.is_empty() {
                block.warnings.push(format!(
                    "the {} mould half has {} cm² of undercut in {} regions along its pull (worst {:.1}°)",
                    h.side,
                    sig4(h.draft.undercut_area * 1e4),
                    h.undercuts.len(),
                    h.undercuts.iter().map(|r| r.worst.deg()).fold(f64::INFINITY, f64::min)
                ));
            }
        }
        block
    }
}
