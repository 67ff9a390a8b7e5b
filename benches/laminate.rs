//! Ply-stress evaluations per second: a 24-ply hybrid laminate under seeded random loads with a
//! residual thermal part, all four criteria (Tsai-Wu, maximum stress, maximum strain, Hashin).
//!
//! Unit: one evaluation is one ply face taken through all four criteria; a 24-ply laminate has
//! 48 faces, so each iteration counts 48 elements. Run with `cargo bench --bench laminate`.

use std::hint::black_box;
use std::sync::Arc;

#[path = "kit/mod.rs"]
mod kit;
use kit::{Runner, Throughput};
use layloft::failure::LaminateStrength;
use layloft::laminate::{Laminate, LaminateLoad, Ply, Resultants};
use layloft::material::Lamina;
use layloft::units::Angle;
use nalgebra::Vector3;

/// A small deterministic generator (xorshift64*, Vigna 2016) so that every run sees the same loads.
struct Seeded(u64);

impl Seeded {
    fn next(&mut self) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        (self.0.wrapping_mul(0x2545_f491_4f6c_dd1d) >> 11) as f64 / (1u64 << 53) as f64 * 2.0 - 1.0
    }
}

fn lamina(name: &str, e1: f64, e2: f64, g12: f64, t: f64, cte: (f64, f64)) -> Arc<Lamina> {
    // Typical carbon and glass UD values (from memory), as in the invented demo materials.
    Arc::new(
        Lamina::builder(name)
            .elastic(e1, e2, g12, 0.3)
            .ply_thickness(t)
            .strengths(1800e6, 1100e6, 45e6, 190e6, 75e6)
            .cte(cte.0, cte.1)
            .s23(60e6)
            .build()
            .expect("valid bench material"),
    )
}

/// [0/±45/90]3s with carbon 0/90 plies and glass ±45 plies: 24 plies.
fn laminate_24() -> Laminate {
    let carbon = lamina("carbon", 135e9, 9e9, 5e9, 0.2e-3, (-0.3e-6, 28e-6));
    let glass = lamina("glass", 42e9, 11e9, 4.2e9, 0.25e-3, (6.5e-6, 25e-6));
    let half: Vec<Ply> = (0..3)
        .flat_map(|_| {
            [
                Ply::new(carbon.clone(), Angle::from_deg(0.0)),
                Ply::new(glass.clone(), Angle::from_deg(45.0)),
                Ply::new(glass.clone(), Angle::from_deg(-45.0)),
                Ply::new(carbon.clone(), Angle::from_deg(90.0)),
            ]
        })
        .collect();
    let mut plies = half.clone();
    plies.extend(half.into_iter().rev());
    Laminate::new(plies)
}

fn loads(n: usize) -> Vec<LaminateLoad> {
    let mut rng = Seeded(0x5eed_1a71);
    (0..n)
        .map(|_| {
            LaminateLoad::Resultants(Resultants {
                n: Vector3::new(rng.next(), rng.next(), rng.next()) * 5e5,
                m: Vector3::new(rng.next(), rng.next(), rng.next()) * 200.0,
            })
        })
        .collect()
}

fn bench(c: &mut Runner) {
    let lam = laminate_24();
    assert_eq!(lam.plies().len(), 24);
    let faces = 2 * lam.plies().len() as u64;
    let loads = loads(64);
    let responses: Vec<_> =
        loads.iter().map(|l| lam.response(l, -100.0).expect("stiff laminate")).collect();

    let mut group = c.benchmark_group("laminate_24_plies");
    group.throughput(Throughput::Elements(faces));
    let mut i = 0;
    group.bench_function("criteria_per_ply_face", |b| {
        b.iter(|| {
            i = (i + 1) % responses.len();
            black_box(LaminateStrength::evaluate(&lam, black_box(&responses[i])))
        })
    });
    let mut j = 0;
    group.bench_function("response_and_criteria_per_ply_face", |b| {
        b.iter(|| {
            j = (j + 1) % loads.len();
            let r = lam.response(black_box(&loads[j]), -100.0).expect("stiff laminate");
            black_box(LaminateStrength::evaluate(&lam, &r).first_ply_failure())
        })
    });
    group.finish();
}

bench_main!(bench);
