//! From a closed loop of points (as read from a file, in either direction) to an [`Outline`]:
//! the orientation, the trailing edge (a point, or a straight base given by its ends or by
//! points along it), the leading edge (a point, or the middle of a flat front face), the chord
//! line, and the checks (no crossing, each surface advancing along the chord).
//!
//! Rules, in order:
//! 1. The loop must not cross or touch itself (checked in the file's order, so the two places
//!    named are lines of the file).
//! 2. The loop is turned to run trailing edge → upper surface → leading edge → lower surface
//!    (counter-clockwise with `x` along the chord and `y` up); points given the other way round
//!    are reversed, with a note.
//! 3. Trailing edge: where the file closes the loop (its first point, repeated last or not), or
//!    the straight base between the first and last points of an open loop. A base given as points
//!    along it, or a straight face at the back that turns sharply off the surface before it, is
//!    taken whole: the outline then has a blunt trailing edge between the base's two corners.
//! 4. A file already drawn on its chord line keeps its frame: when the trailing-edge midpoint
//!    lies within [`ON_CHORD`] of (1, 0), a point of the outline within [`ON_CHORD`] of (0, 0)
//!    is the leading edge (the nearest such point), and no point reaches more than 1 % of the
//!    chord farther from the trailing edge, nothing is turned or scaled beyond what puts these
//!    two exactly on (0, 0) and (1, 0) (at most [`ON_CHORD`], below the notes' thresholds). This
//!    is how a cambered section is drawn (NACA 4412: the mean line starts at (0, 0), and the
//!    upper surface curves round ahead of it, so the point farthest from the trailing edge lies
//!    a little above and ahead of the leading edge: taking it would turn the section by about
//!    0.27°). Ahead of such a leading edge a surface may run forward round the nose before it
//!    advances along the chord.
//! 5. Otherwise the leading edge is the point farthest from the trailing-edge midpoint; on a flat
//!    front face (a box) the middle of that face.
//! 6. The chord line runs from the leading edge to the trailing-edge midpoint; points are scaled
//!    and turned so that these are (0, 0) and (1, 0).

use super::AirfoilError;
use super::outline::Outline;
use super::plane::{P, dist, segments_meet, straight_through, turn, twice_area};

/// A straight run at the back or the front counts as a face (a base, a flat front) when it has
/// at least two segments along one line, or one segment that turns off the surface before it by
/// more than this (a box corner is 90°; a finely sampled round edge turns a few degrees).
const FACE_CORNER: f64 = 60.0 * std::f64::consts::PI / 180.0;

/// A straight run counts as a face across the chord when it is steeper than this to the chord
/// line (sine of the angle).
const STEEP: f64 = 0.7;

/// How close to (0, 0) and (1, 0), in the file's units, a file's leading-edge point and
/// trailing-edge midpoint must lie for the file to count as drawn on its chord line (rule 4):
/// 1e-4 of the chord, well above the round-off of a file's usual 5 to 8 decimals and well below
/// any scale or turn a file is given on purpose.
const ON_CHORD: f64 = 1e-4;

/// A file on its chord line may reach this fraction of the chord beyond its leading edge (a
/// cambered nose, rule 4); one that reaches farther is normalised as any other.
const NOSE_REACH: f64 = 0.01;

/// A closed loop of distinct points from a file.
#[derive(Debug, Clone)]
pub(crate) struct Loop {
    /// The points, each once, in the file's order round the loop.
    pub pts: Vec<P>,
    /// The file line of each point.
    pub lines: Vec<usize>,
    /// The loop is closed at its first point (a sharp trailing edge there); otherwise the
    /// trailing-edge base runs from the last point to the first.
    pub closed: bool,
}

/// The outline of a loop, and notes on what was changed to read it.
pub(crate) fn outline_from_loop(
    lp: Loop,
    notes: &mut Vec<String>,
) -> Result<Outline, AirfoilError> {
    let Loop { pts, lines, closed } = lp;
    let n = pts.len();
    if n < 3 {
        return Err(AirfoilError::TooFewPoints { found: n, needed: 3 });
    }
    let extent = extent(&pts);
    if extent <= 0.0 || !extent.is_finite() {
        return Err(AirfoilError::NoArea);
    }
    // All points on one straight line: no chord or no depth (before the crossing check, which
    // would find the line doubling back on itself).
    let q = pts.iter().copied().max_by(|a, b| dist(*a, pts[0]).total_cmp(&dist(*b, pts[0])));
    if let Some(q) = q {
        let l = dist(q, pts[0]);
        let off = |p: P| {
            ((q[0] - pts[0][0]) * (p[1] - pts[0][1]) - (q[1] - pts[0][1]) * (p[0] - pts[0][0]))
                .abs()
                / l
        };
        if l > 0.0 && pts.iter().all(|&p| off(p) <= 1e-9 * extent) {
            return Err(AirfoilError::NoArea);
        }
    }
    // A crossing is reported after the surfaces are checked for doubling back, which names the
    // place more plainly when both are wrong (two points swapped along a surface).
    let crossing = check_no_crossing(&pts, &lines, 1e-10 * extent).err();
    let rest = orient_and_split(pts, lines, closed, extent, notes);
    match (crossing, rest) {
        (None, r) => r,
        (Some(_), Err(e @ AirfoilError::DoublesBack { .. })) => Err(e),
        (Some(c), _) => Err(c),
    }
}

