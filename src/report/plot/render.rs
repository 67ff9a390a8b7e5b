//! Rendering a figure: frame, axes, grid, items and legend.

use std::fmt::Write;

use super::figure::*;
use super::labels::*;
use super::palette;
use super::style::*;
use super::text::*;

impl Figure {
    /// The SVG document.
    pub fn render(&self) -> String {
        if self.y_log {
            return self.log_copy().render_decades();
        }
        let auto = |fixed: Option<(f64, f64)>, data: Option<(f64, f64)>| match fixed {
            Some(r) => (r, false),
            None => (data.unwrap_or((0.0, 1.0)), true),
        };
        let ((x0, x1), x_auto) = auto(self.x_range, self.data_extent(|p| p.0));
        let ((y0, y1), y_auto) = auto(self.y_range, self.data_extent(|p| p.1));
        let x_ticks = nice_ticks(x0, x1, 8);
        let y_ticks = nice_ticks(y0, y1, 7);
        let widen = |ticks: &[f64], lo: f64, hi: f64, on: bool| {
            if on && ticks.len() >= 2 {
                (ticks[0].min(lo), ticks[ticks.len() - 1].max(hi))
            } else {
                (lo, hi)
            }
        };
        let (x0, x1) = widen(&x_ticks, x0, x1, x_auto);
        let (y0, y1) = widen(&y_ticks, y0, y1, y_auto);
        let plot = self.frame((x0, x1), (y0, y1));
        let mut s = String::new();
        self.render_into(&mut s, &plot, &x_ticks, &y_ticks, &tick_text);
        s
    }

    /// The plot area of this figure's size showing the data ranges `x` and `y`.
    pub(super) fn frame(&self, x: (f64, f64), y: (f64, f64)) -> Frame {
        Frame {
            left: LEFT,
            top: TOP,
            width: self.width - LEFT - RIGHT,
            height: self.height - TOP - BOTTOM,
            x,
            y,
        }
    }

    /// The figure with every y value replaced by its decimal logarithm.
    pub(super) fn log_copy(&self) -> Figure {
        let lg = |y: f64| if y > 0.0 { y.log10() } else { f64::NAN };
        let map = |p: &Vec<(f64, f64)>| p.iter().map(|&(x, y)| (x, lg(y))).collect::<Vec<_>>();
        let mut f = self.clone();
        f.y_log = false;
        f.y_range = self.y_range.map(|(a, b)| (lg(a), lg(b)));
        f.items = self
            .items
            .iter()
            .map(|item| match item {
                Item::Line(p, st) => Item::Line(map(p), st.clone()),
                Item::Markers(p, m, size, c) => Item::Markers(map(p), *m, *size, c.clone()),
                Item::Rect(c, fill, o) => {
                    Item::Rect([c[0], lg(c[1]), c[2], lg(c[3])], fill.clone(), *o)
                }
                Item::Label(x, y, t, c, a) => Item::Label(*x, lg(*y), t.clone(), c.clone(), *a),
                other => other.clone(),
            })
            .collect();
        f
    }

    /// Renders a figure whose y values are decimal logarithms, with ticks at whole decades
    /// labelled by their values.
    pub(super) fn render_decades(&self) -> String {
        let ((x0, x1), x_auto) = match self.x_range {
            Some(r) => (r, false),
            None => (self.data_extent(|p| p.0).unwrap_or((0.0, 1.0)), true),
        };
        let (ly0, ly1) = self.y_range.unwrap_or_else(|| {
            let (a, b) = self.data_extent(|p| p.1).unwrap_or((0.0, 1.0));
            (a.floor(), b.ceil().max(a.floor() + 1.0))
        });
        let x_ticks = nice_ticks(x0, x1, 8);
        let (x0, x1) = if x_auto && x_ticks.len() >= 2 {
            (x_ticks[0].min(x0), x_ticks[x_ticks.len() - 1].max(x1))
        } else {
            (x0, x1)
        };
        let decades: Vec<f64> =
            ((ly0.ceil() as i32)..=(ly1.floor() as i32)).map(f64::from).collect();
        let plot = self.frame((x0, x1), (ly0, ly1));
        let mut s = String::new();
        // One format on the axis: plain numbers when every decade reads well that way, powers
        // of ten otherwise (never "100000" beside "1e6").
        let plain = decades.iter().all(|d| (-3.0..=5.0).contains(d));
        self.render_into(&mut s, &plot, &x_ticks, &decades, &|d, _| decade_text(d, plain));
        s
    }

