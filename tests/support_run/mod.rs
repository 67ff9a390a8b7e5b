//! Running the `layloft` binary the tests were built with: a small command runner with an
//! optional time limit and plain assertions on the exit status and the text it printed.
//!
//! Cargo builds the binary for the integration tests and names it in `CARGO_BIN_EXE_layloft`,
//! so no helper crate is needed to find it. The child's stdin is closed, as with
//! `std::process::Command::output`: a command that waits for input fails instead of hanging.
#![allow(dead_code)]

use std::ffi::OsStr;
use std::io::{self, Read};
use std::path::Path;
use std::process::{Child, Output, Stdio};
use std::thread;
use std::time::{Duration, Instant};

/// A `layloft` run being set up.
pub struct Command {
    cmd: std::process::Command,
    limit: Option<Duration>,
}

impl Command {
    /// The binary of this package called `name` (only `layloft` exists).
    pub fn cargo_bin(name: &str) -> Result<Self, String> {
        if name != "layloft" {
            return Err(format!("this package builds no binary called '{name}'"));
        }
        Ok(Self { cmd: std::process::Command::new(env!("CARGO_BIN_EXE_layloft")), limit: None })
    }

    pub fn arg(&mut self, arg: impl AsRef<OsStr>) -> &mut Self {
        self.cmd.arg(arg);
        self
    }

    pub fn args<I, S>(&mut self, args: I) -> &mut Self
    where
        I: IntoIterator<Item = S>,
        S: AsRef<OsStr>,
    {
        self.cmd.args(args);
        self
    }

    pub fn current_dir(&mut self, dir: impl AsRef<Path>) -> &mut Self {
        self.cmd.current_dir(dir);
        self
    }

    pub fn env(&mut self, key: impl AsRef<OsStr>, value: impl AsRef<OsStr>) -> &mut Self {
        self.cmd.env(key, value);
        self
    }

    /// Kill the run if it takes longer than `limit` (the output then has no exit code).
    pub fn timeout(&mut self, limit: Duration) -> &mut Self {
        self.limit = Some(limit);
        self
    }

    /// Runs to the end (or the time limit) and collects the exit status, stdout and stderr.
    pub fn output(&mut self) -> io::Result<Output> {
        let Some(limit) = self.limit else {
            return self.cmd.stdin(Stdio::null()).output();
        };
        let mut child =
            self.cmd.stdin(Stdio::null()).stdout(Stdio::piped()).stderr(Stdio::piped()).spawn()?;
        // Both pipes are drained while the child runs, so a chatty child never blocks on a full
        // pipe before the time limit is reached.
        let out = drain(child.stdout.take());
        let err = drain(child.stderr.take());
        let status = wait_at_most(&mut child, limit)?;
        let stdout = out.join().unwrap_or_default();
        let stderr = err.join().unwrap_or_default();
        Ok(Output { status, stdout, stderr })
    }

    /// Runs the command and returns its result for assertions; panics if it cannot start.
    pub fn assert(&mut self) -> Assert {
        let shown = format!("{:?}", self.cmd);
        let out = self.output().unwrap_or_else(|e| panic!("{shown} did not run: {e}"));
        Assert { shown, out }
    }
}

fn drain(pipe: Option<impl Read + Send + 'static>) -> thread::JoinHandle<Vec<u8>> {
    thread::spawn(move || {
        let mut bytes = Vec::new();
        if let Some(mut p) = pipe {
            let _ = p.read_to_end(&mut bytes);
        }
        bytes
    })
}

fn wait_at_most(child: &mut Child, limit: Duration) -> io::Result<std::process::ExitStatus> {
    let start = Instant::now();
    loop {
        if let Some(status) = child.try_wait()? {
            return Ok(status);
        }
        if start.elapsed() >= limit {
            child.kill()?;
            return child.wait();
        }
        thread::sleep(Duration::from_millis(20));
    }
}

/// The finished run, with assertions that print what the command said when they fail.
pub struct Assert {
    shown: String,
    out: Output,
}

impl Assert {
    fn fail(&self, what: &str) -> ! {
        panic!(
            "{what}\ncommand: {}\nexit: {:?}\n--- stdout\n{}\n--- stderr\n{}",
            self.shown,
            self.out.status.code(),
            String::from_utf8_lossy(&self.out.stdout),
            String::from_utf8_lossy(&self.out.stderr)
        )
    }

    pub fn success(self) -> Self {
        if !self.out.status.success() {
            self.fail("expected the command to succeed");
        }
        self
    }

    pub fn failure(self) -> Self {
        if self.out.status.success() {
            self.fail("expected the command to fail");
        }
        self
    }

    pub fn code(self, code: i32) -> Self {
        if self.out.status.code() != Some(code) {
            self.fail(&format!("expected exit status {code}"));
        }
        self
    }

    pub fn stdout(self, wanted: predicate::str::Contains) -> Self {
        if !String::from_utf8_lossy(&self.out.stdout).contains(&wanted.0) {
            self.fail(&format!("expected stdout to contain {:?}", wanted.0));
        }
        self
    }

    pub fn stderr(self, wanted: predicate::str::Contains) -> Self {
        if !String::from_utf8_lossy(&self.out.stderr).contains(&wanted.0) {
            self.fail(&format!("expected stderr to contain {:?}", wanted.0));
        }
        self
    }

    pub fn get_output(&self) -> &Output {
        &self.out
    }
}

/// What the printed text must hold.
pub mod predicate {
    pub mod str {
        /// The text holds this substring.
        pub struct Contains(pub String);

        pub fn contains(wanted: impl Into<String>) -> Contains {
            Contains(wanted.into())
        }
    }
}

/// The test binary's own command runner.
#[test]
fn a_run_past_its_time_limit_is_killed_and_a_failing_run_says_so() {
    // `layloft --version` ends at once; an unknown command fails with the usage status of the
    // argument parser (2) and names the command on stderr.
    let quick = Command::cargo_bin("layloft").unwrap().arg("--version").assert().success();
    assert!(String::from_utf8_lossy(&quick.get_output().stdout).starts_with("layloft"));
    Command::cargo_bin("layloft")
        .unwrap()
        .arg("no-such-command")
        .timeout(Duration::from_secs(60))
        .assert()
        .failure()
        .code(2)
        .stderr(predicate::str::contains("no-such-command"));
    assert!(Command::cargo_bin("layloft-else").is_err());
}

/// Copies the files of the demo project `layups/<demo>/` into `dir` (an invented test blade
/// starts as a copy of a demo and changes a file or two); the path of the copy's `blade.toml`.
pub fn copy_demo(demo: &str, dir: &Path) -> std::path::PathBuf {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("layups").join(demo);
    for entry in std::fs::read_dir(&src).unwrap() {
        let entry = entry.unwrap();
        if entry.path().is_file() {
            std::fs::copy(entry.path(), dir.join(entry.file_name())).unwrap();
        }
    }
    dir.join("blade.toml")
}
