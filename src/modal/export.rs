//! Matrix Market export of the constrained stiffness and mass matrices.
//!
//! Format: NIST Matrix Market exchange format, `coordinate real symmetric` (Boisvert, Pozo &
//! Remington, "The Matrix Market exchange formats: initial design", NISTIR 5935, 1996): a header
//! line, `%` comments, a size line `rows cols entries`, then one `row col value` line per entry
//! of the lower triangle, 1-based. Values carry 17 significant digits, so they read back exactly.
//! Beside the matrices, `dofs.csv` names the degree of freedom of every row.

use std::io::Write;
use std::path::{Path, PathBuf};

use super::assemble::SystemMatrices;
use super::band::BandMatrix;
use crate::Error;
use crate::report::write_atomic_with;

/// Writes `stiffness.mtx`, `mass.mtx` and `dofs.csv` into `dir` (created when missing), each
/// atomically; returns the paths written.
pub fn export_matrix_market(dir: &Path, matrices: &SystemMatrices) -> Result<Vec<PathBuf>, Error> {
    crate::report::ensure_folder(dir)?;
    let stiffness = dir.join("stiffness.mtx");
    let mass = dir.join("mass.mtx");
    let dofs = dir.join("dofs.csv");
    let k_note = format!(
        "layloft constrained stiffness K = K_elastic + Omega^2 K_spin at {} rpm; rows as in dofs.csv",
        matrices.rpm
    );
    write_atomic_with(&stiffness, |w| write_matrix_market(w, &matrices.stiffness, &k_note))?;
    let m_note = "layloft constrained consistent mass matrix; rows as in dofs.csv";
    write_atomic_with(&mass, |w| write_matrix_market(w, &matrices.mass, m_note))?;
    write_atomic_with(&dofs, |w| {
        writeln!(w, "dof,node,r_m,quantity")?;
        for (i, d) in matrices.dofs.iter().enumerate() {
            let node = d.node.map_or(String::from("interior"), |n| n.to_string());
            writeln!(w, "{},{},{},{}", i + 1, node, d.r, d.kind.key())?;
        }
        Ok(())
    })?;
    Ok(vec![stiffness, mass, dofs])
}

/// Writes `a` in Matrix Market `coordinate real symmetric` form with one comment line.
pub fn write_matrix_market(
    w: &mut dyn Write,
    a: &BandMatrix,
    comment: &str,
) -> std::io::Result<()> {
    let entries: Vec<(usize, usize, f64)> = a.lower_entries().collect();
    writeln!(w, "%%MatrixMarket matrix coordinate real symmetric")?;
    for line in comment.lines() {
        writeln!(w, "% {line}")?;
    }
    writeln!(w, "{} {} {}", a.dim(), a.dim(), entries.len())?;
    for (i, j, v) in entries {
        writeln!(w, "{} {} {:.16e}", i + 1, j + 1, v)?;
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn matrix_market_text_reads_back_exactly() {
        let mut a = BandMatrix::zeros(4, 1);
        a.add(0, 0, 2.0);
        a.add(1, 0, -1.0 / 3.0);
        a.add(1, 1, 1e-7);
        a.add(3, 3, 6.02e23);
        let mut text = Vec::new();
        write_matrix_market(&mut text, &a, "test").unwrap();
        let text = String::from_utf8(text).unwrap();
        let mut lines = text.lines();
        assert_eq!(lines.next(), Some("%%MatrixMarket matrix coordinate real symmetric"));
        assert_eq!(lines.next(), Some("% test"));
        assert_eq!(lines.next(), Some("4 4 4"));
        let mut back = BandMatrix::zeros(4, 1);
        for line in lines {
            let f: Vec<&str> = line.split_whitespace().collect();
            let (i, j): (usize, usize) = (f[0].parse().unwrap(), f[1].parse().unwrap());
            assert!(i >= j, "lower triangle only");
            back.add(i - 1, j - 1, f[2].parse().unwrap());
        }
        assert_eq!(back, a);
    }
}
