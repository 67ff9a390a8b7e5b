//! The Matrix Market files of the modal model (`stiffness.mtx`, `mass.mtx`, `dofs.csv`), whose
//! contents the modal analysis gives ([`crate::modal::matrix_market_files`]), written into a
//! folder.

/// Writes the Matrix Market export of `matrices` (`stiffness.mtx`, `mass.mtx`, `dofs.csv`, see
/// [`crate::modal::matrix_market_files`]) into `dir`, created when missing, each file
/// atomically; returns the paths written.
pub fn export_matrix_market(
    dir: &std::path::Path,
    matrices: &crate::modal::SystemMatrices,
) -> Result<Vec<std::path::PathBuf>, crate::Error> {
    super::ensure_folder(dir)?;
    let mut written = Vec::new();
    for (name, bytes) in crate::modal::matrix_market_files(matrices) {
        let path = dir.join(name);
        super::write_atomic(&path, &bytes)?;
        written.push(path);
    }
    Ok(written)
}
