//! Assembling the static folder: content-hashed names, the page with its
//! preloads, the chunks and their loader, the manifest and the service worker
//! with its generated precache list.

use crate::split::{self, Split};
use sha2::{Digest, Sha256};
use std::collections::BTreeMap;
use std::path::Path;

/// Which part of the app a shipped file belongs to.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Part {
    /// Fetched by the landing page (vertex) on its way to the first result.
    Landing,
    /// A lazy destination's code, fetched when it is first opened.
    Chunk,
    /// The rest the worker keeps: the worker itself, the manifest, install icons.
    Rest,
}

/// One file of the shipped shell, by its URL relative to the app's root.
pub struct Shipped {
    pub url: String,
    pub bytes: Vec<u8>,
    pub part: Part,
}

/// The shipped files and, for each lazy destination (by its id), the chunks
/// opening it fetches.
pub struct Assembled {
    pub files: Vec<Shipped>,
    pub destinations: BTreeMap<String, Vec<String>>,
}

pub fn short_hash(bytes: &[u8]) -> String {
    let digest = Sha256::digest(bytes);
    digest.iter().take(5).map(|b| format!("{b:02x}")).collect()
}

fn read(path: &Path) -> Result<Vec<u8>, String> {
    std::fs::read(path).map_err(|e| format!("cannot read {}: {e}", path.display()))
}

fn read_text(path: &Path) -> Result<String, String> {
    std::fs::read_to_string(path).map_err(|e| format!("cannot read {}: {e}", path.display()))
}

/// `stem.ext` → `stem-HASH.ext`.
fn hashed(stem: &str, ext: &str, bytes: &[u8]) -> String {
    format!("{stem}-{}.{ext}", short_hash(bytes))
}

fn replace_all(template: &str, pairs: &[(&str, &str)]) -> Result<String, String> {
    let mut out = template.to_string();
    for (key, value) in pairs {
        if !out.contains(key) {
            return Err(format!("template is missing the placeholder {key}"));
        }
        out = out.replace(key, value);
    }
    Ok(out)
}

fn collect_dir(dir: &Path, prefix: &str, part: Part, files: &mut Vec<Shipped>) -> Result<(), String> {
    if !dir.exists() {
        return Ok(());
    }
    let mut entries: Vec<_> = std::fs::read_dir(dir)
        .map_err(|e| format!("cannot list {}: {e}", dir.display()))?
        .filter_map(Result::ok)
        .collect();
    entries.sort_by_key(|e| e.file_name());
    for entry in entries {
        let name = entry.file_name().to_string_lossy().to_string();
        let path = entry.path();
        if path.is_dir() {
            collect_dir(&path, &format!("{prefix}{name}/"), part, files)?;
        } else {
            files.push(Shipped {
                url: format!("{prefix}{name}"),
                bytes: read(&path)?,
                part,
            });
        }
    }
    Ok(())
}

/// The chunks under their hashed names; returns file name → shipped name.
fn chunks(parts: &Split, files: &mut Vec<Shipped>) -> Result<BTreeMap<String, String>, String> {
    let mut names = BTreeMap::new();
    for path in &parts.chunks {
        let bytes = read(path)?;
        let stem = path
            .file_stem()
            .map(|s| s.to_string_lossy().to_string())
            .unwrap_or_default();
        let url = hashed(&stem, "wasm", &bytes);
        names.insert(format!("{stem}.wasm"), url.clone());
        files.push(Shipped {
            url,
            bytes,
            part: Part::Chunk,
        });
    }
    Ok(names)
}

/// Each lazy destination's id (the split point's name with `-` for `_`) and
/// the shipped chunks it needs.
fn destinations(parts: &Split, names: &BTreeMap<String, String>) -> Result<BTreeMap<String, Vec<String>>, String> {
    let mut out = BTreeMap::new();
    for (split, stems) in &parts.needs {
        let urls = stems
            .iter()
            .map(|stem| {
                names
                    .get(&format!("{stem}.wasm"))
                    .cloned()
                    .ok_or_else(|| format!("the splitter lists {stem} for {split} but wrote no such chunk"))
            })
            .collect::<Result<Vec<_>, _>>()?;
        out.insert(split.replace('_', "-"), urls);
    }
    Ok(out)
}

/// `{"near":["split_near-….wasm","chunk_3-….wasm"],…}` for boot.js.
fn destinations_json(destinations: &BTreeMap<String, Vec<String>>) -> String {
    let entries: Vec<String> = destinations
        .iter()
        .map(|(id, urls)| {
            let list: Vec<String> = urls.iter().map(|u| format!("\"{u}\"")).collect();
            format!("\"{id}\":[{}]", list.join(","))
        })
        .collect();
    format!("{{{}}}", entries.join(","))
}

/// The page's preloads: the main wasm, the glue and what the glue imports
/// start downloading with the page instead of one after another.
fn preloads(wasm: &str, modules: &[&str]) -> String {
    let mut out =
        format!("<link rel=\"preload\" href=\"./{wasm}\" as=\"fetch\" type=\"application/wasm\" crossorigin>");
    for m in modules {
        out.push_str(&format!("\n<link rel=\"modulepreload\" href=\"./{m}\">"));
    }
    out
}

