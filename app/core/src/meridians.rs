//! The power cross: a prescription as two principal meridians.

use crate::error::{Error, ErrorKind, Field};
use crate::rx::{check_axis, clean, perpendicular};
use crate::Rx;

/// One principal meridian: its power in dioptres and its direction in
/// degrees (1–180, same notation as an axis).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Meridian {
    /// Power acting in this meridian, dioptres.
    pub power: f64,
    /// Direction of the meridian, degrees 1–180.
    pub axis: u16,
}

/// Two principal meridians 90° apart (the "power cross" practitioners draw).
/// `first` lies along the cylinder axis of the prescription it came from.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PowerCross {
    first: Meridian,
    second: Meridian,
}

impl PowerCross {
    /// Two meridians: `along` in the meridian at `axis`, `across` 90° away.
    /// Powers must be finite; the axis 1–180.
    ///
    /// ```
    /// let cross = lensplane_core::PowerCross::new(-7.0, -9.0, 180)?;
    /// assert_eq!(cross.to_rx().to_string(), "-7.00 -2.00 ×180");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn new(along: f64, across: f64, axis: u16) -> Result<PowerCross, Error> {
        for (p, field) in [(along, Field::Sphere), (across, Field::Cylinder)] {
            if !p.is_finite() {
                return Err(Error::new(ErrorKind::NotANumber, field, None));
            }
        }
        check_axis(axis)?;
        Ok(PowerCross::raw(
            Meridian { power: along, axis },
            Meridian {
                power: across,
                axis: perpendicular(axis),
            },
        ))
    }

    pub(crate) fn raw(first: Meridian, second: Meridian) -> PowerCross {
        PowerCross {
            first: Meridian {
                power: clean(first.power),
                axis: first.axis,
            },
            second: Meridian {
                power: clean(second.power),
                axis: second.axis,
            },
        }
    }

    /// The meridian along the prescription's cylinder axis (power = sphere).
    ///
    /// ```
    /// let c = lensplane_core::Rx::new(1.0, -0.5, 30)?.meridians();
    /// assert_eq!(c.first().axis, 30);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn first(&self) -> Meridian {
        self.first
    }

    /// The meridian 90° away (power = sphere + cylinder).
    ///
    /// ```
    /// let c = lensplane_core::Rx::new(1.0, -0.5, 30)?.meridians();
    /// assert_eq!((c.second().power, c.second().axis), (0.5, 120));
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn second(&self) -> Meridian {
        self.second
    }

    /// Both meridians, first then second.
    ///
    /// ```
    /// let c = lensplane_core::Rx::new(1.0, -0.5, 30)?.meridians();
    /// assert_eq!(c.both().len(), 2);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn both(&self) -> [Meridian; 2] {
        [self.first, self.second]
    }

    /// Back to a prescription: S = first, C = second − first, axis = first's
    /// direction. The cylinder form follows from which meridian is more plus.
    ///
    /// ```
    /// use lensplane_core::Rx;
    /// let rx = Rx::new(6.0, -2.0, 90)?;
    /// assert_eq!(rx.meridians().to_rx(), rx);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn to_rx(&self) -> Rx {
        Rx::raw(self.first.power, self.second.power - self.first.power, self.first.axis)
    }

    /// Apply `f` to each meridian's power, keeping directions.
    pub(crate) fn map_powers(&self, mut f: impl FnMut(f64) -> f64) -> PowerCross {
        PowerCross::raw(
            Meridian {
                power: f(self.first.power),
                axis: self.first.axis,
            },
            Meridian {
                power: f(self.second.power),
                axis: self.second.axis,
            },
        )
    }

    /// Same, for a fallible `f`.
    pub(crate) fn try_map_powers(&self, mut f: impl FnMut(f64) -> Result<f64, Error>) -> Result<PowerCross, Error> {
        Ok(PowerCross::raw(
            Meridian {
                power: f(self.first.power)?,
                axis: self.first.axis,
            },
            Meridian {
                power: f(self.second.power)?,
                axis: self.second.axis,
            },
        ))
    }
}
