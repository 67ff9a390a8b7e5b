//! The constrained stiffness and mass matrices written as Matrix Market files.

/// Writes the Matrix Market export of `matrices` (`stiffness.mtx`, `mass.mtx`, `dofs.csv`, see
/// [`crate::modal::matrix_market_files`]) into `dir`, created when missing, each file
/// atomically; returns the paths written.
pub fn export_matrix_market(
    dir: &std::path::Path,
    matrices: &crate::modal::SystemMatrices,
) -> Result<Vec<std::path::PathBuf>, crate::Error> {
    crate::report::ensure_folder(dir)?;
    let mut written = Vec::new();
    for (name, bytes) in crate::modal::matrix_market_files(matrices) {
        let path = dir.join(name);
        crate::report::write_atomic(&path, &bytes)?;
        written.push(path);
    }
    Ok(written)
}
