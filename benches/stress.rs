//! The whole stress recovery for the mine-fan demo blade with all its load cases: loads,
//! deflection, pitch sweep and ply strength ratios at every station, wall point and ply. The
//! model (sections solved) is built outside the timed loop; `recovery only` times the ply
//! stresses and strength ratios of the three cases without the pitch sweep and deflection.

use criterion::{Criterion, criterion_group, criterion_main};
use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::loads::{LoadDistribution, span_loads};
use layloft::stress::{analyse_cases, recover_at};

fn bench(c: &mut Criterion) {
    let model =
        BladeModel::build(read_project("layups/mine-fan/blade.toml".as_ref()).expect("demo"))
            .expect("demo model");
    let mut g = c.benchmark_group("stress");
    g.sample_size(20);
    g.bench_function("mine-fan, all cases", |b| {
        b.iter(|| analyse_cases(&model, None).expect("stress"))
    });
    let props = model.properties();
    g.bench_function("mine-fan, recovery only", |b| {
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
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
