//! The command tree. The only part of layloft that prints or exits.
//!
//! Exit status: 0 success; 1 a design check failed; 2 invalid input or usage; 3 an output could
//! not be written or a computation failed.

mod check;
mod demo;
mod laminate;
mod materials;
mod modes;
mod output;
mod pairs;
mod plybook;
mod project;
mod report;
mod sections;
mod stress;
mod tooling;

use std::process::ExitCode;

use clap::{Parser, Subcommand};

pub use output::Output;

/// Composite blades for rotating machines: laminate and section stiffness, ply stresses,
/// rotating modes and the Campbell diagram, tooling geometry as STL.
///
/// Design aid only: confirm by test, apply the governing code, have the design reviewed by a
/// qualified engineer.
#[derive(Debug, Parser)]
#[command(name = "layloft", version, about, long_about = None, propagate_version = true)]
pub struct Cli {
    /// Print nothing on stderr but errors (no progress, no notes).
    #[arg(long, short, global = true)]
    pub quiet: bool,

    #[command(subcommand)]
    command: Command,
}

#[derive(Debug, Subcommand)]
/// In the order of the work: the materials and one laminate, then the blade's sections, its
/// stresses and modes, the design check, the tooling, and everything in one report.
enum Command {
    Materials(materials::Args),
    Laminate(laminate::Args),
    Sections(sections::Args),
    Stress(stress::Args),
    Modes(modes::Args),
    Check(check::Args),
    Tooling(tooling::Args),
    Plybook(plybook::Args),
    Report(report::Args),
    Demo(demo::Args),
}

/// How a command ended, other than by an error.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Outcome {
    /// Done; everything asked for passed.
    Success,
    /// Done, and a design check failed.
    CheckFailed,
}

/// Errors with the exit status they map to.
#[derive(Debug)]
pub enum Failure {
    /// Bad input or usage: exit 2.
    Input(anyhow::Error),
    /// Output or computation: exit 3.
    Run(anyhow::Error),
}

impl From<layloft::Error> for Failure {
    fn from(e: layloft::Error) -> Self {
        match e {
            layloft::Error::Write { .. } | layloft::Error::Mesh(_) => Failure::Run(e.into()),
            layloft::Error::Modal(ref m) if !m.is_input() => Failure::Run(e.into()),
            _ => Failure::Input(e.into()),
        }
    }
}

/// The verdict line of a design check, last on stdout, with the project's input warnings and
/// the model's (see `BladeModel::verdict_warnings`).
pub fn verdict(
    check: &layloft::check::DesignCheck,
    model: &layloft::analysis::BladeModel,
    sources: &layloft::input::Sources,
) -> String {
    layloft::report::check::verdict_text(check, &model.verdict_warning_texts(&sources.warnings))
}

/// Parses the arguments, runs the command and maps the result to the exit status.
pub fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(c) => c,
        Err(e) => {
            let _ = e.print();
            return ExitCode::from(if e.use_stderr() { 2 } else { 0 });
        }
    };
    let out = Output::new(cli.quiet);
    // `LAYLOFT_THREADS=N` (a positive whole number) runs the stations' work on N threads; the
    // results are the same on any number.
    if let Some(n) = std::env::var("LAYLOFT_THREADS").ok().and_then(|v| v.trim().parse().ok()) {
        layloft::set_threads(n);
    }
    let result = match cli.command {
        Command::Check(args) => check::run(args, &out),
        Command::Demo(args) => demo::run(args, &out),
        Command::Materials(args) => materials::run(args, &out),
        Command::Laminate(args) => laminate::run(args, &out),
        Command::Modes(args) => modes::run(args, &out),
        Command::Report(args) => report::run(args, &out),
        Command::Stress(args) => stress::run(args, &out),
        Command::Sections(args) => sections::run(args, &out),
        Command::Tooling(args) => tooling::run(args, &out),
        Command::Plybook(args) => plybook::run(args, &out),
    };
    match result {
        Ok(Outcome::Success) => ExitCode::SUCCESS,
        Ok(Outcome::CheckFailed) => ExitCode::from(1),
        Err(Failure::Input(e)) => {
            out.error(&e);
            ExitCode::from(2)
        }
        Err(Failure::Run(e)) => {
            out.error(&e);
            ExitCode::from(3)
        }
    }
}
