//! Reading a blade project and building its model, shared by the commands that take `BLADE.toml`.

use std::path::Path;

use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::modal::{ModalAnalysis, ModalInputs, SpeedRange};

use super::{Failure, Output};

/// Reads the project and solves its sections (the build fills the buoyancy of a `[fluid]`), with
/// a progress bar on a terminal; prints the grouped warnings of the blade and its sections as
/// notes on stderr.
pub fn load_model(path: &Path, out: &Output) -> Result<BladeModel, Failure> {
    let project = read_project(path).map_err(layloft::Error::from)?;
    let total = project.sections.analysis_stations.max(project.stations.len()) as u64;
    let bar = out.progress(total, "sections");
    let model = BladeModel::build_with_progress(project, &mut |_, _| bar.inc(1))?;
    bar.finish();
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
    let attachments = model.modal_attachments();
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
