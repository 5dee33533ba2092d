//! `lensplane`: builds Lensplane's static folder and serves it locally.
//!
//! ```text
//! lensplane serve [--port 8080] [--out dist] [--no-build] [--prefix /sub/]
//! lensplane build [--out dist] [--build-id ID] [--no-opt]
//! ```
//!
//! The build needs nothing beyond the package registries: the wasm target comes
//! from rustup, the splitting at the lazy destinations from the
//! `wasm_split_cli_support` crate, the bindings from the `wasm-bindgen-cli-support`
//! crate pinned to the same version as `wasm-bindgen` in Cargo.lock, and the
//! optional size pass from npm's `binaryen` package (installed by `npm ci` in `tests/`).

mod assets;
mod css;
mod pipeline;
mod serve;
mod sizes;
mod split;

use std::path::PathBuf;
use std::process::ExitCode;

/// Options shared by both subcommands.
#[derive(Debug)]
struct Options {
    out: PathBuf,
    build_id: Option<String>,
    optimise: bool,
    build: bool,
    port: u16,
    prefix: String,
}

fn workspace_root() -> PathBuf {
    // app/tool -> workspace root
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("../..")
        .canonicalize()
        .expect("the workspace root exists")
}

fn usage() -> &'static str {
    "usage:\n  lensplane serve [--port N] [--out DIR] [--no-build] [--prefix /sub/]\n  lensplane build [--out DIR] [--build-id ID] [--no-opt]"
}

fn parse(args: &[String]) -> Result<(String, Options), String> {
    let root = workspace_root();
    let mut opts = Options {
        out: root.join("dist"),
        build_id: None,
        optimise: true,
        build: true,
        port: 8080,
        prefix: "/".into(),
    };
    let mut it = args.iter();
    let cmd = it.next().cloned().ok_or_else(|| usage().to_string())?;
    while let Some(a) = it.next() {
        let mut value = |name: &str| {
            it.next()
                .cloned()
                .ok_or_else(|| format!("{name} needs a value\n{}", usage()))
        };
        match a.as_str() {
            "--out" => opts.out = PathBuf::from(value("--out")?),
            "--build-id" => opts.build_id = Some(value("--build-id")?),
            "--no-opt" => opts.optimise = false,
            "--no-build" => opts.build = false,
            "--port" => {
                let v = value("--port")?;
                opts.port = v.parse().map_err(|_| format!("--port {v} is not a port number"))?;
            }
            "--prefix" => {
                let mut p = value("--prefix")?;
                if !p.starts_with('/') {
                    p.insert(0, '/');
                }
                if !p.ends_with('/') {
                    p.push('/');
                }
                opts.prefix = p;
            }
            other => return Err(format!("unknown option {other}\n{}", usage())),
        }
    }
    if opts.out.is_relative() {
        opts.out = std::env::current_dir().map_err(|e| e.to_string())?.join(&opts.out);
    }
    Ok((cmd, opts))
}

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let result = parse(&args).and_then(|(cmd, opts)| match cmd.as_str() {
        "build" => pipeline::build(&workspace_root(), &opts).map(|_| ()),
        "serve" => {
            if opts.build {
                pipeline::build(&workspace_root(), &opts)?;
            }
            serve::serve(&opts.out, opts.port, &opts.prefix)
        }
        "-h" | "--help" | "help" => {
            println!("{}", usage());
            Ok(())
        }
        other => Err(format!("unknown command {other}\n{}", usage())),
    });
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("lensplane: {e}");
            ExitCode::FAILURE
        }
    }
}
