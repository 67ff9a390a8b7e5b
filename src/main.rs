//! The `layloft` command: parse the arguments, run, map the result to an exit status.

mod cli;

fn main() -> std::process::ExitCode {
    cli::main()
}
