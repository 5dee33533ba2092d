//! Tokens of the notation practitioners type and paste.
//!
//! Normalises look-alike characters first: U+2212 minus, en and em dashes,
//! hyphens and the fullwidth/small minus read as `-`; fullwidth digits,
//! plus, point, comma and slash as their ASCII forms; `×` as `x`.
//! Positions are character indices into the original text.

use crate::error::{Error, ErrorKind, Field};

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Sign {
    None,
    Plus,
    Minus,
    PlusMinus,
}

#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Num {
    pub sign: Sign,
    pub int: String,
    pub frac: Option<String>,
    /// The minus was not ASCII (dash, U+2212, fullwidth…).
    pub typographic_minus: bool,
    /// The decimal separator was a comma.
    pub comma: bool,
}

impl Num {
    /// The magnitude; digits only, so this never fails (a very long number
    /// may be infinite, which range checks reject).
    pub fn magnitude(&self) -> f64 {
        let text = match &self.frac {
            Some(f) if !f.is_empty() => format!("{}.{}", self.int, f),
            _ => self.int.clone(),
        };
        let text = if text.is_empty() { "0".to_string() } else { text };
        crate::decimal::read_decimal(&text).unwrap_or(f64::INFINITY)
    }

    pub fn value(&self) -> f64 {
        let m = self.magnitude();
        if self.sign == Sign::Minus {
            -m
        } else {
            m
        }
    }

    /// As typed, with the ASCII minus every figure uses: "-250", "2.30".
    pub fn typed(&self) -> String {
        let sign = match self.sign {
            Sign::None => "",
            Sign::Plus => "+",
            Sign::Minus => "-",
            Sign::PlusMinus => "±",
        };
        match &self.frac {
            Some(f) => format!("{sign}{}.{f}", self.int),
            None => format!("{sign}{}", self.int),
        }
    }
}

#[derive(Clone, Debug, PartialEq)]
pub(crate) enum Tok {
    Num(Num),
    /// Lower-case letters with any dots removed ("D.S." → "ds").
    Word(String),
    Slash,
    Comma,
    At,
    Degree,
    Inches,
    Other(char),
}

#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Token {
    pub tok: Tok,
    pub start: usize,
    /// The original text of the token.
    pub raw: String,
}

fn normalise(c: char) -> (char, bool) {
    match c {
        '\u{2212}' | '\u{2010}' | '\u{2011}' | '\u{2012}' | '\u{2013}' | '\u{2014}' | '\u{2015}' | '\u{FE58}'
        | '\u{FE63}' | '\u{FF0D}' => ('-', true),
        '\u{FF0B}' => ('+', false),
        '\u{FF10}'..='\u{FF19}' => (
            char::from_u32(c as u32 - 0xFF10 + u32::from(b'0')).unwrap_or('0'),
            false,
        ),
        '\u{FF0E}' => ('.', false),
        '\u{FF0C}' => (',', false),
        '\u{FF0F}' => ('/', false),
        '\u{FF20}' => ('@', false),
        '\u{D7}' | '\u{2715}' | '\u{2A2F}' => ('x', false),
        '\u{BA}' | '\u{2DA}' => ('\u{B0}', false),
        '\u{2033}' => ('"', false),
        c if c.is_whitespace() => (' ', false),
        c => (c, false),
    }
}

