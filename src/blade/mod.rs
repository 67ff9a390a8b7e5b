//! The `blade` stage (see DESIGN.md); filled in by its issue.
