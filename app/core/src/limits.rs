//! Hard limits (errors) and sanity thresholds (warnings), in one place.
//! See the crate documentation, "Limits".

/// Largest sphere accepted as input, dioptres.
pub const SPHERE_LIMIT: f64 = 30.0;
/// Largest cylinder (either sign) accepted as input, dioptres.
pub const CYLINDER_LIMIT: f64 = 10.0;
/// Sphere beyond this draws a warning.
pub const SPHERE_WARN: f64 = 20.0;
/// Cylinder beyond this draws a warning.
pub const CYLINDER_WARN: f64 = 6.0;
/// Largest vertex distance, mm.
pub const VERTEX_MAX_MM: f64 = 30.0;
/// Typed vertex distances under this (but not 0) are questioned, mm.
pub const VERTEX_SHORT_MM: f64 = 3.0;
/// Usual spectacle vertex range, mm (outside: a warning).
pub const VERTEX_USUAL_MM: (f64, f64) = (8.0, 20.0);
/// Reading distance range, cm.
pub const READING_CM: (f64, f64) = (10.0, 100.0);
/// Age range, years.
pub const AGE_YEARS: (u8, u8) = (1, 110);
/// Largest add accepted, dioptres.
pub const ADD_MAX: f64 = 4.0;
/// Any meridian beyond this: measure the vertex distance.
pub const MEASURE_VERTEX_ABOVE: f64 = 4.0;
/// A computed meridian beyond this means the far point sits (practically)
/// at the new lens plane: reported as an error, not a number.
pub const RESULT_LIMIT: f64 = 100.0;
/// Centimetres per inch.
pub const CM_PER_INCH: f64 = 2.54;
