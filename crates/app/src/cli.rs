//! The command line: `padwright solve FILE [--json]` and `padwright example KIND [-o FILE]`.
//!
//! [`run`] does all the work and writes to the streams it is given, so tests can call it in
//! process; `main` only hands it the real arguments and terminal.
//!
//! Exit codes: 0 success; 1 the design file cannot be read or is not valid, or a file cannot
//! be written; 2 the command line itself is wrong; 3 the analysis found no solution (for
//! example an overload).

use std::ffi::OsString;
use std::io::Write;
use std::path::{Path, PathBuf};

use clap::{Parser, Subcommand};
use padwright_solver::prelude::{BearingDesign, SolverError, analyze};

use crate::design_file::DesignFile;
use crate::error::AppError;
use crate::report::{Report, text};
use crate::templates::Template;

/// Exit code of a successful run.
pub const EXIT_OK: u8 = 0;
/// Exit code when an input file is unreadable or invalid, or an output cannot be written.
pub const EXIT_INPUT: u8 = 1;
/// Exit code for a wrong command line.
pub const EXIT_USAGE: u8 = 2;
/// Exit code when the analysis finds no solution.
pub const EXIT_ANALYSIS: u8 = 3;

/// Padwright: sizing of tilting-pad and tapered-land hydrodynamic thrust bearings.
///
/// Results are a preliminary sizing: confirm them with the applicable standards, the bearing
/// maker and licensed engineering practice.
#[derive(Debug, Parser)]
#[command(name = "padwright", version, about, long_about)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The sub-commands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Analyse a design file and print the results.
    Solve {
        /// The design file (RON; see `padwright example tilting`).
        file: PathBuf,
        /// Print one JSON object with SI values under unit-suffixed keys instead of the table.
        #[arg(long)]
        json: bool,
    },
    /// Write a commented, ready-to-run example design file.
    Example {
        /// Which example.
        kind: Template,
        /// Write to this file instead of standard output.
        #[arg(short, long, value_name = "FILE")]
        output: Option<PathBuf>,
        /// Overwrite the output file if it exists.
        #[arg(long, requires = "output")]
        force: bool,
    },
}

/// Runs the command line with `args` (the first being the program name), writing results to
/// `stdout` and messages to `stderr`. Returns the process exit code.
pub fn run<I, T>(args: I, stdout: &mut impl Write, stderr: &mut impl Write) -> u8
where
    I: IntoIterator<Item = T>,
    T: Into<OsString> + Clone,
{
    let cli = match Cli::try_parse_from(args) {
        Ok(cli) => cli,
        Err(e) => {
            // Help and version are not errors; they go to standard output.
            let text = e.render().to_string();
            return if e.use_stderr() {
                let _ = write!(stderr, "{text}");
                EXIT_USAGE
            } else {
                let _ = write!(stdout, "{text}");
                EXIT_OK
            };
        }
    };
    let outcome = match cli.command {
        Command::Solve { file, json } => solve(&file, json, stdout),
        Command::Example {
            kind,
            output,
            force,
        } => example(kind, output.as_deref(), force, stdout, stderr),
    };
    match outcome {
        Ok(()) => EXIT_OK,
        Err(e) => {
            let _ = writeln!(stderr, "error: {e}");
            match e {
                AppError::Analysis(SolverError::Input(_)) => EXIT_INPUT,
                AppError::Analysis(_) => EXIT_ANALYSIS,
                _ => EXIT_INPUT,
            }
        }
    }
}

/// Reads and checks a design file: the file form (for its title) and the solver design.
pub fn load_design(path: &Path) -> Result<(DesignFile, BearingDesign), AppError> {
    let text = std::fs::read_to_string(path).map_err(|source| AppError::Read {
        path: path.to_path_buf(),
        source,
    })?;
    let with_path = |source| AppError::Design {
        path: path.to_path_buf(),
        source: Box::new(source),
    };
    let file = DesignFile::parse(&text).map_err(with_path)?;
    let design = file.to_design().map_err(with_path)?;
    Ok((file, design))
}

fn solve(path: &Path, json: bool, stdout: &mut impl Write) -> Result<(), AppError> {
    let (file, design) = load_design(path)?;
    let result = analyze(&design)?;
    let report = Report::new(&file.title, &design, &result)?;
    if json {
        writeln!(stdout, "{}", report.to_json()?)?;
    } else {
        write!(stdout, "{}", text::render(&report))?;
    }
    stdout.flush()?;
    Ok(())
}

fn example(
    kind: Template,
    output: Option<&Path>,
    force: bool,
    stdout: &mut impl Write,
    stderr: &mut impl Write,
) -> Result<(), AppError> {
    let text = kind.text();
    match output {
        None => {
            write!(stdout, "{text}")?;
            stdout.flush()?;
        }
        Some(path) => {
            if path.exists() && !force {
                return Err(AppError::WouldOverwrite {
                    path: path.to_path_buf(),
                });
            }
            std::fs::write(path, text).map_err(|source| AppError::Write {
                path: path.to_path_buf(),
                source,
            })?;
            let _ = writeln!(
                stderr,
                "wrote {}; run it with: padwright solve {}",
                path.display(),
                path.display()
            );
        }
    }
    Ok(())
}
