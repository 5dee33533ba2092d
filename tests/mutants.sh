#!/usr/bin/env bash
# Mutation testing of the core's formula modules with cargo-mutants (from
# crates.io: `cargo install cargo-mutants`). Each mutant (an operator flipped,
# a return value replaced…) is built and the core's unit and integration tests
# run against it; a mutant the tests do not catch is either killed by a new
# test or listed in DEVELOPERS.md ("Mutation testing") as equivalent, with
# the reason. Results land in mutants.out/ (ignored by git).
#
#   bash tests/mutants.sh              # every formula module
#   bash tests/mutants.sh --list       # only list the mutants
#   bash tests/mutants.sh -f app/core/src/vertex.rs   # one file (cargo-mutants flags pass through)
set -euo pipefail
cd "$(dirname "$0")/.."
command -v cargo-mutants >/dev/null 2>&1 || cargo install cargo-mutants --locked

# The formula modules: every figure a practitioner orders from passes through them.
FORMULAS=(
  vertex near equivalent toric rounding amplitude vectors meridians recommend
  power_matrix overrefraction report_overrefraction rotation
  magnification lens_form percent report_image_size
  tolerances lens_check chart
)
args=()
if ! printf '%s\n' "$@" | grep -qE '^(-f|--file)$'; then
  for f in "${FORMULAS[@]}"; do args+=(--file "app/core/src/$f.rs"); done
fi
# Unit and integration tests (doc tests check examples, not thresholds, and
# would triple the time per mutant).
# Fewer property-test cases per mutant keeps a run to minutes per file.
export PROPTEST_CASES="${PROPTEST_CASES:-64}"
# nextest when installed (`cargo install cargo-nextest`), cargo's own runner otherwise.
tool=cargo
command -v cargo-nextest >/dev/null 2>&1 && tool=nextest
exec cargo mutants --package lensplane-core --test-tool "$tool" --profile mutants --jobs "${MUTANTS_JOBS:-2}" \
  "${args[@]}" "$@"
