//! The tooling summary's tables: parts, prints, core ends, moulds, machining, casting.

use super::ToolingReport;
use crate::report::table::{Align, Table, fixed, sig4};

impl ToolingReport<'_> {
    /// The parts (file, triangles, volume, area, mass) and their bounding boxes as written.
    pub(super) fn parts_tables(&self) -> (Table, Table) {
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
    pub(super) fn prints_table(&self) -> Table {
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
        for d in &self.tooling.print_dropped {
            let none = "-".to_string();
            table.row(vec![
                d.core.clone(),
                "none".into(),
                none.clone(),
                none.clone(),
                none.clone(),
                "print dropped (see the checks)".into(),
                none,
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

    /// Where the last core ends at the thin trailing edge, station by station.
    pub(super) fn core_ends_table(&self) -> Table {
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
    pub(super) fn mould_parts(&self) -> Vec<(&str, &crate::tooling::MouldHalf, f64, Option<f64>)> {
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
    pub(super) fn moulds_table(&self) -> Table {
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
    pub(super) fn machining_table(&self) -> Table {
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
    pub(super) fn casting_table(&self) -> Table {
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
}
