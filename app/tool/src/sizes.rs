//! Raw and gzip sizes of every shipped file, printed and written as JSON.

use crate::assets::Shipped;
use flate2::{write::GzEncoder, Compression};
use std::io::Write;

/// The whole shell must stay at or under this many gzip bytes (the
/// foundation's budget; README "Sizes" has the measured figures).
pub const BUDGET_GZIP: usize = 250_000;

fn gzip_len(bytes: &[u8]) -> usize {
    let mut enc = GzEncoder::new(Vec::new(), Compression::best());
    enc.write_all(bytes).expect("writing to memory");
    enc.finish().expect("writing to memory").len()
}

/// Prints the size table and returns it as JSON.
pub fn report(files: &[Shipped], build_id: &str) -> String {
    let mut rows: Vec<(&str, usize, usize)> = files
        .iter()
        .map(|f| (f.url.as_str(), f.bytes.len(), gzip_len(&f.bytes)))
        .collect();
    rows.sort_by(|a, b| b.2.cmp(&a.2));
    let (raw, gz) = rows.iter().fold((0, 0), |(r, g), row| (r + row.1, g + row.2));
    println!("{:<40} {:>10} {:>10}", "file", "raw B", "gzip B");
    for (url, r, g) in &rows {
        println!("{url:<40} {r:>10} {g:>10}");
    }
    println!("{:<40} {raw:>10} {gz:>10}", "total (whole shell)");
    let verdict = if gz <= BUDGET_GZIP { "within" } else { "OVER" };
    println!("budget: {gz} of {BUDGET_GZIP} gzip bytes ({verdict} budget)");
    let entries: Vec<String> = rows
        .iter()
        .map(|(u, r, g)| format!("    {{\"file\": \"{u}\", \"raw\": {r}, \"gzip\": {g}}}"))
        .collect();
    format!(
        "{{\n  \"build_id\": \"{build_id}\",\n  \"total_raw\": {raw},\n  \"total_gzip\": {gz},\n  \"budget_gzip\": {BUDGET_GZIP},\n  \"files\": [\n{}\n  ]\n}}\n",
        entries.join(",\n")
    )
}
