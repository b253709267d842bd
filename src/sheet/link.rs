//! Worksheet links: the whole sheet in the URL fragment, so it is never
//! sent to a server.
//!
//! Format, version 1: `#h1.` followed by base64url (no padding) of the raw
//! DEFLATE (RFC 1951) of the sheet file's compact JSON (docs/sheet-format.md).
//! - JSON, not a binary layout: the sheet file is already versioned and
//!   self-describing, so any later Headroom that reads sheet files reads
//!   old links too. Deflate wins back most of JSON's size.
//! - A link is untrusted input: limits on both the link's length and the
//!   inflated size come before any parsing, and every failure is a
//!   [`LinkError`], never a panic.

use base64::engine::general_purpose::URL_SAFE_NO_PAD;
use base64::Engine as _;

use super::file::{SheetError, SheetFile};

/// What a version-1 fragment starts with (after `#`).
pub const PREFIX_V1: &str = "h1.";
/// Longest fragment accepted, characters. Browsers keep far longer URLs,
/// but QR codes and chat apps do not; a real worksheet is well under this.
pub const MAX_LINK_CHARS: usize = 64 * 1024;
/// Largest inflated sheet accepted from a link, bytes.
pub const MAX_INFLATED_BYTES: usize = 1024 * 1024;

/// Why a link does not open.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum LinkError {
    /// The fragment is not a Headroom worksheet link.
    NotALink,
    /// A link format newer than this Headroom reads.
    NewerVersion(String),
    /// Longer than [`MAX_LINK_CHARS`].
    TooLong(usize),
    /// Not valid base64url: truncated or altered in transit.
    Damaged,
    /// Not valid deflate, or not UTF-8 inside.
    BadData,
    /// Inflates to more than [`MAX_INFLATED_BYTES`].
    TooBig,
    /// The sheet inside is not readable.
    Sheet(SheetError),
    /// The browser has no Compression Streams (the page only).
    Unsupported,
}

impl std::fmt::Display for LinkError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            LinkError::NotALink => write!(f, "this link does not hold a Headroom worksheet"),
            LinkError::NewerVersion(v) => {
                write!(f, "this link was made by a newer Headroom (format {v}); update Headroom to open it")
            }
            LinkError::TooLong(n) => {
                write!(f, "this link is {n} characters long, more than the {MAX_LINK_CHARS} a worksheet link may be")
            }
            LinkError::Damaged => write!(f, "this link is damaged or cut short: ask for it to be sent again"),
            LinkError::BadData => write!(f, "this link's worksheet is damaged"),
            LinkError::TooBig => write!(
                f,
                "this link's worksheet unpacks to more than {} MiB, too large to open safely",
                MAX_INFLATED_BYTES >> 20
            ),
            LinkError::Sheet(e) => write!(f, "the worksheet in this link cannot be read: {e}"),
            LinkError::Unsupported => {
                write!(f, "this browser cannot unpack worksheet links (it lacks Compression Streams); open it in a current browser")
            }
        }
    }
}

impl std::error::Error for LinkError {}

/// The fragment (without `#`) for a sheet.
///
/// Natively only: the page deflates with the browser's own Compression
/// Streams (`ui::share::fragment_of`), so the module holds no deflate of
/// its own; either's output is raw DEFLATE, and each reads the other's.
#[cfg(not(target_arch = "wasm32"))]
pub fn encode(sheet: &SheetFile) -> String {
    wrap(&miniz_oxide::deflate::compress_to_vec(sheet.to_compact_json().as_bytes(), 9))
}

/// The fragment for deflated JSON.
pub fn wrap(packed: &[u8]) -> String {
    format!("{PREFIX_V1}{}", URL_SAFE_NO_PAD.encode(packed))
}

/// Whether a fragment looks like a worksheet link at all (any version).
pub fn is_link(fragment: &str) -> bool {
    let f = fragment.trim_start_matches('#');
    f.len() > 2
        && f.starts_with('h')
        && f[1..].split('.').next().is_some_and(|v| !v.is_empty() && v.chars().all(|c| c.is_ascii_digit()))
}

