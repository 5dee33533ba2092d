//! # Lensplane core
//!
//! The computation core of Lensplane: moving spectacle and contact-lens
//! prescriptions between optical planes (vertex compensation), spherical
//! equivalents and spherical substitutes, rounding to orderable powers, toric
//! contact-lens mapping, near (add) effectivity, over-refraction (a worn lens
//! combined with what is found over it) and image size (spectacle against
//! contact-lens magnification). Pure functions, no I/O,
//! no web dependencies, no `unsafe`.
//!
//! **Results are starting points, never a prescription**: confirm by
//! over-refraction and acuity, and defer to local regulations and licensed
//! practice. [`cautions_for`] gives each page its standing cautions.
//!
//! ## The model
//!
//! * **Thin lenses in air.** Every lens is a thin lens at one plane; no tear
//!   lens, rigid-lens astigmatism or flexure; toric rotation only as observed
//!   and entered on the over-refraction page.
//! * **The eye's reference plane is the corneal vertex.** "At the eye" means
//!   at the cornea, where a contact lens sits ([`VertexDistance::CORNEA`],
//!   0 mm). The eye's principal point lies ~1.35 mm further in; using it
//!   would change ocular figures by only ~0.1–0.2 D at ±10 D.
//! * **Signs.** Light travels left to right. Powers and vergences are in
//!   dioptres (1/m); converging is plus. A real near object has negative
//!   vergence (L = −1/distance). Cylinders may be minus or plus form;
//!   axes are 1–180 in ISO 8429 notation (180, never 0).
//! * **Vertex compensation** keeps the far point: F' = F / (1 − δ·F) with
//!   δ = d_from − d_to in metres, positive when the correction moves toward
//!   the eye (which needs more plus). Cylinders: each principal meridian on
//!   its own ([`Rx::meridians`]), then recombined; never the cylinder alone.
//! * **Near**: the vergence chain through the correction ([`near_figures`]),
//!   per meridian, never the V(F + A) − V(F) shortcut.
//! * **Astigmatic residuals** are power-vector differences (Thibos, Wheeler
//!   & Horner 1997), which handles obliquely crossed cylinders.
//! * **Lenses at one plane add as dioptric power matrices** (Harris;
//!   Keating), never sphere to sphere and cylinder to cylinder; a matrix
//!   travels toward the eye as L·(I − dL)⁻¹ ([`PowerMatrix::moved`]).
//! * **Spectacle magnification** is the thin-lens power factor
//!   1 / (1 − hF), h = vertex distance + [`ENTRANCE_PUPIL_MM`], times the
//!   shape factor when the lens form is known (Bennett & Rabbetts).
//!
//! ## Units at the edges
//!
//! Vertex distances in **mm** ([`VertexDistance::from_mm`]), reading
//! distances in **cm** or **inches** ([`ReadingDistance::from_cm`],
//! [`ReadingDistance::from_inches`]), powers, adds and accommodation in
//! **D**, ages in whole years. Formulas take metres; conversion happens in
//! those types only.
//!
//! ## Where to find things
//!
//! | concern | entry points | file |
//! |---|---|---|
//! | prescription, transposition | [`Rx`] | `rx.rs` |
//! | principal meridians | [`PowerCross`], [`Meridian`] | `meridians.rs` |
//! | power vectors | [`PowerVector`] | `vectors.rs` |
//! | dioptric power matrices | [`PowerMatrix`], [`PrincipalPowers`] | `power_matrix.rs` |
//! | decimal numbers in text (no std float parser: size) | [`read_decimal`] | `decimal.rs` |
//! | parsing typed text (a token cursor: `eat`, `peek`, `expect_end`) | [`parse_rx`], [`Rx::from_fields`], [`parse_sphere_field`], [`parse_cylinder_field`], [`parse_axis_field`], [`parse_vertex_mm`], [`parse_reading_distance`], [`parse_reading_inches`], [`parse_add`], [`parse_age`] | `parse.rs`, `lex.rs`, `cursor.rs` |
//! | trade notation out | `Display for Rx`, [`fmt_axis`], [`fmt_power`], [`fmt_sphere`], [`fmt_number`], [`fmt_dioptres`], [`fmt_length`] | `format.rs` |
//! | vertex | [`compensate`], [`compensate_power`], [`effective_power`] | `vertex.rs` |
//! | rounding, ladders, residuals | [`TieRule`], [`Ladder`], [`order_lens`], [`OrderSettings`] | `rounding.rs` |
//! | toric contact lenses | [`choose_toric`], [`ToricSettings`] | `toric.rs` |
//! | the one lens to order, and its alternatives | [`recommend`], [`Recommendation`] | `recommend.rs` |
//! | spherical equivalent, substitutes | [`spherical_equivalent_at`], [`assess_substitute`] | `equivalent.rs` |
//! | typed substitute limits | [`parse_cylinder_limit`], [`parse_ratio_limit`], [`SubstituteSettings::from_texts`] | `settings_text.rs` |
//! | near | [`near_figures`], [`NearGeometry`] | `near.rs` |
//! | over-refraction chain, "left add, right subtract" | [`combine_over_refraction`], [`worn_on_eye`], [`lars_order`] | `overrefraction.rs` |
//! | toric rotation, its parsing and words | [`Rotation`], [`RotationDirection`], [`parse_rotation`], [`parse_rotation_amount`] | `rotation.rs` |
//! | spectacle magnification | [`meridian_size`], [`power_factor`], [`shape_factor`], [`ENTRANCE_PUPIL_MM`] | `magnification.rs` |
//! | spectacle lens form | [`LensForm`], [`parse_front_surface`], [`parse_thickness_mm`], [`parse_index`] | `lens_form.rs` |
//! | percentages out | [`fmt_percent`], [`fmt_percent_size`] | `percent.rs` |
//! | amplitude by age | [`hofstetter`], [`tentative_add`] | `amplitude.rs` |
//! | warnings beside a result | [`Warning`], [`rx_warnings`], [`vertex_warnings`] | `warnings.rs` |
//! | standing cautions of a page | [`cautions_for`], [`Caution`], [`Calculation`] | `cautions.rs` |
//! | limits (checks and their words) | [`limits::Limit`], [`limits::SPHERE`] … | `limits.rs` |
//! | ± control and steppers of the entry form | [`toggle_sign`], [`step_text`] | `editing.rs` |
//! | checked quantities | [`VertexDistance`], [`ReadingDistance`], [`Age`], [`Add`], [`EyePair`] | `units.rs` |
//! | the one error type | [`Error`], [`Field`] | `error.rs` |
//! | panel reports | [`vertex_report`], [`equivalent_report`], [`near_report`], [`over_refraction_report`], [`image_size_report`], [`compare_image_sizes`] | `report_*.rs` |
//! | received-lens tolerance tables (ANSI Z80.1-2015, as data) | [`tolerances::Table`], [`tolerances::SPHERE_SV`] …, [`LensType`] | `tolerances.rs` |
//! | lens check: received lens against its order | [`lens_check`], [`LensCheckInput`], [`LensCheckReport`], [`parse_measured_rx`], [`parse_measured_add`], [`axis_deviation`] | `lens_check.rs` |
//! | printable vertex conversion chart | [`parse_chart`], [`ChartSettings`], [`Chart`], [`Chart::rows_for`], [`Chart::csv`] | `chart.rs` |
//!
//! The UI calls one report function per eye and panel and displays what it
//! returns; it does no arithmetic, not even rounding for display (use the
//! `fmt_*` helpers and `Display`).
//!
//! ## Limits
//!
//! Hard limits (errors): sphere ±30 D, cylinder up to 10 D, axis 1–180,
//! vertex 0–30 mm, reading distance 10–100 cm, age 1–110, add 0 to +4.00,
//! toric rotation 0–90° either way, the over-refraction at or in front of the
//! worn lens, and a spectacle lens form of front surface 0.00 to +25.00,
//! centre thickness 0.5–20 mm, index 1.40–2.00.
//! Warnings: a meridian beyond ±20 D, cylinder above 6 D, a spectacle vertex
//! outside 8–20 mm, any meridian beyond ±4 D (measure the vertex distance),
//! a change below a quarter step, off-step input, contact-lens powers outside
//! the stock range, a rotation above 30° or an unstable lens (a refit is
//! usually better), an over-refraction with more cylinder than the worn lens
//! or a meridian beyond ±4 D (check the fit and the refraction). Image-size
//! differences between the eyes are read against about 3–5 % (common
//! practice). Within the hard limits no function returns NaN or
//! infinity: where the far point lies at (or practically at) the new lens
//! plane the result is an [`Error`] (a chart row says "no finite lens").
//!
//! Lens check: a measured add 0 to +5.00 (orders stop at +4.00). Chart:
//! power sizes 0–30 D (the sphere limit), a step of 0.25–30 D, every figure a
//! whole number of quarter dioptres, at most 200 rows. Each is a
//! [`limits::Limit`] whose words are its message.
//!
//! ## Decisions where the notes were silent
//!
//! Each is tested in `tests/decisions.rs`; 14–19 in `tests/overrefraction.rs`,
//! 20–24 in `tests/image_size.rs`, 25–32 in `tests/lens_check.rs` and 33–38
//! in `tests/chart.rs`.
//!
//! 1. **Singular moves.** A compensated meridian beyond ±100 D is reported as
//!    an error ("no finite lens…"), as is 1 − δF = 0 exactly. Within the
//!    input limits this also covers every move that would put the far point
//!    between the old and new planes.
//! 2. **Spherical equivalent at another plane**: meridians compensated first,
//!    then S + C/2 (differs from the other order by < 0.01 D at −8/−2).
//! 3. **Display rounding** is half away from zero on the decimal value
//!    (2.675 → 2.68), separate from order rounding, which uses the explicit
//!    [`TieRule`] (default toward plus). Zero prints `0.00` ([`fmt_power`])
//!    or `plano` (sphere); a cylinder that shows as 0.00 prints as `DS`;
//!    a plano spherical prescription prints `plano`. Axes print with three
//!    digits (`×005`, `×090`), as orders are written. Every figure, in
//!    results and in prose alike, uses the ASCII `-` (one minus style). A
//!    non-finite figure (never produced within the limits) would print `—`,
//!    never `0.00`.
//! 4. **Rounding per meridian** is what reports order; sphere-and-cylinder
//!    rounding ([`round_separately`]) is available only for comparison.
//! 5. **Toric offer.** Shown when the target is the cornea and the cylinder
//!    there rounds (ties to the smaller) to at least the smallest available
//!    toric cylinder. Nearest cylinder, ties to the smaller; axis to the
//!    nearest step, exact half steps up (5° → 10°), 0 → 180.
//! 6. **Substitute verdict.** Both thresholds (cylinder, cylinder:sphere in
//!    minus-cylinder form) met → suitable; one → borderline; neither →
//!    unsuitable. Oblique (31–59°, 121–149°) and against-the-rule (60–120°)
//!    cylinders get the lower limit (default 0.50 D). Mixed astigmatism
//!    (meridians of opposite sign, each ≥ 0.125 D from zero) → unsuitable.
//! 7. **Near summary figure** is computed for the spherical equivalent of the
//!    distance prescription taken as a sphere; the per-meridian figures are
//!    given beside it. The orderable near prescription is the orderable
//!    distance prescription plus the rounded summary add.
//! 8. **Tentative add** is given from Hofstetter's minimum (conservative) and
//!    average amplitudes; the age formulas are flagged as least reliable from
//!    60 and under 10.
//! 9. **Typed input.** A bare third number after a sphero-cylinder is read
//!    as the axis (with a notice); a zero cylinder needs no axis (a given axis
//!    is ignored with a notice); an axis without a cylinder is an error.
//!    Implied-decimal suggestions are offered only when they land on a quarter
//!    step within ±20 D (sphere) or ±6 D (cylinder). A bare reading distance
//!    is taken as cm only from 20 to 100 (10–19 could be inches; under 10
//!    could be metres); vertex distances typed in cm or m are converted with a
//!    notice, bare ones under 3 mm are questioned.
//! 10. **Adds** run from 0 (no add) to +4.00 D; higher (low-vision) adds are
//!     out of scope.
//! 11. **Reading distance "from the eye"** means from the corneal vertex; the
//!     object is then (distance − vertex) from the spectacle lens.
//! 12. **Vertex warning sensitivity**: the "measure the vertex distance"
//!     warning states what a 2 mm error in the spectacle distance would change.
//! 13. **Input limits are for input.** The hard limits apply to the sphere
//!     and cylinder as typed (in the form typed). Results may exceed them
//!     (+20.00 at 20 mm is +33.33 at the cornea; −25.00 −8.00 is −33.00
//!     +8.00 in plus-cylinder form): they print, but are not accepted back as
//!     input.
//! 14. **Over-refraction planes.** The over-refraction is found at or in
//!     front of the worn lens (`at` ≥ `worn`), else an error. The chain
//!     always passes the cornea (the ocular refraction is reported), so where
//!     that exceeds ±100 D the report is an error even when the target is the
//!     worn lens's own plane (only with meridians far beyond ±20 D).
//! 15. **Toric rotation.** Signed whole degrees, positive clockwise as the
//!     examiner sees it (to the examiner's left); 0–90 either way (beyond 90°
//!     a cylinder turned one way is one turned less the other way), a warning
//!     above 30°. It is used only for a contact lens at the cornea with a
//!     cylinder; for spectacles or a spherical lens it is ignored with a
//!     warning (as an axis is for a zero cylinder, decision 9). The order is
//!     compensated (left add, right subtract) only when a contact lens is
//!     ordered; for spectacles the worn lens is taken as it sits. The
//!     compensated exact power is what [`recommend`] receives, so the toric
//!     axis step applies to the axis as labelled; what a lens leaves
//!     uncorrected is the same on the eye. "Unstable" warns whenever the worn
//!     lens is a contact lens, rotation or not.
//! 16. **Rigid lenses are refused**, not approximated: an error at
//!     [`Field::LensType`] and no figures, since the model has no tear lens.
//! 17. **Over-refraction warnings.** "More cylinder than the worn lens"
//!     compares magnitudes, so over a spherical lens any cylinder counts;
//!     "beyond ±4 D" looks at the over-refraction's meridians as typed.
//! 18. **Back from a matrix.** Closed-form eigen-decomposition; the exact
//!     axis lies in (0, 180] (within 1e-9° of 0 it is 180) and is reported
//!     beside the prescription; the whole-degree axis rounds half up,
//!     0 → 180; a cylinder under 1e-9 D is none (axis 180).
//! 19. **What changed** is new lens − worn lens, both at the target plane and
//!     in the frame of the order (as labelled when the rotation is
//!     compensated, as on the eye otherwise), along the new lens's principal
//!     meridians and as a power vector; + means more plus.
//! 20. **Image size per eye.** The 3 mm entrance pupil depth is a named
//!     constant ([`ENTRANCE_PUPIL_MM`], from memory). A contact lens has no
//!     shape factor. The change to contact lenses includes the spectacle
//!     shape factor when the lens form is given (so it equals −d·F only
//!     without one). The spectacle vertex distance must be above 0.
//! 21. **Between the eyes** the difference is the ratio of the two
//!     magnifications − 1, larger over smaller, with which eye is larger:
//!     this is how the notes' 5.9 % for R −1.00 / L −5.00 arises (subtracting
//!     the percentages gives 5.5 %). The eyes are compared in the 180 and 090
//!     meridians, an oblique cylinder by its power in that meridian,
//!     S + C·sin²(θ − α). The tolerance reading uses the figure as shown (one
//!     decimal): under 3.0 % usual, 3.0–5.0 % may not be tolerated, above
//!     5.0 % often not.
//! 22. **Percentages** print with one decimal, a space before `%` (as `D`),
//!     half away from zero: a change with its sign (`+13.6 %`, `-9.6 %`,
//!     `0.0 %`), a difference between the eyes without (`5.9 %`).
//! 23. **Lens form** (front surface 0.00 to +25.00, centre thickness
//!     0.5–20 mm, index 1.40–2.00) is all three fields or none; an index that
//!     lost its decimal point (`16`) is refused with the reading it may mean.
//! 24. **Cautions.** The over-refraction page has its own model caution
//!     instead of the general thin-lens one, which says "no toric rotation".
//! 25. **"Sphere meridian"** (lens check) is read, as the notes put it "in the
//!     minus-cylinder convention", as the sphere of the minus-cylinder form:
//!     the algebraically most plus principal meridian. Order and reading are
//!     both transposed to minus-cylinder form before comparing, so either
//!     form typed gives the same check; the cylinder is compared as the
//!     minus cylinder (a negative deviation is more cylinder than ordered).
//! 26. **Judged as shown.** Every power is compared in whole hundredths of a
//!     dioptre, each value rounded as it prints (two decimals, half away
//!     from zero), and axes in whole degrees; deviation = measured − ordered.
//!     A deviation equal to the tolerance is within. Integer arithmetic: no
//!     epsilon, no floating-point edge. Bands are chosen by the **ordered**
//!     value's size: a band covers sizes above the previous edge up to and
//!     including its own ("up to 2.00" includes 2.00; 2.01 is "over 2.00").
//! 27. **Percentage tolerances** are p % of the ordered size, rounded down
//!     to a whole hundredth (2 % of 8.00 = 0.16; 2 % of 6.75 = 0.135 → 0.13).
//!     For readings in hundredths this judges exactly as the unrounded
//!     percentage; the words show both figures when they differ. The
//!     standard's steps are kept literally even where a percentage band
//!     starts below the fixed band before it (progressive cylinder over 3.50:
//!     5 % of 3.51 is 0.17, against 0.18 up to 3.50).
//! 28. **Axis.** Deviation measured − ordered the short way round, signed,
//!     −89° to +90° (+: the measured axis is at a larger ISO 8429 angle,
//!     counter-clockwise, wrapping through 180); compared by its size. Not
//!     checked for a spherical order, for an ordered cylinder under 0.12 D
//!     (no tolerance defined), or when the reading has no cylinder (no axis
//!     to read; the cylinder item then fails unless within its tolerance).
//! 29. **Adds in a lens check.** The ordered add keeps its limit (0 to
//!     +4.00, decision 10), so the "over +4.00: ±0.18" row is data reached
//!     by the table alone; the measured add is accepted to +5.00 so an
//!     over-strong lens gets a verdict. An ordered add needs a measured add
//!     (else "measured add is empty"); with no add ordered the add is not
//!     checked, whatever was read. The add table is the same for both lens
//!     types.
//! 30. **Overall verdict** per eye: outside tolerance when any judged item
//!     is, within otherwise; items not checked do not count. Prism and
//!     centration are never checked ([`PRISM_NOT_CHECKED`]).
//! 31. **Lens type** link values `sv` (single vision or multifocal, the
//!     default when missing or empty) and `pal` (progressive), any case.
//! 32. **Readings** use the prescription notation; the off-step notice is
//!     dropped for them (focimeter readings are rarely on quarter steps).
//! 33. **Chart figures.** `min` and `max` are sizes (both signs listed; a
//!     typed sign is read as the size, with a notice); sizes and the step
//!     are whole numbers of quarter dioptres (the chart lists orderable
//!     spectacle powers); the step must lead from `min` to `max` exactly
//!     (the error offers the nearest highest powers that it reaches).
//! 34. **Chart rows.** Plano once (when `min` is 0), then the minus powers by
//!     size, then the plus powers. At most 200 rows ([`limits::CHART_ROWS`]):
//!     about four printed pages; the whole range in quarter steps (241 rows)
//!     belongs on the vertex panel, not a wall.
//! 35. **Chart rounding** is the vertex panel's, from
//!     [`OrderSettings::default`]: [`compensate_power`], then the ladder's
//!     round with its tie rule (toward plus). Ladder link values `cl`
//!     (contact-lens steps) and `spec` (spectacle quarter steps); missing or
//!     empty chooses as the vertex panel does (cornea → `cl`, else `spec`).
//! 36. **A row with no finite lens** (far point at, or practically at, the
//!     new plane) stays in the chart with its error; it shows
//!     "no finite lens" and "none", never a number.
//! 37. **Chart CSV**: RFC 4180 (commas, CRLF after every line), ASCII only,
//!     the header row then the rows' cells exactly as shown; no title line.
//! 38. **Highlighted rows** ([`Chart::rows_for`]) are the rows equal, to the
//!     hundredth, to a carried prescription's principal meridians taken at
//!     the chart's `from` plane; a meridian between rows has none.
#![forbid(unsafe_code)]
#![warn(missing_docs)]

