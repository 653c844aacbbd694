//! The one way xtask runs another program. A [`Cmd`] echoes its command line (`+ PROGRAM
//! ARGS`) unless told to be quiet, runs in a folder with extra environment variables,
//! optionally under coreutils' `timeout` or fed bytes on stdin, and turns a program that
//! cannot start or exits non-zero into an error naming the command line.
//!
//! Four ways to finish: [`Cmd::run`] (the terminal sees everything), [`Cmd::stdout`]
//! (stdout kept, stderr to the terminal), [`Cmd::capture`] (both kept) and [`Cmd::output`]
//! (both kept, the exit status left to the caller); [`Cmd::succeeds`] and [`Cmd::spawn`]
//! serve probes and background servers.

use std::ffi::{OsStr, OsString};
use std::io::Write as _;
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::time::Instant;

/// A command line to run, built up before one of the finishing methods runs it.
pub struct Cmd {
    program: OsString,
    args: Vec<OsString>,
    dir: Option<PathBuf>,
    envs: Vec<(OsString, OsString)>,
    /// A folder named in the echo and the error, e.g. `tests/firmware`.
    place: Option<String>,
    echo: bool,
    timeout_s: Option<u32>,
    stdin: Option<Vec<u8>>,
}

/// What a run with kept output gave.
#[derive(Debug)]
pub struct Output {
    pub success: bool,
    /// The exit code, if the program exited (rather than being killed by a signal).
    pub code: Option<i32>,
    /// The exit status in words (`exit status: 1`, or `timed out after 120 s`).
    pub status: String,
    /// Standard output as written (bytes: gzip's output is binary).
    pub stdout: Vec<u8>,
    pub stderr: Vec<u8>,
    /// Wall-clock seconds from start to exit.
    pub seconds: f64,
}

impl Output {
    pub fn stdout_text(&self) -> String {
        String::from_utf8_lossy(&self.stdout).into_owned()
    }

    pub fn stderr_text(&self) -> String {
        String::from_utf8_lossy(&self.stderr).into_owned()
    }

    /// The last ten lines of stdout and five of stderr, indented, for an error message.
    pub fn last_lines(&self) -> String {
        format!("{}{}", tail(&self.stdout_text(), 10), tail(&self.stderr_text(), 5))
    }
}

impl Cmd {
    pub fn new(program: impl AsRef<OsStr>) -> Self {
        Self {
            program: program.as_ref().to_owned(),
            args: Vec::new(),
            dir: None,
            envs: Vec::new(),
            place: None,
            echo: true,
            timeout_s: None,
            stdin: None,
        }
    }

    pub fn arg(mut self, arg: impl AsRef<OsStr>) -> Self {
        self.args.push(arg.as_ref().to_owned());
        self
    }

    pub fn args<I: IntoIterator<Item = S>, S: AsRef<OsStr>>(mut self, args: I) -> Self {
        self.args.extend(args.into_iter().map(|a| a.as_ref().to_owned()));
        self
    }

    /// The working directory (else xtask's own).
    pub fn dir(mut self, dir: impl AsRef<Path>) -> Self {
        self.dir = Some(dir.as_ref().to_path_buf());
        self
    }

    pub fn envs<I, K, V>(mut self, envs: I) -> Self
    where
        I: IntoIterator<Item = (K, V)>,
        K: AsRef<OsStr>,
        V: AsRef<OsStr>,
    {
        self.envs.extend(envs.into_iter().map(|(k, v)| (k.as_ref().to_owned(), v.as_ref().to_owned())));
        self
    }

    /// Names the folder it runs in in the echo (`+ (PLACE) ...`) and in the error.
    pub fn place(mut self, place: &str) -> Self {
        self.place = Some(place.to_owned());
        self
    }

    /// No `+ ...` line: for probes and for commands whose output is the result.
    pub fn quiet(mut self) -> Self {
        self.echo = false;
        self
    }

    /// Runs under `timeout SECONDS`, which ends the program when the time is up.
    pub fn timeout(mut self, seconds: u32) -> Self {
        self.timeout_s = Some(seconds);
        self
    }

    /// Bytes written to the program's stdin (which is then closed).
    pub fn stdin(mut self, bytes: &[u8]) -> Self {
        self.stdin = Some(bytes.to_vec());
        self
    }

    /// The program and arguments as started: under `timeout`, that comes first.
    fn argv(&self) -> (OsString, Vec<OsString>) {
        match self.timeout_s {
            None => (self.program.clone(), self.args.clone()),
            Some(seconds) => {
                let mut args = vec![OsString::from(seconds.to_string()), self.program.clone()];
                args.extend(self.args.iter().cloned());
                (OsString::from("timeout"), args)
            }
        }
    }

    /// `PROGRAM ARGS` as text, for the echo and the errors.
    fn line(&self) -> String {
        let (program, args) = self.argv();
        let args: Vec<_> = args.iter().map(|a| a.to_string_lossy()).collect();
        format!("{} {}", program.to_string_lossy(), args.join(" "))
    }

    fn command(&self) -> Command {
        let (program, args) = self.argv();
        let mut command = Command::new(program);
        command.args(args).envs(self.envs.iter().map(|(k, v)| (k, v)));
        if let Some(dir) = &self.dir {
            command.current_dir(dir);
        }
        if self.echo {
            match &self.place {
                Some(place) => eprintln!("+ ({place}) {}", self.line()),
                None => eprintln!("+ {}", self.line()),
            }
        }
        command
    }

    fn cannot_start(&self, e: std::io::Error) -> String {
        let (program, _) = self.argv();
        format!("cannot start {}: {e}", program.to_string_lossy())
    }

