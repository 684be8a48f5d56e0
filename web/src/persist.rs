//! Keeping a design across visits: localStorage and share links.
//!
//! Both hold the design file text of [`crate::files`]: localStorage as is,
//! a link as `#design=<base64url of the text>` in the fragment (which never
//! leaves the browser, so a link works from file:// and offline).
//!
//! On load the page takes, in order: a design in the fragment, else the one
//! in localStorage, else the demo (see `crate::app`).
//!
//! Nothing stored is overwritten in silence: a stored design the page cannot
//! read (a newer version, damaged text) is held untouched until the user
//! downloads or discards it, and a design opened from a link first copies
//! the different design stored here to [`BEFORE_LINK_KEY`], one click away.

use crate::browser;

/// localStorage key of the last good design.
pub const STORAGE_KEY: &str = "magwright.design";
/// Fragment prefix of a share link.
pub const FRAGMENT_PREFIX: &str = "#design=";

/// localStorage key of the design that was stored when a link was opened.
pub const BEFORE_LINK_KEY: &str = "magwright.design.before-link";

/// Removes the stored design (the user chose to discard it).
pub fn discard() -> bool {
    browser::storage().is_some_and(|s| s.remove_item(STORAGE_KEY).is_ok())
}

/// Keeps `text` as the design from before a link was opened.
pub fn keep_before_link(text: &str) -> bool {
    browser::storage().is_some_and(|s| s.set_item(BEFORE_LINK_KEY, text).is_ok())
}

/// The design kept from before a link was opened, if any.
pub fn before_link() -> Option<String> {
    browser::storage()?.get_item(BEFORE_LINK_KEY).ok().flatten()
}

/// Forgets the design kept from before a link.
pub fn forget_before_link() {
    if let Some(s) = browser::storage() {
        let _ = s.remove_item(BEFORE_LINK_KEY);
    }
}

/// Saves the design text; false when storage is unavailable or full.
pub fn save(text: &str) -> bool {
    browser::storage().is_some_and(|s| s.set_item(STORAGE_KEY, text).is_ok())
}

/// The saved design text, if any.
pub fn load() -> Option<String> {
    browser::storage()?.get_item(STORAGE_KEY).ok().flatten()
}

/// The fragment that carries this design text.
pub fn fragment(text: &str) -> String {
    format!("{FRAGMENT_PREFIX}{}", base64url_encode(text.as_bytes()))
}

/// The design text of a `#design=` fragment: None when the fragment is
/// not a design link, an error message when it is but cannot be read.
pub fn from_fragment(hash: &str) -> Option<Result<String, String>> {
    let data = hash.strip_prefix(FRAGMENT_PREFIX)?;
    Some(
        base64url_decode(data)
            .ok_or_else(|| "the link is cut short or damaged (its design part is not base64url)".to_string())
            .and_then(|b| String::from_utf8(b).map_err(|_| "the link's design is not text".to_string())),
    )
}

const ALPHABET: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

/// RFC 4648 §5 base64url, without padding.
pub fn base64url_encode(bytes: &[u8]) -> String {
    let mut out = String::with_capacity(bytes.len().div_ceil(3) * 4);
    for chunk in bytes.chunks(3) {
        let b = [chunk[0], *chunk.get(1).unwrap_or(&0), *chunk.get(2).unwrap_or(&0)];
        let n = (u32::from(b[0]) << 16) | (u32::from(b[1]) << 8) | u32::from(b[2]);
        let chars = chunk.len() + 1;
        for i in 0..chars {
            out.push(ALPHABET[((n >> (18 - 6 * i)) & 63) as usize] as char);
        }
    }
    out
}

/// Decodes base64url with or without padding; None on any other character.
pub fn base64url_decode(text: &str) -> Option<Vec<u8>> {
    let text = text.trim_end_matches('=');
    let mut out = Vec::with_capacity(text.len() * 3 / 4);
    let mut acc: u32 = 0;
    let mut bits = 0;
    for c in text.bytes() {
        let v = match c {
            b'A'..=b'Z' => c - b'A',
            b'a'..=b'z' => c - b'a' + 26,
            b'0'..=b'9' => c - b'0' + 52,
            b'-' | b'+' => 62,
            b'_' | b'/' => 63,
            _ => return None,
        };
        acc = (acc << 6) | u32::from(v);
        bits += 6;
        if bits >= 8 {
            bits -= 8;
            out.push((acc >> bits) as u8);
            acc &= (1 << bits) - 1;
        }
    }
    if bits >= 6 {
        return None; // a lone trailing character cannot end a byte
    }
    Some(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// RFC 4648 §10 test vectors (base64; base64url differs only in 62/63).
    #[test]
    fn rfc4648_vectors() {
        let cases = [
            ("", ""),
            ("f", "Zg"),
            ("fo", "Zm8"),
            ("foo", "Zm9v"),
            ("foob", "Zm9vYg"),
            ("fooba", "Zm9vYmE"),
            ("foobar", "Zm9vYmFy"),
        ];
        for (plain, enc) in cases {
            assert_eq!(base64url_encode(plain.as_bytes()), enc);
            assert_eq!(base64url_decode(enc).unwrap(), plain.as_bytes());
            assert_eq!(
                base64url_decode(&format!("{enc}{}", "=".repeat((4 - enc.len() % 4) % 4))).unwrap(),
                plain.as_bytes()
            );
        }
        assert_eq!(base64url_encode(&[0xfb, 0xff]), "-_8");
        assert_eq!(base64url_decode("-_8").unwrap(), vec![0xfb, 0xff]);
        assert!(base64url_decode("ab$d").is_none());
        assert!(base64url_decode("Zm9vY").is_none());
    }

    #[test]
    fn fragments() {
        let f = fragment("{\"a\": \"°\"}");
        assert!(f.starts_with("#design="));
        assert_eq!(from_fragment(&f), Some(Ok("{\"a\": \"°\"}".to_string())));
        assert_eq!(from_fragment("#other"), None);
        assert!(matches!(from_fragment("#design=%%"), Some(Err(_))));
    }
}
