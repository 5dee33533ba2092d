//! What can go wrong with the history, and the sentence the user reads.

use super::entry::Invalid;
use std::fmt;

/// Why a change to the history did not happen, or why it lives for this
/// session only. `Display` gives the reason in a few words;
/// [`StoreError::message`] the sentence shown for an action.
#[derive(Clone, Debug, PartialEq)]
pub enum StoreError {
    /// The browser's quota is used up.
    Full,
    /// The browser refused a write for another reason.
    Refused,
    /// No storage at all (disabled, or private browsing blocks it).
    Unavailable,
    /// The stored history was written by a newer version: left alone.
    Newer,
    /// Unreadable stored data that could not be set aside: left as found.
    NoRoomAside,
    /// The entry is no longer in the history.
    NotFound,
    /// An import larger than [`super::files::IMPORT_MAX`].
    TooLarge,
    /// A file that cannot be imported, and why.
    BadImport(BadFile),
}

/// What the user was doing when a [`StoreError`] happened.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Action {
    Save,
    Delete,
    Clear,
    Import,
}

/// Why a file cannot be imported.
#[derive(Clone, Debug, PartialEq)]
pub enum BadFile {
    NotJson,
    NotExport,
    Newer,
    Unsupported,
    NoEntries,
    /// Entry `n` (from 1) is not an entry.
    Incomplete(usize),
    Invalid(Invalid),
}

impl fmt::Display for BadFile {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            BadFile::NotJson => "it is not a Lensplane history export (JSON)",
            BadFile::NotExport => "it is not a Lensplane history export",
            BadFile::Newer => "it was made by a newer version of Lensplane; update first",
            BadFile::Unsupported => "its format version is not supported",
            BadFile::NoEntries => "it is damaged (no entries)",
            BadFile::Incomplete(n) => return write!(f, "it is damaged (entry {n} is incomplete)"),
            BadFile::Invalid(why) => return why.fmt(f),
        })
    }
}

impl fmt::Display for StoreError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            StoreError::Full => "this device's storage is full",
            StoreError::Refused => "the browser refused to store it",
            StoreError::Unavailable => "this browser is not letting Lensplane store anything",
            StoreError::Newer => "the stored history was written by a newer version of Lensplane",
            StoreError::NoRoomAside => "stored history that could not be read has no room to be set aside",
            StoreError::NotFound => "that entry is no longer in the history",
            StoreError::TooLarge => "it is larger than 6 MB",
            StoreError::BadImport(why) => return why.fmt(f),
        })
    }
}

impl StoreError {
    /// The sentence the user reads when `action` failed this way.
    ///
    /// ```
    /// use lensplane_web::history::{Action, StoreError};
    /// assert!(StoreError::Refused.message(Action::Delete).starts_with("Not deleted: the browser refused"));
    /// ```
    pub fn message(&self, action: Action) -> String {
        let not_done = match action {
            Action::Save => "Not saved",
            Action::Delete => "Not deleted",
            Action::Clear => "Nothing was deleted",
            Action::Import => "Nothing was imported",
        };
        let kept = "Nothing already saved was lost, and the calculation stays on screen.";
        match self {
            StoreError::Full => format!("{not_done}: {self}. {kept} Export the history, then delete old entries to make room."),
            StoreError::Refused => format!("{not_done}: {self}. {kept}"),
            StoreError::Unavailable => "This browser is not letting Lensplane store anything (storage is disabled or private browsing blocks it). Calculations work, and the history keeps entries for this session only: they will be gone when the page is closed.".into(),
            StoreError::Newer => "The stored history was written by a newer version of Lensplane. It has been left as it is; new entries are kept for this session only. Reload to get the newer version.".into(),
            StoreError::NoRoomAside => "Some stored history could not be read and the device has no room to set it aside, so it was left exactly as found. Until that is resolved, new entries are kept for this session only.".into(),
            StoreError::NotFound => "That entry is no longer in the history.".into(),
            StoreError::TooLarge | StoreError::BadImport(_) => format!("The file was not imported: {self}. Nothing was changed."),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn each_action_says_what_did_not_happen() {
        let full_tail = "this device's storage is full. Nothing already saved was lost, and the calculation stays on screen. Export the history, then delete old entries to make room.";
        let refused_tail =
            "the browser refused to store it. Nothing already saved was lost, and the calculation stays on screen.";
        for (action, start) in [
            (Action::Save, "Not saved: "),
            (Action::Delete, "Not deleted: "),
            (Action::Clear, "Nothing was deleted: "),
            (Action::Import, "Nothing was imported: "),
        ] {
            assert_eq!(StoreError::Full.message(action), format!("{start}{full_tail}"));
            assert_eq!(StoreError::Refused.message(action), format!("{start}{refused_tail}"));
            assert_eq!(
                StoreError::NotFound.message(action),
                "That entry is no longer in the history."
            );
        }
    }

    #[test]
    fn refused_files_say_why_and_that_nothing_changed() {
        let said = |e: StoreError| e.message(Action::Import);
        assert_eq!(
            super::super::files::IMPORT_MAX,
            6_000_000,
            "the message names the limit"
        );
        assert_eq!(
            said(StoreError::TooLarge),
            "The file was not imported: it is larger than 6 MB. Nothing was changed."
        );
        assert_eq!(
            said(StoreError::BadImport(BadFile::NotJson)),
            "The file was not imported: it is not a Lensplane history export (JSON). Nothing was changed."
        );
        assert_eq!(
            said(StoreError::BadImport(BadFile::Incomplete(3))),
            "The file was not imported: it is damaged (entry 3 is incomplete). Nothing was changed."
        );
        assert_eq!(
            said(StoreError::BadImport(BadFile::Invalid(Invalid::Destination(
                "new-one".into()
            )))),
            "The file was not imported: entry new-one names an unknown panel. Nothing was changed."
        );
    }

    #[test]
    fn session_only_reasons_read_the_same_for_every_action() {
        for e in [StoreError::Unavailable, StoreError::Newer, StoreError::NoRoomAside] {
            assert!(e.message(Action::Save).contains("session only"), "{e}");
            assert_eq!(e.message(Action::Save), e.message(Action::Clear));
        }
        assert!(StoreError::Unavailable
            .message(Action::Save)
            .ends_with("they will be gone when the page is closed."));
    }
}