/// Split `text` into tokens. Fails only on a number with two decimal
/// separators ("2,5,90", "1.2.3").
pub(crate) fn lex(text: &str, field: Field) -> Result<Vec<Token>, Error> {
    let original: Vec<char> = text.chars().collect();
    let mapped: Vec<(char, bool)> = original.iter().map(|&c| normalise(c)).collect();
    let ch = |i: usize| mapped.get(i).map(|m| m.0);
    let is_digit = |i: usize| ch(i).is_some_and(|c| c.is_ascii_digit());
    let raw = |a: usize, b: usize| original[a..b].iter().collect::<String>();
    let mut out = Vec::new();
    let mut i = 0;
    while i < mapped.len() {
        let (c, typographic) = mapped[i];
        let start = i;
        if c == ' ' {
            i += 1;
            continue;
        }
        let starts_number = |j: usize| is_digit(j) || (ch(j) == Some('.') && is_digit(j + 1));
        if matches!(c, '+' | '-' | '\u{B1}') {
            let mut j = i + 1;
            while ch(j) == Some(' ') {
                j += 1;
            }
            if starts_number(j) {
                let sign = match c {
                    '+' => Sign::Plus,
                    '-' => Sign::Minus,
                    _ => Sign::PlusMinus,
                };
                let (num, end) = number(&mapped, j, sign, typographic, field, start, &raw)?;
                out.push(Token {
                    tok: Tok::Num(num),
                    start,
                    raw: raw(start, end),
                });
                i = end;
            } else {
                out.push(Token {
                    tok: Tok::Other(c),
                    start,
                    raw: raw(start, i + 1),
                });
                i += 1;
            }
            continue;
        }
        if starts_number(i) {
            let (num, end) = number(&mapped, i, Sign::None, false, field, start, &raw)?;
            out.push(Token {
                tok: Tok::Num(num),
                start,
                raw: raw(start, end),
            });
            i = end;
            continue;
        }
        if c.is_ascii_alphabetic() {
            let mut j = i;
            let mut word = String::new();
            let mut dotted = false;
            while let Some(d) = ch(j) {
                if d.is_ascii_alphabetic() {
                    word.push(d.to_ascii_lowercase());
                } else if d == '.' && (dotted || ch(j + 1).is_some_and(|e| e.is_ascii_alphabetic())) {
                    dotted = true;
                } else {
                    break;
                }
                j += 1;
            }
            out.push(Token {
                tok: Tok::Word(word),
                start,
                raw: raw(start, j),
            });
            i = j;
            continue;
        }
        let tok = match c {
            '/' => Tok::Slash,
            ',' | ';' => Tok::Comma,
            '@' => Tok::At,
            '\u{B0}' => Tok::Degree,
            '"' => Tok::Inches,
            other => Tok::Other(other),
        };
        out.push(Token {
            tok,
            start,
            raw: raw(start, i + 1),
        });
        i += 1;
    }
    Ok(out)
}

#[allow(clippy::too_many_arguments)]
fn number(
    mapped: &[(char, bool)],
    from: usize,
    sign: Sign,
    typographic_minus: bool,
    field: Field,
    token_start: usize,
    raw: &dyn Fn(usize, usize) -> String,
) -> Result<(Num, usize), Error> {
    let ch = |i: usize| mapped.get(i).map(|m| m.0);
    let is_digit = |i: usize| ch(i).is_some_and(|c| c.is_ascii_digit());
    let mut j = from;
    let mut int = String::new();
    while is_digit(j) {
        int.push(mapped[j].0);
        j += 1;
    }
    let mut frac = None;
    let mut comma = false;
    if let Some(sep @ ('.' | ',')) = ch(j) {
        if is_digit(j + 1) {
            comma = sep == ',';
            j += 1;
            let mut f = String::new();
            while is_digit(j) {
                f.push(mapped[j].0);
                j += 1;
            }
            frac = Some(f);
            // A second separator followed by a digit: "2,5,90", "1.2.3".
            if matches!(ch(j), Some('.' | ',')) && is_digit(j + 1) {
                let mut end = j + 1;
                while is_digit(end) || (matches!(ch(end), Some('.' | ',')) && is_digit(end + 1)) {
                    end += 1;
                }
                return Err(Error::new(
                    ErrorKind::Ambiguous {
                        text: raw(token_start, end),
                    },
                    field,
                    Some(token_start),
                ));
            }
        } else if sep == '.' {
            // "2." : a trailing point.
            j += 1;
            frac = Some(String::new());
        }
    }
    Ok((
        Num {
            sign,
            int,
            frac,
            typographic_minus,
            comma,
        },
        j,
    ))
}
