//! Modal results as CSV, units in every column name: the Campbell data one row per mode and
//! speed (`campbell_csv`), and mode shapes one row per mode and node (`mode_shapes_csv`: `mode,
//! track, frequency_hz, kind, r_m, axial_m, in_plane_m, out_of_plane_m, twist_rad`, rotor frame,
//! scaled as `modal::ModeShape` says).

use std::fmt::Write;

use crate::modal::{Campbell, ModeSet};

/// The Campbell data: `rpm, track, label, kind, frequency_hz`, one row per mode and speed.
pub fn campbell_csv(campbell: &Campbell) -> String {
    let mut s = String::from("rpm,track,label,kind,frequency_hz\n");
    for set in &campbell.speeds {
        for m in &set.modes {
            let (id, label) = match m.track.and_then(|t| campbell.tracks.get(t)) {
                Some(t) => (t.id.to_string(), t.label.as_str()),
                None => (String::new(), ""),
            };
            let _ = writeln!(
                s,
                "{},{id},{label},{},{}",
                set.speed.rpm(),
                m.kind.name(),
                m.frequency_hz
            );
        }
    }
    s
}

/// Mode shapes at one speed, one row per mode and node.
pub fn mode_shapes_csv(set: &ModeSet) -> String {
    let mut s = String::from(
        "mode,track,frequency_hz,kind,r_m,axial_m,in_plane_m,out_of_plane_m,twist_rad\n",
    );
    for (i, m) in set.modes.iter().enumerate() {
        let track = m.track.map(|t| t.to_string()).unwrap_or_default();
        let sh = &m.shape;
        // Adding +0 writes a negative zero (the clamped root's displacements) as 0 and leaves
        // every other value as it is.
        let v = |x: f64| x + 0.0;
        for n in 0..sh.r.len() {
            let _ = writeln!(
                s,
                "{},{track},{},{},{},{},{},{},{}",
                i + 1,
                m.frequency_hz,
                m.kind.name(),
                sh.r[n],
                v(sh.axial[n]),
                v(sh.in_plane[n]),
                v(sh.out_of_plane[n]),
                v(sh.twist[n])
            );
        }
    }
    s
}
