//! Light, dark, or the system's choice; remembered on the device. boot.js
//! applies the remembered choice before the app starts, so there is no
//! flash of the wrong theme.

use leptos::prelude::*;

/// The key boot.js reads too.
const KEY: &str = "lensplane.theme";

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Theme {
    System,
    Light,
    Dark,
}

impl Theme {
    pub fn name(self) -> &'static str {
        match self {
            Theme::System => "system",
            Theme::Light => "light",
            Theme::Dark => "dark",
        }
    }

    pub fn from_name(name: &str) -> Theme {
        match name {
            "light" => Theme::Light,
            "dark" => Theme::Dark,
            _ => Theme::System,
        }
    }

    /// The next choice of the theme button.
    pub fn next(self) -> Theme {
        match self {
            Theme::System => Theme::Dark,
            Theme::Dark => Theme::Light,
            Theme::Light => Theme::System,
        }
    }

    /// What the button shows (its accessible name is [`Theme::label`]).
    pub fn short(self) -> &'static str {
        match self {
            Theme::System => "◐ System",
            Theme::Light => "☀ Light",
            Theme::Dark => "☾ Dark",
        }
    }

    pub fn label(self) -> &'static str {
        match self {
            Theme::System => "Theme: system",
            Theme::Light => "Theme: light",
            Theme::Dark => "Theme: dark",
        }
    }
}

pub fn remembered() -> Theme {
    crate::prefs::read(KEY)
        .map(|n| Theme::from_name(&n))
        .unwrap_or(Theme::System)
}

pub fn apply(theme: Theme) {
    if let Some(root) = document().document_element() {
        let _ = match theme {
            Theme::System => root.remove_attribute("data-theme"),
            t => root.set_attribute("data-theme", t.name()),
        };
    }
    crate::prefs::write(KEY, (theme != Theme::System).then(|| theme.name()));
}

/// The theme button of the masthead.
#[component]
pub fn ThemeButton() -> impl IntoView {
    let theme = RwSignal::new(remembered());
    view! {
        <button type="button" class="button quiet theme-button" aria-label=move || theme.get().label()
            on:click=move |_| { let next = theme.get_untracked().next(); theme.set(next); apply(next); }>
            {move || theme.get().short()}
        </button>
    }
}

#[cfg(test)]
mod tests {
    use super::Theme;

    #[test]
    fn the_button_cycles_through_every_theme_and_names_round_trip() {
        let mut t = Theme::System;
        let mut seen = vec![];
        for _ in 0..3 {
            t = t.next();
            seen.push(t);
            assert_eq!(Theme::from_name(t.name()), t);
        }
        assert_eq!(t, Theme::System);
        assert_eq!(seen, vec![Theme::Dark, Theme::Light, Theme::System]);
    }
}
