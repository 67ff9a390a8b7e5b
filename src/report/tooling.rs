//! The tooling summary: each part's file, triangle count, volume, surface area, mass and
//! bounding box; the end spheres; where the core ends at the thin trailing edge; the core
//! alloy's melting check with its handling note; each mould half's pull, least draft and
//! undercut regions; the allowances. As a terminal summary ([`ToolingReport::to_text`]) or one
//! JSON object ([`ToolingReport::to_json`], SI units in every key; a value not computed is
//! `null` with the reason beside it).
//!
//! Volumes and masses are those of the nominal parts; the files hold the parts with the
//! allowance factors applied (cores by the shrink factor, the mould cavity by the expansion
//! factor, both about the rotor centre). Places are rotor-frame points (origin on the rotor
//! axis, x along the pitch axis) in the output unit.

use std::fmt::Write as _;

use serde_json::{Value, json};

use super::table::{Align, Table, fixed, sig4};
use crate::mesh::{LengthUnit, WrittenPart};
use crate::tooling::{BladeTooling, StaleFiles, ToolingSummary};

/// What `layloft tooling` reports.
#[derive(Debug, Clone, Copy)]
pub struct ToolingReport<'a> {
    /// The project's name.
    pub name: &'a str,
    /// The parts and what their construction found.
    pub tooling: &'a BladeTooling,
    /// The files written, one per part in the order of `tooling.parts`, then one per machined
    /// part in the order of `tooling.machining`.
    pub written: &'a [WrittenPart],
    /// Masses and the melting check.
    pub summary: &'a ToolingSummary,
    /// STL format and unit, in words ("binary STL in mm").
    pub format: &'a str,
    /// Files of an earlier run that the new set does not hold: removed or left in place.
    pub stale: &'a StaleFiles,
}

/// The caution on melting the cores out, beside the drain plan.
const DRAIN_CAUTION: &str = "Melting out: low-melting core alloys give off metal fumes above \
     their melting range; alloys with bismuth, lead or cadmium are toxic: melt out in a \
     ventilated place or under extraction, wear gloves and eye protection, keep food away, \
     catch and weigh every drop, and keep the alloy for recasting or hazardous-waste disposal.";

/// The caution on casting the cores, beside the casting moulds.
const CASTING_CAUTION: &str = "Casting the cores: molten low-melting alloys burn and give off \
     metal fumes; alloys with bismuth, lead or cadmium are toxic: pour in a ventilated place or \
     under extraction, dry and warm the mould first (moisture under molten metal flashes to \
     steam), wear a face shield, gloves and closed clothing, keep food away, and keep the \
     sprue, the vent and the spills for recasting or hazardous-waste disposal.";

/// `text` wrapped at 96 columns, the first line after `first`, the others after `rest`.
fn wrap(text: &str, first: &str, rest: &str) -> String {
    let mut out = String::new();
    let mut line = first.to_string();
    let mut empty = true;
    for word in text.split_whitespace() {
        if !empty && line.chars().count() + 1 + word.chars().count() > 96 {
            out.push_str(&line);
            out.push('\n');
            line = rest.to_string();
            empty = true;
        }
        if !empty {
            line.push(' ');
        }
        line.push_str(word);
        empty = false;
    }
    out.push_str(&line);
    out.push('\n');
    out
}

fn num(v: f64) -> Value {
    if v.is_finite() { json!(v) } else { Value::Null }
}

fn opt(v: Option<f64>) -> Value {
    v.map_or(Value::Null, num)
}

fn point(p: [f64; 3]) -> Value {
    json!({"x_m": num(p[0]), "y_m": num(p[1]), "z_m": num(p[2])})
}

