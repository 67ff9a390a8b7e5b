//! The modal outputs: the Campbell diagram SVG is well-formed and labelled, the JSON has the keys
//! the command line promises, and the CSV files carry units in their column names.

use crate::modal_support::*;
use layloft::modal::{BeamModel, ModalAnalysis, SpeedRange, excitation_orders};
use layloft::project::Criteria;
use layloft::report::{campbell_csv, campbell_svg, modal_json, mode_shapes_csv};
use layloft::units::{RotorSpeed, fraction_of_pct, rpm_of};

/// Checks that every tag is closed in order (a small XML well-formedness check: elements,
/// self-closing tags, comments and declarations).
fn assert_balanced(svg: &str) {
    let mut stack: Vec<String> = Vec::new();
    let mut rest = svg;
    while let Some(start) = rest.find('<') {
        let end = rest[start..].find('>').expect("every tag is closed") + start;
        let tag = &rest[start + 1..end];
        assert!(!rest[start + 1..end].contains('<'), "a '<' inside a tag: {tag}");
        if tag.starts_with('?') || tag.starts_with('!') {
        } else if let Some(name) = tag.strip_prefix('/') {
            assert_eq!(stack.pop().as_deref(), Some(name.trim()), "closing {name}");
        } else if !tag.ends_with('/') {
            stack.push(tag.split_whitespace().next().unwrap_or("").to_string());
        }
        // Text between tags must not hold a bare '&' that starts no entity.
        let text_end = rest[end..].find('<').map_or(rest.len(), |i| i + end);
        let text = &rest[end + 1..text_end];
        for (i, _) in text.match_indices('&') {
            let entity = &text[i..];
            assert!(
                ["&amp;", "&lt;", "&gt;", "&quot;", "&apos;"].iter().any(|e| entity.starts_with(e)),
                "bare & in {text}"
            );
        }
        rest = &rest[end + 1..];
    }
    assert!(stack.is_empty(), "unclosed: {stack:?}");
}

#[test]
fn the_campbell_diagram_is_well_formed_and_labelled() {
    let model =
        BeamModel::new(&twisted_blade(6), &rotor(5, 3000.0, 3600.0, 8.0), &spec(20)).unwrap();
    let r = model.rotor().clone();
    let speeds =
        SpeedRange::for_rotor(&r, None).unwrap().speeds(&[RotorSpeed::from_rad_s(r.omega_nominal)]);
    let campbell = model.campbell(&speeds, 6, &mut |_, _| {}).unwrap();
    let orders = excitation_orders(12, r.blades, 2);
    let crossings = campbell.crossings(&orders);
    assert!(!crossings.is_empty());
    let svg = campbell_svg(
        &campbell,
        &orders,
        &crossings,
        (rpm_of(r.omega_nominal), rpm_of(r.omega_max)),
        "Campbell <invented blade>",
    );
    assert!(svg.starts_with("<svg xmlns=\"http://www.w3.org/2000/svg\""));
    assert_balanced(&svg);
    for needle in [
        "rotor speed (rpm)",
        "frequency (Hz)",
        "Campbell &lt;invented blade&gt;",
        "5P",
        "flap 1",
        "operating range",
    ] {
        assert!(svg.contains(needle), "missing {needle}");
    }
    assert!(!svg.to_lowercase().contains("nan"));
    assert_eq!(
        svg.matches("<circle").count(),
        crossings.len() + 2,
        "one marker per crossing, two in the legend"
    );
    if std::env::var_os("LAYLOFT_KEEP_SVG").is_some() {
        std::fs::write(std::env::temp_dir().join("layloft-campbell.svg"), &svg).unwrap();
    }

    let margins = campbell.rotor_margins(&r, &orders, Some(5.0)).unwrap();
    let json = modal_json(&campbell, &r, &orders, &crossings, &margins);
    let first = &json["speeds"][0];
    assert_eq!(first["rpm"], 0.0);
    assert!(first["modes"][0]["frequency_hz"].as_f64().unwrap() > 0.0);
    assert_eq!(first["modes"][0]["kind"], "flap");
    assert_eq!(first["modes"][0]["track"], 0);
    let c = &json["crossings"][0];
    assert!(c["track"].is_u64() && c["harmonic"].is_u64() && c["rpm"].is_f64());
    assert_eq!(json["margins"][0]["speed"], "nominal");
    assert!(json["margins"][1]["modes"][0]["margin_pct"].is_f64());
    assert!(json["margins"][0]["pass"].is_boolean());

    let csv = campbell_csv(&campbell);
    assert!(csv.starts_with("rpm,track,label,kind,frequency_hz\n"));
    assert_eq!(csv.lines().count(), 1 + speeds.len() * 6);
    let shapes = mode_shapes_csv(&campbell.speeds[0]);
    assert!(shapes.starts_with(
        "mode,track,frequency_hz,kind,r_m,axial_m,in_plane_m,out_of_plane_m,twist_rad\n"
    ));
    assert_eq!(shapes.lines().count(), 1 + 6 * 21);
}

