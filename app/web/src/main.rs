//! The wasm entry point: everything lives in the library so tests can import it.
fn main() {
    lensplane_web::start();
}
