//! The tooling summary's text on the core ends and the mould halves (pull, draft, undercuts).

use std::fmt::Write as _;

use super::{ToolingReport, wrap};
use crate::report::table::sig4;

impl ToolingReport<'_> {
    pub(super) fn ends_text(&self, s: &mut String) {
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

    pub(super) fn moulds_text(&self, s: &mut String) {
        let t = self.tooling;
        let u = self.unit().symbol();
        s.push('\n');
        // The pull is the first tried without an undercut facet, or, when every pull leaves
        // some, the one with the least: say which.
        let undercut = self.mould_parts().iter().any(|(_, h, _, _)| !h.undercuts.is_empty());
        let chosen = if undercut {
            "the pull with the least undercut area; none drew every facet"
        } else {
            "chosen so that no cavity facet undercuts"
        };
        s.push_str(&wrap(
            &format!(
                "Mould halves: pulled normal to a chord at {:.1}° ({chosen}), parted along the \
                 blade's silhouette across the pull; least acceptable draft {:.1}°",
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
}
