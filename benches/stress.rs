//! The whole stress recovery for the mine-fan demo blade with all its load cases: loads,
//! deflection, pitch sweep and ply strength ratios at every station, wall point and ply. The
//! model (sections solved) is built outside the timed loop; `recovery only` times the ply
//! stresses and strength ratios of the three cases without the pitch sweep and deflection.
//! Both run with the walls following the beam (`wall_bending = true`, the default) and with the
//! wall curvatures held (`false`); the number of ply faces evaluated per iteration is printed
//! once, so a time per ply-face evaluation follows from the figures.
//! `panels` times what buckling adds: the wall panels and their critical loads (once per model)
//! and their checks under the three cases. Its share is panels over all cases.
//! `generated blade` times what `check` runs after the model is built (every case's recovery
//! with the summaries only, and the panel checks) on a generated, invented blade of 40
//! stations, 2,000 plies and 2,000 contour points (a tenth of the large blade of
//! `stress_scaling`); its rate is in ply-face-criterion evaluations (ply points times two faces
//! times four criteria), so that the time per evaluation is the inverse of the rate.

#[path = "kit/mod.rs"]
mod kit;
#[path = "large_blade/mod.rs"]
mod large_blade;
use kit::{Runner, Throughput};
use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::loads::{LoadDistribution, span_loads};
use layloft::stress::{analyse_cases, model_panels, recover_at};

fn bench(c: &mut Runner) {
    bench_generated(c);
    for wall_bending in [true, false] {
        bench_mode(c, wall_bending);
    }
}

fn bench_generated(c: &mut Runner) {
    let dir = tempfile::tempdir().expect("temporary folder");
    let size = large_blade::Size { stations: 40, plies: 2000, points: 2000 };
    let file = large_blade::write(dir.path(), size).expect("write the generated blade");
    let model = BladeModel::build(read_project(&file).expect("generated project reads"))
        .expect("generated model builds");
    let mut evaluations = 0u64;
    recover_all(&model, &mut |points| {
        evaluations += points.iter().map(|p| 8 * p.plies.len() as u64).sum::<u64>();
    });
    eprintln!("generated blade: {evaluations} ply-face-criterion evaluations per call");
    let mut g = c.benchmark_group("stress");
    g.sample_size(10);
    g.throughput(Throughput::Elements(evaluations));
    g.bench_function("generated blade, summaries only, with panel checks", |b| {
        b.iter(|| {
            layloft::stress::analyse_cases_detail(&model, None, layloft::stress::Detail::Summary)
                .expect("stress")
        })
    });
    g.finish();
    // CPU time of the whole process (both stress threads) over a few calls: on a shared machine
    // the wall clock counts the waits for a core, the CPU time does not.
    if let Some(t0) = process_cpu_seconds() {
        let calls = 5;
        for _ in 0..calls {
            kit::black_box(
                layloft::stress::analyse_cases_detail(
                    &model,
                    None,
                    layloft::stress::Detail::Summary,
                )
                .expect("stress"),
            );
        }
        if let Some(t1) = process_cpu_seconds() {
            let per_call = (t1 - t0) / calls as f64;
            println!(
                "stress/generated blade: {:.3} s CPU per call, {:.1} ns CPU per evaluation",
                per_call,
                per_call * 1e9 / evaluations as f64
            );
        }
    }
}

/// The ply stresses and strength ratios of every load case at every station of `model` (loads
/// along the span, then the recovery alone: no pitch sweep, no deflection), each station's
/// points handed to `each`.
fn recover_all(model: &BladeModel, each: &mut dyn FnMut(Vec<layloft::stress::PointStress>)) {
    let props = model.properties();
    for case in &model.project.load_cases {
        let pitch = case.pitch.unwrap_or(model.project.rotor.pitch);
        let loads = span_loads(
            &LoadDistribution::new(&props, &model.project.point_masses, case, pitch)
                .expect("loads"),
        );
        for st in &model.stations {
            let res = loads.chord_at(st.layout.r);
            each(recover_at(&st.layout, &st.section, &res, case.delta_t).expect("recovery"));
        }
    }
}

/// User plus system CPU time of this process so far, s (Linux `/proc/self/stat`, in ticks of
/// 1/100 s); `None` elsewhere.
fn process_cpu_seconds() -> Option<f64> {
    let stat = std::fs::read_to_string("/proc/self/stat").ok()?;
    // Fields after the command name (which is in parentheses and may hold spaces).
    let rest = stat.rsplit_once(')')?.1;
    let fields: Vec<&str> = rest.split_whitespace().collect();
    let utime: f64 = fields.get(11)?.parse().ok()?;
    let stime: f64 = fields.get(12)?.parse().ok()?;
    Some((utime + stime) / 100.0)
}

fn bench_mode(c: &mut Runner, wall_bending: bool) {
    let mut project = read_project("layups/mine-fan/blade.toml".as_ref()).expect("demo");
    project.sections.wall_bending = wall_bending;
    let model = BladeModel::build(project).expect("demo model");
    let mode = if wall_bending { "wall bending" } else { "walls held" };
    let mut faces = 0;
    recover_all(&model, &mut |points| {
        faces += points.iter().map(|p| 2 * p.plies.len()).sum::<usize>()
    });
    eprintln!("mine-fan, {mode}: {faces} ply faces per recovery-only iteration");
    let mut g = c.benchmark_group("stress");
    g.sample_size(20);
    g.bench_function(format!("mine-fan, all cases, {mode}"), |b| {
        b.iter(|| analyse_cases(&model, None).expect("stress"))
    });
    g.bench_function(format!("mine-fan, recovery only, {mode}"), |b| {
        b.iter(|| recover_all(&model, &mut |points| drop(kit::black_box(points))))
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
