//! The near panel's entry point.

use crate::amplitude::{amplitude_reliable, hofstetter, tentative_add, Amplitude, TentativeAdd};
use crate::error::{Error, Field};
use crate::format::{fmt_number, fmt_power};
use crate::near::{near_figures, NearFigures, NearGeometry};
use crate::rounding::{round_meridians, round_to_step, OrderSettings};
use crate::warnings::{off_step, rx_warnings, vertex_warnings, warn, Warning, WarningKind};
use crate::{compensate, Add, Age, Measured, Meridian, PowerCross, ReadingDistance, Rx, VertexDistance};

/// What the near panel sends for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct NearInput {
    /// The distance prescription, worn at `spectacle_vertex`.
    pub rx: Rx,
    /// The spectacle add.
    pub add: Add,
    /// Vertex distance of the spectacles.
    pub spectacle_vertex: VertexDistance,
    /// Reading distance.
    pub reading: ReadingDistance,
    /// Measured from the spectacle plane or from the eye.
    pub measured: Measured,
    /// The new lens plane (0: contact lens).
    pub target: VertexDistance,
    /// The patient's age, if given.
    pub age: Option<Age>,
    /// Ladders and tie rule.
    pub settings: OrderSettings,
}

/// Amplitude by age and the tentative adds it suggests.
#[derive(Clone, Debug, PartialEq)]
pub struct AmplitudeReport {
    /// The age used.
    pub age: Age,
    /// Hofstetter's minimum / average / maximum.
    pub amplitude: Amplitude,
    /// Tentative add from the minimum amplitude (the conservative figure).
    pub tentative_from_minimum: TentativeAdd,
    /// Tentative add from the average amplitude.
    pub tentative_from_average: TentativeAdd,
    /// False at ages where the formulas are least reliable.
    pub reliable: bool,
}

/// Everything the near panel shows for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct NearReport {
    /// The distance prescription as entered.
    pub input: Rx,
    /// The spectacle add.
    pub add: f64,
    /// Dioptric demand of the reading distance as entered (100 / cm).
    pub demand: f64,
    /// Spectacle accommodation (−L, object vergence at the spectacle plane).
    pub spectacle_accommodation: f64,
    /// Per principal meridian (one entry when spherical, two otherwise).
    pub meridians: Vec<NearFigures>,
    /// The same figures for the spherical equivalent of the distance
    /// prescription (the summary a practitioner reads).
    pub equivalent: NearFigures,
    /// Exact equivalent add at the target plane (spherical-equivalent
    /// figure).
    pub add_at_target: f64,
    /// That add on quarter steps (tie rule from the settings).
    pub add_at_target_rounded: f64,
    /// add_at_target − spectacle add.
    pub add_change: f64,
    /// Distance prescription at the target plane, exact.
    pub distance_at_target: Rx,
    /// Distance prescription at the target plane, orderable (per meridian).
    pub distance_at_target_ordered: Rx,
    /// Near prescription at the target plane, exact (per meridian: distance
    /// power there + that meridian's equivalent add).
    pub near_at_target: Rx,
    /// Near prescription at the target plane, orderable: the orderable
    /// distance prescription plus the rounded add.
    pub near_at_target_ordered: Rx,
    /// With an age: amplitude and tentative adds.
    pub amplitude: Option<AmplitudeReport>,
    /// One line in plain words.
    pub summary: String,
    /// Warnings and cautions.
    pub warnings: Vec<Warning>,
}

fn kind_of_eye(se: f64) -> &'static str {
    if se <= -0.25 {
        "a myope"
    } else if se >= 0.25 {
        "a hyperope"
    } else {
        "a near-emmetrope"
    }
}