/// Steps 2 to 6 of the module doc on a loop that does not cross itself.
fn orient_and_split(
    mut pts: Vec<P>,
    mut lines: Vec<usize>,
    closed: bool,
    extent: f64,
    notes: &mut Vec<String>,
) -> Result<Outline, AirfoilError> {
    let n = pts.len();
    let area2 = twice_area(&pts);
    if area2.abs() <= 1e-9 * extent * extent {
        return Err(AirfoilError::NoArea);
    }
    if area2 < 0.0 {
        notes.push(
            "the points run round the outline the other way (trailing edge, lower surface, \
             leading edge, upper surface); read in reverse order"
                .to_string(),
        );
        if closed {
            pts[1..].reverse();
            lines[1..].reverse();
        } else {
            pts.reverse();
            lines.reverse();
        }
    }

    // Trailing edge: indices `u` (upper corner) and `l` (lower corner) in the loop, running
    // u → upper → leading edge → lower → l; u == l for a sharp edge.
    let (u, l, base_note) = trailing_edge(&pts, closed);
    if let Some(note) = base_note {
        notes.push(note);
    }
    // The loop from the upper corner round to the lower corner.
    let order: Vec<usize> =
        if u == l { (0..=n).map(|k| (u + k) % n).collect() } else { walk(u, l, n) };
    let te = mid(pts[u], pts[l]);

    // Leading edge: the farthest point, or the middle of a flat front face.
    let far = (1..order.len() - 1)
        .max_by(|&a, &b| dist(pts[order[a]], te).total_cmp(&dist(pts[order[b]], te)))
        .unwrap_or(1);
    let (mut path, mut path_lines): (Vec<P>, Vec<usize>) =
        (order.iter().map(|&k| pts[k]).collect(), order.iter().map(|&k| lines[k]).collect());
    let on_chord = on_chord_line(&path, far, te);
    let ile = match on_chord {
        Some(k) => k,
        None => front_face(&mut path, &mut path_lines, far, te),
    };
    let le = path[ile];
    let chord = dist(le, te);
    if chord <= 1e-9 * extent {
        return Err(AirfoilError::NoArea);
    }
    let (s, c) = ((te[1] - le[1]) / chord, (te[0] - le[0]) / chord);
    // Chord fractions are expected; a file in other units or turned off its chord line reads
    // all the same, and says so (beyond 1 % of scale or 0.1° of turn: the round-off of a
    // file's digits stays well inside these).
    if (chord - 1.0).abs() > 0.01 {
        notes.push(format!(
            "the chord from the leading edge to the trailing edge's middle is {chord:.3} in the \
             file's units, not 1: the points are scaled to chord fractions"
        ));
    }
    let turn = s.atan2(c).to_degrees();
    if turn.abs() > 0.1 {
        notes.push(format!(
            "the chord line is turned {turn:.2}° from the file's x axis: the points are turned \
             onto it"
        ));
    }
    let norm = |p: P| {
        let (dx, dy) = (p[0] - le[0], p[1] - le[1]);
        [(dx * c + dy * s) / chord, (-dx * s + dy * c) / chord]
    };
    let all: Vec<P> = path.iter().map(|&p| norm(p)).collect();
    let upper: Vec<P> = all[..=ile].iter().rev().copied().collect();
    let lower: Vec<P> = all[ile..].to_vec();
    let upper_lines: Vec<usize> = path_lines[..=ile].iter().rev().copied().collect();
    let lower_lines: Vec<usize> = path_lines[ile..].to_vec();
    if upper.len() < 2 || lower.len() < 2 {
        return Err(AirfoilError::NoLeadingEdge);
    }
    // On its own chord line a surface may first run forward round the nose (rule 4).
    let (su, sl) = match on_chord {
        Some(_) => (nose_run(&upper), nose_run(&lower)),
        None => (0, 0),
    };
    check_advancing(&upper[su..], &upper_lines[su..], "upper")?;
    check_advancing(&lower[sl..], &lower_lines[sl..], "lower")?;
    Ok(Outline { upper, lower })
}

