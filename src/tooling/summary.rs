//! What the tooling amounts to: the masses of the parts, the core alloy's melting range against
//! the resin's process temperatures, and what the ply schedule holds.
//!
//! - **Ply schedule content** (the reference for the shell): over the blade's stations, the
//!   volume, mass and resin mass of the laminates per unit span integrated by the midpoint rule
//!   (400 intervals, as [`crate::analysis::BladeModel::mass`]): each wall segment of the outer
//!   mould line (120 intervals a surface) times its laminate's thickness, areal mass and resin
//!   content, the blunt base with the upper trailing-edge laminate, each web over the local depth
//!   less the skins. Resin of a ply is `(1 − V_f) ρ_resin t` per unit area (no voids); an
//!   isotropic layer (foam, metal) holds none; a lamina without `fibre_volume_fraction` or
//!   `resin_density_kg_m3` leaves the resin mass not computed.
//! - **Shell mass**: the shell's volume times the schedule's mean density (mass over volume), and
//!   likewise its resin: the shell is a multi-material laminate whose plies the schedule places.
//! - **Core alloy mass**: the nominal core volume (before the shrink allowance) times the alloy's
//!   density: the finished core's mass, which the pour must supply.
//! - **Mould masses**: each mould part's volume as made (the block less the cavity and the
//!   locating sockets) times the density of `mould_material`; not computed without one.
//! - **Melting check** (common practice for fusible cores): a core must stay solid through
//!   injection and gelation and melt out before the end of the cure: flagged when
//!   `solidus ≤ injection` or `solidus ≤ gel` (it melts before the resin gels), or
//!   `liquidus ≥ cure` (it never melts out); a missing temperature or melting range leaves its
//!   comparison not checked.
//! - **Draining** (common practice for fusible cores: the alloy leaves through the core prints
//!   with the mould stood on the end they point out of): which way up to stand the mould, and
//!   per print whether the core's end surface lies anywhere below the print's entrance (alloy
//!   that pools there instead of running out, flagged beyond 1 mm or the chordal tolerance); a core
//!   without a print is flagged, as its alloy cannot leave the shell.

use super::blade_parts::{BladeTooling, PartKind};
use crate::blade::Blade;
use crate::material::{Isotropic, Material};
use crate::mesh::End;
use crate::project::Project;
use crate::units::Temperature;

pub use super::melt_note::{MeltNote, ProcessStage};

/// Volume, mass and resin mass of the ply schedule over the blade's stations.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ScheduleContent {
    /// Laminate volume, m³.
    pub volume: f64,
    /// Laminate mass, kg.
    pub mass: f64,
    /// Resin mass, kg; `None` where a lamina lacks its fibre volume fraction or resin density.
    pub resin: Option<f64>,
}

/// What the ply schedule holds over the blade's stations (see the module docs).
pub fn schedule_content(blade: &Blade) -> ScheduleContent {
    // The laminates' content per unit span at the midpoints of equal intervals, shared with the
    // blade's mass.
    let table = blade.span_content();
    let h = table.h;
    let (mut volume, mut mass, mut resin) = (0.0, 0.0, Some(0.0));
    for row in &table.rows {
        volume += row.volume * h;
        mass += row.schedule_mass * h;
        resin = resin.zip(row.resin).map(|(a, b)| a + b * h);
    }
    ScheduleContent { volume, mass, resin }
}

/// One comparison of the melting check.
#[derive(Debug, Clone, PartialEq)]
pub struct MeltFinding {
    /// Whether it passed; `None` when a value it needs is missing.
    pub passed: Option<bool>,
    /// What was compared, with the numbers (the report words it).
    pub note: MeltNote,
}

/// The core alloy against the resin's process temperatures.
#[derive(Debug, Clone, PartialEq)]
pub struct MeltCheck {
    /// The alloy's name, when the project names one.
    pub alloy: Option<String>,
    /// Its solidus and liquidus.
    pub melting_range: Option<[Temperature; 2]>,
    /// The comparisons, in process order.
    pub findings: Vec<MeltFinding>,
    /// The alloy's handling note from the materials file.
    pub safety_note: Option<String>,
}

impl MeltCheck {
    /// Whether any comparison failed.
    pub fn failed(&self) -> bool {
        self.findings.iter().any(|f| f.passed == Some(false))
    }
}

