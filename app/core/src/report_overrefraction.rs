//! The over-refraction panel's entry point: everything the UI shows for
//! one eye.

use crate::error::{Error, ErrorKind, Field};
use crate::format::{fmt_axis, fmt_length, fmt_power};
use crate::limits::{OVER_REFRACTION_WARN, ROTATION_WARN, VERTEX_USUAL};
use crate::power_matrix::whole_degrees;
use crate::rounding::OrderSettings;
use crate::warnings::{rx_warnings, strongest_meridian, vertex_warnings, warn, Warning, WarningKind};
use crate::{
    combine_over_refraction, lars_order, recommend, worn_on_eye, Meridian, OverRefractionPlanes, PowerCross,
    PowerMatrix, PowerVector, Recommendation, Rotation, Rx, VertexDistance,
};

/// What the over-refraction panel sends for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct OverRefractionInput {
    /// The worn lens, as labelled or ordered (link `r` / `l`).
    pub worn: Rx,
    /// Where the worn lens sits: 0 for a contact lens at the cornea, else
    /// the spectacle vertex distance (link `worn`).
    pub worn_at: VertexDistance,
    /// The over-refraction found over it (link `ror` / `lor`).
    pub over_refraction: Rx,
    /// The vertex distance of the trial lens or refractor (link `at`,
    /// default 12 mm); at or in front of the worn lens.
    pub over_refraction_at: VertexDistance,
    /// The plane of the lens to order: 0 for a contact lens (link `to`,
    /// default: `worn_at`).
    pub target: VertexDistance,
    /// The observed rotation of a toric contact lens (link `rrot` / `lrot`).
    pub rotation: Rotation,
    /// The practitioner describes the contact lens as unstable (its
    /// rotation varies).
    pub unstable: bool,
    /// The contact lens is rigid: refused (the tear lens is not modelled).
    pub rigid: bool,
    /// Ladders, tie rule, toric availability.
    pub settings: OrderSettings,
}

/// The kind of contact lens worn (link `lens`): soft, the default, or
/// rigid, which [`over_refraction_report`] refuses (decision 16).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
pub enum ContactLensKind {
    /// A soft lens: computed.
    #[default]
    Soft,
    /// A rigid lens: refused (the tear lens is not modelled).
    Rigid,
}

impl ContactLensKind {
    /// Every kind, in the order a form offers them.
    pub const ALL: [ContactLensKind; 2] = [ContactLensKind::Soft, ContactLensKind::Rigid];

    /// The value a link carries.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ContactLensKind::Rigid.link_value(), "rigid");
    /// ```
    pub fn link_value(self) -> &'static str {
        match self {
            ContactLensKind::Soft => "soft",
            ContactLensKind::Rigid => "rigid",
        }
    }

    /// Plain words for a form.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ContactLensKind::Soft.words(), "Soft lens");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            ContactLensKind::Soft => "Soft lens",
            ContactLensKind::Rigid => "Rigid lens",
        }
    }

    /// True for a rigid lens (the input's `rigid`).
    ///
    /// ```
    /// assert!(lensplane_core::ContactLensKind::Rigid.is_rigid());
    /// ```
    pub fn is_rigid(self) -> bool {
        self == ContactLensKind::Rigid
    }

    /// From a link value, any letter case; empty means soft.
    ///
    /// ```
    /// use lensplane_core::ContactLensKind;
    /// assert_eq!(ContactLensKind::from_link("Rigid")?, ContactLensKind::Rigid);
    /// assert_eq!(ContactLensKind::from_link("")?, ContactLensKind::Soft);
    /// assert_eq!(ContactLensKind::from_link("hard").unwrap_err().to_string(),
    ///            "lens type \"hard\" is not one of soft, rigid");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_link(text: &str) -> Result<ContactLensKind, Error> {
        let t = text.trim();
        if t.is_empty() {
            return Ok(ContactLensKind::default());
        }
        ContactLensKind::ALL
            .into_iter()
            .find(|k| t.eq_ignore_ascii_case(k.link_value()))
            .ok_or_else(|| {
                Error::new(
                    ErrorKind::UnknownChoice {
                        typed: t.to_string(),
                        choices: "soft, rigid",
                    },
                    Field::LensType,
                    None,
                )
            })
    }
}

