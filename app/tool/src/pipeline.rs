//! The build: wasm target → cargo (linked with relocations) → split at the lazy
//! destinations → wasm-bindgen on the main module → (wasm-opt on the main module
//! and every chunk, terser on the glue and the loader) → hashed static folder.

use crate::{assets, sizes, split, Options};
use std::path::{Path, PathBuf};
use std::process::Command;

const TARGET: &str = "wasm32-unknown-unknown";
/// Debian's wasm-opt 108 emits wasm that fails at start-up with current
/// wasm-bindgen output; npm's binaryen 132 is known good. Anything older than
/// this is skipped rather than trusted.
const MIN_WASM_OPT: u32 = 118;

pub fn build(root: &Path, opts: &Options) -> Result<(), String> {
    ensure_target()?;
    let raw = cargo_build(root)?;
    let staging = opts.out.with_extension("staging");
    let _ = std::fs::remove_dir_all(&staging);
    let bindgen_dir = staging.join("bindgen");
    let site = staging.join("site");
    std::fs::create_dir_all(&bindgen_dir).map_err(|e| format!("cannot create {}: {e}", bindgen_dir.display()))?;

    println!("lensplane: splitting the app at its lazy destinations (wasm_split_cli_support)");
    let parts = split::split(&raw, &staging.join("split"))?;
    for (name, stems) in &parts.needs {
        println!("lensplane:   {name}: {}", stems.join(" + "));
    }

    println!(
        "lensplane: generating bindings (wasm-bindgen {})",
        wasm_bindgen_version()
    );
    let mut bindgen = wasm_bindgen_cli_support::Bindgen::new();
    bindgen
        .input_path(&parts.main)
        .out_name("lensplane")
        .web(true)
        .map_err(|e| e.to_string())?
        // Without the default module path the page cannot find its wasm.
        .omit_default_module_path(false)
        .debug(false)
        // The chunks import the linker's exports (table, stack pointer, …) and
        // the functions by their raw names.
        .keep_lld_exports(true)
        .demangle(false)
        .keep_debug(std::env::var_os("LENSPLANE_NAMES").is_some())
        .typescript(false);
    bindgen
        .generate(&bindgen_dir)
        .map_err(|e| format!("wasm-bindgen failed: {e}"))?;

    let wasm_out = bindgen_dir.join("lensplane_bg.wasm");
    if let Some(dest) = std::env::var_os("LENSPLANE_NAMES") {
        let _ = std::fs::copy(&wasm_out, dest);
    }
    if opts.optimise {
        match find_wasm_opt(root) {
            Some(tool) => {
                for wasm in std::iter::once(&wasm_out).chain(&parts.chunks) {
                    optimise(&tool, wasm)?;
                }
            }
            None => println!(
                "lensplane: no working wasm-opt (npm binaryen ≥ {MIN_WASM_OPT}); shipping the unoptimised wasm"
            ),
        }
        let terser = root.join("tests/node_modules/.bin/terser");
        if terser.exists() {
            minify_js(&terser, &bindgen_dir.join("lensplane.js"))?;
            minify_js(&terser, &parts.loader)?;
            // boot.js too (−0.7 KB gzip of the landing load); assets.rs fills in its placeholders.
            let boot = bindgen_dir.join("boot.js");
            std::fs::copy(root.join("public/boot.js"), &boot).map_err(|e| format!("cannot copy boot.js: {e}"))?;
            minify_js(&terser, &boot)?;
        } else {
            println!("lensplane: no terser in tests/node_modules; shipping the glue unminified");
        }
    }

    let build_id = opts.build_id.clone().unwrap_or_else(|| default_build_id(root));
    let built = assets::assemble(root, &bindgen_dir, &parts, &site, &build_id)?;

    // Swap the finished folder in whole, so a running server never serves half a build.
    let old = opts.out.with_extension("old");
    let _ = std::fs::remove_dir_all(&old);
    if opts.out.exists() {
        std::fs::rename(&opts.out, &old).map_err(|e| format!("cannot move the old build aside: {e}"))?;
    }
    std::fs::rename(&site, &opts.out).map_err(|e| format!("cannot place the build at {}: {e}", opts.out.display()))?;
    let _ = std::fs::remove_dir_all(&old);
    let _ = std::fs::remove_dir_all(&staging);

    let report = sizes::report(&built, &build_id);
    let report_path = opts.out.with_extension("report.json");
    std::fs::write(&report_path, report).map_err(|e| format!("cannot write {}: {e}", report_path.display()))?;
    println!(
        "lensplane: built {} (build {build_id}); size report in {}",
        opts.out.display(),
        report_path.display()
    );
    Ok(())
}

fn wasm_bindgen_version() -> &'static str {
    // Kept equal to the `=` pin in Cargo.toml; the lockfile enforces the rest.
    "0.2.130"
}

fn run(cmd: &mut Command, what: &str) -> Result<(), String> {
    let status = cmd.status().map_err(|e| format!("cannot start {what}: {e}"))?;
    if status.success() {
        Ok(())
    } else {
        Err(format!("{what} failed ({status})"))
    }
}

fn ensure_target() -> Result<(), String> {
    let installed = Command::new("rustup").args(["target", "list", "--installed"]).output();
    match installed {
        Ok(out) if String::from_utf8_lossy(&out.stdout).lines().any(|l| l.trim() == TARGET) => Ok(()),
        Ok(_) => {
            println!("lensplane: adding the {TARGET} target with rustup");
            run(
                Command::new("rustup").args(["target", "add", TARGET]),
                "rustup target add",
            )
        }
        // No rustup: let cargo say whether the target's standard library is there.
        Err(_) => Ok(()),
    }
}

