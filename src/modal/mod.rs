//! The `modal` stage (see DESIGN.md); filled in by its issue.
