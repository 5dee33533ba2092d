//! "Check the received lens": the lens-check link that opens a spectacle
//! order (the current vertex result or a saved calculation) as the lens
//! ordered. Only the values the lens check takes travel: `r`, `l` (the
//! orderable spectacle lens per eye) and `add`. A contact-lens order has no
//! focimeter check here, so it gets no link.

use crate::history::Entry;
use crate::link::{href, Destination, Query};
use lensplane_core::{fmt_power, parse_add, parse_rx, parse_vertex_mm, Eye};

/// The lens-check link for the spectacle lenses ordered per eye (trade
/// notation, as the core writes them) and the add ordered; `None` when
/// neither eye has a lens.
pub fn check_href(right: Option<String>, left: Option<String>, add: Option<String>) -> Option<String> {
    if right.is_none() && left.is_none() {
        return None;
    }
    let q = Query::default()
        .with("r", right.as_deref().unwrap_or(""))
        .with("l", left.as_deref().unwrap_or(""))
        .with("add", add.as_deref().unwrap_or(""));
    Some(href(Destination::LensCheck, &q))
}

/// Whether a link's plane value (`default` when missing) is a spectacle
/// plane: it reads as a vertex distance and is not the cornea.
fn spectacle_plane(text: Option<&str>, default: Option<&str>) -> bool {
    text.or(default)
        .is_some_and(|t| parse_vertex_mm(t).is_ok_and(|p| !p.value.is_cornea()))
}

/// A lens as the core reads it back, in its trade notation.
fn lens(text: Option<&str>) -> Option<String> {
    parse_rx(text?).ok().map(|p| p.value.to_string())
}

/// The lens-check link of a saved calculation that holds a spectacle
/// order: a vertex, spherical-equivalent or over-refraction result for
/// spectacles (the orderable lens saved per eye), or a near calculation
/// (the distance lens and the add). `None` for anything else.
pub fn entry_check_href(e: &Entry) -> Option<String> {
    let q = Query::parse(&e.query);
    let saved_order = |eye| {
        e.eyes
            .iter()
            .find(|y| y.eye == eye)
            .and_then(|y| lens(y.order.as_deref()))
    };
    let spectacles = match e.destination {
        Destination::Vertex | Destination::Equivalent => spectacle_plane(q.get("to"), Some("0")),
        Destination::OverRefraction => spectacle_plane(q.get("to"), q.get("worn")),
        Destination::Near => {
            let add = q
                .get("add")
                .and_then(|a| parse_add(a).ok())
                .map(|a| fmt_power(a.value.dioptres()));
            return check_href(lens(q.get("r")), lens(q.get("l")), add);
        }
        _ => false,
    };
    if !spectacles {
        return None;
    }
    check_href(saved_order(Eye::Right), saved_order(Eye::Left), None)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::history::EyeSummary;

    fn entry(destination: Destination, query: &str, order: Option<&str>) -> Entry {
        Entry::new(
            "x".into(),
            1_714_745_100_000,
            destination,
            query.into(),
            String::new(),
            vec![EyeSummary {
                eye: Eye::Right,
                input: "-10.00 DS".into(),
                result: "-10.42 DS".into(),
                order: order.map(Into::into),
            }],
        )
    }

    #[test]
    fn only_lenses_make_a_link() {
        assert_eq!(
            check_href(None, Some("-2.00 DS".into()), None).as_deref(),
            Some("/lens-check?l=-2.00%20DS")
        );
        assert_eq!(check_href(None, None, Some("+2.00".into())), None);
    }

    #[test]
    fn a_spectacle_vertex_result_opens_its_orderable_lens() {
        // Notes V6 [textbook]: −10.00 from 10 to 14 mm → −10.42, ordered −10.50 on spectacle quarter steps.
        let e = entry(Destination::Vertex, "r=-10&from=10&to=14", Some("-10.50 DS"));
        assert_eq!(entry_check_href(&e).as_deref(), Some("/lens-check?r=-10.50%20DS"));
    }

    #[test]
    fn a_contact_lens_order_has_no_focimeter_check() {
        let e = entry(Destination::Vertex, "r=-10&from=12&to=0", Some("-9.00 DS"));
        assert_eq!(entry_check_href(&e), None);
        // The vertex panel's default target is the cornea.
        let e = entry(Destination::Vertex, "r=-10", Some("-9.00 DS"));
        assert_eq!(entry_check_href(&e), None);
        let e = entry(Destination::LensCheck, "r=-10&rm=-10", None);
        assert_eq!(entry_check_href(&e), None);
    }

    #[test]
    fn a_near_entry_opens_the_distance_lens_and_the_add() {
        let e = entry(
            Destination::Near,
            "r=%2B1.00%20-0.50%20x90&add=2&to=0",
            Some("+1.25 DS"),
        );
        assert_eq!(
            entry_check_href(&e).as_deref(),
            Some("/lens-check?r=%2B1.00%20-0.50%20%C3%97090&add=%2B2.00")
        );
    }
}
