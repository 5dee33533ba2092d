#!/usr/bin/env bash
# Runs every Lensplane test on a fresh machine: native Rust tests, then the
# browser tests in Debian's headless Chromium. Installs what it needs from the
# package registries only (Debian's chromium, npm packages from the lockfile,
# the wasm32 target through rustup). Ends with one line: "N passed, N failed".
set -uo pipefail
cd "$(dirname "$0")/.."
ROOT=$(pwd)
LOG=$(mktemp -d)

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

if ! command -v "${CHROMIUM:-chromium}" >/dev/null 2>&1; then
  echo "== installing Debian's chromium"
  as_root apt-get update -qq && as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null || { echo "cannot install chromium"; exit 1; }
fi
echo "== npm packages (tests/package-lock.json)"
(cd tests && npm ci --no-audit --no-fund) || { echo "npm ci failed"; exit 1; }

echo "== native tests (core and web crates)"
cargo test --workspace --exclude lensplane-tool --locked 2>&1 | tee "$LOG/cargo.txt"
cargo_status=${PIPESTATUS[0]}

# Formatting (rustfmt.toml), when the toolchain has rustfmt: it cannot be fetched from a registry.
if cargo fmt --version >/dev/null 2>&1; then
  echo "== formatting (cargo fmt --check)"
  cargo fmt --all --check >/dev/null || { echo "formatting differs from rustfmt.toml: run cargo fmt --all"; cargo_status=1; }
else
  echo "== formatting not checked: this toolchain has no rustfmt"
fi

echo "== the build program (release: its tests reuse the build it needs anyway)"
cargo build --release --locked -p lensplane-tool || exit 1
cargo test --release --locked -p lensplane-tool 2>&1 | tee -a "$LOG/cargo.txt"
[ "${PIPESTATUS[0]}" = 0 ] || cargo_status=1

echo "== building the app for the browser tests"
./target/release/lensplane build --out "$ROOT/target/browser-dist" --build-id test-run || exit 1

echo "== browser tests (node --test, headless chromium)"
(cd tests && LENSPLANE_DIST="$ROOT/target/browser-dist" node --test --test-concurrency=1 --test-reporter=spec browser/) 2>&1 | tee "$LOG/node.txt"
node_status=${PIPESTATUS[0]}

# One closing line over both runners.
cargo_pass=$(grep -oE 'test result: [a-zA-Z]+\. [0-9]+ passed' "$LOG/cargo.txt" | grep -oE '[0-9]+ passed' | awk '{s+=$1} END {print s+0}')
cargo_fail=$(grep -oE '[0-9]+ failed;' "$LOG/cargo.txt" | awk '{s+=$1} END {print s+0}')
node_pass=$(grep -E '^ℹ pass [0-9]+' "$LOG/node.txt" | awk '{s+=$3} END {print s+0}')
node_fail=$(grep -E '^ℹ fail [0-9]+' "$LOG/node.txt" | awk '{s+=$3} END {print s+0}')
[ "$cargo_status" = 0 ] || [ "$cargo_fail" -gt 0 ] || cargo_fail=1
[ "$node_status" = 0 ] || [ "$node_fail" -gt 0 ] || node_fail=1
echo "native: $cargo_pass passed, $cargo_fail failed; browser: $node_pass passed, $node_fail failed"
echo "$((cargo_pass + node_pass)) passed, $((cargo_fail + node_fail)) failed"
[ "$cargo_status" = 0 ] && [ "$node_status" = 0 ]
