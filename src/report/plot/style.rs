//! Line styles, markers and label anchors, and how they are drawn.

use std::fmt::Write;

use super::text::{escape, num};

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

pub(super) fn draw_marker(s: &mut String, x: f64, y: f64, marker: Marker, size: f64, colour: &str) {
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

pub(super) fn stroke_attrs(style: &LineStyle) -> String {
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
