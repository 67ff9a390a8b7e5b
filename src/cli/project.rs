//! Reading a blade project and building its model, shared by the commands that take `BLADE.toml`.

use std::path::Path;

use layloft::analysis::BladeModel;
use layloft::input::{Buoyancy, BuoyantSection, read_project};
use layloft::modal::{Attachments, FluidSection, ModalAnalysis, ModalInputs, SpeedRange};

use super::{Failure, Output};

/// Reads the project and solves its sections, with a progress bar on a terminal; prints the
/// grouped warnings of the blade and its sections as notes on stderr.
pub fn load_model(path: &Path, out: &Output) -> Result<BladeModel, Failure> {
    let project = read_project(path).map_err(layloft::Error::from)?;
    let total = project.sections.analysis_stations.max(project.stations.len()) as u64;
    let bar = out.progress(total, "sections");
    let mut model = BladeModel::build_with_progress(project, &mut |_, _| bar.inc(1))?;
    bar.finish();
    add_buoyancy(&mut model);
    for w in model.warnings() {
        out.warn(&w.to_string());
    }
    Ok(model)
}

/// The modal stage of a model (speed range and mode count from the project unless given), with a
/// progress bar over the speeds on a terminal.
pub fn run_modal(
    model: &BladeModel,
    out: &Output,
    range: Option<SpeedRange>,
    modes: Option<usize>,
) -> Result<ModalAnalysis, Failure> {
    let p = &model.project;
    let sections = model.properties();
    let attachments = attachments(model);
    let inputs = ModalInputs {
        sections: &sections,
        rotor: &p.rotor,
        spec: &p.modal,
        criteria: &p.criteria,
        attachments: &attachments,
        excitation: &p.excitation,
    };
    let bar = out.progress(1, "speeds");
    let analysis = ModalAnalysis::run_inputs(&inputs, range, modes, &mut |_, total| {
        bar.set_length(total as u64);
        bar.inc(1)
    })
    .map_err(layloft::Error::from)?;
    bar.finish();
    Ok(analysis)
}

/// The point masses of the project and, with a `[fluid]`, the ellipse of every analysis
/// station's outer mould line.
pub fn attachments(model: &BladeModel) -> Attachments {
    let p = &model.project;
    let mut a = Attachments::of_point_masses(&p.point_masses);
    if let Some(fluid) = &p.fluid {
        let sections = model
            .stations
            .iter()
            .filter_map(|s| FluidSection::of_outline(s.layout.r, &s.layout.outer))
            .collect();
        a.fluid = Some((fluid.density, sections));
    }
    a
}

/// With a `[fluid]`, gives every load case with gravity the buoyancy of the displaced fluid
/// (the area inside each analysis station's outer mould line).
pub fn add_buoyancy(model: &mut BladeModel) {
    let Some(fluid) = model.project.fluid.clone() else { return };
    let sections: Vec<BuoyantSection> = model
        .stations
        .iter()
        .filter_map(|s| BuoyantSection::of_outline(s.layout.r, &s.layout.outer))
        .collect();
    for case in model.project.load_cases.iter_mut().filter(|c| c.gravity.is_some()) {
        case.buoyancy = Some(Buoyancy { density: fluid.density, sections: sections.clone() });
    }
}
