//! Coordinate files: two numbers per line (`x y`, separated by spaces, tabs or a comma), in one of
//! the two common layouts, told apart by the content:
//!
//! - **one loop**: from the trailing edge over the upper surface to the leading edge and back
//!   along the lower surface, with or without the first point repeated at the end (a closed,
//!   sharp trailing edge; otherwise the base runs from the last point to the first). A loop may
//!   also start at the leading edge, or at any point along a flat base;
//! - **two surfaces**: the upper surface from the leading edge to the trailing edge, then the
//!   lower one the same way, with or without a line of the two point counts before them (a line
//!   of two whole numbers that add up to the points that follow).
//!
//! Tolerated: a title line at the top, blank lines, `#` comments, a byte-order mark, and line
//! ends `\n`, `\r\n` or `\r`. Points in either direction round the outline are accepted
//! (reversed, with a note); a point that repeats the one before it is removed, with a note.

use std::fmt;

use super::normalise::{Loop, outline_from_loop};
use super::plane::{P, dist, turn};
use super::{AirfoilError, Outline};

/// What is wrong with a coordinate file: the file as messages name it, the 1-based line where
/// the fault is known, and what was expected and found. Shown as `file line N: message` (or
/// `file: message`), the form of every input error; the reader turns it into one.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CoordinateError {
    /// The file as messages name it.
    pub file: String,
    /// 1-based line, where the fault has one.
    pub line: Option<usize>,
    /// What was expected and what was found.
    pub message: String,
}

impl fmt::Display for CoordinateError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.file)?;
        if let Some(line) = self.line {
            write!(f, " line {line}")?;
        }
        write!(f, ": {}", self.message)
    }
}

impl std::error::Error for CoordinateError {}

impl CoordinateError {
    fn at(file: &str, line: Option<usize>, message: impl Into<String>) -> Self {
        CoordinateError { file: file.to_string(), line, message: message.into() }
    }
}

/// Points with their file lines.
type Points = Vec<(usize, P)>;

/// Fewest points a coordinate file must give.
const MIN_POINTS: usize = 10;

/// Parses the text of a coordinate file.
pub fn parse_coordinates(text: &str, display: &str) -> Result<Outline, CoordinateError> {
    parse_coordinates_noted(text, display).map(|(o, _)| o)
}

/// Parses the text of a coordinate file, with notes on what was changed to read it (points
/// reversed, repeated points removed, a base given as points along it), each naming the file.
pub fn parse_coordinates_noted(
    text: &str,
    display: &str,
) -> Result<(Outline, Vec<String>), CoordinateError> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    let text = text.replace("\r\n", "\n").replace('\r', "\n");
    let mut points: Vec<(usize, P)> = Vec::new();
    let mut first = true;
    for (i, raw) in text.split('\n').enumerate() {
        let line = i + 1;
        let content = raw.split('#').next().unwrap_or("").trim();
        if content.is_empty() {
            continue;
        }
        let fields =
            content.split(|c: char| c.is_whitespace() || c == ',').filter(|s| !s.is_empty());
        let numbers: Option<Vec<f64>> =
            fields.map(|f| f.parse::<f64>().ok().filter(|x| x.is_finite())).collect();
        match numbers {
            Some(v) if v.len() == 2 => points.push((line, [v[0], v[1]])),
            // The first line may be a title.
            _ if first => {}
            _ => return Err(bad_line(display, line, content)),
        }
        first = false;
    }
    let mut notes = Vec::new();
    let lp = arrange(points, display, &mut notes)?;
    let outline = outline_from_loop(lp, &mut notes).map_err(|e| locate(display, e))?;
    Ok((outline, notes.into_iter().map(|n| format!("{display}: {n}")).collect()))
}

