//! A small SVG plotting kit: one x–y figure with axes, "nice" ticks, grid, lines (solid or
//! dashed), markers, shaded bands, text labels, a legend and a title; layloft's own palette.
//!
//! Ticks follow the 1–2–5 rule (Heckbert, "Nice numbers for graph labels", Graphics Gems, 1990).
//! Text is SVG `<text>` with XML escaping; points that are not finite are skipped (a line is
//! broken there), so no `NaN` reaches the file. Data are drawn inside a clip path of the plot
//! area.
//!
//! ```
//! use layloft::report::svg::{Figure, LineStyle, palette};
//!
//! let mut fig = Figure::new("Tip deflection", "radius (m)", "deflection (mm)");
//! fig.line(&[(0.4, 0.0), (0.6, 1.2), (0.9, 4.8)], &LineStyle::solid(palette::SERIES[0], 2.0));
//! fig.legend_line("invented data", &LineStyle::solid(palette::SERIES[0], 2.0));
//! let svg = fig.render();
//! assert!(svg.starts_with("<svg") && svg.contains("radius (m)"));
//! ```

use std::fmt::Write;

/// layloft's colours.
pub mod palette {
    /// Text, axes and frames.
    pub const INK: &str = "#26313b";
    /// Secondary text and excitation lines.
    pub const MUTED: &str = "#7d858c";
    /// Grid lines.
    pub const GRID: &str = "#e6e2da";
    /// Figure background.
    pub const PAPER: &str = "#fcfbf8";
    /// Shaded bands.
    pub const BAND: &str = "#efdfb8";
    /// Data series, in order.
    pub const SERIES: [&str; 8] =
        ["#2b6a8f", "#c8553d", "#4f8a55", "#d39a2e", "#7a5c8e", "#3f8f8b", "#a34a6b", "#5d5d5d"];
}

/// How a line is drawn.
#[derive(Debug, Clone, PartialEq)]
pub struct LineStyle {
    /// Stroke colour (`#rrggbb`).
    pub colour: String,
    /// Stroke width, px.
    pub width: f64,
    /// Dash pattern (`"6 4"`), solid when `None`.
    pub dash: Option<String>,
    /// Opacity, 0 to 1.
    pub opacity: f64,
}

impl LineStyle {
    /// A solid line.
    pub fn solid(colour: &str, width: f64) -> Self {
        LineStyle { colour: colour.to_string(), width, dash: None, opacity: 1.0 }
    }

    /// A dashed line with the SVG dash pattern `dash`.
    pub fn dashed(colour: &str, width: f64, dash: &str) -> Self {
        LineStyle { colour: colour.to_string(), width, dash: Some(dash.to_string()), opacity: 1.0 }
    }
}

/// Marker shapes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Marker {
    /// Open circle.
    Ring,
    /// Filled circle.
    Dot,
    /// Filled square.
    Square,
    /// Filled diamond.
    Diamond,
    /// A cross.
    Cross,
}

/// Horizontal placement of a label relative to its point.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    /// Text starts at the point.
    Start,
    /// Text is centred on the point.
    Middle,
    /// Text ends at the point.
    End,
}

#[derive(Debug, Clone)]
enum Item {
    Line(Vec<(f64, f64)>, LineStyle),
    Markers(Vec<(f64, f64)>, Marker, f64, String),
    BandX(f64, f64, String, f64),
    Rect([f64; 4], String, f64),
    Label(f64, f64, String, String, Anchor),
}

#[derive(Debug, Clone)]
enum Key {
    Line(LineStyle),
    Marker(Marker, String),
    Band(String, f64),
}

/// An x–y figure.
#[derive(Debug, Clone)]
pub struct Figure {
    title: String,
    x_label: String,
    y_label: String,
    width: f64,
    height: f64,
    x_range: Option<(f64, f64)>,
    y_range: Option<(f64, f64)>,
    y_log: bool,
    items: Vec<Item>,
    legend: Vec<(String, Key)>,
}

