//! Prints the report of a scenario as JSON: `cargo run --release --example report -- 'QUERY'`,
//! or `-` to read one query per line from standard input and print one JSON object per line.

use sharpfield::core::contract::report::report_json;
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
        [query] => {
            let _ = writeln!(out, "{}", report_json(query));
        }
        _ => {
            eprintln!("usage: report 'QUERY' | report -   (see shared/reference/url-and-report.md)");
            std::process::exit(2);
        }
    }
}
