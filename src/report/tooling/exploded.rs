//! The exploded drawing of the mould parts (SVG).

use std::fmt::Write as _;

use super::ToolingReport;

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