/// The index in `path` (upper corner → leading edge → lower corner) of the leading edge of a
/// file drawn on its chord line (rule 4 of the module doc), or `None` when the file is not.
fn on_chord_line(path: &[P], far: usize, te: P) -> Option<usize> {
    if dist(te, [1.0, 0.0]) > ON_CHORD || path.len() < 3 {
        return None;
    }
    let k = (1..path.len() - 1)
        .min_by(|&a, &b| dist(path[a], [0.0, 0.0]).total_cmp(&dist(path[b], [0.0, 0.0])))?;
    let chord = dist(path[k], te);
    (dist(path[k], [0.0, 0.0]) <= ON_CHORD && dist(path[far], te) <= (1.0 + NOSE_REACH) * chord)
        .then_some(k)
}

/// The number of steps at the start of a surface (from the leading edge, normalised) that run
/// forward ahead of the leading edge: round the nose of a cambered section on its chord line.
fn nose_run(surface: &[P]) -> usize {
    let mut k = 0;
    while k + 1 < surface.len() && surface[k + 1][0] < surface[k][0] && surface[k + 1][0] < 0.0 {
        k += 1;
    }
    k
}

fn extent(pts: &[P]) -> f64 {
    let (mut lo, mut hi) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
    for p in pts {
        for k in 0..2 {
            lo[k] = lo[k].min(p[k]);
            hi[k] = hi[k].max(p[k]);
        }
    }
    (hi[0] - lo[0]).max(hi[1] - lo[1])
}

fn mid(a: P, b: P) -> P {
    [(a[0] + b[0]) / 2.0, (a[1] + b[1]) / 2.0]
}

/// Indices from `a` forward round the loop to `b`, both included.
fn walk(a: usize, b: usize, n: usize) -> Vec<usize> {
    let len = (b + n - a) % n + 1;
    (0..len).map(|k| (a + k) % n).collect()
}

/// The end of the straight run from `pts[start]` stepping by `step` (+1 or n-1) round the loop,
/// and the number of segments in it.
fn straight_run(pts: &[P], start: usize, step: usize) -> (usize, usize) {
    let n = pts.len();
    let mut end = (start + step) % n;
    let mut count = 1;
    while count < n - 2 {
        let next = (end + step) % n;
        if !straight_through(pts[start], pts[end], pts[next]) {
            break;
        }
        end = next;
        count += 1;
    }
    (end, count)
}

/// Whether the straight run from `start` to `end` (of `count` segments, stepping by `step`)
/// is a face: two or more segments, or a sharp corner where it meets the surface beyond.
fn is_face(pts: &[P], start: usize, end: usize, count: usize, step: usize) -> bool {
    let n = pts.len();
    let beyond = (end + step) % n;
    count >= 2 || turn(pts[start], pts[end], pts[beyond]) >= FACE_CORNER
}

/// Whether direction `a → b` is steep to the direction `c → d`.
fn steep(a: P, b: P, c: P, d: P) -> bool {
    let (u, v) = ([b[0] - a[0], b[1] - a[1]], [d[0] - c[0], d[1] - c[1]]);
    let (lu, lv) = (u[0].hypot(u[1]), v[0].hypot(v[1]));
    lu > 0.0 && lv > 0.0 && (u[0] * v[1] - u[1] * v[0]).abs() > STEEP * lu * lv
}

/// The upper and lower corners of the trailing edge (equal for a sharp edge), and a note when a
/// base was made out of points along it.
fn trailing_edge(pts: &[P], closed: bool) -> (usize, usize, Option<String>) {
    let n = pts.len();
    let back = n - 1;
    let far_from =
        |p: P| (0..n).max_by(|&a, &b| dist(pts[a], p).total_cmp(&dist(pts[b], p))).unwrap_or(0);
    let note = |what: &str| {
        Some(format!(
            "the trailing-edge base is given {what}: read as a straight base between its two corners"
        ))
    };
    if closed {
        // Points along a base through the closing point.
        if straight_through(pts[back], pts[0], pts[1]) {
            let (u, _) = straight_run(pts, 0, 1);
            let (l, _) = straight_run(pts, 0, back);
            return (u, l, note("as points along it"));
        }
        // A straight face at one side of the closing point that turns off the surface sharply:
        // the loop was closed at one corner of a base.
        let le = pts[far_from(pts[0])];
        let (ue, uc) = straight_run(pts, 0, 1);
        let (le_end, lc) = straight_run(pts, 0, back);
        let up = is_face(pts, 0, ue, uc, 1) && steep(pts[0], pts[ue], le, pts[0]);
        let down = is_face(pts, 0, le_end, lc, back) && steep(pts[0], pts[le_end], le, pts[0]);
        return match (up, down) {
            (true, false) => (ue, 0, note("along the back, closed at its lower corner")),
            (false, true) => (0, le_end, note("along the back, closed at its upper corner")),
            _ => (0, 0, None),
        };
    }
    // Open: the base runs from the last point to the first; it may go on along one line.
    let u = extend_base(pts, 0, back, 1);
    let l = extend_base(pts, back, 0, back);
    let note = if u != 0 || l != back { note("partly as points along it") } else { None };
    (u, l, note)
}