/// What was done with the rotation entered.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum RotationHandling {
    /// No rotation was entered.
    NotGiven,
    /// A toric contact lens worn and one ordered: the chain uses the axis
    /// as the worn lens sits, and the ordered axis is compensated (left add,
    /// right subtract).
    Compensated,
    /// A toric contact lens worn, spectacles ordered: the chain uses the axis
    /// as the worn lens sits; a spectacle lens does not turn, so the order
    /// is not compensated.
    PlacedOnly,
    /// A rotation entered for a spectacle lens or a lens without cylinder,
    /// where it means nothing: not used (with a warning).
    Ignored,
}

impl RotationHandling {
    /// Plain words for the handling.
    ///
    /// ```
    /// use lensplane_core::RotationHandling;
    /// assert_eq!(RotationHandling::Compensated.words(),
    ///            "the ordered axis allows for the rotation (left add, right subtract)");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            RotationHandling::NotGiven => "no rotation entered",
            RotationHandling::Compensated => "the ordered axis allows for the rotation (left add, right subtract)",
            RotationHandling::PlacedOnly => {
                "the worn lens is taken where it sits; a spectacle lens does not turn, so its axis is not compensated"
            }
            RotationHandling::Ignored => "the rotation is not used: it applies only to a toric contact lens",
        }
    }
}

/// What changed from the worn lens, both at the target plane and in the
/// frame of [`OverRefractionReport::exact`] (as labelled when the rotation
/// is compensated, as on the eye otherwise).
#[derive(Clone, Debug, PartialEq)]
pub struct LensChange {
    /// The worn lens moved to the target plane.
    pub worn_at_target: Rx,
    /// (new lens − worn lens) as a power vector: + means more plus.
    pub vector: PowerVector,
    /// The same difference along the new lens's two principal meridians
    /// (directions of `exact`, its axis first): + means more plus there.
    pub meridians: PowerCross,
    /// The astigmatic part of the change as a cylinder size, D (≥ 0).
    pub astigmatic: f64,
    /// One line in plain words.
    pub words: String,
}

/// The power-vector cross-check at the worn lens plane: the worn lens (as
/// it sits) and the over-refraction carried there, each as a power vector
/// from its sphere, cylinder and axis (Thibos, Wheeler & Horner 1997), add
/// component by component; the matrix sum must give the same vector.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VectorCheck {
    /// The worn lens as it sits on the eye.
    pub worn: PowerVector,
    /// The over-refraction carried to the worn lens plane.
    pub over_refraction: PowerVector,
    /// `worn + over_refraction`, by vectors.
    pub sum: PowerVector,
    /// The vector of the matrix sum ([`OverRefractionReport::combined_at_worn`]).
    pub matrices: PowerVector,
    /// The largest difference between `sum` and `matrices` in any
    /// component, D (≥ 0; rounding error only).
    pub difference: f64,
}

impl VectorCheck {
    fn new(worn: &Rx, over_refraction_at_worn: &Rx, combined: &PowerMatrix) -> VectorCheck {
        let (w, o) = (worn.power_vector(), over_refraction_at_worn.power_vector());
        let sum = w.plus(&o);
        let matrices = combined.power_vector();
        let d = sum.minus(&matrices);
        VectorCheck {
            worn: w,
            over_refraction: o,
            sum,
            matrices,
            difference: d.m.abs().max(d.j0.abs()).max(d.j45.abs()),
        }
    }

    /// True when the two sums agree to well within a hundredth of a dioptre.
    ///
    /// ```
    /// use lensplane_core::*;
    /// // O4 [derived]: the cross-check at the spectacle plane agrees.
    /// let r = over_refraction_report(&OverRefractionInput {
    ///     worn: Rx::new(-7.0, -1.5, 170)?,
    ///     worn_at: VertexDistance::SPECTACLES,
    ///     over_refraction: Rx::new(-0.5, -0.25, 80)?,
    ///     over_refraction_at: VertexDistance::SPECTACLES,
    ///     target: VertexDistance::CORNEA,
    ///     rotation: Rotation::NONE,
    ///     unstable: false,
    ///     rigid: false,
    ///     settings: OrderSettings::default(),
    /// })?;
    /// assert!(r.vector_check.agrees());
    /// assert!((r.vector_check.sum.m - -8.375).abs() < 1e-9);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn agrees(&self) -> bool {
        self.difference < 1e-6
    }
}

