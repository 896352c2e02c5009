//! The `padwright` command. All behaviour lives in [`padwright::cli::run`].
#![forbid(unsafe_code)]

use std::process::ExitCode;

fn main() -> ExitCode {
    let code = padwright::cli::run(
        std::env::args_os(),
        &mut std::io::stdout().lock(),
        &mut std::io::stderr().lock(),
    );
    ExitCode::from(code)
}