/// Writes the static folder into `out` and returns every shipped file.
pub fn assemble(root: &Path, bindgen: &Path, parts: &Split, out: &Path, build_id: &str) -> Result<Assembled, String> {
    let public = root.join("public");
    let mut files: Vec<Shipped> = Vec::new();

    let wasm = read(&bindgen.join("lensplane_bg.wasm"))?;
    let wasm_name = hashed("lensplane", "wasm", &wasm);
    let glue = read(&bindgen.join("lensplane.js"))?;
    let glue_name = hashed("lensplane", "js", &glue);
    // Inline-JS snippets of dependencies keep the relative paths the glue imports.
    collect_dir(&bindgen.join("snippets"), "snippets/", Part::Landing, &mut files)?;
    let mut modules: Vec<String> = files
        .iter()
        .map(|f| f.url.clone())
        .filter(|u| u.ends_with(".js"))
        .collect();

    let names = chunks(parts, &mut files)?;
    let destinations = destinations(parts, &names)?;
    let loader = split::rewrite_loader(&read_text(&parts.loader)?, &glue_name, &names)?;
    files.push(Shipped {
        url: split::LOADER.into(),
        bytes: loader.into_bytes(),
        part: Part::Landing,
    });
    // Not the loader: the glue names it, and a sixth request at the page's
    // start (page, css, wasm, glue, loader, boot.js) held back the page's load
    // in headless Chromium against the local server.
    modules.insert(0, glue_name.clone());

    let boot = replace_all(
        // Minified by the pipeline when terser is there, as written otherwise.
        &read_text(
            &Some(bindgen.join("boot.js"))
                .filter(|p| p.exists())
                .unwrap_or(public.join("boot.js")),
        )?,
        &[
            ("__APP_JS__", &glue_name),
            ("__APP_WASM__", &wasm_name),
            ("__CHUNKS__", &destinations_json(&destinations)),
        ],
    )?;
    let boot_name = hashed("boot", "js", boot.as_bytes());
    let css = crate::css::minify(&read_text(&public.join("styles.css"))?).into_bytes();
    let css_name = hashed("styles", "css", &css);
    // The lazy destinations' styles: linked by the page when one of them opens.
    let panels_css = crate::css::minify(&read_text(&public.join("panels.css"))?).into_bytes();
    let panels_css_name = hashed("panels", "css", &panels_css);
    let preload_tags = preloads(&wasm_name, &modules.iter().map(String::as_str).collect::<Vec<_>>());

    files.push(Shipped {
        url: wasm_name,
        bytes: wasm,
        part: Part::Landing,
    });
    files.push(Shipped {
        url: glue_name,
        bytes: glue,
        part: Part::Landing,
    });
    files.push(Shipped {
        url: boot_name.clone(),
        bytes: boot.into_bytes(),
        part: Part::Landing,
    });
    files.push(Shipped {
        url: css_name.clone(),
        bytes: css,
        part: Part::Landing,
    });
    files.push(Shipped {
        url: panels_css_name.clone(),
        bytes: panels_css,
        part: Part::Chunk,
    });
    collect_dir(&public.join("icons"), "icons/", Part::Rest, &mut files)?;
    // No icon is part of the landing load: the masthead's mark is drawn by
    // the page, and the tab icon is the browser's own, fetched at idle
    // priority with nothing on the page waiting for it. It is a PNG:
    // Chromium fetches and decodes the tab icon again after every address
    // change (every keystroke), and the SVG took three times as long.
    files.push(Shipped {
        url: "manifest.json".into(),
        bytes: read(&root.join("manifest.json"))?,
        part: Part::Rest,
    });

    let version = env!("CARGO_PKG_VERSION");
    let index = replace_all(
        &read_text(&public.join("index.html"))?,
        &[
            ("__PRELOADS__", &preload_tags),
            ("__BOOT_JS__", &boot_name),
            ("__STYLES_CSS__", &css_name),
            ("__PANELS_CSS__", &panels_css_name),
            ("__BUILD_ID__", build_id),
            ("__VERSION__", version),
        ],
    )?;
    files.push(Shipped {
        url: "index.html".into(),
        bytes: index.into_bytes(),
        part: Part::Landing,
    });

    // The worker precaches every file above; its own bytes change whenever any
    // of them does, which is how the browser learns of a new version.
    let list: Vec<String> = files
        .iter()
        .map(|f| format!("{{\"url\":\"{}\",\"hash\":\"{}\"}}", f.url, short_hash(&f.bytes)))
        .collect();
    let list_json = format!("[\n  {}\n]", list.join(",\n  "));
    let shell_version = short_hash(list_json.as_bytes());
    let sw = replace_all(
        &read_text(&public.join("sw.js"))?,
        &[
            ("__PRECACHE__", &list_json),
            ("__SHELL_VERSION__", &shell_version),
            ("__BUILD_ID__", build_id),
        ],
    )?;
    files.push(Shipped {
        url: "sw.js".into(),
        bytes: sw.into_bytes(),
        part: Part::Rest,
    });

    for f in &files {
        let path = out.join(&f.url);
        if let Some(dir) = path.parent() {
            std::fs::create_dir_all(dir).map_err(|e| format!("cannot create {}: {e}", dir.display()))?;
        }
        std::fs::write(&path, &f.bytes).map_err(|e| format!("cannot write {}: {e}", path.display()))?;
    }
    Ok(Assembled { files, destinations })
}
