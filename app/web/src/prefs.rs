//! Small choices remembered on the device: the theme, whether a panel's
//! details are open, whether the separate prescription fields are shown.
//! Each is one localStorage key; a browser that refuses storage keeps the
//! choice for the session only.

use leptos::prelude::*;

fn storage() -> Option<web_sys::Storage> {
    // Some private modes throw on access: then the choice lasts for the session only.
    web_sys::window().and_then(|w| w.local_storage().ok().flatten())
}

/// The stored text under `key`.
pub fn read(key: &str) -> Option<String> {
    storage().and_then(|s| s.get_item(key).ok().flatten())
}

/// Stores `value` under `key` (`None` removes it).
pub fn write(key: &str, value: Option<&str>) {
    if let Some(s) = storage() {
        let _ = match value {
            Some(v) => s.set_item(key, v),
            None => s.remove_item(key),
        };
    }
}

/// An open/closed choice remembered under one key (closed unless stored open).
#[derive(Clone, Copy)]
pub struct Remembered {
    key: &'static str,
    open: RwSignal<bool>,
}

impl Remembered {
    pub fn new(key: &'static str) -> Remembered {
        Remembered {
            key,
            open: RwSignal::new(read(key).as_deref() == Some("open")),
        }
    }

    pub fn is_open(&self) -> bool {
        self.open.get()
    }

    /// Records the user's choice (from the disclosure's toggle event).
    pub fn set(&self, open: bool) {
        if self.open.get_untracked() != open {
            self.open.set(open);
            write(self.key, open.then_some("open"));
        }
    }
}

/// Whether the separate sphere/cylinder/axis fields are shown, for every
/// panel (provided by the shell).
#[derive(Clone, Copy)]
pub struct FieldsShown(pub Remembered);

/// The `toggle` handler of a `<details>` that keeps `choice` in step.
pub fn on_toggle(choice: Remembered) -> impl Fn(leptos::ev::Event) + Copy + 'static {
    move |ev| {
        let open = event_target::<web_sys::HtmlDetailsElement>(&ev).open();
        choice.set(open);
    }
}