    /// The error of a run that exited with `status`.
    fn failed(&self, status: &str) -> String {
        match &self.place {
            Some(place) => format!("`{}` in {place} failed ({status})", self.line()),
            None => format!("`{}` failed ({status})", self.line()),
        }
    }

    fn status_text(&self, status: std::process::ExitStatus) -> String {
        match (self.timeout_s, status.code()) {
            // 124 is `timeout`'s own exit code when the time ran out.
            (Some(seconds), Some(124)) => format!("timed out after {seconds} s"),
            _ => status.to_string(),
        }
    }

    /// Runs it with the terminal's stdout and stderr; Err if it fails.
    pub fn run(self) -> Result<(), String> {
        let status = self.command().status().map_err(|e| self.cannot_start(e))?;
        if status.success() {
            Ok(())
        } else {
            Err(self.failed(&self.status_text(status)))
        }
    }

    /// Runs it keeping stdout (stderr goes to the terminal); Err with the stdout if it fails.
    pub fn stdout(self) -> Result<String, String> {
        let output = self.run_kept(Stdio::inherit())?;
        let text = output.stdout_text();
        if output.success {
            Ok(text)
        } else {
            Err(format!("{}:\n{text}", self.failed(&output.status)))
        }
    }

    /// Runs it keeping stdout and stderr; Err with both if it fails.
    pub fn capture(self) -> Result<Output, String> {
        let output = self.run_kept(Stdio::piped())?;
        if output.success {
            Ok(output)
        } else {
            let (stdout, stderr) = (output.stdout_text(), output.stderr_text());
            Err(format!("{}:\n{stdout}{stderr}", self.failed(&output.status)))
        }
    }

    /// Runs it keeping stdout and stderr, whatever its exit status; Err only if it
    /// cannot start.
    pub fn output(self) -> Result<Output, String> {
        self.run_kept(Stdio::piped())
    }

    /// True when it starts and exits 0 (quietly: a probe of what the machine has).
    pub fn succeeds(self) -> bool {
        self.quiet().output().is_ok_and(|o| o.success)
    }

    /// Starts it in the background with its output discarded; the caller stops it.
    pub fn spawn(self) -> Result<Child, String> {
        self.command().stdout(Stdio::null()).stderr(Stdio::null()).spawn().map_err(|e| self.cannot_start(e))
    }

    fn run_kept(&self, stderr: Stdio) -> Result<Output, String> {
        let mut command = self.command();
        command.stdout(Stdio::piped()).stderr(stderr);
        command.stdin(if self.stdin.is_some() { Stdio::piped() } else { Stdio::null() });
        let started = Instant::now();
        let mut child = command.spawn().map_err(|e| self.cannot_start(e))?;
        if let (Some(bytes), Some(mut stdin)) = (&self.stdin, child.stdin.take()) {
            // A program that exits without reading its input is judged by its exit status.
            let _ = stdin.write_all(bytes);
        }
        let output = child.wait_with_output().map_err(|e| self.cannot_start(e))?;
        Ok(Output {
            success: output.status.success(),
            code: output.status.code(),
            status: self.status_text(output.status),
            stdout: output.stdout,
            stderr: output.stderr,
            seconds: started.elapsed().as_secs_f64(),
        })
    }
}

/// The last `lines` lines of `text`, each indented by two spaces.
fn tail(text: &str, lines: usize) -> String {
    let all: Vec<&str> = text.lines().collect();
    all[all.len().saturating_sub(lines)..].iter().map(|l| format!("  {l}\n")).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_failure_names_the_command_line_and_its_place() {
        let error = Cmd::new("false").arg("--flag").quiet().run().unwrap_err();
        assert_eq!(error, "`false --flag` failed (exit status: 1)");
        let error = Cmd::new("false").quiet().place("tests/firmware").run().unwrap_err();
        assert_eq!(error, "`false ` in tests/firmware failed (exit status: 1)");
        let error = Cmd::new("no-such-program-here").quiet().run().unwrap_err();
        assert!(error.starts_with("cannot start no-such-program-here: "), "{error}");
    }

    #[test]
    fn output_is_kept_and_stdin_is_fed() {
        let output = Cmd::new("sh")
            .args(["-c", "cat; echo oops >&2; exit 3"])
            .stdin(b"in\n")
            .quiet()
            .output()
            .unwrap();
        assert_eq!((output.success, output.code), (false, Some(3)));
        assert_eq!((output.stdout_text().as_str(), output.stderr_text().as_str()), ("in\n", "oops\n"));
        let error =
            Cmd::new("sh").args(["-c", "echo out; echo err >&2; exit 1"]).quiet().capture().unwrap_err();
        assert_eq!(error, "`sh -c echo out; echo err >&2; exit 1` failed (exit status: 1):\nout\nerr\n");
        assert_eq!(Cmd::new("echo").arg("hi").quiet().stdout(), Ok("hi\n".to_owned()));
    }

    #[test]
    fn a_timeout_is_named_as_such() {
        let output = Cmd::new("sleep").arg("5").timeout(1).quiet().output().unwrap();
        assert!(!output.success);
        assert_eq!(output.status, "timed out after 1 s");
        assert!(Cmd::new("true").timeout(5).succeeds());
        assert!(!Cmd::new("false").succeeds());
    }

    #[test]
    fn the_tail_keeps_the_last_lines() {
        assert_eq!(tail("a\nb\nc\n", 2), "  b\n  c\n");
        assert_eq!(tail("a", 5), "  a\n");
    }
}
