//! Lensplane's computation core (skeleton; see issue 3).
#![forbid(unsafe_code)]