    pub(super) fn render_into(
        &self,
        s: &mut String,
        f: &Frame,
        x_ticks: &[f64],
        y_ticks: &[f64],
        y_text: &dyn Fn(f64, f64) -> String,
    ) {
        let clip = format!("clip-{}", slug(&self.title));
        let _ = writeln!(
            s,
            r#"<svg xmlns="http://www.w3.org/2000/svg" width="{w}" height="{h}" viewBox="0 0 {w} {h}" font-family="Helvetica, Arial, sans-serif" font-size="12">"#,
            w = num(self.width),
            h = num(self.height)
        );
        let _ = writeln!(s, "<title>{}</title>", escape(&self.title));
        let _ = writeln!(
            s,
            r#"<rect width="{}" height="{}" fill="{}"/>"#,
            num(self.width),
            num(self.height),
            palette::PAPER
        );
        let _ = writeln!(
            s,
            r#"<defs><clipPath id="{clip}"><rect x="{}" y="{}" width="{}" height="{}"/></clipPath></defs>"#,
            num(f.left),
            num(f.top),
            num(f.width),
            num(f.height)
        );
        // Title and axis labels get a smaller font where they would not fit at full size.
        let title_font = fit_font(&self.title, 16.0, 0.65, self.width - f.left - 8.0);
        let _ = writeln!(
            s,
            r#"<text x="{}" y="28" font-size="{}" font-weight="bold" fill="{}">{}</text>"#,
            num(f.left),
            num(title_font),
            palette::INK,
            escape(&self.title)
        );
        // Grid and ticks.
        let _ = writeln!(s, r#"<g stroke="{}" stroke-width="1">"#, palette::GRID);
        for &t in x_ticks.iter().filter(|t| f.inside_x(**t)) {
            let x = f.px(t);
            let _ = writeln!(
                s,
                r#"<line x1="{x}" y1="{}" x2="{x}" y2="{}"/>"#,
                num(f.top),
                num(f.top + f.height),
                x = num(x)
            );
        }
        for &t in y_ticks.iter().filter(|t| f.inside_y(**t)) {
            let y = f.py(t);
            let _ = writeln!(
                s,
                r#"<line x1="{}" y1="{y}" x2="{}" y2="{y}"/>"#,
                num(f.left),
                num(f.left + f.width),
                y = num(y)
            );
        }
        let _ = writeln!(s, "</g>");
        // Data: lines and areas clipped to the frame; markers at points inside the data range
        // drawn whole, also where they stand on the frame's edge.
        let _ = writeln!(s, r#"<g clip-path="url(#{clip})">"#);
        for item in self.items.iter().filter(|i| !matches!(i, Item::Markers(..))) {
            draw_item(s, f, item);
        }
        let _ = writeln!(s, "</g>");
        for item in self.items.iter().filter(|i| matches!(i, Item::Markers(..))) {
            draw_item(s, f, item);
        }
        for placed in self.place_labels(f) {
            draw_label(s, &placed);
        }
        // Frame, tick labels and axis labels.
        let _ = writeln!(
            s,
            r#"<rect x="{}" y="{}" width="{}" height="{}" fill="none" stroke="{}" stroke-width="1.2"/>"#,
            num(f.left),
            num(f.top),
            num(f.width),
            num(f.height),
            palette::INK
        );
        let _ = writeln!(s, r#"<g fill="{}">"#, palette::INK);
        let step_x = x_ticks.get(1).zip(x_ticks.first()).map_or(1.0, |(b, a)| b - a);
        for &t in x_ticks.iter().filter(|t| f.inside_x(**t)) {
            let _ = writeln!(
                s,
                r#"<text x="{}" y="{}" text-anchor="middle">{}</text>"#,
                num(f.px(t)),
                num(f.top + f.height + 18.0),
                tick_text(t, step_x)
            );
        }
        let step_y = y_ticks.get(1).zip(y_ticks.first()).map_or(1.0, |(b, a)| b - a);
        for &t in y_ticks.iter().filter(|t| f.inside_y(**t)) {
            let _ = writeln!(
                s,
                r#"<text x="{}" y="{}" text-anchor="end">{}</text>"#,
                num(f.left - 8.0),
                num(f.py(t) + 4.0),
                y_text(t, step_y)
            );
        }
        let _ = writeln!(
            s,
            r#"<text x="{}" y="{}" text-anchor="middle" font-size="{}">{}</text>"#,
            num(f.left + f.width / 2.0),
            num(f.top + f.height + 42.0),
            num(fit_font(&self.x_label, 13.0, 0.6, f.width)),
            escape(&self.x_label)
        );
        let (cx, cy) = (f.left - 52.0, f.top + f.height / 2.0);
        let _ = writeln!(
            s,
            r#"<text x="{x}" y="{y}" text-anchor="middle" font-size="{}" transform="rotate(-90 {x} {y})">{}</text>"#,
            num(fit_font(&self.y_label, 13.0, 0.6, f.height + f.top + BOTTOM * 0.5)),
            escape(&self.y_label),
            x = num(cx),
            y = num(cy)
        );
        let _ = writeln!(s, "</g>");
        self.render_legend(s, f);
        let _ = writeln!(s, "</svg>");
    }

    pub(super) fn render_legend(&self, s: &mut String, f: &Frame) {
        if self.legend.is_empty() {
            return;
        }
        const FONT: f64 = 11.0;
        let x = f.left + f.width + 16.0;
        // Text wraps to stay inside the figure's right edge.
        let room = self.width - (x + 30.0) - 4.0;
        let chars = ((room / (0.6 * FONT)).floor() as usize).max(8);
        let _ = writeln!(s, r#"<g font-size="{}" fill="{}">"#, num(FONT), palette::INK);
        let mut y = f.top + 10.0;
        for (text, key) in &self.legend {
            match key {
                Key::Line(style) => {
                    let _ = writeln!(
                        s,
                        r#"<line x1="{}" y1="{y}" x2="{}" y2="{y}"{}/>"#,
                        num(x),
                        num(x + 24.0),
                        stroke_attrs(style),
                        y = num(y)
                    );
                }
                Key::Marker(marker, colour) => draw_marker(s, x + 12.0, y, *marker, 8.0, colour),
                Key::Band(fill, opacity) => {
                    let _ = writeln!(
                        s,
                        r#"<rect x="{}" y="{}" width="24" height="10" fill="{fill}" fill-opacity="{}"/>"#,
                        num(x),
                        num(y - 5.0),
                        num(*opacity)
                    );
                }
            }
            let lines = wrap_words(text, chars);
            let _ = write!(s, r#"<text x="{}" y="{}">"#, num(x + 30.0), num(y + 4.0));
            for (i, line) in lines.iter().enumerate() {
                let dy = if i == 0 { 0.0 } else { 1.15 * FONT };
                let _ = write!(
                    s,
                    r#"<tspan x="{}" dy="{}">{}</tspan>"#,
                    num(x + 30.0),
                    num(dy),
                    escape(line)
                );
            }
            let _ = writeln!(s, "</text>");
            y += 18.0 + 1.15 * FONT * (lines.len() - 1) as f64;
        }
        let _ = writeln!(s, "</g>");
    }
}

/// Splits `text` into lines of at most `chars` characters at spaces (a longer word stands alone).
pub(super) fn wrap_words(text: &str, chars: usize) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        if !line.is_empty() && line.chars().count() + 1 + word.chars().count() > chars {
            lines.push(std::mem::take(&mut line));
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    if !line.is_empty() || lines.is_empty() {
        lines.push(line);
    }
    lines
}

/// The plot area and its data ranges.
pub(super) struct Frame {
    pub(super) left: f64,
    pub(super) top: f64,
    pub(super) width: f64,
    pub(super) height: f64,
    pub(super) x: (f64, f64),
    pub(super) y: (f64, f64),
}

impl Frame {
    pub(super) fn px(&self, x: f64) -> f64 {
        self.left + (x - self.x.0) / (self.x.1 - self.x.0) * self.width
    }
    pub(super) fn py(&self, y: f64) -> f64 {
        self.top + self.height - (y - self.y.0) / (self.y.1 - self.y.0) * self.height
    }
    pub(super) fn inside_x(&self, x: f64) -> bool {
        let tol = 1e-9 * (self.x.1 - self.x.0);
        x >= self.x.0 - tol && x <= self.x.1 + tol
    }
    pub(super) fn inside_y(&self, y: f64) -> bool {
        let tol = 1e-9 * (self.y.1 - self.y.0);
        y >= self.y.0 - tol && y <= self.y.1 + tol
    }
}

pub(super) fn draw_item(s: &mut String, f: &Frame, item: &Item) {
    match item {
        Item::Line(points, style) => {
            for run in points.split(|p| !(p.0.is_finite() && p.1.is_finite())) {
                if run.len() < 2 {
                    continue;
                }
                let coords: Vec<String> =
                    run.iter().map(|p| format!("{},{}", num(f.px(p.0)), num(f.py(p.1)))).collect();
                let _ = writeln!(
                    s,
                    r#"<polyline points="{}" fill="none" stroke-linejoin="round"{}/>"#,
                    coords.join(" "),
                    stroke_attrs(style)
                );
            }
        }
        Item::Markers(points, marker, size, colour) => {
            let shown = |p: &&(f64, f64)| {
                p.0.is_finite() && p.1.is_finite() && f.inside_x(p.0) && f.inside_y(p.1)
            };
            for p in points.iter().filter(shown) {
                draw_marker(s, f.px(p.0), f.py(p.1), *marker, *size, colour);
            }
        }
        Item::BandX(a, b, fill, opacity) => {
            if a.is_finite() && b.is_finite() {
                let (xa, xb) = (f.px(*a).max(f.left), f.px(*b).min(f.left + f.width));
                if xb > xa {
                    let _ = writeln!(
                        s,
                        r#"<rect x="{}" y="{}" width="{}" height="{}" fill="{fill}" fill-opacity="{}"/>"#,
                        num(xa),
                        num(f.top),
                        num(xb - xa),
                        num(f.height),
                        num(*opacity)
                    );
                }
            }
        }
        Item::Rect(c, fill, opacity) => {
            if c.iter().all(|v| v.is_finite()) {
                let (xa, xb) = (f.px(c[0].min(c[2])), f.px(c[0].max(c[2])));
                let (ya, yb) = (f.py(c[1].max(c[3])), f.py(c[1].min(c[3])));
                let _ = writeln!(
                    s,
                    r#"<rect x="{}" y="{}" width="{}" height="{}" fill="{}" fill-opacity="{}" shape-rendering="crispEdges"/>"#,
                    num(xa),
                    num(ya),
                    num(xb - xa),
                    num(yb - ya),
                    escape(fill),
                    num(*opacity)
                );
            }
        }
        Item::Label(..) => {}
    }
}
