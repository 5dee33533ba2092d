//! The link format: every calculation is a URL that can be bookmarked,
//! shared, stored in the history and opened offline.
//!
//! ```text
//! /vertex?r=RX&l=RX&from=MM&to=MM
//! /equivalent?r=RX&l=RX&from=MM&to=MM
//! /near?r=RX&l=RX&add=D&from=MM&to=MM&reading=CM&measured=lens|eye&age=YEARS
//! /history
//! ```
//!
//! Values are kept exactly as typed (the panels parse them through the core),
//! so a link reproduces what was on screen, errors included. In values, `%20`
//! is a space and a literal `+` is a plus sign (never a space): `r=+2.00`
//! means plus two dioptres.

use percent_encoding::{percent_decode_str, utf8_percent_encode, AsciiSet, NON_ALPHANUMERIC};

/// Everything but the unreserved characters of RFC 3986 is escaped, so `+`
/// travels as `%2B` and a space as `%20`.
const VALUE: &AsciiSet = &NON_ALPHANUMERIC.remove(b'-').remove(b'.').remove(b'_').remove(b'~');

/// The destinations of the app.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Destination {
    Vertex,
    Equivalent,
    Near,
    /// A worn lens combined with the over-refraction found over it.
    OverRefraction,
    /// Spectacle against contact-lens magnification.
    ImageSize,
    /// A printable vertex conversion chart.
    Chart,
    /// A received lens checked against its order.
    LensCheck,
    History,
    /// What the tool computes, the model, the cautions, the version.
    About,
}

impl Destination {
    /// Every destination.
    pub const ALL: [Destination; 9] = [
        Destination::Vertex,
        Destination::Equivalent,
        Destination::Near,
        Destination::OverRefraction,
        Destination::ImageSize,
        Destination::Chart,
        Destination::LensCheck,
        Destination::History,
        Destination::About,
    ];

    /// The route, relative to where the app is deployed.
    pub fn path(self) -> &'static str {
        match self {
            Destination::Vertex => "/vertex",
            Destination::Equivalent => "/equivalent",
            Destination::Near => "/near",
            Destination::OverRefraction => "/over-refraction",
            Destination::ImageSize => "/image-size",
            Destination::Chart => "/chart",
            Destination::LensCheck => "/lens-check",
            Destination::History => "/history",
            Destination::About => "/about",
        }
    }

    /// Its stable id: the path without the slash (`"vertex"`). Stored in the
    /// history and written into its files, so it never changes.
    ///
    /// ```
    /// use lensplane_web::link::Destination;
    /// assert_eq!(Destination::Equivalent.id(), "equivalent");
    /// assert_eq!(Destination::from_id("near"), Some(Destination::Near));
    /// assert_eq!(Destination::from_id("/near"), None);
    /// ```
    pub fn id(self) -> &'static str {
        &self.path()[1..]
    }

    /// The destination with this [`Destination::id`].
    pub fn from_id(id: &str) -> Option<Destination> {
        Destination::ALL.into_iter().find(|d| d.id() == id)
    }

    /// Whether it computes something that can be saved (every destination
    /// but the history and the about page).
    pub fn is_calculator(self) -> bool {
        !matches!(self, Destination::History | Destination::About)
    }

    /// Whether its calculations are per eye. A conversion chart is not: it
    /// is saved in the history without eye summaries, with a one-line
    /// summary of its settings instead.
    pub fn has_eyes(self) -> bool {
        self.is_calculator() && self != Destination::Chart
    }

    /// The destination a route path (without the deploy base) names.
    pub fn from_path(path: &str) -> Option<Destination> {
        let trimmed = path.trim_end_matches('/');
        Destination::ALL.into_iter().find(|d| d.path() == trimmed)
    }

    /// What a full path names below the deploy `base` ("" or "/sub"):
    /// `None` for the app's root (which opens the vertex panel), `Some(None)`
    /// for a path that is not a destination.
    pub fn route(path: &str, base: &str) -> Option<Option<Destination>> {
        let Some(rest) = path.strip_prefix(base) else {
            return Some(None);
        };
        if rest.is_empty() || rest == "/" {
            return None;
        }
        Some(Destination::from_path(rest))
    }

    /// Its one name: the page title, the navigation, the history and
    /// copied text all use it.
    pub fn title(self) -> &'static str {
        match self {
            Destination::Vertex => "Vertex",
            Destination::Equivalent => "Spherical equivalent",
            Destination::Near => "Near",
            Destination::OverRefraction => "Over-refraction",
            Destination::ImageSize => "Image size",
            Destination::Chart => "Conversion chart",
            Destination::LensCheck => "Lens check",
            Destination::History => "History",
            Destination::About => "About",
        }
    }

    /// The query keys this destination understands, in the order links write them.
    pub fn keys(self) -> &'static [&'static str] {
        match self {
            Destination::Vertex => &["r", "l", "from", "to", "form"],
            Destination::Equivalent => &["r", "l", "from", "to", "cylmax", "oblmax", "ratio"],
            Destination::Near => &["r", "l", "add", "from", "to", "reading", "unit", "measured", "age"],
            Destination::OverRefraction => &[
                "r",
                "l",
                "ror",
                "lor",
                "worn",
                "at",
                "to",
                "rrot",
                "lrot",
                "runstable",
                "lunstable",
                "lens",
            ],
            Destination::ImageSize => &["r", "l", "from", "rf", "rt", "rn", "lf", "lt", "ln"],
            Destination::Chart => &["from", "to", "min", "max", "step", "ladder", "r", "l"],
            Destination::LensCheck => &["r", "l", "rm", "lm", "add", "radd", "ladd", "type"],
            Destination::History => &["q", "panel"],
            Destination::About => &[],
        }
    }

    /// Whether the navigation carries the value of `key` into this
    /// destination's link from the calculators opened before. Only what means
    /// the same thing carries: the refraction and its planes into the
    /// calculators that start from a refraction, never into the lens check
    /// (whose `r` and `l` are the lens ordered) or the over-refraction (whose
    /// `r` and `l` are the lens worn).
    pub fn carries(self, key: &str) -> bool {
        match self {
            Destination::LensCheck | Destination::OverRefraction | Destination::About => false,
            Destination::ImageSize => matches!(key, "r" | "l" | "from"),
            _ => self.keys().contains(&key),
        }
    }

    /// The calculation whose standing cautions the page shows.
    pub fn calculation(self) -> Option<lensplane_core::Calculation> {
        use lensplane_core::Calculation as C;
        match self {
            Destination::Vertex => Some(C::Vertex),
            Destination::Equivalent => Some(C::Equivalent),
            Destination::Near => Some(C::Near),
            Destination::OverRefraction => Some(C::OverRefraction),
            Destination::ImageSize => Some(C::ImageSize),
            Destination::Chart => Some(C::Chart),
            Destination::LensCheck => Some(C::LensCheck),
            Destination::History | Destination::About => None,
        }
    }
}