const LEFT: f64 = 72.0;
const RIGHT: f64 = 210.0;
const TOP: f64 = 48.0;
const BOTTOM: f64 = 56.0;

impl Figure {
    /// An empty 900 x 560 px figure.
    pub fn new(title: &str, x_label: &str, y_label: &str) -> Self {
        Figure {
            title: title.to_string(),
            x_label: x_label.to_string(),
            y_label: y_label.to_string(),
            width: 900.0,
            height: 560.0,
            x_range: None,
            y_range: None,
            y_log: false,
            items: Vec::new(),
            legend: Vec::new(),
        }
    }

    /// Sets the size in px.
    pub fn size(&mut self, width: f64, height: f64) -> &mut Self {
        self.width = width.max(LEFT + RIGHT + 100.0);
        self.height = height.max(TOP + BOTTOM + 100.0);
        self
    }

    /// Fixes the x range (otherwise taken from the data, widened to ticks).
    pub fn x_range(&mut self, min: f64, max: f64) -> &mut Self {
        self.x_range = valid_range(min, max);
        self
    }

    /// Fixes the y range.
    pub fn y_range(&mut self, min: f64, max: f64) -> &mut Self {
        self.y_range = valid_range(min, max);
        self
    }

    /// Draws the y axis on a logarithmic scale with ticks at whole decades (values that are not
    /// positive are left out).
    pub fn y_log(&mut self) -> &mut Self {
        self.y_log = true;
        self
    }

    /// A polyline through `points` (data coordinates).
    pub fn line(&mut self, points: &[(f64, f64)], style: &LineStyle) -> &mut Self {
        self.items.push(Item::Line(points.to_vec(), style.clone()));
        self
    }

    /// Markers of `size` px at `points`.
    pub fn markers(
        &mut self,
        points: &[(f64, f64)],
        marker: Marker,
        size: f64,
        colour: &str,
    ) -> &mut Self {
        self.items.push(Item::Markers(points.to_vec(), marker, size, colour.to_string()));
        self
    }

    /// A band shaded over the whole height between `x0` and `x1`.
    pub fn band_x(&mut self, x0: f64, x1: f64, fill: &str, opacity: f64) -> &mut Self {
        self.items.push(Item::BandX(x0.min(x1), x0.max(x1), fill.to_string(), opacity));
        self
    }

    /// A filled rectangle between data corners `(x0, y0)` and `(x1, y1)` (cells of a map).
    pub fn rect(
        &mut self,
        x0: f64,
        y0: f64,
        x1: f64,
        y1: f64,
        fill: &str,
        opacity: f64,
    ) -> &mut Self {
        self.items.push(Item::Rect([x0, y0, x1, y1], fill.to_string(), opacity));
        self
    }

    /// Text at a data point, clamped into the plot area.
    pub fn label(&mut self, x: f64, y: f64, text: &str, colour: &str, anchor: Anchor) -> &mut Self {
        self.items.push(Item::Label(x, y, text.to_string(), colour.to_string(), anchor));
        self
    }

    /// A legend entry drawn as a line sample.
    pub fn legend_line(&mut self, text: &str, style: &LineStyle) -> &mut Self {
        self.legend.push((text.to_string(), Key::Line(style.clone())));
        self
    }

    /// A legend entry drawn as a marker.
    pub fn legend_marker(&mut self, text: &str, marker: Marker, colour: &str) -> &mut Self {
        self.legend.push((text.to_string(), Key::Marker(marker, colour.to_string())));
        self
    }

    /// A legend entry drawn as a shaded box.
    pub fn legend_band(&mut self, text: &str, fill: &str, opacity: f64) -> &mut Self {
        self.legend.push((text.to_string(), Key::Band(fill.to_string(), opacity)));
        self
    }

