//! Splitting the linked app at its lazy destinations.
//!
//! The web crate marks each destination but the landing one as a split point
//! (`wasm_split` in `app/web/src/shell.rs`). Linked with `--emit-relocs`, the
//! wasm still knows which bytes point where, so `wasm_split_cli_support` can
//! cut it into a main module (everything the landing page needs and whatever
//! is shared with it), one chunk per split point and shared chunks for code
//! that several split points need but the main module does not, plus a small
//! JS loader that fetches and instantiates a chunk when its split point is
//! first called. A build with split points that is not split cannot start
//! (their imports have nothing behind them), so every build splits.

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

/// The loader's file name. The main module imports the loader by this name, and
/// the name is compiled into the wasm before bindgen, so it cannot carry a
/// content hash; the server sends it with `no-cache` and the worker precaches
/// it with its hash like every other file.
pub const LOADER: &str = "lensplane-chunks.js";
/// What the loader imports the glue as until the glue has its hashed name.
pub const GLUE_PLACEHOLDER: &str = "./__LENSPLANE_GLUE__.js";

/// What the splitter wrote.
pub struct Split {
    /// The main module, the input of wasm-bindgen.
    pub main: PathBuf,
    /// The JS loader, with the placeholder glue name and unhashed chunk names.
    pub loader: PathBuf,
    /// Every chunk file (`split_near.wasm`, `chunk_9.wasm`, …).
    pub chunks: Vec<PathBuf>,
    /// For each split point, the file stems of the chunks it needs.
    pub needs: BTreeMap<String, Vec<String>>,
}

/// Splits the raw linked wasm into `dir`.
pub fn split(raw: &Path, dir: &Path) -> Result<Split, String> {
    let input = std::fs::read(raw).map_err(|e| format!("cannot read {}: {e}", raw.display()))?;
    std::fs::create_dir_all(dir).map_err(|e| format!("cannot create {}: {e}", dir.display()))?;
    let main = dir.join("main.wasm");
    let link_name = format!("./{LOADER}");
    let mut opts = wasm_split_cli_support::Options::new(&input);
    opts.output_dir = dir;
    opts.main_out_path = &main;
    opts.link_name = &link_name;
    opts.main_module = GLUE_PLACEHOLDER;
    opts.target.web();
    opts.emit_dwarf = false;
    let out = wasm_split_cli_support::transform(opts).map_err(|e| format!("splitting the wasm failed: {e:#}"))?;
    if out.split_modules.is_empty() {
        return Err("the app has no split points: nothing to split (see app/web/src/shell.rs)".into());
    }
    let mut needs: BTreeMap<String, Vec<String>> = BTreeMap::new();
    for (split, mut stems) in out.prefetch_map {
        stems.sort();
        stems.dedup();
        needs.insert(split, stems);
    }
    let mut chunks = out.split_modules;
    chunks.sort();
    Ok(Split {
        main,
        loader: dir.join(LOADER),
        chunks,
        needs,
    })
}

/// The loader with the glue's and the chunks' final (hashed) names.
/// `names` maps a chunk's file name (`split_near.wasm`) to its shipped one.
pub fn rewrite_loader(loader: &str, glue: &str, names: &BTreeMap<String, String>) -> Result<String, String> {
    let mut out = replace_once(loader, &format!("\"{GLUE_PLACEHOLDER}\""), &format!("\"./{glue}\""))?;
    for (from, to) in names {
        out = replace_once(&out, &format!("\"./{from}\""), &format!("\"./{to}\""))?;
    }
    Ok(out)
}

fn replace_once(text: &str, from: &str, to: &str) -> Result<String, String> {
    match text.matches(from).count() {
        1 => Ok(text.replacen(from, to, 1)),
        n => Err(format!("the chunk loader names {from} {n} times, expected once")),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const LOADER_TEXT: &str = "import { initSync } from \"./__LENSPLANE_GLUE__.js\";\n\
        const __chunk_1 = makeLoad(() => { const src = fetch(new URL(\"./chunk_1.wasm\", import.meta.url)); }, []);\n\
        export const __wasm_split_load_near = wrapAsyncCb(makeLoad(() => fetch(new URL(\"./split_near.wasm\", import.meta.url)), [__chunk_1]));\n";

    #[test]
    fn the_loader_gets_the_hashed_names() {
        let names = BTreeMap::from([
            ("chunk_1.wasm".to_string(), "chunk_1-0123456789.wasm".to_string()),
            ("split_near.wasm".to_string(), "split_near-abcdefabcd.wasm".to_string()),
        ]);
        let out = rewrite_loader(LOADER_TEXT, "lensplane-9876543210.js", &names).unwrap();
        assert!(out.contains("from \"./lensplane-9876543210.js\""));
        assert!(out.contains("new URL(\"./chunk_1-0123456789.wasm\""));
        assert!(out.contains("new URL(\"./split_near-abcdefabcd.wasm\""));
        assert!(!out.contains("__LENSPLANE_GLUE__"));
    }

    #[test]
    fn a_name_the_loader_does_not_hold_is_an_error() {
        let names = BTreeMap::from([("split_far.wasm".to_string(), "split_far-0123456789.wasm".to_string())]);
        assert!(rewrite_loader(LOADER_TEXT, "g.js", &names).is_err());
        // A prefix of another name is not taken for it: names are matched with their quotes.
        let names = BTreeMap::from([("chunk_.wasm".to_string(), "x.wasm".to_string())]);
        assert!(rewrite_loader(LOADER_TEXT, "g.js", &names).is_err());
    }
}
