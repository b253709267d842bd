//! headroom-batch: sizes every line of a sheet file and prints the results.
//!
//! ```text
//! headroom-batch SHEET.json [--format table|csv|json]
//! ```
//! Exit codes: 0 every line evaluated; 1 the file or a line has bad values
//! (the other lines are still printed); 2 usage or unreadable file.
//! A reader that stops early (`| head`) ends the output quietly, as other
//! command-line tools do.

use std::io::Write;
use std::process::ExitCode;

use headroom::sheet::file::SheetFile;
use headroom::sheet::report;

const USAGE: &str = "usage: headroom-batch SHEET.json [--format table|csv|json]";

/// The sheet's path and the output format, or the exit code to stop with.
fn parse_args() -> Result<(String, String), ExitCode> {
    let mut path = None;
    let mut format = "table".to_owned();
    let mut args = std::env::args().skip(1);
    while let Some(a) = args.next() {
        match a.as_str() {
            "--format" | "-f" => match args.next() {
                Some(f) if ["table", "csv", "json"].contains(&f.as_str()) => format = f,
                _ => {
                    eprintln!("headroom-batch: --format takes table, csv or json\n{USAGE}");
                    return Err(ExitCode::from(2));
                }
            },
            "--help" | "-h" => {
                println!("{USAGE}");
                return Err(ExitCode::SUCCESS);
            }
            _ if path.is_none() && !a.starts_with('-') => path = Some(a),
            other => {
                eprintln!("headroom-batch: unexpected argument '{other}'\n{USAGE}");
                return Err(ExitCode::from(2));
            }
        }
    }
    match path {
        Some(p) => Ok((p, format)),
        None => {
            eprintln!("{USAGE}");
            Err(ExitCode::from(2))
        }
    }
}

fn main() -> ExitCode {
    let (path, format) = match parse_args() {
        Ok(a) => a,
        Err(code) => return code,
    };
    let bytes = match std::fs::read(&path) {
        Ok(b) => b,
        Err(e) => {
            eprintln!("headroom-batch: cannot read {path}: {e}");
            return ExitCode::from(2);
        }
    };
    let text = match String::from_utf8(bytes) {
        Ok(t) => t,
        Err(_) => {
            eprintln!("headroom-batch: {path} is not UTF-8 text");
            return ExitCode::from(1);
        }
    };
    let sheet = match SheetFile::from_json(&text) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("headroom-batch: {path}: {e}");
            return ExitCode::from(1);
        }
    };
    let reports = report::evaluate(&sheet);
    let out = match format.as_str() {
        "csv" => report::csv(&sheet, &reports),
        "json" => report::json(&sheet, &reports),
        _ => report::table(&sheet, &reports),
    };
    // Rust ignores SIGPIPE, so a closed pipe is an error from write, which
    // `print!` would turn into a panic. A reader that has gone is no fault.
    let mut stdout = std::io::stdout().lock();
    match stdout.write_all(out.as_bytes()).and_then(|()| stdout.flush()) {
        Ok(()) => {}
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => {}
        Err(e) => {
            eprintln!("headroom-batch: cannot write the results: {e}");
            return ExitCode::from(2);
        }
    }
    let mut bad = false;
    for r in &reports {
        if let Err(errs) = &r.outcome {
            bad = true;
            for e in errs {
                let name = if r.name.is_empty() { String::new() } else { format!(" ({})", r.name) };
                eprintln!("headroom-batch: {path}: line {}{name}, {e}", r.number);
            }
        }
    }
    if bad {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}
