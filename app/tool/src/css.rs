//! The stylesheet as shipped: comments dropped and whitespace squeezed.
//!
//! Why by hand: the stylesheet is ours, plain CSS with no escapes, and the
//! only savings that matter are its comments (about 1.2 KB gzip of the
//! landing load) and indentation; a CSS minifier crate would add a large
//! parser to the build program for a few hundred bytes more. Quoted strings
//! (attribute selectors) are copied verbatim; whitespace is kept as one
//! space except next to `{`, `}`, `;` and `,`, where CSS never needs it (a
//! space before `:` or `>` can be a descendant combinator, so it stays).

/// The stylesheet without comments and without whitespace CSS does not need.
pub fn minify(css: &str) -> String {
    let mut out = String::with_capacity(css.len());
    let mut chars = css.chars().peekable();
    let mut space = false;
    while let Some(c) = chars.next() {
        match c {
            '/' if chars.peek() == Some(&'*') => {
                chars.next();
                let mut last = ' ';
                for d in chars.by_ref() {
                    if last == '*' && d == '/' {
                        break;
                    }
                    last = d;
                }
                space = true;
            }
            c if c.is_whitespace() => space = true,
            '"' | '\'' => {
                push_space(&mut out, &mut space, c);
                out.push(c);
                for d in chars.by_ref() {
                    out.push(d);
                    if d == c {
                        break;
                    }
                }
            }
            c => {
                push_space(&mut out, &mut space, c);
                if c == '}' && out.ends_with(';') {
                    out.pop();
                }
                out.push(c);
            }
        }
    }
    out
}

const TIGHT: [char; 4] = ['{', '}', ';', ','];

fn push_space(out: &mut String, space: &mut bool, next: char) {
    if std::mem::take(space) && !out.is_empty() && !TIGHT.contains(&next) && !out.ends_with(TIGHT) {
        out.push(' ');
    }
}

#[cfg(test)]
mod tests {
    use super::minify;

    #[test]
    fn drops_comments_and_needless_whitespace() {
        let css = "/* the page */\n.a, .b {\n  color: red;\n  margin: 0 1px;\n}\n\n.c > .d :focus { x: y }\n";
        assert_eq!(minify(css), ".a,.b{color: red;margin: 0 1px}.c > .d :focus{x: y}");
    }

    #[test]
    fn keeps_quoted_text_and_media_queries() {
        let css = "@media (min-width: 40rem) {\n :root[data-theme=\"a  b\"] /* c */ .x { y: z; }\n}";
        assert_eq!(
            minify(css),
            "@media (min-width: 40rem){:root[data-theme=\"a  b\"] .x{y: z}}"
        );
    }

    #[test]
    fn the_shipped_stylesheet_keeps_every_rule() {
        let css = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/../../public/styles.css")).unwrap();
        let small = minify(&css);
        assert!(small.len() < css.len() * 9 / 10, "{} of {}", small.len(), css.len());
        // As many rule blocks as before (no comment holds a brace), and no comment left.
        assert_eq!(small.matches('{').count(), css.matches('{').count());
        assert_eq!(small.matches('}').count(), css.matches('}').count());
        assert!(!small.contains("/*"));
    }
}