/// Detects the layout and makes one closed loop of distinct points.
fn arrange(
    mut points: Vec<(usize, P)>,
    display: &str,
    notes: &mut Vec<String>,
) -> Result<Loop, CoordinateError> {
    let file_err = |e: AirfoilError| locate(display, e);
    // A line of counts before two surfaces.
    let mut counts = None;
    if let Some(&(line, [a, b])) = points.first() {
        let whole = |v: f64| v >= 2.0 && v.fract() == 0.0;
        if whole(a) && whole(b) && (a + b) as usize == points.len() - 1 {
            counts = Some((line, a as usize));
            points.remove(0);
        }
    }
    if points.len() < MIN_POINTS {
        return Err(file_err(AirfoilError::TooFewPoints {
            found: points.len(),
            needed: MIN_POINTS,
        }));
    }
    let extent = {
        let (mut lo, mut hi) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
        for (_, p) in &points {
            for k in 0..2 {
                lo[k] = lo[k].min(p[k]);
                hi[k] = hi[k].max(p[k]);
            }
        }
        (hi[0] - lo[0]).max(hi[1] - lo[1])
    };
    if extent.is_nan() || extent <= 0.0 {
        return Err(file_err(AirfoilError::NoArea));
    }
    let same = |a: P, b: P| dist(a, b) <= 1e-9 * extent;

    let (upper, lower): (Points, Option<Points>) = match counts {
        Some((count_line, nu)) => {
            let lower = points.split_off(nu);
            // Both surfaces run from one end of the chord to the other, the same way: a count
            // that is off moves a point from one surface to the other, and a surface then
            // starts or ends mid-chord. Named at the counts line (it was named as a surface
            // doubling back, at a point's line).
            let (xmin, xmax) = points
                .iter()
                .chain(&lower)
                .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), (_, p)| {
                    (a.min(p[0]), b.max(p[0]))
                });
            let end = |x: f64| {
                if (x - xmin).abs() <= 0.01 * (xmax - xmin) {
                    Some(false)
                } else if (xmax - x).abs() <= 0.01 * (xmax - xmin) {
                    Some(true)
                } else {
                    None
                }
            };
            let ends = |v: &Points| match (v.first(), v.last()) {
                (Some(a), Some(b)) => (end(a.1[0]), end(b.1[0])),
                _ => (None, None),
            };
            let (eu, el) = (ends(&points), ends(&lower));
            let one_way = eu == el && eu.0.is_some() && eu.1.is_some() && eu.0 != eu.1;
            if !one_way {
                return Err(CoordinateError::at(
                    display,
                    Some(count_line),
                    format!(
                        "the point counts ({nu} upper, {} lower) do not match the surfaces: \
                         split there, a surface does not run from one end of the chord to the \
                         other (expected the number of points of each surface, each from the \
                         leading edge to the trailing edge)",
                        lower.len()
                    ),
                ));
            }
            (points, Some(lower))
        }
        None => {
            let (xmin, xmax) =
                points.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), (_, p)| {
                    (a.min(p[0]), b.max(p[0]))
                });
            let w = xmax - xmin;
            let near_max = |p: P| p[0] > xmax - 0.25 * w;
            let near_min = |p: P| p[0] < xmin + 0.25 * w;
            let (p0, pl) = (points[0].1, points[points.len() - 1].1);
            // Two surfaces: split at the step from one end of the chord to the other.
            let split = |from: &dyn Fn(P) -> bool, to: &dyn Fn(P) -> bool| {
                (1..points.len()).filter(|&k| from(points[k - 1].1) && to(points[k].1)).max_by(
                    |&a, &b| {
                        dist(points[a - 1].1, points[a].1)
                            .total_cmp(&dist(points[b - 1].1, points[b].1))
                    },
                )
            };
            if near_min(p0) && near_max(pl) && !same(p0, pl) {
                match split(&near_max, &near_min) {
                    Some(k) => {
                        let lower = points.split_off(k);
                        (points, Some(lower))
                    }
                    None => return Err(layout_err(display)),
                }
            } else if near_max(p0) && near_min(pl) && !same(p0, pl) {
                match split(&near_min, &near_max) {
                    Some(k) => {
                        let mut lower = points.split_off(k);
                        points.reverse();
                        lower.reverse();
                        (points, Some(lower))
                    }
                    None => return Err(layout_err(display)),
                }
            } else {
                (points, None)
            }
        }
    };

    let mut repeated = Vec::new();
    let mut dedup = |v: Vec<(usize, P)>| -> Vec<(usize, P)> {
        let mut out: Vec<(usize, P)> = Vec::with_capacity(v.len());
        for (line, p) in v {
            if out.last().is_some_and(|&(_, q)| same(p, q)) {
                repeated.push(line);
            } else {
                out.push((line, p));
            }
        }
        out
    };
    let (mut pts, closed) = match lower {
        Some(lower) => {
            let (mut upper, mut lower) = (dedup(upper), dedup(lower));
            // Each surface from the leading edge to the trailing edge.
            for s in [&mut upper, &mut lower] {
                if s.len() >= 2 && s[0].1[0] > s[s.len() - 1].1[0] {
                    s.reverse();
                }
            }
            if upper.len() < 2 || lower.len() < 2 {
                return Err(layout_err(display));
            }
            if same(upper[0].1, lower[0].1) {
                lower.remove(0);
            }
            let closed = lower.last().is_some_and(|l| same(l.1, upper[upper.len() - 1].1));
            if closed {
                lower.pop();
            }
            let mut pts: Vec<(usize, P)> = upper.into_iter().rev().collect();
            pts.extend(lower);
            (pts, closed)
        }
        None => {
            let mut pts = dedup(upper);
            let closed = pts.len() > 2 && same(pts[0].1, pts[pts.len() - 1].1);
            if closed {
                pts.pop();
            }
            let (xmin, xmax) =
                pts.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), (_, p)| {
                    (a.min(p[0]), b.max(p[0]))
                });
            if pts.len() >= 3 && pts[0].1[0] < xmin + 0.25 * (xmax - xmin) {
                // A loop from the leading edge: start it at the point farthest from there.
                let p0 = pts[0].1;
                let k = (0..pts.len())
                    .max_by(|&a, &b| dist(pts[a].1, p0).total_cmp(&dist(pts[b].1, p0)))
                    .unwrap_or(0);
                pts.rotate_left(k);
                (pts, true)
            } else if !closed && pts.len() >= 4 {
                // The segment from the last point back to the first is the base of an open
                // trailing edge when the outline turns sharply at both its ends (corners);
                // otherwise it is a piece of surface and the loop is closed at the end that turns
                // more (the file's first point, as a rule).
                let n = pts.len();
                let (first, last) = (pts[0].1, pts[n - 1].1);
                let at_first = turn(last, first, pts[1].1);
                let at_last = turn(pts[n - 2].1, last, first);
                let corner = 30f64.to_radians();
                if at_first > corner && at_last > corner {
                    (pts, false)
                } else {
                    if at_last > at_first {
                        pts.rotate_right(1);
                    }
                    (pts, true)
                }
            } else {
                (pts, closed)
            }
        }
    };
    if !repeated.is_empty() {
        let list: Vec<String> = repeated.iter().map(|l| l.to_string()).collect();
        notes.push(format!(
            "line{} {}: a point repeats the one before it; removed",
            if list.len() > 1 { "s" } else { "" },
            list.join(", ")
        ));
    }
    if pts.len() < 3 {
        return Err(file_err(AirfoilError::TooFewPoints { found: pts.len(), needed: MIN_POINTS }));
    }
    let lines = pts.iter().map(|p| p.0).collect();
    let pts_only = pts.drain(..).map(|p| p.1).collect();
    Ok(Loop { pts: pts_only, lines, closed })
}

