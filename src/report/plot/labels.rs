//! Data labels placed inside the frame and off each other.

use std::fmt::Write;

use super::figure::*;
use super::render::Frame;
use super::style::Anchor;
use super::text::{escape, num};

/// Font size of data labels, px.
pub(super) const LABEL_FONT: f64 = 10.0;

/// The box a text of `chars` characters takes at `font` px: width from a mean advance of 0.6 em
/// (generous for Helvetica and Arial, whose mean advance is near 0.55 em), height one line.
pub(super) fn text_width(chars: usize, font: f64) -> f64 {
    0.6 * font * chars as f64
}

/// The font size, at most `base` and at least 8 px, at which `text` fits in `room` px, taking a
/// mean advance of `advance` em (bold text is wider).
pub(super) fn fit_font(text: &str, base: f64, advance: f64, room: f64) -> f64 {
    let need = advance * base * text.chars().count() as f64;
    if need <= room { base } else { (base * room / need).max(8.0) }
}

/// A label placed by [`Figure::place_labels`]: its left edge, baseline and text.
pub(super) struct PlacedLabel {
    pub(super) left: f64,
    pub(super) baseline: f64,
    pub(super) text: String,
    pub(super) colour: String,
}

impl PlacedLabel {
    /// `[left, top, right, bottom]` in px.
    pub(super) fn bounds(&self) -> [f64; 4] {
        let w = text_width(self.text.chars().count(), LABEL_FONT);
        [
            self.left,
            self.baseline - 0.8 * LABEL_FONT,
            self.left + w,
            self.baseline + 0.25 * LABEL_FONT,
        ]
    }
}

pub(super) fn overlap(a: [f64; 4], b: [f64; 4]) -> bool {
    a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3]
}

impl Figure {
    /// Places the data labels: each inside the frame (so off the legend, which stands beside
    /// it), and off the labels placed before it, by moving it up or down in steps of a line
    /// from where it was asked for, the nearest free place first. A label that finds no free
    /// place within the frame keeps its first place.
    pub(super) fn place_labels(&self, f: &Frame) -> Vec<PlacedLabel> {
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

pub(super) fn draw_label(s: &mut String, label: &PlacedLabel) {
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