/// Everything the over-refraction panel shows for one eye. Cylinders are in
/// minus-cylinder form unless a field says otherwise. Warnings use
/// [`Field::Rx`] for the worn lens, [`Field::OverRefraction`],
/// [`Field::VertexFrom`] for `worn`, [`Field::OverRefractionVertex`] for
/// `at`, [`Field::VertexTo`] for `to`, and [`Field::Rotation`].
#[derive(Clone, Debug, PartialEq)]
pub struct OverRefractionReport {
    /// The worn lens as entered.
    pub worn: Rx,
    /// The over-refraction as entered.
    pub over_refraction: Rx,
    /// The three planes.
    pub planes: OverRefractionPlanes,
    /// The rotation entered.
    pub rotation: Rotation,
    /// What was done with it.
    pub rotation_handling: RotationHandling,
    /// The worn lens as it sits on the eye (its axis turned when the
    /// rotation is used).
    pub worn_on_eye: Rx,
    /// The over-refraction carried to the worn lens plane.
    pub over_refraction_at_worn: Rx,
    /// Worn lens (as it sits) + over-refraction, at the worn lens plane.
    pub combined_at_worn: Rx,
    /// The ocular refraction at the cornea.
    pub ocular_refraction: Rx,
    /// What the new lens must do on the eye, at the target plane.
    pub needed_at_target: Rx,
    /// The exact (unrounded) axis of `needed_at_target`, degrees (0, 180].
    pub needed_axis_exact: f64,
    /// The new lens, exact, at the target plane, as it is to be labelled
    /// (its axis compensated when [`RotationHandling::Compensated`]).
    pub exact: Rx,
    /// The same, plus-cylinder form.
    pub exact_plus_cyl: Rx,
    /// The exact (unrounded) axis of `exact`, degrees (0, 180].
    pub exact_axis: f64,
    /// The one lens to order and its alternatives: [`recommend`] of `exact`
    /// at the target plane. Every lens in it is as labelled; what each
    /// leaves uncorrected is the same on the eye (a rotation turns lens and
    /// need alike).
    pub recommendation: Recommendation,
    /// One line in plain words: how the new lens was found.
    pub reason: String,
    /// What changed from the worn lens.
    pub change: LensChange,
    /// The power-vector cross-check of the sum at the worn lens plane.
    pub vector_check: VectorCheck,
    /// Warnings, each tied to a field. The vertex checks leave out "below a
    /// quarter step": what changed is in `change`.
    pub warnings: Vec<Warning>,
}

fn plane_words(d: VertexDistance) -> String {
    if d.is_cornea() {
        "at the cornea".into()
    } else {
        format!("at {} mm", fmt_length(d.mm()))
    }
}

fn handling(input: &OverRefractionInput) -> RotationHandling {
    if input.rotation.is_none() {
        RotationHandling::NotGiven
    } else if !input.worn_at.is_cornea() || input.worn.is_spherical() {
        RotationHandling::Ignored
    } else if input.target.is_cornea() {
        RotationHandling::Compensated
    } else {
        RotationHandling::PlacedOnly
    }
}

fn retag(mut warnings: Vec<Warning>, field: Field) -> Vec<Warning> {
    for w in &mut warnings {
        w.field = field;
    }
    warnings
}

fn reason(input: &OverRefractionInput, handled: RotationHandling) -> String {
    let planes = (input.worn_at, input.over_refraction_at);
    let lens = if input.worn_at.is_cornea() {
        "the contact lens".to_string()
    } else {
        format!("the spectacle lens {}", plane_words(input.worn_at))
    };
    let mut s = if planes.0 == planes.1 {
        format!("the over-refraction was found at the plane of {lens}: the two add as power matrices, so crossed axes combine as they do optically")
    } else {
        format!(
            "the over-refraction {} was carried to {lens} and added to it as power matrices, so crossed axes combine as they do optically",
            plane_words(input.over_refraction_at)
        )
    };
    s.push_str(&format!(
        "; the sum, taken to the cornea, is the lens needed {}",
        plane_words(input.target)
    ));
    let r = input.rotation;
    match handled {
        RotationHandling::Compensated if r.clockwise() > 0 => s.push_str(&format!(
            "; left add: the lens settles {}° to the examiner's left, so its axis is ordered {}° more",
            r.amount(),
            r.amount()
        )),
        RotationHandling::Compensated => s.push_str(&format!(
            "; right subtract: the lens settles {}° to the examiner's right, so its axis is ordered {}° less",
            r.amount(),
            r.amount()
        )),
        RotationHandling::PlacedOnly => s.push_str(&format!(
            "; the worn lens was taken as it sits, turned {}, and a spectacle lens does not turn",
            r.words()
        )),
        RotationHandling::NotGiven | RotationHandling::Ignored => {}
    }
    s
}

