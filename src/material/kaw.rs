//! Two laminae of a published table for the library's unit tests: T300/5208 carbon/epoxy and
//! an E-glass/epoxy (Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1; the CTEs
//! from the same table, from memory).

use super::{Lamina, LaminaBuilder};

/// T300/5208 carbon/epoxy, ply 0.125 mm.
pub(crate) fn t300() -> LaminaBuilder {
    Lamina::builder("t300")
        .elastic(181e9, 10.3e9, 7.17e9, 0.28)
        .ply_thickness(0.125e-3)
        .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
        .cte(0.02e-6, 22.5e-6)
}

/// E-glass/epoxy, ply 0.2 mm.
pub(crate) fn e_glass() -> LaminaBuilder {
    Lamina::builder("glass")
        .elastic(38.6e9, 8.27e9, 4.14e9, 0.26)
        .ply_thickness(0.2e-3)
        .strengths(1062e6, 610e6, 31e6, 118e6, 72e6)
        .cte(8.6e-6, 22.1e-6)
}