/// A query string as ordered key/value pairs of raw (decoded) text.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Query(Vec<(String, String)>);

impl Query {
    /// Parses `?a=1&b=2` (the `?` is optional). Later duplicates win.
    ///
    /// ```
    /// use lensplane_web::link::Query;
    /// let q = Query::parse("?r=%2B2.00%20-1.00%20x90&from=12");
    /// assert_eq!(q.get("r"), Some("+2.00 -1.00 x90"));
    /// assert_eq!(Query::parse("r=+2.00").get("r"), Some("+2.00"));
    /// ```
    pub fn parse(raw: &str) -> Query {
        let mut q = Query::default();
        for pair in raw.trim_start_matches('?').split('&').filter(|p| !p.is_empty()) {
            let (k, v) = pair.split_once('=').unwrap_or((pair, ""));
            q.set(&decode(k), &decode(v));
        }
        q
    }

    pub fn get(&self, key: &str) -> Option<&str> {
        self.0.iter().find(|(k, _)| k == key).map(|(_, v)| v.as_str())
    }

    /// Sets a value; an empty value removes the key.
    pub fn set(&mut self, key: &str, value: &str) {
        self.0.retain(|(k, _)| k != key);
        if !value.trim().is_empty() {
            self.0.push((key.to_string(), value.to_string()));
        }
    }

    pub fn with(mut self, key: &str, value: &str) -> Query {
        self.set(key, value);
        self
    }

    pub fn is_empty(&self) -> bool {
        self.0.is_empty()
    }

    /// Encodes the pairs in the order of `keys` (unknown keys last), without `?`.
    ///
    /// ```
    /// use lensplane_web::link::Query;
    /// let q = Query::default().with("to", "0").with("r", "+2.00 -1.00 ×90");
    /// assert_eq!(q.encode(&["r", "to"]), "r=%2B2.00%20-1.00%20%C3%9790&to=0");
    /// ```
    pub fn encode(&self, keys: &[&str]) -> String {
        // In the order of `keys`, then the rest as they come (a stable sort by
        // rank, without a sort instantiation in the wasm).
        let known = keys
            .iter()
            .enumerate()
            .filter(|(i, k)| !keys[..*i].contains(k))
            .flat_map(|(_, k)| self.0.iter().filter(move |(pk, _)| pk == k));
        let rest = self.0.iter().filter(|(k, _)| !keys.contains(&k.as_str()));
        known
            .chain(rest)
            .map(|(k, v)| format!("{}={}", utf8_percent_encode(k, VALUE), utf8_percent_encode(v, VALUE)))
            .collect::<Vec<_>>()
            .join("&")
    }
}

