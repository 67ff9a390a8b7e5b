/// Most blades on one rotor: axial fans carry up to a few dozen blades, compressor and
/// ducted-fan stages rarely more than about 60 (common practice).
pub const MAX_BLADES: u32 = 100;
/// Greatest tip speed at `rpm_max`, m/s: the fastest composite fan blades (turbofan fans)
/// run at about 450–500 m/s at the tip (common practice); beyond this the input is a typo.
pub const MAX_TIP_SPEED_M_S: f64 = 700.0;

/// The words of a sweep step (`step`, rpm) that makes more than [`MAX_SWEEP_STEPS`] speeds over
/// `span` (rpm; `what`, empty or starting with a space, names it): the count found and the
/// least step allowed; `None` within it.
pub fn sweep_excess(step: f64, span: f64, what: &str) -> Option<String> {
    let count = span / step;
    (count > MAX_SWEEP_STEPS).then(|| {
        format!(
            "a step of {step} rpm{what} makes {count:.0} speeds: expected at most \
             {MAX_SWEEP_STEPS} (each speed is an eigen solution), a step of at least {} rpm",
            span / MAX_SWEEP_STEPS
        )
    })
}

/// The words of a rotor speed (`rpm`) that takes a tip at radius `tip_radius` (m) beyond
/// [`MAX_TIP_SPEED_M_S`]: the tip speed found and the greatest speed allowed; `None` within it.
/// `rpm` is echoed as written (`shown`).
pub fn tip_speed_excess(shown: &str, rpm: f64, tip_radius: f64) -> Option<String> {
    let per_rpm = std::f64::consts::PI / 30.0 * tip_radius;
    let tip_speed = rpm * per_rpm;
    (tip_speed > MAX_TIP_SPEED_M_S).then(|| {
        format!(
            "{shown} rpm at tip_radius_m = {tip_radius} gives a tip speed of {tip_speed:.0} m/s: \
             expected at most {MAX_TIP_SPEED_M_S} m/s (the fastest composite fan blades run at \
             about 500 m/s), at most {:.0} rpm",
            MAX_TIP_SPEED_M_S / per_rpm
        )
    })
}
/// Least and greatest load factor: partial load factors of design codes run from about 0.9
/// (favourable loads) to 2 (common practice); outside 0.5–10 the factor is a typo.
pub const LOAD_FACTOR: (f64, f64) = (0.5, 10.0);
/// Pitch settings and ranges, degrees: from reverse pitch to feathered.
pub const MAX_PITCH_DEG: f64 = 90.0;
/// Most rotor harmonics checked: excitation falls off fast with the order; 12 is the
/// default and blade passing is added on its own (common practice).
pub const MAX_HARMONICS: u32 = 100;
/// Most speeds of the Campbell sweep from `[modal] rpm_step` (each is an eigen solution).
pub const MAX_SWEEP_STEPS: f64 = 1000.0;
/// Most modes per speed.
pub const MAX_MODES: usize = 100;
/// Most vane counts, further orders and fixed excitations, and the greatest order.
pub const MAX_EXCITATIONS: usize = 100;
/// Greatest excitation order or vane count.
pub const MAX_ORDER: f64 = 1000.0;
/// Most multiples of a vane count.
pub const MAX_VANE_MULTIPLES: u32 = 20;
/// Greatest fluid density, kg/m³: sea water is 1,025, drilling mud about 2,000.
pub const MAX_FLUID_DENSITY: f64 = 3000.0;
/// Absolute zero, °C.
pub const ABSOLUTE_ZERO_C: f64 = -273.15;
/// Greatest process temperature, °C: epoxies cure below about 200 °C, high-temperature
/// resins below about 400 °C.
pub const MAX_PROCESS_C: f64 = 500.0;
/// Greatest temperature change of a load case, K, either way.
pub const MAX_DELTA_T_K: f64 = 400.0;
/// The tip radius may lie beyond the last station by at most this fraction of the blade's
/// length (a tip cap not described by a station).
pub const TIP_GAP: f64 = 0.1;
/// Least chordal tolerance of the tooling meshes, as a fraction of the blade's length: the
/// facet count grows as the inverse of the tolerance; 1/50,000 of the length is finer than
/// any mould is machined (common practice).
pub const MIN_TOLERANCE: f64 = 2e-5;
/// Greatest chordal tolerance, as a fraction of the least chord: a coarser mesh no longer
/// follows the thin sections (the surfaces turn over).
pub const MAX_TOLERANCE: f64 = 0.01;
/// Least mould margin, as a fraction of the largest chord.
pub const MIN_MARGIN: f64 = 0.02;
/// Greatest mould margin, as a multiple of the blade's length plus its largest chord.
pub const MAX_MARGIN: f64 = 2.0;
