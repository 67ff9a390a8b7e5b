//! The figure and what is added to it.

use super::style::{Anchor, LineStyle, Marker};
use super::text::valid_range;

#[derive(Debug, Clone)]
pub(super) enum Item {
    Line(Vec<(f64, f64)>, LineStyle),
    Markers(Vec<(f64, f64)>, Marker, f64, String),
    BandX(f64, f64, String, f64),
    Rect([f64; 4], String, f64),
    Label(f64, f64, String, String, Anchor),
}

#[derive(Debug, Clone)]
pub(super) enum Key {
    Line(LineStyle),
    Marker(Marker, String),
    Band(String, f64),
}

/// An x–y figure.
#[derive(Debug, Clone)]
pub struct Figure {
    pub(super) title: String,
    pub(super) x_label: String,
    pub(super) y_label: String,
    pub(super) width: f64,
    pub(super) height: f64,
    pub(super) x_range: Option<(f64, f64)>,
    pub(super) y_range: Option<(f64, f64)>,
    pub(super) y_log: bool,
    pub(super) items: Vec<Item>,
    pub(super) legend: Vec<(String, Key)>,
}

pub(super) const LEFT: f64 = 72.0;
pub(super) const RIGHT: f64 = 210.0;
pub(super) const TOP: f64 = 48.0;
pub(super) const BOTTOM: f64 = 56.0;

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

    pub(super) fn data_extent(&self, pick: impl Fn(&(f64, f64)) -> f64) -> Option<(f64, f64)> {
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
}
