//! Reading a decimal number from text, without the standard library's float
//! parser.
//!
//! Why: `str::parse::<f64>` handles every possible input exactly, and for
//! that carries a 10 KB table of powers of five and a slow path for
//! arbitrarily long input; in the shipped wasm that is about 15 KB gzip,
//! for numbers that are a few digits long. The figures typed here (powers,
//! millimetres, limits) have at most a handful of digits, and for those this
//! reader gives exactly the same `f64` as `str::parse` (checked against it in
//! `tests/parsing.rs`).
//!
//! How: the significant digits are gathered into an integer `m` (up to 19)
//! and a power of ten `e`. When `m < 2^53` and `|e| ≤ 22` (any number with
//! at most 15 significant digits and no large exponent), `m` and `10^|e|`
//! are both exact `f64` values and one IEEE multiplication or division gives
//! the correctly rounded result. Longer or more extreme input (which no
//! clinical value comes near) is scaled in steps of `10^22` and may differ
//! from the correctly rounded value by a few units in the last place.

/// 10^0 … 10^22: every one is exact in `f64`.
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20,
    1e21, 1e22,
];

/// The most significant digits kept (19 always fit in a `u64`).
const MAX_DIGITS: u32 = 19;

/// Reads an optional sign at `bytes[*i]`, moving past it; true for minus.
fn sign(bytes: &[u8], i: &mut usize) -> bool {
    match bytes.get(*i) {
        Some(b'-') => {
            *i += 1;
            true
        }
        Some(b'+') => {
            *i += 1;
            false
        }
        _ => false,
    }
}

/// Reads a finite decimal number written as `str::parse::<f64>` accepts it:
/// an optional sign, digits with an optional decimal point (at least one
/// digit in all), and an optional exponent (`e` or `E`, optional sign,
/// digits). Anything else, including `inf` and `NaN`, is `None`. A number
/// too large for `f64` is infinite, as with `str::parse`.
///
/// ```
/// use lensplane_core::read_decimal;
/// assert_eq!(read_decimal("-8.25"), Some(-8.25));
/// assert_eq!(read_decimal("0.1"), Some(0.1));
/// assert_eq!(read_decimal("+.5"), Some(0.5));
/// assert_eq!(read_decimal("12."), Some(12.0));
/// assert_eq!(read_decimal("2.5e-1"), Some(0.25));
/// assert_eq!(read_decimal("1e400"), Some(f64::INFINITY));
/// for bad in ["", ".", "-", "1e", "e5", "1.2.3", "1,5", " 1", "inf", "NaN"] {
///     assert_eq!(read_decimal(bad), None, "{bad:?}");
/// }
/// ```
pub fn read_decimal(text: &str) -> Option<f64> {
    let bytes = text.as_bytes();
    let mut i = 0;
    let negative = sign(bytes, &mut i);
    let mut m: u64 = 0;
    let mut kept = 0;
    // The power of ten to apply to `m`.
    let mut exp: i64 = 0;
    let mut seen_digit = false;
    let mut after_point = false;
    while i < bytes.len() {
        match bytes[i] {
            b'0'..=b'9' => {
                seen_digit = true;
                let d = u64::from(bytes[i] - b'0');
                if m == 0 && d == 0 {
                    // A leading zero: only its place counts.
                    exp -= i64::from(after_point);
                } else if kept < MAX_DIGITS {
                    m = m * 10 + d;
                    kept += 1;
                    exp -= i64::from(after_point);
                } else {
                    // Beyond the kept digits: a whole digit still scales.
                    exp += i64::from(!after_point);
                }
            }
            b'.' if !after_point => after_point = true,
            _ => break,
        }
        i += 1;
    }
    if !seen_digit {
        return None;
    }
    if i < bytes.len() {
        if !matches!(bytes[i], b'e' | b'E') {
            return None;
        }
        i += 1;
        let exp_negative = sign(bytes, &mut i);
        let digits = &bytes[i..];
        if digits.is_empty() || !digits.iter().all(u8::is_ascii_digit) {
            return None;
        }
        // Beyond ±400 every `m` is infinite or zero, so larger exponents need not be held.
        let e = digits
            .iter()
            .fold(0i64, |e, d| (e * 10 + i64::from(d - b'0')).min(100_000));
        exp += if exp_negative { -e } else { e };
    }
    let magnitude = scale(m, exp.clamp(-400, 400));
    Some(if negative { -magnitude } else { magnitude })
}

/// `m × 10^exp`, correctly rounded when `m < 2^53` and `|exp| ≤ 22` after
/// trailing zeros are moved into the exponent.
fn scale(mut m: u64, mut exp: i64) -> f64 {
    if m == 0 {
        return 0.0;
    }
    while m % 10 == 0 {
        m /= 10;
        exp += 1;
    }
    let mut v = m as f64;
    while exp > 22 {
        v *= POW10[22];
        exp -= 22;
    }
    while exp < -22 {
        v /= POW10[22];
        exp += 22;
    }
    // `exp` is now within ±22.
    let p = POW10[exp.unsigned_abs() as usize];
    if exp >= 0 {
        v * p
    } else {
        v / p
    }
}

#[cfg(test)]
mod tests {
    use super::read_decimal;

    #[test]
    fn same_as_the_standard_parser_for_typed_figures() {
        for text in [
            "0",
            "-0",
            "+0.00",
            "0.125",
            "2.675",
            "-8.00",
            "-2.75",
            "0.1",
            "0.3",
            "12",
            "13.5",
            "40.64",
            "0.0000001",
            "123456789012345",
            "9007199254740993",
            "00012.5000",
            "1e22",
            "1e-22",
            "1e-400",
            "1e400",
            "1e99999999999999999999",
        ] {
            let ours = read_decimal(text).unwrap();
            let std: f64 = text.parse().unwrap();
            assert_eq!(ours.to_bits(), std.to_bits(), "{text}");
        }
    }

    #[test]
    fn extreme_input_is_within_a_few_units_in_the_last_place() {
        for text in [
            "1.7976931348623157e308",
            "4.9e-324",
            "2.2250738585072014e-308",
            "0.30000000000000000000000000001",
        ] {
            let (ours, std) = (read_decimal(text).unwrap(), text.parse::<f64>().unwrap());
            assert!(
                ours.to_bits().abs_diff(std.to_bits()) <= 4,
                "{text}: {ours:e} vs {std:e}"
            );
        }
    }
}
