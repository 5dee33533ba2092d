//! A small local static server: the built folder, route fallback to
//! index.html, no-cache for the worker and the page, long cache for hashed
//! files, gzip for text and wasm when the browser accepts it (as any real
//! host would send them, so a throttled first visit measures honest bytes).

use flate2::{write::GzEncoder, Compression};
use std::collections::HashMap;
use std::io::Write;
use std::path::{Component, Path, PathBuf};
use std::time::SystemTime;
use tiny_http::{Header, Request, Response, Server};

/// The same policy the page carries in its meta tag, plus what only a header can say.
pub const CSP: &str = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; \
img-src 'self' data: blob:; font-src 'self'; connect-src 'self'; manifest-src 'self'; worker-src 'self'; \
object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

fn content_type(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()).unwrap_or("") {
        "html" => "text/html; charset=utf-8",
        "js" => "text/javascript; charset=utf-8",
        "wasm" => "application/wasm",
        "css" => "text/css; charset=utf-8",
        "json" if path.file_name().is_some_and(|n| n == "manifest.json") => "application/manifest+json",
        "json" => "application/json",
        "png" => "image/png",
        "svg" => "image/svg+xml",
        "ico" => "image/x-icon",
        "txt" => "text/plain; charset=utf-8",
        _ => "application/octet-stream",
    }
}

/// Whether a response of this type is worth compressing (images are already).
fn compressible(content_type: &str) -> bool {
    !content_type.starts_with("image/png") && content_type != "application/octet-stream"
}

fn accepts_gzip(request: &Request) -> bool {
    request.headers().iter().any(|h| {
        h.field.equiv("Accept-Encoding")
            && h.value
                .as_str()
                .split(',')
                .any(|v| v.split(';').next().unwrap_or("").trim() == "gzip")
    })
}

/// Gzip bodies by file, kept while the file is unchanged (level 9, as the size report counts).
#[derive(Default)]
struct Gzipped(HashMap<PathBuf, (Option<SystemTime>, Vec<u8>)>);

impl Gzipped {
    fn get(&mut self, file: &Path, bytes: &[u8]) -> Vec<u8> {
        let modified = std::fs::metadata(file).and_then(|m| m.modified()).ok();
        if let Some((when, body)) = self.0.get(file) {
            if *when == modified && modified.is_some() {
                return body.clone();
            }
        }
        let mut enc = GzEncoder::new(Vec::new(), Compression::best());
        enc.write_all(bytes).expect("writing to memory");
        let body = enc.finish().expect("writing to memory");
        self.0.insert(file.to_path_buf(), (modified, body.clone()));
        body
    }
}

/// Whether a file name carries a content hash (`name-0123456789.ext`).
fn is_hashed(path: &Path) -> bool {
    let stem = path.file_stem().and_then(|s| s.to_str()).unwrap_or("");
    stem.rsplit_once('-')
        .is_some_and(|(_, h)| h.len() == 10 && h.bytes().all(|b| b.is_ascii_hexdigit()))
}

/// Maps a request path to a file in `dir`, refusing anything that climbs out.
fn resolve(dir: &Path, prefix: &str, url: &str) -> Option<PathBuf> {
    let path = url.split(['?', '#']).next().unwrap_or("");
    let rest = path
        .strip_prefix(prefix)
        .or_else(|| (path.to_string() + "/" == prefix).then_some(""))?;
    let rest = percent_encoding::percent_decode_str(rest).decode_utf8_lossy();
    let rel = Path::new(rest.as_ref());
    if rel.components().any(|c| !matches!(c, Component::Normal(_))) {
        return None;
    }
    let file = dir.join(rel);
    if file.is_file() {
        return Some(file);
    }
    // A route of the app (no file extension): the page handles it.
    if rel.extension().is_none() {
        return Some(dir.join("index.html"));
    }
    None
}

pub fn serve(dir: &Path, port: u16, prefix: &str) -> Result<(), String> {
    if !dir.join("index.html").is_file() {
        return Err(format!(
            "{} has no index.html; run `lensplane build` first",
            dir.display()
        ));
    }
    let server = Server::http(("127.0.0.1", port)).map_err(|e| format!("cannot listen on 127.0.0.1:{port}: {e}"))?;
    let actual = server.server_addr().to_ip().map(|a| a.port()).unwrap_or(port);
    println!("Lensplane is served at http://127.0.0.1:{actual}{prefix}  (Ctrl-C stops it)");
    // Several threads answer at once: one slow reader (a preload the page has
    // not consumed yet) must not hold back the page's other files. A page
    // opens up to six connections, and a deep link to a lazy destination
    // asks for a dozen files at once. With four threads a first visit now
    // and then never finished in the browser tests (the cause was not pinned
    // down; more threads cost nothing here).
    let server = std::sync::Arc::new(server);
    let gzipped = std::sync::Arc::new(std::sync::Mutex::new(Gzipped::default()));
    let threads: Vec<_> = (0..16)
        .map(|_| {
            let (server, gzipped, dir, prefix) =
                (server.clone(), gzipped.clone(), dir.to_path_buf(), prefix.to_string());
            std::thread::spawn(move || {
                while let Ok(request) = server.recv() {
                    answer(request, &dir, &prefix, &gzipped);
                }
            })
        })
        .collect();
    for t in threads {
        let _ = t.join();
    }
    Ok(())
}