/// From `from` stepping by `step`, the last point still on the line through `pts[anchor]` and
/// `pts[from]` beyond `from`.
fn extend_base(pts: &[P], from: usize, anchor: usize, step: usize) -> usize {
    let n = pts.len();
    let mut end = from;
    for _ in 0..n - 3 {
        let next = (end + step) % n;
        if !straight_through(pts[anchor], pts[end], pts[next]) {
            break;
        }
        end = next;
    }
    end
}

/// The index of the leading edge in `path` (upper corner → leading edge → lower corner): the
/// point `far`, or, when a flat face across the chord runs through it or ends at it, a point in
/// the middle of that face (inserted if no point is there).
fn front_face(path: &mut Vec<P>, lines: &mut Vec<usize>, far: usize, te: P) -> usize {
    let n = path.len();
    // The straight run from `far` towards the upper corner (-1) or the lower one (+1): its end
    // and whether it is a face (two segments or more, or a sharp corner at its end).
    let run = |down: bool| -> (usize, bool) {
        let next = |k: usize| if down { k + 1 } else { k.wrapping_sub(1) };
        let inside = |k: usize| k >= 1 && k + 1 < n;
        let mut end = next(far);
        if !inside(end) {
            return (far, false);
        }
        let mut count = 1;
        while inside(next(end)) && straight_through(path[far], path[end], path[next(end)]) {
            end = next(end);
            count += 1;
        }
        let beyond = next(end);
        let sharp = beyond < n && turn(path[far], path[end], path[beyond]) >= FACE_CORNER;
        (end, count >= 2 || sharp)
    };
    let (up_end, up_face) = run(false);
    let (down_end, down_face) = run(true);
    let (a, b) =
        if far >= 1 && far + 1 < n && straight_through(path[far - 1], path[far], path[far + 1]) {
            (up_end, down_end)
        } else {
            let up = up_face && steep(path[up_end], path[far], path[far], te);
            let down = down_face && steep(path[far], path[down_end], path[far], te);
            match (up, down) {
                (true, false) => (up_end, far),
                (false, true) => (far, down_end),
                _ => return far,
            }
        };
    if a >= b || !steep(path[a], path[b], path[far], te) {
        return far;
    }
    let m = mid(path[a], path[b]);
    let tol = 1e-12 * dist(path[a], path[b]);
    if let Some(k) = (a..=b).find(|&k| dist(path[k], m) <= tol) {
        return k;
    }
    let k = (a..b)
        .find(|&k| {
            let (p, q) = (path[k], path[k + 1]);
            let d = [q[0] - p[0], q[1] - p[1]];
            let t = ((m[0] - p[0]) * d[0] + (m[1] - p[1]) * d[1]) / (d[0] * d[0] + d[1] * d[1]);
            (0.0..=1.0).contains(&t)
        })
        .unwrap_or(a);
    path.insert(k + 1, m);
    lines.insert(k + 1, lines[k]);
    k + 1
}

fn check_no_crossing(pts: &[P], lines: &[usize], eps: f64) -> Result<(), AirfoilError> {
    let n = pts.len();
    let seg = |i: usize| (pts[i], pts[(i + 1) % n]);
    for i in 0..n {
        for j in (i + 2)..n {
            if i == 0 && j == n - 1 {
                continue;
            }
            let (a, b) = seg(i);
            let (c, d) = seg(j);
            if segments_meet(a, b, c, d, eps) {
                return Err(AirfoilError::Crossing { line_a: lines[i], line_b: lines[j] });
            }
        }
    }
    Ok(())
}

/// Each surface must advance along the chord from the leading edge to the trailing edge; a
/// straight face across the chord (at a box's front or back) may stand still.
fn check_advancing(surface: &[P], lines: &[usize], name: &str) -> Result<(), AirfoilError> {
    for (i, w) in surface.windows(2).enumerate() {
        if w[1][0] < w[0][0] - 1e-9 {
            return Err(AirfoilError::DoublesBack {
                surface: name.to_string(),
                line: lines[i + 1],
            });
        }
    }
    Ok(())
}