fn target_dir(root: &Path) -> PathBuf {
    std::env::var_os("CARGO_TARGET_DIR")
        .map(PathBuf::from)
        .map(|p| if p.is_relative() { root.join(p) } else { p })
        .unwrap_or_else(|| root.join("target"))
}

/// Compiles the app and links it with its relocations kept, which the splitter
/// needs. `cargo rustc` passes the flag to the final link only, so every
/// dependency is the same build a plain `cargo build` makes.
fn cargo_build(root: &Path) -> Result<PathBuf, String> {
    let cargo = std::env::var("CARGO").unwrap_or_else(|_| "cargo".into());
    println!("lensplane: compiling the app for {TARGET} (release, size-tuned, linked with relocations)");
    run(
        Command::new(cargo).current_dir(root).args([
            "rustc",
            "--release",
            "--locked",
            "--target",
            TARGET,
            "-p",
            "lensplane-web",
            "--bin",
            "lensplane-web",
            "--",
            "-C",
            "link-arg=--emit-relocs",
        ]),
        "cargo build of the app",
    )?;
    let wasm = target_dir(root).join(TARGET).join("release").join("lensplane-web.wasm");
    if wasm.exists() {
        Ok(wasm)
    } else {
        Err(format!("cargo finished but {} is missing", wasm.display()))
    }
}

fn wasm_opt_version(tool: &Path) -> Option<u32> {
    let out = Command::new(tool).arg("--version").output().ok()?;
    let text = String::from_utf8_lossy(&out.stdout);
    // "wasm-opt version 132 (version_132)"
    text.split_whitespace().nth(2)?.parse().ok()
}

fn find_wasm_opt(root: &Path) -> Option<PathBuf> {
    let local = root.join("tests/node_modules/.bin/wasm-opt");
    let complete = local.exists() && root.join("tests/node_modules/.bin/terser").exists();
    if !complete && root.join("tests/package-lock.json").exists() {
        println!("lensplane: installing npm packages in tests/ from the lockfile (for wasm-opt and terser)");
        let ok = Command::new("npm")
            .current_dir(root.join("tests"))
            .args(["ci", "--no-audit", "--no-fund"])
            .status()
            .map(|s| s.success())
            .unwrap_or(false);
        if !ok {
            println!("lensplane: npm ci did not succeed; continuing without wasm-opt");
        }
    }
    for candidate in [local, PathBuf::from("wasm-opt")] {
        match wasm_opt_version(&candidate) {
            Some(v) if v >= MIN_WASM_OPT => return Some(candidate),
            Some(v) => println!(
                "lensplane: skipping {} (version {v} < {MIN_WASM_OPT})",
                candidate.display()
            ),
            None => {}
        }
    }
    None
}

fn optimise(tool: &Path, wasm: &Path) -> Result<(), String> {
    let name = wasm
        .file_name()
        .map(|n| n.to_string_lossy().to_string())
        .unwrap_or_default();
    println!("lensplane: wasm-opt -Oz {name} with {}", tool.display());
    let tmp = wasm.with_extension("opt.wasm");
    run(
        Command::new(tool).arg(wasm).arg("-o").arg(&tmp).args([
            // Rust puts the stack first (1 MiB growing down to 0) and its data
            // above it, so the lowest 1 KiB is never addressed: binaryen may
            // fold constant addresses into load/store offsets (−0.9 KB gzip).
            "--low-memory-unused",
            // Twice: the second pass still finds work after the first (−0.3 KB gzip).
            "-Oz",
            "-Oz",
            // The features rustc enables by default for wasm32-unknown-unknown.
            "--enable-bulk-memory",
            "--enable-mutable-globals",
            "--enable-nontrapping-float-to-int",
            "--enable-sign-ext",
            "--enable-reference-types",
            "--enable-multivalue",
        ]),
        "wasm-opt",
    )?;
    std::fs::rename(&tmp, wasm).map_err(|e| e.to_string())
}

/// Minifies an ES module with npm's terser (the glue: about −2 KB gzip): its
/// exports (`default`, `initSync`, the classes, the loader's functions) and
/// the paths it imports keep their names.
fn minify_js(terser: &Path, glue: &Path) -> Result<(), String> {
    println!("lensplane: minifying {} with {}", glue.display(), terser.display());
    let tmp = glue.with_extension("min.js");
    run(
        Command::new(terser)
            .arg(glue)
            .arg("-o")
            .arg(&tmp)
            .args(["--module", "--compress", "passes=2", "--mangle"]),
        "terser",
    )?;
    std::fs::rename(&tmp, glue).map_err(|e| e.to_string())
}

fn default_build_id(root: &Path) -> String {
    if let Ok(id) = std::env::var("LENSPLANE_BUILD_ID") {
        return id;
    }
    let git = |args: &[&str]| {
        Command::new("git")
            .current_dir(root)
            .args(args)
            .output()
            .ok()
            .filter(|o| o.status.success())
            .map(|o| String::from_utf8_lossy(&o.stdout).trim().to_string())
    };
    match git(&["rev-parse", "--short=10", "HEAD"]) {
        Some(rev) if !rev.is_empty() => {
            let dirty = git(&["status", "--porcelain", "--untracked-files=no"]).is_some_and(|s| !s.is_empty());
            if dirty {
                format!("{rev}+local")
            } else {
                rev
            }
        }
        _ => "local".into(),
    }
}
