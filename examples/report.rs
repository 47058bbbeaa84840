//! Prints the report of a scenario as JSON: `cargo run --release --example report -- 'QUERY'`,
//! or `-` to read one query per line from standard input and print one JSON object per line.
//! `--field FILE [QUERY]` plans the survey over the boundary in FILE (GeoJSON, KML, or `lon lat`
//! points), as the `field` key would: the same figures, and the file's problem named if it has one.

use sharpfield::core::contract::report::report_json;
use sharpfield::core::formats::boundary::read_file;
use std::io::{BufRead, Write};

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let stdout = std::io::stdout();
    let mut out = stdout.lock();
    match args.as_slice() {
        [dash] if dash == "-" => {
            for line in std::io::stdin().lock().lines() {
                let Ok(line) = line else { break };
                if writeln!(out, "{}", report_json(&line)).is_err() {
                    return;
                }
            }
        }
        [flag, file, rest @ ..] if flag == "--field" && rest.len() <= 1 => {
            let text = match std::fs::read_to_string(file) {
                Ok(text) => text,
                Err(e) => {
                    eprintln!("report: cannot read {file}: {e}");
                    std::process::exit(2);
                }
            };
            let query = rest.first().map(String::as_str).unwrap_or("");
            match read_file(file, &text) {
                Ok(boundary) => {
                    let field: String = form_urlencoded::byte_serialize(boundary.to_text().as_bytes()).collect();
                    let _ = writeln!(out, "{}", report_json(&format!("{query}&field={field}")));
                }
                Err(problem) => {
                    eprintln!("report: {file}: {}", problem.message());
                    std::process::exit(1);
                }
            }
        }
        [query] => {
            let _ = writeln!(out, "{}", report_json(query));
        }
        _ => {
            eprintln!("usage: report 'QUERY' | report - | report --field FILE ['QUERY']   (see shared/reference/url-and-report.md)");
            std::process::exit(2);
        }
    }
}