fn change(exact: &PowerMatrix, worn_at_target: &PowerMatrix, target: VertexDistance) -> LensChange {
    let d = exact.minus(worn_at_target);
    let p = exact.principal_powers();
    let (first, second) = (whole_degrees(p.axis), whole_degrees(p.axis + 90.0));
    let meridians = PowerCross::raw(
        Meridian {
            power: d.power_in_meridian(p.axis),
            axis: first,
        },
        Meridian {
            power: d.power_in_meridian(p.axis + 90.0),
            axis: second,
        },
    );
    let vector = d.power_vector();
    let (m1, m2) = (meridians.first(), meridians.second());
    let shows = |x: f64| fmt_power(x) != "0.00";
    let words = if !shows(m1.power) && !shows(m2.power) {
        format!("no change from the worn lens {} at two decimals", plane_words(target))
    } else {
        format!(
            "against the worn lens {}: {} in the {} meridian, {} in the {} meridian; spherical equivalent {} (+ means more plus)",
            plane_words(target),
            fmt_power(m1.power),
            fmt_axis(m1.axis),
            fmt_power(m2.power),
            fmt_axis(m2.axis),
            fmt_power(vector.m)
        )
    };
    LensChange {
        worn_at_target: worn_at_target.to_rx(),
        vector,
        meridians,
        astigmatic: vector.cylinder_size(),
        words,
    }
}

fn rotation_warnings(input: &OverRefractionInput, handled: RotationHandling) -> Vec<Warning> {
    let mut out = vec![];
    let r = input.rotation;
    match handled {
        RotationHandling::Ignored => out.push(warn(
            WarningKind::RotationIgnored,
            Field::Rotation,
            if input.worn_at.is_cornea() {
                "the worn lens has no cylinder, so its rotation changes nothing: not used".to_string()
            } else {
                "a rotation applies only to a toric contact lens, not to spectacles: not used".to_string()
            },
        )),
        RotationHandling::Compensated | RotationHandling::PlacedOnly => {
            if ROTATION_WARN.exceeded_by(f64::from(r.amount())) {
                out.push(warn(
                    WarningKind::RotationLarge,
                    Field::Rotation,
                    format!(
                        "a rotation of {}° is above {ROTATION_WARN}°: a refit is usually better than compensating",
                        r.amount()
                    ),
                ));
            }
        }
        RotationHandling::NotGiven => {}
    }
    if input.unstable && input.worn_at.is_cornea() {
        out.push(warn(
            WarningKind::RotationUnstable,
            Field::Rotation,
            "the lens is described as unstable: a refit is usually better than compensating its rotation".into(),
        ));
    }
    out
}

fn over_refraction_warnings(input: &OverRefractionInput) -> Vec<Warning> {
    let mut out = vec![];
    let (or, worn) = (input.over_refraction.to_minus_cyl(), input.worn.to_minus_cyl());
    if or.cylinder().abs() > worn.cylinder().abs() + 1e-9 {
        let worn_cyl = if worn.is_spherical() {
            "none".to_string()
        } else {
            fmt_power(worn.cylinder())
        };
        out.push(warn(
            WarningKind::OverRefractionCylinder,
            Field::OverRefraction,
            format!(
                "the over-refraction has more cylinder ({}) than the worn lens ({worn_cyl}): check the fit and the refraction",
                fmt_power(or.cylinder())
            ),
        ));
    }
    let strongest = strongest_meridian(&or);
    if OVER_REFRACTION_WARN.exceeded_by(strongest) {
        out.push(warn(
            WarningKind::OverRefractionHigh,
            Field::OverRefraction,
            format!(
                "an over-refraction meridian of {} is beyond {OVER_REFRACTION_WARN}: check the fit and the refraction",
                fmt_power(strongest)
            ),
        ));
    }
    out
}

