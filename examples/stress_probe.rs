use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::stress::analyse_cases;
fn main() {
    for demo in ["layups/mine-fan/blade.toml", "layups/small-wind/blade.toml"] {
        let t = std::time::Instant::now();
        let model = BladeModel::build(read_project(demo.as_ref()).unwrap()).unwrap();
        let t1 = t.elapsed();
        let cases = analyse_cases(&model, None).unwrap();
        let t2 = t.elapsed() - t1;
        println!("{demo}: build {t1:?}, stress {t2:?}, mass {:.3}", model.mass().total_kg);
        for c in &cases {
            let cr = c.critical.as_ref().unwrap();
            println!(
                "  {} rpm {} root F={:?} M={:?} tip defl {:.4} m twist {:.3} deg",
                c.name,
                c.rpm,
                c.root.force.map(|v| v.round()),
                c.root.moment.map(|v| (v * 10.0).round() / 10.0),
                c.tip_deflection.total,
                c.tip_deflection.twist.to_degrees()
            );
            println!(
                "    RF {:.3} at r={:.3} {} ply {} ({} {}°) {} {} stress {:?}",
                cr.reserve_factor,
                cr.r,
                cr.location,
                cr.ply_id,
                cr.material,
                cr.angle_deg,
                cr.criterion,
                cr.mode,
                cr.stress_12.map(|v| (v / 1e6 * 10.0).round() / 10.0)
            );
            let ps = &c.pitch_sweep;
            println!(
                "    pitch moment {:.2}..{:.2} N·m, ctm {:.2}..{:.2}",
                ps.first().unwrap().pitch_moment,
                ps.last().unwrap().pitch_moment,
                ps.first().unwrap().centrifugal_twisting_moment,
                ps.last().unwrap().centrifugal_twisting_moment
            );
        }
    }
}
