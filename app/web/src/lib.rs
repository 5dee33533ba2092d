//! Lensplane's user interface.
