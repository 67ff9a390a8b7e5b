//! The whole stress recovery for the mine-fan demo blade with all its load cases: loads,
//! deflection, pitch sweep and ply strength ratios at every station, wall point and ply. The
//! model (sections solved) is built outside the timed loop; `recovery only` times the ply
//! stresses and strength ratios of the three cases without the pitch sweep and deflection.
//! Both run with the walls following the beam (`wall_bending = true`, the default) and with the
//! wall curvatures held (`false`); the number of ply faces evaluated per iteration is printed
//! once, so a time per ply-face evaluation follows from the figures.
//! `panels` times what buckling adds: the wall panels and their critical loads (once per model)
//! and their checks under the three cases. Its share is panels over all cases.

#[path = "kit/mod.rs"]
mod kit;
use kit::Runner;
use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::loads::{LoadDistribution, span_loads};
use layloft::stress::{analyse_cases, model_panels, recover_at};

fn bench(c: &mut Runner) {
    for wall_bending in [true, false] {
        bench_mode(c, wall_bending);
    }
}

fn bench_mode(c: &mut Runner, wall_bending: bool) {
    let mut project = read_project("layups/mine-fan/blade.toml".as_ref()).expect("demo");
    project.sections.wall_bending = wall_bending;
    let model = BladeModel::build(project).expect("demo model");
    let mode = if wall_bending { "wall bending" } else { "walls held" };
    let props = model.properties();
    let mut faces = 0;
    for case in &model.project.load_cases {
        let pitch = case.pitch.unwrap_or(model.project.rotor.pitch);
        let loads = span_loads(
            &LoadDistribution::new(&props, &model.project.point_masses, case, pitch)
                .expect("loads"),
        );
        for st in &model.stations {
            let res = loads.chord_at(st.layout.r);
            let points = recover_at(&st.layout, &st.section, &res, case.delta_t).expect("recovery");
            faces += points.iter().map(|p| 2 * p.plies.len()).sum::<usize>();
        }
    }
    eprintln!("mine-fan, {mode}: {faces} ply faces per recovery-only iteration");
    let mut g = c.benchmark_group("stress");
    g.sample_size(20);
    g.bench_function(format!("mine-fan, all cases, {mode}"), |b| {
        b.iter(|| analyse_cases(&model, None).expect("stress"))
    });
    g.bench_function(format!("mine-fan, recovery only, {mode}"), |b| {
        b.iter(|| {
            for case in &model.project.load_cases {
                let pitch = case.pitch.unwrap_or(model.project.rotor.pitch);
                let loads = span_loads(
                    &LoadDistribution::new(&props, &model.project.point_masses, case, pitch)
                        .expect("loads"),
                );
                for st in &model.stations {
                    let res = loads.chord_at(st.layout.r);
                    recover_at(&st.layout, &st.section, &res, case.delta_t).expect("recovery");
                }
            }
        })
    });
    g.bench_function(format!("mine-fan, all cases, summaries only, {mode}"), |b| {
        b.iter(|| {
            layloft::stress::analyse_cases_detail(&model, None, layloft::stress::Detail::Summary)
                .expect("stress")
        })
    });
    g.bench_function("mine-fan, panels and their critical loads", |b| {
        b.iter(|| model_panels(&model))
    });
    let panels = model_panels(&model);
    let cases = analyse_cases(&model, None).expect("stress");
    g.bench_function("mine-fan, panel checks of all cases", |b| {
        b.iter(|| {
            let mut least = f64::INFINITY;
            for case in &cases {
                for (st, ps) in case.stations.iter().zip(&panels) {
                    for p in ps {
                        let res: Vec<(f64, f64)> = p
                            .elements
                            .iter()
                            .map(|&k| {
                                st.points
                                    .iter()
                                    .find(|q| q.element == k)
                                    .map_or((0.0, 0.0), |q| (q.n_x, q.n_xs))
                            })
                            .collect();
                        least = least.min(layloft::buckling::check_panel(p, &res).reserve_factor);
                    }
                }
            }
            least
        })
    });
    g.finish();
}

bench_main!(bench);