/// Reads a sheet from a fragment (with or without the leading `#`).
///
/// Natively only; the page reads links with `ui::share::read_fragment`,
/// through the same [`unwrap`] and [`open`] around the browser's inflate.
///
/// # Errors
/// A [`LinkError`] for anything that is not a complete, current-or-older
/// worksheet link; never panics.
#[cfg(not(target_arch = "wasm32"))]
pub fn decode(fragment: &str) -> Result<SheetFile, LinkError> {
    let packed = unwrap(fragment)?;
    let json = miniz_oxide::inflate::decompress_to_vec_with_limit(&packed, MAX_INFLATED_BYTES).map_err(|e| {
        if e.status == miniz_oxide::inflate::TINFLStatus::HasMoreOutput {
            LinkError::TooBig
        } else {
            LinkError::BadData
        }
    })?;
    open(json)
}

/// The deflated bytes a fragment carries, after the checks that come
/// before any inflating: its length, its version, its base64url.
///
/// # Errors
/// [`LinkError::TooLong`], [`LinkError::NotALink`],
/// [`LinkError::NewerVersion`] or [`LinkError::Damaged`].
pub fn unwrap(fragment: &str) -> Result<Vec<u8>, LinkError> {
    let f = fragment.trim().trim_start_matches('#');
    if f.len() > MAX_LINK_CHARS {
        return Err(LinkError::TooLong(f.len()));
    }
    let Some(body) = f.strip_prefix(PREFIX_V1) else {
        if is_link(f) {
            let v = f[1..].split('.').next().unwrap_or_default();
            return Err(LinkError::NewerVersion(v.to_owned()));
        }
        return Err(LinkError::NotALink);
    };
    URL_SAFE_NO_PAD.decode(body.as_bytes()).map_err(|_| LinkError::Damaged)
}

/// The sheet in a link's inflated bytes (at most [`MAX_INFLATED_BYTES`]).
///
/// # Errors
/// [`LinkError::BadData`] when they are not UTF-8, [`LinkError::Sheet`]
/// when they are not a sheet.
pub fn open(inflated: Vec<u8>) -> Result<SheetFile, LinkError> {
    let text = String::from_utf8(inflated).map_err(|_| LinkError::BadData)?;
    SheetFile::from_json(&text).map_err(LinkError::Sheet)
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests {
    use super::*;

    fn demo() -> SheetFile {
        SheetFile::from_json(include_str!("../../examples/clinic-chilled-water.json")).unwrap()
    }

    #[test]
    fn round_trip() {
        let s = demo();
        let link = encode(&s);
        assert!(link.starts_with("h1."));
        assert!(link.chars().all(|c| c.is_ascii_alphanumeric() || "-_.".contains(c)), "URL-safe");
        assert_eq!(decode(&format!("#{link}")).unwrap(), s);
    }

    #[test]
    fn truncated_and_altered_links_are_errors() {
        let link = encode(&demo());
        for cut in [4, link.len() / 2, link.len() - 1] {
            assert!(decode(&link[..cut]).is_err(), "cut at {cut}");
        }
        let mut bad = link.clone().into_bytes();
        bad[10] = b'*';
        assert_eq!(decode(std::str::from_utf8(&bad).unwrap()), Err(LinkError::Damaged));
        assert_eq!(decode("#section-3"), Err(LinkError::NotALink));
        assert_eq!(decode("#h7.abc"), Err(LinkError::NewerVersion("7".into())));
        assert!(matches!(decode(&format!("h1.{}", "A".repeat(MAX_LINK_CHARS))), Err(LinkError::TooLong(_))));
    }

    #[test]
    fn a_deflate_bomb_is_refused() {
        // 4 MiB of spaces deflates to a few kilobytes.
        let bomb = miniz_oxide::deflate::compress_to_vec(&vec![b' '; 4 << 20], 9);
        let link = format!("h1.{}", URL_SAFE_NO_PAD.encode(bomb));
        assert!(link.len() < MAX_LINK_CHARS);
        assert_eq!(decode(&link), Err(LinkError::TooBig));
    }
}