/// The melting check of `alloy` against the `[injection, gel, cure]` temperatures (see the
/// module docs).
pub fn melt_check(alloy: Option<&Isotropic>, temps: [Option<Temperature>; 3]) -> MeltCheck {
    let [injection, gel, cure] = temps;
    let range = alloy.and_then(|a| a.melting_range);
    let mut findings = Vec::new();
    let missing = |note: MeltNote| MeltFinding { passed: None, note };
    match (alloy, range) {
        (None, _) => findings.push(missing(MeltNote::NoAlloy)),
        (Some(a), None) => {
            findings.push(missing(MeltNote::NoMeltingRange { alloy: a.name.clone() }))
        }
        (Some(_), Some([solidus, liquidus])) => {
            for (stage, t) in [(ProcessStage::Injection, injection), (ProcessStage::Gelation, gel)]
            {
                findings.push(match t {
                    Some(at) if solidus > at => MeltFinding {
                        passed: Some(true),
                        note: MeltNote::SolidThrough { stage, solidus, at },
                    },
                    Some(at) => MeltFinding {
                        passed: Some(false),
                        note: MeltNote::MeltsBeforeGel { stage, solidus, at },
                    },
                    None => missing(MeltNote::NoTemperature { stage }),
                });
            }
            findings.push(match cure {
                Some(cure) if liquidus < cure => {
                    MeltFinding { passed: Some(true), note: MeltNote::MeltsOut { liquidus, cure } }
                }
                Some(cure) => MeltFinding {
                    passed: Some(false),
                    note: MeltNote::NeverMeltsOut { liquidus, cure },
                },
                None => missing(MeltNote::NoTemperature { stage: ProcessStage::Cure }),
            });
        }
    }
    MeltCheck {
        alloy: alloy.map(|a| a.name.clone()),
        melting_range: range,
        findings,
        safety_note: alloy.and_then(|a| a.safety_note.clone()),
    }
}

/// A part's mass and what it rests on.
#[derive(Debug, Clone, PartialEq)]
pub struct PartMass {
    /// Mass, kg; `None` when not computed.
    pub mass: Option<f64>,
    /// Resin in it, kg (the shell).
    pub resin: Option<f64>,
    /// What the mass is, or why it is not computed.
    pub basis: String,
}

/// The tooling's masses and checks.
#[derive(Debug, Clone, PartialEq)]
pub struct ToolingSummary {
    /// Per part, in the order of [`BladeTooling::parts`].
    pub masses: Vec<PartMass>,
    /// The ply schedule over the stations.
    pub schedule: ScheduleContent,
    /// Total core alloy, kg (`None` without an alloy).
    pub core_alloy: Option<f64>,
    /// The melting check.
    pub melt: MeltCheck,
    /// How to stand the mould so the alloy drains, one stand per end that has prints.
    pub drain_orientation: Vec<DrainStand>,
    /// Per print (and per core without one) whether its alloy drains, in core order.
    pub drain_findings: Vec<MeltFinding>,
    /// Alloy to melt for each core's casting, in the order of [`BladeTooling::casting`].
    pub casting_alloy: Vec<PartMass>,
}

/// One way to stand the mould while the cores' alloy drains: on one end, the pitch axis
/// vertical, so that the prints at that end point down. The report words it.
#[derive(Debug, Clone, PartialEq)]
pub struct DrainStand {
    /// The end the mould stands on (down).
    pub end: End,
    /// The end up.
    pub other: End,
    /// The cores whose prints are at `end`, in core order.
    pub cores: Vec<String>,
    /// Whether the mould is turned over to this stand after an earlier one.
    pub turned: bool,
}