    fn data_extent(&self, pick: impl Fn(&(f64, f64)) -> f64) -> Option<(f64, f64)> {
        let mut lo = f64::INFINITY;
        let mut hi = f64::NEG_INFINITY;
        for item in &self.items {
            if let Item::Line(p, _) | Item::Markers(p, ..) = item {
                for v in p.iter().map(&pick).filter(|v| v.is_finite()) {
                    lo = lo.min(v);
                    hi = hi.max(v);
                }
            }
            if let Item::Rect(c, ..) = item {
                for v in
                    [pick(&(c[0], c[1])), pick(&(c[2], c[3]))].into_iter().filter(|v| v.is_finite())
                {
                    lo = lo.min(v);
                    hi = hi.max(v);
                }
            }
        }
        if lo > hi {
            None
        } else if lo == hi {
            Some((lo - 1.0, hi + 1.0))
        } else {
            Some((lo, hi))
        }
    }

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
    fn frame(&self, x: (f64, f64), y: (f64, f64)) -> Frame {
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
    fn log_copy(&self) -> Figure {
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
    fn render_decades(&self) -> String {
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

    fn render_into(
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

    fn render_legend(&self, s: &mut String, f: &Frame) {
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
fn wrap_words(text: &str, chars: usize) -> Vec<String> {
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
struct Frame {
    left: f64,
    top: f64,
    width: f64,
    height: f64,
    x: (f64, f64),
    y: (f64, f64),
}

impl Frame {
    fn px(&self, x: f64) -> f64 {
        self.left + (x - self.x.0) / (self.x.1 - self.x.0) * self.width
    }
    fn py(&self, y: f64) -> f64 {
        self.top + self.height - (y - self.y.0) / (self.y.1 - self.y.0) * self.height
    }
    fn inside_x(&self, x: f64) -> bool {
        let tol = 1e-9 * (self.x.1 - self.x.0);
        x >= self.x.0 - tol && x <= self.x.1 + tol
    }
    fn inside_y(&self, y: f64) -> bool {
        let tol = 1e-9 * (self.y.1 - self.y.0);
        y >= self.y.0 - tol && y <= self.y.1 + tol
    }
}

fn draw_item(s: &mut String, f: &Frame, item: &Item) {
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

/// Font size of data labels, px.
const LABEL_FONT: f64 = 10.0;

/// The box a text of `chars` characters takes at `font` px: width from a mean advance of 0.6 em
/// (generous for Helvetica and Arial, whose mean advance is near 0.55 em), height one line.
fn text_width(chars: usize, font: f64) -> f64 {
    0.6 * font * chars as f64
}

/// The font size, at most `base` and at least 8 px, at which `text` fits in `room` px, taking a
/// mean advance of `advance` em (bold text is wider).
fn fit_font(text: &str, base: f64, advance: f64, room: f64) -> f64 {
    let need = advance * base * text.chars().count() as f64;
    if need <= room { base } else { (base * room / need).max(8.0) }
}

/// A label placed by [`Figure::place_labels`]: its left edge, baseline and text.
struct PlacedLabel {
    left: f64,
    baseline: f64,
    text: String,
    colour: String,
}

impl PlacedLabel {
    /// `[left, top, right, bottom]` in px.
    fn bounds(&self) -> [f64; 4] {
        let w = text_width(self.text.chars().count(), LABEL_FONT);
        [
            self.left,
            self.baseline - 0.8 * LABEL_FONT,
            self.left + w,
            self.baseline + 0.25 * LABEL_FONT,
        ]
    }
}

fn overlap(a: [f64; 4], b: [f64; 4]) -> bool {
    a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3]
}

impl Figure {
    /// Places the data labels: each inside the frame (so off the legend, which stands beside
    /// it), and off the labels placed before it, by moving it up or down in steps of a line
    /// from where it was asked for, the nearest free place first. A label that finds no free
    /// place within the frame keeps its first place.
    fn place_labels(&self, f: &Frame) -> Vec<PlacedLabel> {
        let mut placed: Vec<PlacedLabel> = Vec::new();
        let (x_lo, x_hi) = (f.left + 2.0, f.left + f.width - 2.0);
        let (y_lo, y_hi) =
            (f.top + 0.8 * LABEL_FONT + 2.0, f.top + f.height - 0.25 * LABEL_FONT - 2.0);
        for item in &self.items {
            let Item::Label(x, y, text, colour, anchor) = item else { continue };
            if !(x.is_finite() && y.is_finite()) {
                continue;
            }
            let w = text_width(text.chars().count(), LABEL_FONT);
            let px = f.px(*x);
            let left = match anchor {
                Anchor::Start => px,
                Anchor::Middle => px - w / 2.0,
                Anchor::End => px - w,
            };
            let left = left.min(x_hi - w).max(x_lo);
            let base = f.py(*y).clamp(y_lo, y_hi.max(y_lo));
            let step = 1.2 * LABEL_FONT;
            let mut label =
                PlacedLabel { left, baseline: base, text: text.clone(), colour: colour.clone() };
            for k in 0..40 {
                let shift = step * ((k + 1) / 2) as f64 * if k % 2 == 0 { 1.0 } else { -1.0 };
                let baseline = base + if k == 0 { 0.0 } else { shift };
                if baseline < y_lo || baseline > y_hi {
                    continue;
                }
                let trial = PlacedLabel { baseline, ..label };
                if placed.iter().all(|p| !overlap(p.bounds(), trial.bounds())) {
                    label = trial;
                    break;
                }
                label = PlacedLabel { baseline: base, ..trial };
            }
            placed.push(label);
        }
        placed
    }
}

fn draw_label(s: &mut String, label: &PlacedLabel) {
    let _ = writeln!(
        s,
        r#"<text x="{}" y="{}" font-size="{}" fill="{}">{}</text>"#,
        num(label.left),
        num(label.baseline),
        num(LABEL_FONT),
        escape(&label.colour),
        escape(&label.text)
    );
}

fn draw_marker(s: &mut String, x: f64, y: f64, marker: Marker, size: f64, colour: &str) {
    let r = size / 2.0;
    let c = escape(colour);
    let _ = match marker {
        Marker::Ring => writeln!(
            s,
            r#"<circle cx="{}" cy="{}" r="{}" fill="none" stroke="{c}" stroke-width="1.5"/>"#,
            num(x),
            num(y),
            num(r)
        ),
        Marker::Dot => {
            writeln!(s, r#"<circle cx="{}" cy="{}" r="{}" fill="{c}"/>"#, num(x), num(y), num(r))
        }
        Marker::Square => writeln!(
            s,
            r#"<rect x="{}" y="{}" width="{}" height="{}" fill="{c}"/>"#,
            num(x - r),
            num(y - r),
            num(size),
            num(size)
        ),
        Marker::Diamond => writeln!(
            s,
            r#"<polygon points="{},{} {},{} {},{} {},{}" fill="{c}"/>"#,
            num(x),
            num(y - r),
            num(x + r),
            num(y),
            num(x),
            num(y + r),
            num(x - r),
            num(y)
        ),
        Marker::Cross => writeln!(
            s,
            r#"<path d="M{} {}L{} {}M{} {}L{} {}" stroke="{c}" stroke-width="1.5"/>"#,
            num(x - r),
            num(y - r),
            num(x + r),
            num(y + r),
            num(x - r),
            num(y + r),
            num(x + r),
            num(y - r)
        ),
    };
}

fn stroke_attrs(style: &LineStyle) -> String {
    let mut a =
        format!(r#" stroke="{}" stroke-width="{}""#, escape(&style.colour), num(style.width));
    if let Some(d) = &style.dash {
        let _ = write!(a, r#" stroke-dasharray="{}""#, escape(d));
    }
    if style.opacity < 1.0 {
        let _ = write!(a, r#" stroke-opacity="{}""#, num(style.opacity));
    }
    a
}

fn valid_range(min: f64, max: f64) -> Option<(f64, f64)> {
    (min.is_finite() && max.is_finite() && max > min).then_some((min, max))
}

/// Tick values covering `[min, max]` at a 1, 2 or 5 times power-of-ten step, about `target` of
/// them; the first tick is at or below `min` and the last at or above `max`.
pub fn nice_ticks(min: f64, max: f64, target: usize) -> Vec<f64> {
    if !(min.is_finite() && max.is_finite()) || max <= min || target < 2 {
        return Vec::new();
    }
    let raw = (max - min) / (target - 1) as f64;
    let power = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * power)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * power);
    let first = (min / step).floor();
    let last = (max / step).ceil();
    let count = (last - first) as usize;
    (0..=count)
        .map(|i| (first + i as f64) * step)
        .map(|v| if v.abs() < step * 1e-9 { 0.0 } else { v })
        .collect()
}

/// Escapes `&`, `<`, `>`, `"` and `'` for XML text and attributes.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c if (c as u32) < 0x20 && c != '\n' && c != '\t' => {}
            c => out.push(c),
        }
    }
    out
}

/// A coordinate with two decimals (never `NaN`: non-finite values become 0).
fn num(v: f64) -> String {
    if !v.is_finite() {
        return "0".to_string();
    }
    let s = format!("{v:.2}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".to_string() } else { s.to_string() }
}

/// A tick label with as many decimals as the step needs.
/// The value of decade `d` (10^d) as a tick label.
fn decade_text(d: f64, plain: bool) -> String {
    let e = d.round() as i32;
    if plain {
        let v = 10f64.powi(e);
        if e >= 0 { format!("{v:.0}") } else { format!("{v}") }
    } else {
        format!("1e{e}")
    }
}

fn tick_text(v: f64, step: f64) -> String {
    let decimals = if step >= 1.0 { 0 } else { (-step.log10()).ceil().clamp(0.0, 9.0) as usize };
    let s = format!("{v:.decimals$}");
    if s.trim_start_matches('-').chars().all(|c| c == '0' || c == '.') { "0".into() } else { s }
}

fn slug(title: &str) -> String {
    let s: String = title
        .chars()
        .map(|c| if c.is_ascii_alphanumeric() { c.to_ascii_lowercase() } else { '-' })
        .collect();
    if s.is_empty() { "plot".into() } else { s }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_are_nice_and_cover_the_range() {
        assert_eq!(
            nice_ticks(0.0, 1090.0, 8),
            vec![0.0, 200.0, 400.0, 600.0, 800.0, 1000.0, 1200.0]
        );
        let t = nice_ticks(0.13, 0.87, 5);
        let expected = [0.0, 0.2, 0.4, 0.6, 0.8, 1.0];
        assert_eq!(t.len(), expected.len());
        assert!(t.iter().zip(expected).all(|(a, b)| (a - b).abs() < 1e-12), "{t:?}");
        assert_eq!(tick_text(t[3], 0.2), "0.6");
        assert_eq!(nice_ticks(0.0, 0.7, 4), vec![0.0, 0.25, 0.5, 0.75]);
        assert!(nice_ticks(1.0, 1.0, 5).is_empty());
        assert!(nice_ticks(f64::NAN, 1.0, 5).is_empty());
    }

    #[test]
    fn text_is_escaped_and_nan_never_written() {
        assert_eq!(escape(r#"a<b & "c">'d'"#), "a&lt;b &amp; &quot;c&quot;&gt;&apos;d&apos;");
        let mut fig = Figure::new("T & <x>", "x (m)", "y (N)");
        fig.line(
            &[(0.0, 1.0), (f64::NAN, 2.0), (1.0, 2.0), (2.0, f64::INFINITY), (3.0, 0.5)],
            &LineStyle::solid("#000000", 1.0),
        );
        fig.label(f64::NAN, 0.0, "lost", "#000000", Anchor::Start);
        let svg = fig.render();
        assert!(!svg.contains("NaN") && !svg.contains("inf"), "{svg}");
        assert!(svg.contains("T &amp; &lt;x&gt;"));
        assert_eq!(svg.matches("<polyline").count(), 0, "no run has two finite points");
    }
}