fn layout_err(display: &str) -> CoordinateError {
    CoordinateError::at(
        display,
        None,
        "cannot tell the layout of the points: expected one loop from the trailing edge over the \
         upper surface to the leading edge and back, or the upper surface then the lower one, \
         each from the leading edge to the trailing edge"
            .to_string(),
    )
}

fn bad_line(display: &str, line: usize, content: &str) -> CoordinateError {
    CoordinateError::at(
        display,
        Some(line),
        format!(
            "expected two numbers 'x y' in chord fractions, found '{}'",
            crate::text::excerpt(content)
        ),
    )
}

/// The file error of an outline fault, with the line as a number where the fault has one (the
/// outline's own message for those faults starts with the line, which the file error gives
/// in its place).
fn locate(display: &str, e: AirfoilError) -> CoordinateError {
    match e {
        AirfoilError::Repeated { line } => {
            CoordinateError::at(display, Some(line), "the point repeats the one before it")
        }
        AirfoilError::DoublesBack { surface, line } => CoordinateError::at(
            display,
            Some(line),
            format!("the {surface} surface doubles back towards the leading edge"),
        ),
        AirfoilError::Crossing { line_a, .. } => {
            CoordinateError::at(display, Some(line_a), e.to_string())
        }
        e => CoordinateError::at(display, None, e.to_string()),
    }
}