#[test]
fn the_whole_stage_runs_in_one_call_and_gives_a_verdict() {
    let r = rotor(5, 3000.0, 3600.0, 8.0);
    let criteria = |pct: Option<f64>| Criteria {
        frequency_margin: pct.map(fraction_of_pct),
        harmonics: 12,
        ..Criteria::default()
    };
    let sections = twisted_blade(6);
    let mut calls = 0;
    let run = ModalAnalysis::run(
        &sections,
        &r,
        &spec(16),
        &criteria(Some(3.0)),
        None,
        Some(5),
        &mut |_, _| calls += 1,
    )
    .unwrap();
    // 0..3600 rpm in 60 steps, nominal 3000 rpm already on the grid: 61 speeds.
    assert_eq!(calls, 61);
    assert_eq!(run.campbell.speeds.len(), 61);
    // Five modes asked for; as many more solved as reach past 12P at 3600 rpm (720 Hz) plus
    // the 3 % margin, so that no mode near an excitation goes unchecked.
    let c = run.coverage;
    assert!(c.asked == 5 && c.solved >= 5 && c.covered(), "{c:?}");
    assert!((c.needed_hz / (720.0 * 1.03) - 1.0).abs() < 1e-9, "{c:?}");
    assert!(run.campbell.speeds.iter().all(|s| s.modes.len() == c.solved));
    // The nominal and the maximum speed, and the speed between them where the least margin is
    // smaller than at both (this blade has one: a third check).
    let names: Vec<&str> = run.margins.iter().map(|m| m.name.as_str()).collect();
    assert_eq!(names, ["nominal", "maximum", "running"]);
    let least = |m: &layloft::modal::MarginCheck| {
        m.modes.iter().map(|x| x.margin).fold(f64::INFINITY, f64::min)
    };
    assert!(least(&run.margins[2]) < least(&run.margins[0]).min(least(&run.margins[1])));
    let (lo, hi) = (run.margins[0].speed, run.margins[1].speed);
    assert!(run.margins[2].speed > lo && run.margins[2].speed < hi);
    let all_pass = run.margins.iter().all(|m| m.modes.iter().all(|x| x.margin >= 0.03));
    assert_eq!(run.pass(), Some(all_pass));
    // No margin asked: no verdict. A range below the nominal speed: no margins checked there.
    let none = ModalAnalysis::run(
        &sections,
        &r,
        &spec(16),
        &criteria(None),
        None,
        Some(3),
        &mut |_, _| {},
    )
    .unwrap();
    assert_eq!(none.pass(), None);
    let low = SpeedRange::new(
        RotorSpeed::ZERO,
        RotorSpeed::from_rpm(2000.0),
        RotorSpeed::from_rpm(500.0),
    )
    .unwrap();
    let part = ModalAnalysis::run(
        &sections,
        &r,
        &spec(16),
        &criteria(Some(3.0)),
        Some(low),
        Some(3),
        &mut |_, _| {},
    )
    .unwrap();
    assert!(part.margins.is_empty());
    assert_eq!(part.pass(), None);
}
