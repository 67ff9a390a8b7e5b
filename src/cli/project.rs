//! Reading a blade project and building its model, shared by the commands that take `BLADE.toml`.

use std::path::Path;

use layloft::analysis::BladeModel;
use layloft::input::{Sources, read_project_sourced};
use layloft::modal::{ModalAnalysis, ModalInputs, SpeedRange};

use super::{Failure, Output};

/// Reads the project and solves its sections (the build fills the buoyancy of a `[fluid]`), with
/// a progress bar on a terminal; prints the grouped warnings of the blade and its sections as
/// notes on stderr (the input's first). With the model, where the project was written, for
/// naming the files of later errors.
pub fn load_model(path: &Path, out: &Output) -> Result<(BladeModel, Sources), Failure> {
    let (project, sources) = read_project_sourced(path).map_err(layloft::Error::from)?;
    let total = project.sections.analysis_stations.max(project.stations.len()) as u64;
    let bar = out.progress(total, "sections");
    let model = BladeModel::build_with_progress(project, &mut |_, _| bar.inc(1))
        .map_err(|e| layloft::Error::placed(e, &sources))?;
    bar.finish();
    for w in model.warnings_with(&sources.warnings) {
        out.warn(&w.to_string());
    }
    Ok((model, sources))
}

/// The modal stage of a model (speed range and mode count from the project unless given), with a
/// progress bar over the speeds on a terminal.
pub fn run_modal(
    model: &BladeModel,
    sources: &Sources,
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
    .map_err(|e| modal_failure(sources, range.is_some(), modes.is_some(), e))?;
    bar.finish();
    // Modes the elements cannot resolve, near an excitation: the margin check cannot see them.
    if !analysis.coverage.covered() {
        out.warn(&layloft::report::coverage_statement(
            &analysis.coverage,
            analysis.model.elements(),
        ));
    }
    Ok(analysis)
}

/// A modal error caused by the input, named by the key or option that set it: the speed range
/// (`rotor.rpm_max`, `modal.rpm_step` or `--rpm`), the modes (`modal.modes` or `--modes`), or a
/// blade that the spin makes statically unstable below `rpm_max` (exit 2 naming the key, not an
/// internal failure).
fn modal_failure(
    sources: &Sources,
    range_given: bool,
    modes_given: bool,
    e: layloft::modal::ModalError,
) -> Failure {
    use layloft::modal::{EigenError, ModalError};
    let speed_key =
        if range_given { "--rpm".to_string() } else { format!("{}, rotor.rpm_max", sources.file) };
    let modes_key =
        if modes_given { "--modes".to_string() } else { format!("{}, modal.modes", sources.file) };
    match &e {
        // At standstill nothing spins: the blade is held by its sections and the root springs
        // alone, so the cause lies there, not in the speed.
        ModalError::Eigen { source: EigenError::NotPositiveDefinite { .. }, speed }
            if speed.rpm() == 0.0 =>
        {
            Failure::Input(anyhow::anyhow!(
                "{}: {e}; at standstill the blade is held by its structure and the root springs \
                 alone: check [modal.root_springs] (a spring near zero leaves the blade free), the \
                 point masses and the sections' stiffness",
                sources.file
            ))
        }
        ModalError::Eigen { source: EigenError::NotPositiveDefinite { .. }, .. } => {
            Failure::Input(anyhow::anyhow!(
                "{speed_key}: {e}; the spin softens the blade's in-plane stiffness more than its \
                 structure holds at this speed: check rpm_max against the blade (and the root \
                 springs)"
            ))
        }
        ModalError::SpeedRange { .. } | ModalError::NoSpeeds | ModalError::SpeedOrder { .. } => {
            Failure::Input(anyhow::anyhow!("{speed_key}: {e}"))
        }
        ModalError::TooManyModes { .. }
        | ModalError::Eigen { source: EigenError::TooManyModes { .. }, .. } => {
            Failure::Input(anyhow::anyhow!("{modes_key}: {e}"))
        }
        _ => layloft::Error::from(e).into(),
    }
}