mod amplitude;
mod cautions;
mod chart;
mod cursor;
mod decimal;
mod editing;
mod equivalent;
mod error;
mod format;
mod lens_check;
mod lens_form;
mod lex;
pub mod limits;
mod magnification;
mod meridians;
mod near;
mod overrefraction;
mod parse;
mod percent;
mod power_matrix;
mod recommend;
mod report_equivalent;
mod report_image_size;
mod report_near;
mod report_overrefraction;
mod report_vertex;
mod rotation;
mod rounding;
mod rx;
mod settings_text;
pub mod tolerances;
mod toric;
mod units;
mod vectors;
mod vertex;
mod warnings;

pub use amplitude::{amplitude_reliable, hofstetter, tentative_add, Amplitude, TentativeAdd};
pub use cautions::{cautions, cautions_for, Calculation, Caution, CautionKind, Scope};
pub use chart::{parse_chart, Chart, ChartQuery, ChartRow, ChartSection, ChartSettings, ChartValue};
pub use decimal::read_decimal;
pub use editing::{step_text, toggle_sign, StepKind};
pub use equivalent::{
    assess_substitute, spherical_equivalent_at, Orientation, SubstituteAssessment, SubstituteSettings, Verdict,
};
pub use error::{Error, Field};
pub use format::{fmt_axis, fmt_dioptres, fmt_length, fmt_number, fmt_power, fmt_sphere};
pub use lens_check::{
    axis_deviation, lens_check, parse_measured_add, parse_measured_rx, CheckItem, CheckVerdict, ItemCheck, ItemResult,
    Judgement, LensCheckInput, LensCheckReport, PRISM_NOT_CHECKED,
};
pub use lens_form::{parse_front_surface, parse_index, parse_thickness_mm, LensForm};
pub use magnification::{
    meridian_size, power_factor, shape_factor, MeridianSize, ANTERIOR_FOCAL_POINT_MM, ENTRANCE_PUPIL_MM,
};
pub use meridians::{Meridian, PowerCross};
pub use near::{near_figures, NearFigures, NearGeometry};
pub use overrefraction::{combine_over_refraction, lars_order, worn_on_eye, OverRefractionChain, OverRefractionPlanes};
pub use parse::{
    parse_add, parse_age, parse_axis_field, parse_cylinder_field, parse_reading_distance, parse_reading_inches,
    parse_rx, parse_sphere_field, parse_vertex_mm, Notice, NoticeKind, Parsed,
};
pub use percent::{fmt_factor, fmt_percent, fmt_percent_size};
pub use power_matrix::{PowerMatrix, PrincipalPowers};
pub use recommend::{recommend, Candidate, Leftover, LensKind, Recommendation};
pub use report_equivalent::{equivalent_report, EquivalentInput, EquivalentReport};
pub use report_image_size::{
    compare_image_sizes, image_size_report, ImageSizeComparison, ImageSizeInput, ImageSizeReport, MeridianDifference,
    Outline, OutlinePair, Tolerance, CONTACT_LENS_SHARE, SHAPE_FACTOR_LEFT_OUT, SPECTACLE_PERCENT_PER_DIOPTRE,
};
pub use report_near::{near_report, AmplitudeReport, NearInput, NearReport};
pub use report_overrefraction::{
    over_refraction_report, ContactLensKind, LensChange, OverRefractionInput, OverRefractionReport, RotationHandling,
    VectorCheck,
};
pub use report_vertex::{vertex_report, LadderKind, VertexInput, VertexReport};
pub use rotation::{parse_rotation, parse_rotation_amount, Rotation, RotationDirection};
pub use rounding::{
    is_on_step, order_lens, round_meridians, round_separately, round_to_step, Ladder, OrderSettings, OrderedLens,
    StockRange, TieRule,
};
pub use rx::Rx;
pub use settings_text::{parse_cylinder_limit, parse_ratio_limit};
pub use tolerances::LensType;
pub use toric::{choose_toric, round_axis, ToricChoice, ToricSettings};
pub use units::{Add, Age, Eye, EyePair, Measured, ReadingDistance, VertexDistance};
pub use vectors::PowerVector;
pub use vertex::{compensate, compensate_meridians, compensate_power, effective_power};
pub use warnings::{rx_warnings, vertex_warnings, Place, Warning, WarningKind};