fn decode(s: &str) -> String {
    percent_decode_str(s).decode_utf8_lossy().into_owned()
}

/// A full link (path and query) for a destination, relative to the deploy base.
///
/// ```
/// use lensplane_web::link::{href, Destination, Query};
/// let q = Query::default().with("r", "-8.00 -2.00 x180").with("from", "12").with("to", "0");
/// assert_eq!(href(Destination::Vertex, &q), "/vertex?r=-8.00%20-2.00%20x180&from=12&to=0");
/// assert_eq!(href(Destination::History, &Query::default()), "/history");
/// ```
pub fn href(dest: Destination, query: &Query) -> String {
    let encoded = query.encode(dest.keys());
    if encoded.is_empty() {
        dest.path().to_string()
    } else {
        format!("{}?{}", dest.path(), encoded)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_typed_character_survives_a_round_trip() {
        let typed = [
            "−6.00 –1.25 ×005",
            "-2,50",
            "pl",
            "+1.00 DS",
            "-2.00/-1.00x180",
            "a&b=c%d",
            "180°",
            "  ",
        ];
        for t in typed {
            let q = Query::default().with("r", t);
            let back = Query::parse(&q.encode(&["r"]));
            assert_eq!(back.get("r"), if t.trim().is_empty() { None } else { Some(t) }, "{t:?}");
        }
    }

    #[test]
    fn a_literal_plus_is_a_sign_not_a_space() {
        assert_eq!(Query::parse("?r=+12.00&l=%2B4").get("r"), Some("+12.00"));
        assert_eq!(Query::parse("?r=+12.00&l=%2B4").get("l"), Some("+4"));
    }

    #[test]
    fn destinations_round_trip_their_paths() {
        for d in Destination::ALL {
            assert_eq!(Destination::from_path(d.path()), Some(d));
            assert_eq!(Destination::from_path(&format!("{}/", d.path())), Some(d));
        }
        assert_eq!(Destination::from_path("/elsewhere"), None);
        for d in Destination::ALL {
            assert_eq!(Destination::from_id(d.id()), Some(d));
        }
    }

    #[test]
    fn ids_are_the_paths_without_the_slash_and_name_their_destination() {
        for d in Destination::ALL {
            assert_eq!(format!("/{}", d.id()), d.path());
            assert_eq!(Destination::from_id(d.id()), Some(d));
        }
        // The ids the history has stored since its first version.
        let stored: Vec<&str> = Destination::ALL
            .into_iter()
            .filter(|d| d.is_calculator())
            .map(Destination::id)
            .collect();
        assert_eq!(stored[..3], ["vertex", "equivalent", "near"]);
        assert_eq!(Destination::from_id(""), None);
        assert_eq!(Destination::from_id("Vertex"), None);
    }

    #[test]
    fn keys_encode_in_the_given_order_then_the_rest_as_they_came() {
        let q = Query::default()
            .with("z", "1")
            .with("to", "0")
            .with("y", "2")
            .with("r", "-1");
        assert_eq!(q.encode(&["r", "from", "to"]), "r=-1&to=0&z=1&y=2");
        assert_eq!(q.encode(&[]), "z=1&to=0&y=2&r=-1");
    }

    #[test]
    fn malformed_queries_do_not_panic() {
        let q = Query::parse("?=&&r&%zz=%e2%28&to=%");
        assert_eq!(q.get("r"), None);
        assert_eq!(q.get("to"), Some("%"));
    }

    #[test]
    fn routes_are_read_below_the_deploy_base() {
        assert_eq!(Destination::route("/", ""), None);
        assert_eq!(Destination::route("/vertex", ""), Some(Some(Destination::Vertex)));
        assert_eq!(Destination::route("/near/", ""), Some(Some(Destination::Near)));
        assert_eq!(Destination::route("/clinic/lensplane/", "/clinic/lensplane"), None);
        assert_eq!(Destination::route("/clinic/lensplane", "/clinic/lensplane"), None);
        assert_eq!(
            Destination::route("/clinic/lensplane/history", "/clinic/lensplane"),
            Some(Some(Destination::History))
        );
        assert_eq!(Destination::route("/elsewhere", ""), Some(None));
        assert_eq!(Destination::route("/other/vertex", "/clinic"), Some(None));
    }
}
