//! Assembling the static folder: content-hashed names, the page, the manifest
//! and the service worker with its generated precache list.

use sha2::{Digest, Sha256};
use std::path::Path;

/// One file of the shipped shell, by its URL relative to the app's root.
pub struct Shipped {
    pub url: String,
    pub bytes: Vec<u8>,
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

fn collect_dir(dir: &Path, prefix: &str, files: &mut Vec<Shipped>) -> Result<(), String> {
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
            collect_dir(&path, &format!("{prefix}{name}/"), files)?;
        } else {
            files.push(Shipped {
                url: format!("{prefix}{name}"),
                bytes: read(&path)?,
            });
        }
    }
    Ok(())
}

/// Writes the static folder into `out` and returns every shipped file.
pub fn assemble(root: &Path, bindgen: &Path, out: &Path, build_id: &str) -> Result<Vec<Shipped>, String> {
    let public = root.join("public");
    let mut files: Vec<Shipped> = Vec::new();

    let wasm = read(&bindgen.join("lensplane_bg.wasm"))?;
    let wasm_name = hashed("lensplane", "wasm", &wasm);
    let glue = read(&bindgen.join("lensplane.js"))?;
    let glue_name = hashed("lensplane", "js", &glue);
    // Inline-JS snippets of dependencies keep the relative paths the glue imports.
    collect_dir(&bindgen.join("snippets"), "snippets/", &mut files)?;

    let boot = replace_all(
        &read_text(&public.join("boot.js"))?,
        &[("__APP_JS__", &glue_name), ("__APP_WASM__", &wasm_name)],
    )?;
    let boot_name = hashed("boot", "js", boot.as_bytes());
    let css = read(&public.join("styles.css"))?;
    let css_name = hashed("styles", "css", &css);

    files.push(Shipped {
        url: wasm_name,
        bytes: wasm,
    });
    files.push(Shipped {
        url: glue_name,
        bytes: glue,
    });
    files.push(Shipped {
        url: boot_name.clone(),
        bytes: boot.into_bytes(),
    });
    files.push(Shipped {
        url: css_name.clone(),
        bytes: css,
    });
    collect_dir(&public.join("icons"), "icons/", &mut files)?;
    files.push(Shipped {
        url: "manifest.json".into(),
        bytes: read(&root.join("manifest.json"))?,
    });

    let version = env!("CARGO_PKG_VERSION");
    let index = replace_all(
        &read_text(&public.join("index.html"))?,
        &[
            ("__BOOT_JS__", &boot_name),
            ("__STYLES_CSS__", &css_name),
            ("__BUILD_ID__", build_id),
            ("__VERSION__", version),
        ],
    )?;
    files.push(Shipped {
        url: "index.html".into(),
        bytes: index.into_bytes(),
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
    });

    for f in &files {
        let path = out.join(&f.url);
        if let Some(dir) = path.parent() {
            std::fs::create_dir_all(dir).map_err(|e| format!("cannot create {}: {e}", dir.display()))?;
        }
        std::fs::write(&path, &f.bytes).map_err(|e| format!("cannot write {}: {e}", path.display()))?;
    }
    Ok(files)
}
