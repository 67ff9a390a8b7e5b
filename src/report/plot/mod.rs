//! A small SVG plotting kit: one x–y figure with axes, "nice" ticks, grid, lines (solid or
//! dashed), markers, shaded bands, text labels, a legend and a title; layloft's own palette.
//!
//! Ticks follow the 1–2–5 rule (Heckbert, "Nice numbers for graph labels", Graphics Gems, 1990).
//! Text is SVG `<text>` with XML escaping; points that are not finite are skipped (a line is
//! broken there), so no `NaN` reaches the file. Data are drawn inside a clip path of the plot
//! area.
//!
//! ```
//! use layloft::report::plot::{Figure, LineStyle, palette};
//!
//! let mut fig = Figure::new("Tip deflection", "radius (m)", "deflection (mm)");
//! fig.line(&[(0.4, 0.0), (0.6, 1.2), (0.9, 4.8)], &LineStyle::solid(palette::SERIES[0], 2.0));
//! fig.legend_line("invented data", &LineStyle::solid(palette::SERIES[0], 2.0));
//! let svg = fig.render();
//! assert!(svg.starts_with("<svg") && svg.contains("radius (m)"));
//! ```
//!
//! Files: `style.rs` (line styles, markers, anchors and how they are drawn), `figure.rs` (the
//! figure and what is added to it), `render.rs` (the frame, axes, items and legend), `labels.rs`
//! (placing data labels off each other), `text.rs` (ticks, numbers and escaping).

mod figure;
mod labels;
mod render;
mod style;
mod text;

pub use figure::Figure;
pub use style::{Anchor, LineStyle, Marker};
pub use text::{escape, nice_ticks};

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