impl ToolingReport<'_> {
    fn unit(&self) -> LengthUnit {
        self.tooling.params.unit
    }

    /// A length in the output unit with micrometre decimals.
    fn len(&self, v: f64) -> String {
        let u = self.unit();
        fixed(v * u.per_metre(), u.decimals().saturating_sub(2))
    }

    /// A small length (a tolerance, a laminate thickness) in the output unit, four digits.
    fn small(&self, v: f64) -> String {
        sig4(v * self.unit().per_metre())
    }

    /// The parts (file, triangles, volume, area, mass) and their bounding boxes as written.
    fn parts_tables(&self) -> (Table, Table) {
        let t = self.tooling;
        let u = self.unit().symbol();
        let mut table = Table::new(&[
            ("part", Align::Left),
            ("file", Align::Left),
            ("triangles", Align::Right),
            ("volume cm³", Align::Right),
            ("area cm²", Align::Right),
            ("mass kg", Align::Right),
        ]);
        let mut boxes = Table::new(&[
            ("part", Align::Left),
            (&format!("x {u}"), Align::Right),
            (&format!("y {u}"), Align::Right),
            (&format!("z {u}"), Align::Right),
        ]);
        for ((p, w), m) in t.parts.iter().zip(self.written).zip(&self.summary.masses) {
            let b = w.summary.bounding_box;
            let span = |k: usize| format!("{}..{}", self.len(b.min[k]), self.len(b.max[k]));
            let file = w.path.file_name().map(|f| f.to_string_lossy().into_owned());
            table.row(vec![
                p.name.clone(),
                file.unwrap_or_default(),
                w.summary.triangles.to_string(),
                sig4(p.nominal_volume * 1e6),
                sig4(w.summary.area * 1e4),
                m.mass.map_or("not computed".into(), sig4),
            ]);
            boxes.row(vec![p.name.clone(), span(0), span(1), span(2)]);
        }
        (table, boxes)
    }

    /// Each core's print: the end it leaves through, section, length, volume beyond the core's
    /// end, drain point and the depth of alloy that cannot run into it.
    fn prints_table(&self) -> Table {
        let u = self.unit().symbol();
        let mut table = Table::new(&[
            ("core", Align::Left),
            ("end", Align::Left),
            ("section cm²", Align::Right),
            (&format!("length {u}"), Align::Right),
            ("print cm³", Align::Right),
            (&format!("drain point (x, y, z) {u}"), Align::Left),
            (&format!("pool {u}"), Align::Right),
        ]);
        for p in &self.tooling.prints {
            let d = p.drain_point;
            table.row(vec![
                p.core.clone(),
                p.end.to_string(),
                sig4(p.section_area * 1e4),
                self.small(p.length),
                sig4(p.volume * 1e6),
                format!("{}, {}, {}", self.len(d[0]), self.len(d[1]), self.len(d[2])),
                self.small(p.pool_depth),
            ]);
        }
        for core in &self.tooling.unprinted {
            let none = "-".to_string();
            table.row(vec![
                core.clone(),
                "none".into(),
                none.clone(),
                none.clone(),
                none.clone(),
                "sealed by bulkheads".into(),
                none,
            ]);
        }
        table
    }

    fn drain_text(&self, s: &mut String) {
        let t = self.tooling;
        if t.prints.is_empty() && t.unprinted.is_empty() {
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
        for line in &self.summary.drain_orientation {
            s.push_str(&wrap(line, "  ", "    "));
        }
        for f in &self.summary.drain_findings {
            let mark = if f.passed == Some(false) { "FAIL" } else { "ok  " };
            s.push_str(&wrap(&format!("{mark} {}", f.text), "  ", "    "));
        }
        s.push_str(&wrap(DRAIN_CAUTION, "  ! ", "    "));
    }

    /// Where the last core ends at the thin trailing edge, station by station.
    fn core_ends_table(&self) -> Table {
        let t = self.tooling;
        let u = self.unit().symbol();
        let mut table = Table::new(&[
            (&format!("r {u}"), Align::Right),
            ("core ends at x/c", Align::Right),
            (&format!("solid chord {u}"), Align::Right),
        ]);
        for c in &t.core_ends {
            table.row(vec![self.len(c.r), fixed(c.chord_fraction, 3), self.len(c.solid_chord)]);
        }
        table
    }

    /// The mould parts with what each is: the part's file name, its description, its volume as
    /// made and its mass, in the order of the parts.
    fn mould_parts(&self) -> Vec<(&str, &crate::tooling::MouldHalf, f64, Option<f64>)> {
        let t = self.tooling;
        t.parts
            .iter()
            .zip(&self.summary.masses)
            .filter(|(p, _)| p.kind.is_mould())
            .zip(t.mould_halves())
            .map(|((p, m), h)| (p.name.as_str(), h, p.nominal_volume, m.mass))
            .collect()
    }

    /// Each mould part's pull, least draft, undercut area, volume and mass.
    fn moulds_table(&self) -> Table {
        let mut table = Table::new(&[
            ("part", Align::Left),
            ("pull (x, y, z)", Align::Left),
            ("least draft °", Align::Right),
            ("at", Align::Left),
            ("below least cm²", Align::Right),
            ("undercut cm²", Align::Right),
            ("volume cm³", Align::Right),
            ("mass kg", Align::Right),
        ]);
        let modular = self.tooling.modular.is_some();
        for (name, h, volume, mass) in self.mould_parts() {
            table.row(vec![
                // A mould split along the span names its modules' halves by part name.
                if modular {
                    name.trim_start_matches("mould-").to_string()
                } else {
                    h.side.to_string()
                },
                format!(
                    "({}, {}, {})",
                    fixed(h.pull[0], 3),
                    fixed(h.pull[1], 3),
                    fixed(h.pull[2], 3)
                ),
                fixed(h.draft.min_draft.deg(), 2),
                h.draft.at.to_string(),
                sig4(h.draft.below_min_area * 1e4),
                sig4(h.draft.undercut_area * 1e4),
                sig4(volume * 1e6),
                mass.map_or("not computed".into(), sig4),
            ]);
        }
        table
    }

    /// Each mould part's machining frame: file, axes and origin in the rotor frame.
    fn machining_table(&self) -> Table {
        let u = self.unit().symbol();
        let mut table = Table::new(&[
            ("part", Align::Left),
            ("file", Align::Left),
            ("X axis", Align::Left),
            ("Y axis", Align::Left),
            ("Z axis (cavity opens)", Align::Left),
            (&format!("origin {u}"), Align::Left),
        ]);
        let v =
            |a: [f64; 3]| format!("({}, {}, {})", fixed(a[0], 4), fixed(a[1], 4), fixed(a[2], 4));
        for m in &self.tooling.machining {
            let o = m.frame.origin;
            table.row(vec![
                m.part.clone(),
                format!("{}.stl", m.name),
                v(m.frame.axes[0]),
                v(m.frame.axes[1]),
                v(m.frame.axes[2]),
                format!("({}, {}, {})", self.len(o[0]), self.len(o[1]), self.len(o[2])),
            ]);
        }
        table
    }

    /// The cores' casting moulds: alloy to melt, pouring position, sprue and vent, parts.
    fn casting_table(&self) -> Table {
        let u = self.unit().symbol();
        let mut table = Table::new(&[
            ("core", Align::Left),
            ("alloy cm³", Align::Right),
            ("alloy kg", Align::Right),
            ("shrink %", Align::Right),
            ("up (pouring)", Align::Left),
            (&format!("sprue in/out {u}"), Align::Left),
            (&format!("vent in/out {u}"), Align::Left),
            (&format!("vent below highest {u}"), Align::Right),
            ("parts", Align::Left),
        ]);
        let v =
            |a: [f64; 3]| format!("({}, {}, {})", fixed(a[0], 3), fixed(a[1], 3), fixed(a[2], 3));
        let p =
            |a: [f64; 3]| format!("({}, {}, {})", self.len(a[0]), self.len(a[1]), self.len(a[2]));
        for (m, a) in self.tooling.casting.iter().zip(&self.summary.casting_alloy) {
            table.row(vec![
                m.core.clone(),
                sig4(m.metal_volume * 1e6),
                a.mass.map_or("-".into(), sig4),
                fixed(m.shrinkage * 100.0, 2),
                v(m.up),
                format!("{} -> {}", p(m.sprue.entry), p(m.sprue.outlet)),
                format!("{} -> {}", p(m.vent.entry), p(m.vent.outlet)),
                self.small(m.vent_shortfall),
                m.parts.len().to_string(),
            ]);
        }
        table
    }

    fn casting_text(&self, s: &mut String) {
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
            s.push_str(&wrap(n, "  ", "    "));
        }
        s.push_str(&wrap(CASTING_CAUTION, "  ! ", "    "));
    }

    /// What became of the files of an earlier run, as lines (empty when nothing was there).
    fn stale_lines(&self) -> Vec<String> {
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
    pub fn to_block(&self) -> super::ReportBlock {
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
        let mut block = super::ReportBlock::default();
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
        if !self.tooling.prints.is_empty() || !self.tooling.unprinted.is_empty() {
            block.tables.push((
                "Core prints and drain ports: the section, the length beyond the shell, the \
                 print's volume beyond the core's end, the drain point (rotor frame) and the \
                 depth of alloy that cannot run into the print."
                    .into(),
                self.prints_table(),
            ));
            block.paragraphs.extend(self.summary.drain_orientation.iter().cloned());
            for f in &self.summary.drain_findings {
                if f.passed == Some(false) {
                    block.warnings.push(format!("draining: {}", f.text));
                } else {
                    block.notes.push(format!("passed: {}", f.text));
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
        block.notes.extend(self.tooling.casting_notes.iter().cloned());
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

    fn machining_text(&self, s: &mut String) {
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

    fn masses_text(&self, s: &mut String) {
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

    fn ends_text(&self, s: &mut String) {
        let t = self.tooling;
        let u = self.unit().symbol();
        let e = t.ends;
        let _ = writeln!(s, "\nEnds");
        match t.params.ends {
            crate::tooling::EndShape::Spheres => {
                let text = format!(
                    "spheres about the rotor centre: outer surface {} and {} {u}, cores {} and \
                     {} {u} (end laminate {} and {} {u})",
                    self.len(e.root),
                    self.len(e.tip),
                    self.len(e.root + e.root_laminate),
                    self.len(e.tip - e.tip_laminate),
                    self.small(e.root_laminate),
                    self.small(e.tip_laminate)
                );
                s.push_str(&wrap(&text, "  ", "    "));
            }
            crate::tooling::EndShape::Planes => {
                let _ =
                    writeln!(s, "  planes normal to the pitch axis at the first and last station");
            }
        }
        if t.root_extension > 0.0 {
            let _ = writeln!(
                s,
                "  the root section is carried up to {} {u} inboard of the first station to meet \
                 the root trim",
                self.len(t.root_extension)
            );
        }
        if t.tip_extension > 0.0 {
            let _ = writeln!(
                s,
                "  the tip section is carried {} {u} beyond the last station to meet the tip trim",
                self.len(t.tip_extension)
            );
        }
        s.push('\n');
        s.push_str(&wrap(
            &format!(
                "Core at the trailing edge: the last core closes where the inner surfaces come \
                 within {} {u}; behind it the shell is solid laminate",
                self.small(t.params.min_core_thickness)
            ),
            "",
            "  ",
        ));
        let table = self.core_ends_table();
        s.push_str(&table.render(2));
    }

    fn melt_text(&self, s: &mut String) {
        let m = &self.summary.melt;
        let range =
            m.melting_range_c.map(|[a, b]| format!(", melts {a}..{b} °C")).unwrap_or_default();
        let name = m.alloy.clone().unwrap_or_else(|| "none named".into());
        let _ = writeln!(s, "\nCore alloy: {name}{range}");
        for f in &m.findings {
            let mark = match f.passed {
                Some(true) => "ok  ",
                Some(false) => "FAIL",
                None => "-   ",
            };
            let _ = writeln!(s, "  {mark} {}", f.text);
        }
        if let Some(note) = &m.safety_note {
            s.push_str(&wrap(&format!("handling: {note}"), "  ", "    "));
        }
        s.push_str(&wrap(crate::CAUTIONS[3], "  ! ", "    "));
    }

    fn moulds_text(&self, s: &mut String) {
        let t = self.tooling;
        let u = self.unit().symbol();
        s.push('\n');
        s.push_str(&wrap(
            &format!(
                "Mould halves: pulled normal to a chord at {:.1}° (chosen so that no cavity facet \
                 undercuts), parted along the blade's silhouette across the pull; least \
                 acceptable draft {:.1}°",
                t.mould_pull_angle.deg(),
                t.params.min_draft.deg()
            ),
            "",
            "  ",
        ));
        let table = self.moulds_table();
        s.push_str(&table.render(2));
        if let Some(m) = &t.modular {
            let text = format!(
                "no single pull draws every section: the mould is split along the span into {} \
                 modules, each two halves with its own pull parted at its own silhouette, meeting \
                 flush on planes normal to the pitch axis (radii {} {u}); take the end pieces off \
                 first, then each module's halves",
                m.modules.len(),
                m.modules[1..]
                    .iter()
                    .map(|k| self.len(k.x_range[0]))
                    .collect::<Vec<_>>()
                    .join(", ")
            );
            s.push_str(&wrap(&text, "  ", "    "));
        }
        for (name, h, _, _) in self.mould_parts() {
            // A mould of modules names each part by its file name (several halves share a side).
            let side = match t.modular {
                Some(_) => name.to_string(),
                None => format!("{} half", h.side),
            };
            if h.undercuts.is_empty() {
                let _ = writeln!(s, "  {side}: no undercuts");
                continue;
            }
            let _ = writeln!(s, "  undercuts of the {side} ({} regions):", h.undercuts.len());
            for r in h.undercuts.iter().take(8) {
                let text = format!(
                    "{} cm² on the {}, x {}..{} {u}, worst {:.2}° at {}",
                    sig4(r.area * 1e4),
                    r.region,
                    self.len(r.x_range[0]),
                    self.len(r.x_range[1]),
                    r.worst.deg(),
                    r.at
                );
                s.push_str(&wrap(&text, "    ", "      "));
            }
            if h.undercuts.len() > 8 {
                let _ = writeln!(s, "    and {} smaller regions", h.undercuts.len() - 8);
            }
        }
        if !t.end_pieces.is_empty() {
            let names: Vec<&str> = t.end_pieces.iter().map(|e| e.side).collect();
            let text = format!(
                "end pieces ({}): the spherical end undercuts the halves' pull, so its cap is \
                 moulded by a plug pulled along the span, bounded by the end ring carried along \
                 the pitch axis to the block's end face; take the end pieces off first",
                names.join(", ")
            );
            s.push_str(&wrap(&text, "  ", "    "));
        }
        let b = t.modular.as_ref().map_or(t.moulds[0].block_size, |m| m.block_size);
        let text = format!(
            "block {} x {} x {} {u} (along the pitch axis, the middle chord, the pull); three \
             conical locating pins on the lower half's corners register the halves one way round",
            self.len(b[0]),
            self.len(b[1]),
            self.len(b[2])
        );
        s.push_str(&wrap(&text, "  ", "    "));
        let _ = writeln!(
            s,
            "  allowances: mould cavity x{} (thermal expansion), cores x{} (shrink), about the \
             rotor centre",
            t.params.mould_expansion_factor, t.params.core_shrink_factor
        );
    }

    /// The summary as one JSON object, SI units in every key.
    pub fn to_json(&self) -> Value {
        let t = self.tooling;
        let parts: Vec<Value> = t
            .parts
            .iter()
            .zip(self.written)
            .zip(&self.summary.masses)
            .map(|((p, w), m)| {
                let b = w.summary.bounding_box;
                json!({
                    "name": p.name,
                    "file": w.path.display().to_string(),
                    "triangles": w.summary.triangles,
                    "volume_m3": num(p.nominal_volume),
                    "volume_in_file_m3": num(w.summary.volume),
                    "area_m2": num(w.summary.area),
                    "mass_kg": opt(m.mass),
                    "resin_mass_kg": opt(m.resin),
                    "mass_basis": m.basis,
                    "bounding_box": {"min": point(b.min), "max": point(b.max)},
                })
            })
            .collect();
        let e = t.ends;
        let melt = &self.summary.melt;
        let sc = self.summary.schedule;
        let halves: Vec<Value> = t
            .moulds
            .iter()
            .map(|h| {
                json!({
                    "half": h.side,
                    "pull": {"x": num(h.pull[0]), "y": num(h.pull[1]), "z": num(h.pull[2])},
                    "least_draft_deg": num(h.draft.min_draft.deg()),
                    "least_draft_at": point(h.draft.at.point),
                    "below_least_draft_area_m2": num(h.draft.below_min_area),
                    "undercut_area_m2": num(h.draft.undercut_area),
                    "cavity_area_m2": num(h.cavity_area),
                    "undercuts": h.undercuts.iter().map(|r| json!({
                        "area_m2": num(r.area),
                        "worst_draft_deg": num(r.worst.deg()),
                        "at": point(r.at.point),
                        "x_from_m": num(r.x_range[0]),
                        "x_to_m": num(r.x_range[1]),
                        "region": r.region,
                    })).collect::<Vec<_>>(),
                    "locators": h.locators.iter().map(|&p| point(p)).collect::<Vec<_>>(),
                    "block_size_m": h.block_size.map(num),
                })
            })
            .collect();
        let mut out = json!({
            "project": self.name,
            "format": self.format,
            "unit": self.unit().symbol(),
            "tolerance_m": num(t.params.tolerance),
            "pitch_deg": num(t.pitch.deg()),
            "cautions": crate::CAUTIONS,
            "parts": parts,
            "ends": {
                "shape": match t.params.ends {
                    crate::tooling::EndShape::Spheres => "spheres",
                    crate::tooling::EndShape::Planes => "planes",
                },
                "root_sphere_radius_m": num(e.root),
                "tip_sphere_radius_m": num(e.tip),
                "root_laminate_m": num(e.root_laminate),
                "tip_laminate_m": num(e.tip_laminate),
                "root_extension_m": num(t.root_extension),
                "tip_extension_m": num(t.tip_extension),
            },
            "core_ends": t.core_ends.iter().map(|c| json!({
                "r_m": num(c.r),
                "chord_fraction": num(c.chord_fraction),
                "solid_chord_m": num(c.solid_chord),
            })).collect::<Vec<_>>(),
            "min_core_thickness_m": num(t.params.min_core_thickness),
            "masses": {
                "core_alloy_kg": opt(self.summary.core_alloy),
                "schedule_volume_m3": num(sc.volume),
                "schedule_mass_kg": num(sc.mass),
                "schedule_resin_mass_kg": opt(sc.resin),
            },
            "core_alloy": {
                "name": melt.alloy,
                "solidus_C": opt(melt.melting_range_c.map(|r| r[0])),
                "liquidus_C": opt(melt.melting_range_c.map(|r| r[1])),
                "checks": melt.findings.iter().map(|f| json!({
                    "passed": f.passed,
                    "text": f.text,
                })).collect::<Vec<_>>(),
                "failed": melt.failed(),
                "safety_note": melt.safety_note,
            },
            "moulds": halves,
            "mould_pull_chord_angle_deg": num(t.mould_pull_angle.deg()),
            "mould_parts": self.mould_parts().iter().map(|(name, h, volume, mass)| json!({
                "name": name,
                "pull": {"x": num(h.pull[0]), "y": num(h.pull[1]), "z": num(h.pull[2])},
                "least_draft_deg": num(h.draft.min_draft.deg()),
                "below_least_draft_area_m2": num(h.draft.below_min_area),
                "undercut_area_m2": num(h.draft.undercut_area),
                "volume_m3": num(*volume),
                "mass_kg": opt(*mass),
            })).collect::<Vec<_>>(),
            "end_pieces": t.end_pieces.iter().map(|h| json!({
                "part": h.side,
                "pull": {"x": num(h.pull[0]), "y": num(h.pull[1]), "z": num(h.pull[2])},
                "least_draft_deg": num(h.draft.min_draft.deg()),
                "least_draft_at": point(h.draft.at.point),
                "below_least_draft_area_m2": num(h.draft.below_min_area),
                "undercut_area_m2": num(h.draft.undercut_area),
                "cavity_area_m2": num(h.cavity_area),
                "size_m": h.block_size.map(num),
            })).collect::<Vec<_>>(),
            "machining_frames": t.machining.iter().map(|m| json!({
                "part": m.part,
                "name": m.name,
                "file": format!("{}.stl", m.name),
                "x_axis": m.frame.axes[0].map(num),
                "y_axis": m.frame.axes[1].map(num),
                "z_axis": m.frame.axes[2].map(num),
                "origin_m": m.frame.origin.map(num),
            })).collect::<Vec<_>>(),
            "earlier_files": {
                "removed": self.stale.remove,
                "left_in_place": self.stale.kept.iter().map(|(f, why)| json!({
                    "file": f,
                    "reason": why,
                })).collect::<Vec<_>>(),
                "manifest_unreadable": self.stale.unreadable,
            },
            "allowances": {
                "mould_expansion_factor": num(t.params.mould_expansion_factor),
                "core_shrink_factor": num(t.params.core_shrink_factor),
            },
        });
        // Prints and draining, after the keys above.
        let prints = json!({
            "core_prints": t.prints.iter().map(|p| json!({
                "core": p.core,
                "end": p.end.to_string(),
                "section_area_m2": num(p.section_area),
                "length_m": num(p.length),
                "x_end_m": num(p.x_end),
                "volume_m3": num(p.volume),
                "drain_point": point(p.drain_point),
                "down": p.down.map(num),
                "pool_depth_m": num(p.pool_depth),
                "section_m": p.section.iter().map(|q| [num(q[0]), num(q[1])]).collect::<Vec<_>>(),
            })).collect::<Vec<_>>(),
            "cores_without_print": t.unprinted,
            "core_print_fraction": num(t.params.print_fraction),
            "core_print_length_m": num(t.params.print_length),
            "drain": {
                "orientation": self.summary.drain_orientation,
                "checks": self.summary.drain_findings.iter().map(|f| json!({
                    "passed": f.passed,
                    "text": f.text,
                })).collect::<Vec<_>>(),
                "caution": DRAIN_CAUTION,
            },
        });
        if let (Some(o), Value::Object(p)) = (out.as_object_mut(), prints) {
            o.extend(p);
        }
        // The cores' casting moulds, after the keys above.
        let channel = |c: &crate::tooling::Channel| {
            json!({
                "entry": point(c.entry),
                "outlet": point(c.outlet),
                "entry_diameter_m": num(c.entry_diameter),
                "outlet_diameter_m": num(c.outlet_diameter),
                "volume_m3": num(c.volume),
            })
        };
        let casting = json!({
            "casting_moulds": t.casting.iter().zip(&self.summary.casting_alloy).map(|(m, a)| json!({
                "core": m.core,
                "shrinkage_pct": num(m.shrinkage * 100.0),
                "core_volume_m3": num(m.core_volume),
                "cavity_volume_m3": num(m.cavity_volume),
                "alloy_volume_m3": num(m.metal_volume),
                "alloy_mass_kg": opt(a.mass),
                "alloy_mass_basis": a.basis,
                "pull_chord_angle_deg": num(m.pull_angle.deg()),
                "pouring_up": m.up.map(num),
                "highest_point": point(m.highest),
                "vent_below_highest_m": num(m.vent_shortfall),
                "sprue": channel(&m.sprue),
                "vent": channel(&m.vent),
                "block_volume_m3": num(m.block_volume),
                "parts": m.parts.iter().map(|p| json!({
                    "name": p.name,
                    "file": format!("{}.stl", p.name),
                    "pull": {"x": num(p.pull[0]), "y": num(p.pull[1]), "z": num(p.pull[2])},
                    "volume_m3": num(p.mesh.signed_volume()),
                })).collect::<Vec<_>>(),
                "halves": m.halves.iter().chain(&m.end_pieces).map(|h| json!({
                    "part": h.side,
                    "least_draft_deg": num(h.draft.min_draft.deg()),
                    "below_least_draft_area_m2": num(h.draft.below_min_area),
                    "undercut_area_m2": num(h.draft.undercut_area),
                })).collect::<Vec<_>>(),
                "machining_frames": m.machining.iter().map(|c| json!({
                    "part": c.part,
                    "name": c.name,
                    "file": format!("{}.stl", c.name),
                    "x_axis": c.frame.axes[0].map(num),
                    "y_axis": c.frame.axes[1].map(num),
                    "z_axis": c.frame.axes[2].map(num),
                    "origin_m": c.frame.origin.map(num),
                })).collect::<Vec<_>>(),
            })).collect::<Vec<_>>(),
            "casting_notes": t.casting_notes,
            "casting_caution": CASTING_CAUTION,
        });
        if let (Some(o), Value::Object(c)) = (out.as_object_mut(), casting) {
            o.extend(c);
        }
        // A mould split along the span (only then: a mould of two halves keeps its keys).
        if let (Some(o), Some(m)) = (out.as_object_mut(), &t.modular) {
            o.insert(
                "mould_modules".into(),
                json!({
                    "modules": m.modules.iter().map(|k| json!({
                        "x_from_m": num(k.x_range[0]),
                        "x_to_m": num(k.x_range[1]),
                        "pull_chord_angle_deg": num(k.pull_angle.deg()),
                        "drawing_window_deg": num(k.window.deg()),
                    })).collect::<Vec<_>>(),
                    "block_size_m": m.block_size.map(num),
                }),
            );
        }
        out
    }
}

/// Convex hull of points in the plane, counter-clockwise (Andrew's monotone chain, 1979).
fn hull(mut pts: Vec<[f64; 2]>) -> Vec<[f64; 2]> {
    pts.sort_by(|a, b| a[0].total_cmp(&b[0]).then(a[1].total_cmp(&b[1])));
    pts.dedup();
    if pts.len() < 3 {
        return pts;
    }
    let cross = |o: [f64; 2], a: [f64; 2], b: [f64; 2]| {
        (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
    };
    let mut out: Vec<[f64; 2]> = Vec::with_capacity(2 * pts.len());
    for pass in 0..2 {
        let start = out.len();
        let iter: Box<dyn Iterator<Item = &[f64; 2]>> =
            if pass == 0 { Box::new(pts.iter()) } else { Box::new(pts.iter().rev()) };
        for &p in iter {
            while out.len() >= start + 2 && cross(out[out.len() - 2], out[out.len() - 1], p) <= 0.0
            {
                out.pop();
            }
            out.push(p);
        }
        out.pop();
    }
    out
}

impl ToolingReport<'_> {
    /// An exploded drawing of the mould parts (SVG): seen across the pull, the pitch axis to the
    /// right and the upper half's pull up, each part drawn as its outline in that view and moved
    /// away from the blade along its own pull (the halves up and down, the end pieces along the
    /// span), with the blade's outline (dashed) in the middle and the pull of each part as an
    /// arrow. Outlines are the convex hulls of the parts' vertices in the view.
    pub fn exploded_svg(&self) -> String {
        let t = self.tooling;
        let up = t.moulds[0].pull;
        let view = |p: [f64; 3]| [p[0], p[0] * up[0] + p[1] * up[1] + p[2] * up[2]];
        let outline = |m: &crate::mesh::Mesh| -> Vec<[f64; 2]> {
            hull(m.vertices.iter().map(|&p| view(p)).collect())
        };
        let b = t.moulds[0].block_size;
        let gap = 0.35 * b[2].max(0.2 * b[0]);
        let mut shapes: Vec<Outline> = Vec::new();
        if let Some(shell) = t.parts.iter().find(|p| p.kind == crate::tooling::PartKind::Shell) {
            shapes.push(("blade".into(), outline(&shell.mesh), [0.0, 0.0], true));
        }
        for ((name, h, _, _), p) in
            self.mould_parts().into_iter().zip(t.parts.iter().filter(|p| p.kind.is_mould()))
        {
            let d = view(h.pull);
            let n = (d[0] * d[0] + d[1] * d[1]).sqrt().max(1e-12);
            let shift = [gap * d[0] / n, gap * d[1] / n];
            let pts = outline(&p.mesh).iter().map(|q| [q[0] + shift[0], q[1] + shift[1]]).collect();
            shapes.push((name.to_string(), pts, [d[0] / n, d[1] / n], false));
        }
        let (mut lo, mut hi) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
        for q in shapes.iter().flat_map(|s| s.1.iter()) {
            for k in 0..2 {
                lo[k] = lo[k].min(q[k]);
                hi[k] = hi[k].max(q[k]);
            }
        }
        let (w, h) = (960.0, 600.0);
        let pad = 60.0;
        let scale = ((w - 2.0 * pad) / (hi[0] - lo[0])).min((h - 2.0 * pad) / (hi[1] - lo[1]));
        let px = |q: [f64; 2]| [pad + (q[0] - lo[0]) * scale, h - pad - (q[1] - lo[1]) * scale];
        let mut s = String::new();
        let _ = writeln!(
            s,
            "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {w} {h}\" width=\"{w}\" \
             height=\"{h}\" font-family=\"sans-serif\" font-size=\"13\">"
        );
        let _ = writeln!(
            s,
            "<title>{}: mould parts, exploded along their pulls</title>",
            xml(self.name)
        );
        // Two title lines, each shrunk to the drawing's width (a mean advance of 0.6 em).
        let room = w - 2.0 * pad;
        let fit = |text: &str, base: f64| -> f64 {
            let need = 0.6 * base * text.chars().count() as f64;
            if need <= room { base } else { (base * room / need).max(6.0) }
        };
        let what = "Mould parts moved apart along their pulls (seen across the pull; pitch axis to \
                    the right). Outlines only.";
        let _ = writeln!(
            s,
            "<text x=\"{pad}\" y=\"22\" font-size=\"{:.1}\">{}</text>",
            fit(self.name, 13.0),
            xml(self.name)
        );
        let _ = writeln!(
            s,
            "<text x=\"{pad}\" y=\"42\" font-size=\"{:.1}\">{what}</text>",
            fit(what, 12.0)
        );
        for (name, pts, dir, dashed) in &shapes {
            if pts.is_empty() {
                continue;
            }
            let path: Vec<String> = pts
                .iter()
                .map(|&q| {
                    let p = px(q);
                    format!("{:.1},{:.1}", p[0], p[1])
                })
                .collect();
            let style = if *dashed {
                "fill=\"#d8d8d8\" stroke=\"#333\" stroke-dasharray=\"6 4\""
            } else {
                "fill=\"#f4f0e6\" stroke=\"#222\""
            };
            let _ = writeln!(s, "<polygon points=\"{}\" {style}/>", path.join(" "));
            let n = pts.len() as f64;
            let c = [
                pts.iter().map(|q| q[0]).sum::<f64>() / n,
                pts.iter().map(|q| q[1]).sum::<f64>() / n,
            ];
            let p = px(c);
            let _ = writeln!(
                s,
                "<text x=\"{:.1}\" y=\"{:.1}\" text-anchor=\"middle\">{}</text>",
                p[0],
                p[1],
                xml(name)
            );
            if !dashed {
                let a = 40.0;
                let (x2, y2) = (p[0] + a * dir[0], p[1] - a * dir[1]);
                let _ = writeln!(
                    s,
                    "<line x1=\"{:.1}\" y1=\"{:.1}\" x2=\"{x2:.1}\" y2=\"{y2:.1}\" stroke=\"#b00\" \
                     stroke-width=\"2\"/><circle cx=\"{x2:.1}\" cy=\"{y2:.1}\" r=\"3\" \
                     fill=\"#b00\"/>",
                    p[0],
                    p[1] + 6.0
                );
            }
        }
        let _ = writeln!(
            s,
            "<text x=\"{pad}\" y=\"{}\">Red: the way each part is pulled off. Design aid only: \
             confirm by test.</text>",
            h - 16.0
        );
        s.push_str("</svg>\n");
        s
    }
}

/// A part's outline in the exploded view: name, points, unit pull in the view, and whether it
/// is the blade (dashed).
type Outline = (String, Vec<[f64; 2]>, [f64; 2], bool);

/// `text` with the XML special characters escaped.
fn xml(text: &str) -> String {
    text.replace('&', "&amp;").replace('<', "&lt;").replace('>', "&gt;").replace('"', "&quot;")
}
