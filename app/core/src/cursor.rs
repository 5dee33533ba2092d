//! A small cursor over the tokens of typed text, so each parser reads as the
//! notation it accepts: `peek` at what comes, `eat` what may be there,
//! `expect_end` where nothing more may follow.

use crate::error::{Error, ErrorKind, Field};
use crate::lex::{Num, Tok, Token};

pub(crate) struct Cursor<'a> {
    toks: &'a [Token],
    at: usize,
}

/// The error for a token that fits no accepted notation.
pub(crate) fn unexpected(t: &Token, field: Field) -> Error {
    Error::new(ErrorKind::Unexpected { text: t.raw.clone() }, field, Some(t.start))
}

impl<'a> Cursor<'a> {
    pub fn new(toks: &'a [Token]) -> Cursor<'a> {
        Cursor { toks, at: 0 }
    }

    /// The next token, without moving.
    pub fn peek(&self) -> Option<&'a Token> {
        self.toks.get(self.at)
    }

    /// The token after the next one, without moving.
    pub fn peek_second(&self) -> Option<&'a Token> {
        self.toks.get(self.at + 1)
    }

    pub fn at_end(&self) -> bool {
        self.at >= self.toks.len()
    }

    /// Takes the next token, whatever it is.
    pub fn next(&mut self) -> Option<&'a Token> {
        let t = self.peek()?;
        self.at += 1;
        Some(t)
    }

    /// Takes the next token if `fits` accepts it.
    pub fn eat(&mut self, fits: impl Fn(&Tok) -> bool) -> Option<&'a Token> {
        let t = self.peek().filter(|t| fits(&t.tok))?;
        self.at += 1;
        Some(t)
    }

    /// Takes the next token if it is a word `fits` accepts.
    pub fn eat_word(&mut self, fits: impl Fn(&str) -> bool) -> bool {
        self.eat(|t| matches!(t, Tok::Word(w) if fits(w))).is_some()
    }

    /// Takes a label word (`sph`, `cyl`…) only when a number follows it.
    pub fn eat_label(&mut self, fits: impl Fn(&str) -> bool) -> bool {
        let number_follows = matches!(self.peek_second().map(|t| &t.tok), Some(Tok::Num(_)));
        number_follows && self.eat_word(fits)
    }

    /// Takes a `/` or `,` separating the parts of a prescription.
    pub fn eat_separator(&mut self) -> bool {
        self.eat(|t| matches!(t, Tok::Slash | Tok::Comma)).is_some()
    }

    /// Takes a number, with its token (for positions).
    pub fn eat_number(&mut self) -> Option<(&'a Token, &'a Num)> {
        let t = self.eat(|t| matches!(t, Tok::Num(_)))?;
        match &t.tok {
            Tok::Num(n) => Some((t, n)),
            _ => None,
        }
    }

    /// Nothing more may follow: anything left is unexpected in `field`.
    pub fn expect_end(&self, field: Field) -> Result<(), Error> {
        match self.peek() {
            Some(t) => Err(unexpected(t, field)),
            None => Ok(()),
        }
    }
}

/// A token's word, if it is one.
pub(crate) fn word(t: Option<&Token>) -> Option<&str> {
    match t.map(|t| &t.tok) {
        Some(Tok::Word(w)) => Some(w.as_str()),
        _ => None,
    }
}
