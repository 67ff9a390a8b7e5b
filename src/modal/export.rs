//! Matrix Market export of the constrained stiffness and mass matrices.
//!
//! Format: NIST Matrix Market exchange format, `coordinate real symmetric` (Boisvert, Pozo &
//! Remington, "The Matrix Market exchange formats: initial design", NISTIR 5935, 1996): a header
//! line, `%` comments, a size line `rows cols entries`, then one `row col value` line per entry
//! of the lower triangle, 1-based. Values carry 17 significant digits, so they read back exactly.
//! Beside the matrices, `dofs.csv` names the degree of freedom of every row.

use std::io::Write;

use super::assemble::SystemMatrices;
use super::band::BandMatrix;

/// The three files of the export as `(name, contents)`: `stiffness.mtx`, `mass.mtx` and
/// `dofs.csv`. Writing them is the caller's (`report::export_matrix_market`).
pub fn matrix_market_files(matrices: &SystemMatrices) -> Vec<(&'static str, Vec<u8>)> {
    // The nodes' displacements are the shear centre's (a root on springs: the pitch axis's).
    let nodes =
        "displacements u, v, w of the shear centre (of the pitch axis at a root on springs)";
    let k_note = format!(
        "layloft constrained stiffness K = K_elastic + Omega^2 K_spin at {} rpm; rows as in dofs.csv\n{nodes}",
        matrices.speed.rpm()
    );
    let m_note =
        format!("layloft constrained consistent mass matrix; rows as in dofs.csv\n{nodes}");
    let mut k = Vec::new();
    let mut m = Vec::new();
    let mut dofs = Vec::new();
    // Writing into a Vec cannot fail.
    let _ = write_matrix_market(&mut k, &matrices.stiffness, &k_note);
    let _ = write_matrix_market(&mut m, &matrices.mass, &m_note);
    let _ = writeln!(dofs, "dof,node,r_m,quantity");
    for (i, d) in matrices.dofs.iter().enumerate() {
        let node = d.node.map_or(String::from("interior"), |n| n.to_string());
        let _ = writeln!(dofs, "{},{},{},{}", i + 1, node, d.r, d.kind.key());
    }
    vec![("stiffness.mtx", k), ("mass.mtx", m), ("dofs.csv", dofs)]
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