fn answer(request: Request, dir: &Path, prefix: &str, gzipped: &std::sync::Mutex<Gzipped>) {
    let url = request.url().to_string();
    let gzip = accepts_gzip(&request);
    let response = match resolve(dir, prefix, &url) {
        Some(file) => match std::fs::read(&file) {
            Ok(bytes) => {
                let cache = if is_hashed(&file) {
                    "public, max-age=31536000, immutable"
                } else {
                    "no-cache"
                };
                let kind = content_type(&file);
                let response = if gzip && compressible(kind) {
                    let body = gzipped.lock().map(|mut g| g.get(&file, &bytes)).unwrap_or_default();
                    Response::from_data(body).with_header(header("Content-Encoding", "gzip"))
                } else {
                    Response::from_data(bytes)
                };
                response
                    .with_header(header("Content-Type", kind))
                    .with_header(header("Cache-Control", cache))
                    .with_header(header("Vary", "Accept-Encoding"))
            }
            Err(_) => Response::from_string("not found").with_status_code(404),
        },
        None => Response::from_string("not found").with_status_code(404),
    };
    let response = response
        .with_header(header("Content-Security-Policy", CSP))
        .with_header(header("X-Content-Type-Options", "nosniff"))
        .with_header(header("Referrer-Policy", "no-referrer"));
    let _ = request.respond(response);
}

fn header(name: &str, value: &str) -> Header {
    Header::from_bytes(name.as_bytes(), value.as_bytes()).expect("static header is valid")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hashed_names_are_recognised() {
        assert!(is_hashed(Path::new("lensplane-0a1b2c3d4e.wasm")));
        assert!(!is_hashed(Path::new("sw.js")));
        assert!(!is_hashed(Path::new("icon-192.png")));
    }

    #[test]
    fn text_and_wasm_are_compressed_images_are_not() {
        assert!(compressible(content_type(Path::new("lensplane-0a1b2c3d4e.wasm"))));
        assert!(compressible(content_type(Path::new("index.html"))));
        assert!(compressible(content_type(Path::new("icons/icon.svg"))));
        assert!(!compressible(content_type(Path::new("icons/icon-192.png"))));
    }

    #[test]
    fn gzip_bodies_decode_to_the_file() {
        let dir = std::env::temp_dir().join(format!("lensplane-gzip-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let file = dir.join("a.js");
        let text = "export const a = 1;\n".repeat(200);
        std::fs::write(&file, &text).unwrap();
        let body = Gzipped::default().get(&file, text.as_bytes());
        assert!(body.len() < text.len() / 10);
        let mut out = String::new();
        std::io::Read::read_to_string(&mut flate2::read::GzDecoder::new(&body[..]), &mut out).unwrap();
        assert_eq!(out, text);
        let _ = std::fs::remove_dir_all(&dir);
    }

    #[test]
    fn paths_cannot_climb_out() {
        let dir = std::env::temp_dir();
        assert!(resolve(&dir, "/", "/../etc/passwd").is_none());
        assert!(resolve(&dir, "/", "/%2e%2e/etc/passwd").is_none());
        assert!(resolve(&dir, "/sub/", "/other/vertex").is_none());
    }

    #[test]
    fn routes_fall_back_to_the_page() {
        let dir = std::env::temp_dir();
        assert_eq!(resolve(&dir, "/", "/near?r=-2.00").unwrap(), dir.join("index.html"));
        assert_eq!(resolve(&dir, "/sub/", "/sub").unwrap(), dir.join("index.html"));
        assert!(resolve(&dir, "/", "/missing.js").is_none());
    }

    #[test]
    fn percent_escapes_decode_before_the_path_is_checked() {
        let dir = std::env::temp_dir().join(format!("lensplane-serve-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        std::fs::write(dir.join("a b.txt"), "x").unwrap();
        assert_eq!(resolve(&dir, "/", "/a%20b.txt").unwrap(), dir.join("a b.txt"));
        // An escaped climb out of the folder is refused like a plain one.
        assert!(resolve(&dir, "/", "/%2E%2E/%2E%2E/etc/passwd").is_none());
        assert!(resolve(&dir, "/", "/..%2F..%2Fetc%2Fpasswd").is_none());
        let _ = std::fs::remove_dir_all(&dir);
    }
}