/// Which way to stand the mould so the cores drain, and whether each one does (see the module
/// docs); `tolerance` is the chordal tolerance, m.
pub fn drain_plan(tooling: &BladeTooling, tolerance: f64) -> (Vec<DrainStand>, Vec<MeltFinding>) {
    let mut orientation: Vec<DrainStand> = Vec::new();
    for (end, other) in [(End::Root, End::Tip), (End::Tip, End::Root)] {
        let cores: Vec<String> =
            tooling.prints.iter().filter(|p| p.end == end).map(|p| p.core.clone()).collect();
        if cores.is_empty() {
            continue;
        }
        orientation.push(DrainStand { end, other, cores, turned: !orientation.is_empty() });
    }
    let mut findings: Vec<MeltFinding> = tooling
        .prints
        .iter()
        .map(|p| {
            let (core, end, depth) = (p.core.clone(), p.end, p.pool_depth);
            // A film of a millimetre at the edge is left in any case (common practice).
            if p.pool_depth <= tolerance.max(1e-3) {
                MeltFinding { passed: Some(true), note: MeltNote::Drains { core, end, depth } }
            } else {
                MeltFinding { passed: Some(false), note: MeltNote::Pools { core, end, depth } }
            }
        })
        .collect();
    // A print the mould has no seat for (at an end of a mould split along the span whose outer
    // module has no end piece): the shop must cut its seat by hand.
    for p in tooling.prints.iter().filter(|p| p.seat_clearance.is_none()) {
        let n = p.section.len().max(1) as f64;
        let c = p.section.iter().fold([0.0, 0.0], |a, q| [a[0] + q[0] / n, a[1] + q[1] / n]);
        findings.push(MeltFinding {
            passed: Some(false),
            note: MeltNote::NoSeat {
                core: p.core.clone(),
                end: p.end,
                section_area: p.section_area,
                centre: c,
                x_end: p.x_end,
            },
        });
    }
    for d in &tooling.print_dropped {
        findings.push(MeltFinding {
            passed: Some(false),
            note: MeltNote::PrintDropped {
                core: d.core.clone(),
                end: d.end,
                reason: d.reason.clone(),
            },
        });
    }
    for core in &tooling.unprinted {
        findings.push(MeltFinding {
            passed: Some(false),
            note: MeltNote::NoPrint { core: core.clone() },
        });
    }
    (orientation, findings)
}

/// Masses and the melting check of `tooling` for `project`'s blade.
pub fn summarise(project: &Project, blade: &Blade, tooling: &BladeTooling) -> ToolingSummary {
    let spec = project.tooling.clone().unwrap_or_default();
    let alloy = spec.core_alloy.as_deref().and_then(|n| match project.materials.get(n) {
        Ok(Material::Isotropic(i)) => Some(i.clone()),
        _ => None,
    });
    let mould = spec.mould_material.as_deref().and_then(|n| match project.materials.get(n) {
        Ok(Material::Isotropic(i)) => Some(i.clone()),
        _ => None,
    });
    let schedule = schedule_content(blade);
    let has_laminate = schedule.volume > 0.0;
    let density = schedule.mass / schedule.volume;
    let resin_density = schedule.resin.filter(|_| has_laminate).map(|r| r / schedule.volume);
    // The core alloy filling a volume (a core, or a casting's cavity, sprue and vent).
    let alloy_mass = |volume: f64| match &alloy {
        Some(a) => PartMass {
            mass: Some(volume * a.density),
            resin: None,
            basis: format!("core alloy {} at {} kg/m³", a.name, a.density),
        },
        None => PartMass {
            mass: None,
            resin: None,
            basis: "not computed: no core_alloy in [tooling]".into(),
        },
    };
    let masses: Vec<PartMass> = tooling
        .parts
        .iter()
        .map(|p| match p.kind {
            PartKind::Core => alloy_mass(p.nominal_volume),
            PartKind::Shell if !has_laminate => PartMass {
                mass: None,
                resin: None,
                basis: "not computed: the ply schedule holds no laminate".into(),
            },
            PartKind::Shell => PartMass {
                mass: Some(p.nominal_volume * density),
                resin: resin_density.map(|r| p.nominal_volume * r),
                basis: format!("laminate at the schedule's mean density {density:.0} kg/m³"),
            },
            PartKind::MouldUpper | PartKind::MouldLower | PartKind::MouldEnd => match &mould {
                Some(m) => PartMass {
                    mass: Some(p.nominal_volume * m.density),
                    resin: None,
                    basis: format!("mould material {} at {} kg/m³", m.name, m.density),
                },
                None => PartMass {
                    mass: None,
                    resin: None,
                    basis: "not computed: no mould_material in [tooling]".into(),
                },
            },
        })
        .collect();
    let core_alloy = alloy.as_ref().map(|_| {
        masses
            .iter()
            .zip(&tooling.parts)
            .filter(|(_, p)| p.kind == PartKind::Core)
            .filter_map(|(m, _)| m.mass)
            .sum()
    });
    let temps = [spec.injection_temperature, spec.gel_temperature, spec.cure_temperature];
    let (drain_orientation, drain_findings) = drain_plan(tooling, tooling.params.tolerance);
    // Each casting takes the cavity, the sprue and the vent full of alloy.
    let casting_alloy = tooling.casting.iter().map(|m| alloy_mass(m.metal_volume)).collect();
    ToolingSummary {
        masses,
        schedule,
        core_alloy,
        melt: melt_check(alloy.as_ref(), temps),
        drain_orientation,
        drain_findings,
        casting_alloy,
    }
}
