//! The tooling summary as terminal text: parts, masses, drain plan, melting and casting.

use std::fmt::Write as _;

use super::{CASTING_CAUTION, DRAIN_CAUTION, ToolingReport, wrap};
use crate::report::table::sig4;

impl ToolingReport<'_> {
    /// The summary as text for the terminal.
    pub fn to_text(&self) -> String {
        let t = self.tooling;
        let u = self.unit().symbol();
        let mut s = String::new();
        let _ = writeln!(s, "Tooling  {}", self.name);
        s.push_str(&wrap(
            &format!(
                "{}; chordal tolerance {} {u}; parts at pitch {:.1}°, rotor frame (x along the \
                 pitch axis from the rotor centre)",
                self.format,
                self.small(t.params.tolerance),
                t.pitch.deg()
            ),
            "  ",
            "  ",
        ));
        let _ = writeln!(s, "\nCaution");
        for c in crate::CAUTIONS {
            s.push_str(&wrap(c, "  ! ", "    "));
        }
        let dir = self.written.first().and_then(|w| w.path.parent());
        let _ = writeln!(
            s,
            "\nParts in {} (volume and mass of the nominal part, area as written)",
            dir.map_or(String::from("."), |d| d.display().to_string())
        );
        let (table, boxes) = self.parts_tables();
        s.push_str(&table.render(2));
        let _ = writeln!(s, "\nBounding boxes as written, rotor frame");
        s.push_str(&boxes.render(2));
        self.masses_text(&mut s);
        self.ends_text(&mut s);
        self.melt_text(&mut s);
        self.drain_text(&mut s);
        self.moulds_text(&mut s);
        self.machining_text(&mut s);
        self.casting_text(&mut s);
        s
    }

    pub(super) fn drain_text(&self, s: &mut String) {
        let t = self.tooling;
        if t.prints.is_empty() && t.unprinted.is_empty() && t.print_dropped.is_empty() {
            return;
        }
        let _ = writeln!(
            s,
            "\nCore prints and drain ports (print section {} of the core's end section, {} {} \
             beyond the shell)",
            sig4(t.params.print_fraction),
            self.small(t.params.print_length),
            self.unit().symbol()
        );
        s.push_str(&self.prints_table().render(2));
        for stand in &self.summary.drain_orientation {
            s.push_str(&wrap(&stand.to_string(), "  ", "    "));
        }
        for f in &self.summary.drain_findings {
            let mark = if f.passed == Some(false) { "FAIL" } else { "ok  " };
            s.push_str(&wrap(&format!("{mark} {}", f.note), "  ", "    "));
        }
        s.push_str(&wrap(DRAIN_CAUTION, "  ! ", "    "));
    }

    pub(super) fn casting_text(&self, s: &mut String) {
        let t = self.tooling;
        if t.casting.is_empty() && t.casting_notes.is_empty() {
            return;
        }
        s.push('\n');
        s.push_str(&wrap(
            "Core casting moulds (core-N-cast-upper/-lower.stl, end pieces where an end needs \
             them, each also in its machining frame): the cavity is the core scaled by the \
             alloy's shrinkage; pour with the block on the lower half's back face, up as given \
             (rotor frame); the sprue and the vent run up to the top face, narrowing; alloy to \
             melt is the cavity, the sprue and the vent",
            "",
            "  ",
        ));
        s.push_str(&self.casting_table().render(2));
        for n in &t.casting_notes {
            s.push_str(&wrap(&n.to_string(), "  ", "    "));
        }
        s.push_str(&wrap(CASTING_CAUTION, "  ! ", "    "));
    }

    pub(super) fn machining_text(&self, s: &mut String) {
        s.push('\n');
        s.push_str(&wrap(
            "Machining frames: each mould part again with the cavity opening along +Z, its back \
             face on z = 0, in the positive octant; back to the rotor frame by p = origin + X x + \
             Y y + Z z (axes and origin in the rotor frame)",
            "",
            "  ",
        ));
        s.push_str(&self.machining_table().render(2));
        let lines = self.stale_lines();
        if !lines.is_empty() {
            let _ = writeln!(s, "\nFiles of the earlier run");
            for l in lines {
                s.push_str(&wrap(&l, "  ", "    "));
            }
        }
    }

    pub(super) fn masses_text(&self, s: &mut String) {
        let sum = self.summary;
        let _ = writeln!(s, "\nMasses");
        match sum.core_alloy {
            Some(m) => {
                let basis = self
                    .tooling
                    .parts
                    .iter()
                    .zip(&sum.masses)
                    .find(|(p, _)| p.kind == crate::tooling::PartKind::Core)
                    .map(|(_, m)| m.basis.clone())
                    .unwrap_or_default();
                let _ = writeln!(s, "  cores: {} kg of {basis} (nominal core volume)", sig4(m));
            }
            None => {
                let _ = writeln!(
                    s,
                    "  cores: core alloy mass not computed: no core_alloy in [tooling]"
                );
            }
        }
        if let Some((p, m)) = self
            .tooling
            .parts
            .iter()
            .zip(&sum.masses)
            .find(|(p, _)| p.kind == crate::tooling::PartKind::Shell)
        {
            let resin = m.resin.map_or(
                "resin not computed (a lamina lacks fibre_volume_fraction or \
                 resin_density_kg_m3)"
                    .to_string(),
                |r| format!("of it resin {} kg", sig4(r)),
            );
            let text = format!(
                "shell: {} kg of laminate, {resin}; {}",
                m.mass.map_or("-".into(), sig4),
                m.basis
            );
            s.push_str(&wrap(&text, "  ", "    "));
            let sc = sum.schedule;
            let text = format!(
                "the ply schedule over the stations holds {} kg in {} cm³; the shell's {} cm³ \
                 ({:+.1}%) add the end closures and the blade carried to the end trims",
                sig4(sc.mass),
                sig4(sc.volume * 1e6),
                sig4(p.nominal_volume * 1e6),
                100.0 * (p.nominal_volume / sc.volume - 1.0)
            );
            s.push_str(&wrap(&text, "  ", "    "));
        }
    }

    pub(super) fn melt_text(&self, s: &mut String) {
        let m = &self.summary.melt;
        let range = m
            .melting_range
            .map(|[a, b]| format!(", melts {}..{} °C", a.celsius(), b.celsius()))
            .unwrap_or_default();
        let name = m.alloy.clone().unwrap_or_else(|| "none named".into());
        let _ = writeln!(s, "\nCore alloy: {name}{range}");
        for f in &m.findings {
            let mark = match f.passed {
                Some(true) => "ok  ",
                Some(false) => "FAIL",
                None => "-   ",
            };
            let _ = writeln!(s, "  {mark} {}", f.note);
        }
        if let Some(note) = &m.safety_note {
            s.push_str(&wrap(&format!("handling: {note}"), "  ", "    "));
        }
        s.push_str(&wrap(crate::CAUTIONS[3], "  ! ", "    "));
    }
}