/// Compute the near panel for one eye.
///
/// ```
/// use lensplane_core::*;
/// let r = near_report(&NearInput {
///     rx: Rx::sphere_only(-6.0)?,
///     add: Add::new(2.5)?,
///     spectacle_vertex: VertexDistance::SPECTACLES,
///     reading: ReadingDistance::from_cm(40.0)?,
///     measured: Measured::FromLens,
///     target: VertexDistance::CORNEA,
///     age: Some(Age::new(50)?),
///     settings: OrderSettings::default(),
/// })?;
/// assert_eq!(fmt_number(r.equivalent.accommodation_spectacles), "2.12");
/// assert_eq!(fmt_number(r.equivalent.accommodation_target), "2.43");
/// assert_eq!(fmt_power(r.add_at_target), "+2.43");
/// assert_eq!(r.add_at_target_rounded, 2.5);
/// assert_eq!(r.near_at_target_ordered.to_string(), "-3.00 DS");
/// # Ok::<(), Error>(())
/// ```
pub fn near_report(input: &NearInput) -> Result<NearReport, Error> {
    let NearInput {
        rx,
        add,
        spectacle_vertex,
        reading,
        measured,
        target,
        age,
        settings,
    } = input;
    settings.validate()?;
    let tie = settings.tie;
    let g = NearGeometry {
        spectacle_vertex: *spectacle_vertex,
        target: *target,
        reading: *reading,
        measured: *measured,
    };
    let a = add.dioptres();
    // Spherical-equivalent summary first: its rounded add is the one ordered.
    let se = rx.spherical_equivalent();
    let exact_se = near_figures(se, a, &g, None)?;
    let add_rounded = round_to_step(exact_se.add_at_target, 0.25, tie);
    let equivalent = near_figures(se, a, &g, Some(add_rounded))?;
    let cross = rx.meridians();
    let mut per = vec![];
    for m in cross.both() {
        let mut f = near_figures(m.power, a, &g, Some(add_rounded))?;
        f.meridian = Some(m.axis);
        per.push(f);
    }
    let near_cross = PowerCross::raw(
        Meridian {
            power: per[0].near_power_at_target,
            axis: cross.first().axis,
        },
        Meridian {
            power: per[1].near_power_at_target,
            axis: cross.second().axis,
        },
    );
    if rx.is_spherical() {
        per.truncate(1);
    }
    let distance_at_target = compensate(rx, *spectacle_vertex, *target)?;
    let ladder = settings.ladder_for(*target);
    let ordered_cross = round_meridians(&distance_at_target.meridians(), &ladder, tie);
    let distance_ordered = ordered_cross.to_rx();
    let near_ordered = ordered_cross.map_powers(|p| p + add_rounded).to_rx();

    let mut warnings = rx_warnings(rx);
    warnings.extend(vertex_warnings(rx, *spectacle_vertex, *target));
    if let Some(message) = off_step(Field::Add, a) {
        warnings.push(warn(WarningKind::OffStep, Field::Add, message));
    }
    let amplitude = age.map(|age| {
        let amp = hofstetter(age);
        let demand = reading.demand();
        AmplitudeReport {
            age,
            amplitude: amp,
            tentative_from_minimum: tentative_add(demand, amp.minimum, tie),
            tentative_from_average: tentative_add(demand, amp.average, tie),
            reliable: amplitude_reliable(age),
        }
    });
    if let Some(amp) = &amplitude {
        if !amp.reliable {
            warnings.push(warn(
                WarningKind::AmplitudeUnreliable,
                Field::Age,
                format!("at age {} the age formulas are least reliable", amp.age.years()),
            ));
        }
        let low = tentative_add(reading.demand(), amp.amplitude.maximum, tie).half_reserve;
        let high = amp.tentative_from_minimum.half_reserve;
        if a < low - 0.25 || a > high + 0.25 {
            warnings.push(warn(
                WarningKind::AddDiffersFromAge,
                Field::Add,
                format!(
                    "the add {} is outside the age estimate ({} to {}, half in reserve): check the amplitude",
                    fmt_power(a),
                    fmt_power(low),
                    fmt_power(high)
                ),
            ));
        }
    }
    let summary = near_summary(se, a, *target, &equivalent);
    Ok(NearReport {
        input: *rx,
        add: a,
        demand: reading.demand(),
        spectacle_accommodation: -g.object_vergence_at_spectacles(),
        meridians: per,
        add_at_target: equivalent.add_at_target,
        add_at_target_rounded: add_rounded,
        add_change: equivalent.add_at_target - a,
        equivalent,
        distance_at_target,
        distance_at_target_ordered: distance_ordered,
        near_at_target: near_cross.to_rx(),
        near_at_target_ordered: near_ordered,
        amplitude,
        summary,
        warnings,
    })
}

fn near_summary(se: f64, add: f64, target: VertexDistance, f: &NearFigures) -> String {
    let who = kind_of_eye(se);
    let wearing = if target.is_cornea() {
        "in contact lenses".to_string()
    } else {
        format!("with the lens at {} mm", crate::format::fmt_length(target.mm()))
    };
    let diff = f.accommodation_target - f.accommodation_spectacles;
    let more = if diff.abs() < 0.005 {
        "the same accommodation"
    } else if diff > 0.0 {
        "more accommodation"
    } else {
        "less accommodation"
    };
    let mut s = format!(
        "{who} needs {more} {wearing}: {} D against {} D in spectacles",
        fmt_number(f.accommodation_target),
        fmt_number(f.accommodation_spectacles)
    );
    if add > 0.0 {
        let change = f.add_at_target - add;
        if change.abs() < 0.125 {
            s.push_str(&format!(
                "; within a quarter step of the spectacle add {}",
                fmt_power(add)
            ));
        } else {
            s.push_str(&format!(
                "; the add may need to {} by about {} D from {}",
                if change > 0.0 { "rise" } else { "fall" },
                fmt_number(change.abs()),
                fmt_power(add)
            ));
        }
    }
    s
}
