//! Raw and gzip sizes of every shipped file, by part (the landing page, the
//! lazy destinations' chunks, the rest), printed and written as JSON.

use crate::assets::{Assembled, Part};
use flate2::{write::GzEncoder, Compression};
use std::io::Write;

/// What the landing page (vertex) fetches before its first result must stay
/// at or under this many gzip bytes, with every destination in place
/// (README "Sizes" has the measured figures).
pub const BUDGET_GZIP: usize = 210_000;

pub fn gzip_len(bytes: &[u8]) -> usize {
    let mut enc = GzEncoder::new(Vec::new(), Compression::best());
    enc.write_all(bytes).expect("writing to memory");
    enc.finish().expect("writing to memory").len()
}

fn part_name(part: Part) -> &'static str {
    match part {
        Part::Landing => "landing",
        Part::Chunk => "chunk",
        Part::Rest => "rest",
    }
}

/// Prints the size table and returns it as JSON.
pub fn report(built: &Assembled, build_id: &str) -> String {
    let mut rows: Vec<(&str, Part, usize, usize)> = built
        .files
        .iter()
        .map(|f| (f.url.as_str(), f.part, f.bytes.len(), gzip_len(&f.bytes)))
        .collect();
    rows.sort_by(|a, b| (a.1 as u8, b.3).cmp(&(b.1 as u8, a.3)));
    let sum = |part: Option<Part>| {
        rows.iter()
            .filter(|r| part.is_none_or(|p| r.1 == p))
            .fold((0, 0), |(raw, gz), r| (raw + r.2, gz + r.3))
    };
    let (landing_raw, landing_gz) = sum(Some(Part::Landing));
    let (chunks_raw, chunks_gz) = sum(Some(Part::Chunk));
    let (raw, gz) = sum(None);
    println!("{:<44} {:>8} {:>10} {:>10}", "file", "part", "raw B", "gzip B");
    for (url, part, r, g) in &rows {
        println!("{url:<44} {:>8} {r:>10} {g:>10}", part_name(*part));
    }
    println!("{:<53} {landing_raw:>10} {landing_gz:>10}", "landing page (vertex)");
    println!("{:<53} {chunks_raw:>10} {chunks_gz:>10}", "every chunk");
    println!("{:<53} {raw:>10} {gz:>10}", "whole output");
    for (id, urls) in &built.destinations {
        let g: usize = rows.iter().filter(|r| urls.iter().any(|u| u == r.0)).map(|r| r.3).sum();
        println!("  /{id} fetches {} ({g} B gzip)", urls.join(" + "));
    }
    let verdict = if landing_gz <= BUDGET_GZIP { "within" } else { "OVER" };
    println!("budget: landing page {landing_gz} of {BUDGET_GZIP} gzip bytes ({verdict} budget)");
    let entries: Vec<String> = rows
        .iter()
        .map(|(u, p, r, g)| {
            format!(
                "    {{\"file\": \"{u}\", \"part\": \"{}\", \"raw\": {r}, \"gzip\": {g}}}",
                part_name(*p)
            )
        })
        .collect();
    let destinations: Vec<String> = built
        .destinations
        .iter()
        .map(|(id, urls)| {
            let list: Vec<String> = urls.iter().map(|u| format!("\"{u}\"")).collect();
            format!("    \"{id}\": [{}]", list.join(", "))
        })
        .collect();
    format!(
        "{{\n  \"build_id\": \"{build_id}\",\n  \"landing_raw\": {landing_raw},\n  \"landing_gzip\": {landing_gz},\n  \
         \"chunks_raw\": {chunks_raw},\n  \"chunks_gzip\": {chunks_gz},\n  \"total_raw\": {raw},\n  \"total_gzip\": {gz},\n  \
         \"budget_gzip\": {BUDGET_GZIP},\n  \"destinations\": {{\n{}\n  }},\n  \"files\": [\n{}\n  ]\n}}\n",
        destinations.join(",\n"),
        entries.join(",\n")
    )
}