/// Compute the over-refraction panel for one eye.
///
/// Refuses a rigid lens (an error at [`Field::LensType`]): the thin-lens
/// model has no tear lens, so it does not pretend to give an order.
///
/// ```
/// use lensplane_core::*;
/// // O4 [derived]: -7.00 -1.50 ×170 spectacles at 12 mm, over-refraction -0.50 -0.25 ×080 at 12 mm, to the cornea.
/// let r = over_refraction_report(&OverRefractionInput {
///     worn: Rx::new(-7.0, -1.5, 170)?,
///     worn_at: VertexDistance::SPECTACLES,
///     over_refraction: Rx::new(-0.5, -0.25, 80)?,
///     over_refraction_at: VertexDistance::SPECTACLES,
///     target: VertexDistance::CORNEA,
///     rotation: Rotation::NONE,
///     unstable: false,
///     rigid: false,
///     settings: OrderSettings::default(),
/// })?;
/// assert_eq!(r.combined_at_worn.to_string(), "-7.75 -1.25 ×170");
/// assert_eq!(r.exact.to_string(), "-7.09 -1.03 ×170");
/// assert_eq!(r.recommendation.order.lens.to_string(), "-7.00 -1.25 ×170");
/// # Ok::<(), Error>(())
/// ```
pub fn over_refraction_report(input: &OverRefractionInput) -> Result<OverRefractionReport, Error> {
    if input.rigid {
        return Err(Error::new(ErrorKind::RigidLens, Field::LensType, None));
    }
    input.settings.validate()?;
    let planes = OverRefractionPlanes {
        worn: input.worn_at,
        over_refraction: input.over_refraction_at,
        target: input.target,
    };
    let handled = handling(input);
    let used_rotation = match handled {
        RotationHandling::Compensated | RotationHandling::PlacedOnly => input.rotation,
        RotationHandling::NotGiven | RotationHandling::Ignored => Rotation::NONE,
    };
    let worn_matrix = worn_on_eye(&input.worn, used_rotation);
    let or_matrix = PowerMatrix::from_rx(&input.over_refraction);
    let chain = combine_over_refraction(&worn_matrix, &or_matrix, &planes)?;
    let compensated = handled == RotationHandling::Compensated;
    let order = if compensated {
        lars_order(&chain.at_target, input.rotation)
    } else {
        chain.at_target
    };
    let exact = order.to_rx();
    // The worn lens at the target plane, in the frame of `order`.
    let worn_frame = if compensated {
        PowerMatrix::from_rx(&input.worn)
    } else {
        worn_matrix
    };
    let worn_at_target = worn_frame.moved(input.worn_at.metres() - input.target.metres())?;
    let recommendation = recommend(&exact, input.target, &input.settings)?;

    let mut warnings = retag(rx_warnings(&input.worn), Field::Rx);
    warnings.extend(retag(rx_warnings(&input.over_refraction), Field::OverRefraction));
    warnings.extend(over_refraction_warnings(input));
    warnings.extend(rotation_warnings(input, handled));
    if !input.over_refraction_at.is_cornea() && !VERTEX_USUAL.contains(input.over_refraction_at.mm()) {
        warnings.push(warn(
            WarningKind::UnusualVertex,
            Field::OverRefractionVertex,
            format!(
                "vertex distance {} mm is unusual for a trial frame or refractor (usually {VERTEX_USUAL}): check it",
                fmt_length(input.over_refraction_at.mm())
            ),
        ));
    }
    // The vertex checks of the move from the worn lens to the new one; "below a
    // quarter step" is left out: what changed is reported on its own.
    warnings.extend(
        vertex_warnings(&chain.combined_at_worn.to_rx(), input.worn_at, input.target)
            .into_iter()
            .filter(|w| w.kind != WarningKind::BelowQuarterStep),
    );
    if input.target.is_cornea() {
        if let Some(stock) = input.settings.stock {
            let lens = recommendation.order.lens.meridians();
            if let Some(m) = lens.both().iter().find(|m| m.power < stock.min || m.power > stock.max) {
                warnings.push(warn(
                    WarningKind::OutsideStock,
                    Field::Ordered,
                    format!(
                        "{} is outside the usual stock range ({} to {}): may need a special order",
                        fmt_power(m.power),
                        fmt_power(stock.min),
                        fmt_power(stock.max)
                    ),
                ));
            }
        }
    }
    let needed = chain.at_target.principal_powers();
    Ok(OverRefractionReport {
        worn: input.worn,
        over_refraction: input.over_refraction,
        planes,
        rotation: input.rotation,
        rotation_handling: handled,
        worn_on_eye: worn_matrix.to_rx(),
        over_refraction_at_worn: chain.over_refraction_at_worn.to_rx(),
        combined_at_worn: chain.combined_at_worn.to_rx(),
        ocular_refraction: chain.ocular_refraction.to_rx(),
        needed_at_target: chain.at_target.to_rx(),
        needed_axis_exact: needed.axis,
        exact,
        exact_plus_cyl: exact.to_plus_cyl(),
        exact_axis: order.principal_powers().axis,
        recommendation,
        reason: reason(input, handled),
        change: change(&order, &worn_at_target, input.target),
        vector_check: VectorCheck::new(
            &worn_matrix.to_rx(),
            &chain.over_refraction_at_worn.to_rx(),
            &chain.combined_at_worn,
        ),
        warnings,
    })
}
