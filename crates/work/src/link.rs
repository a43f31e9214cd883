//! The share link's fragment: `#w1.` then the work file's JSON (compact), zlib-compressed
//! (RFC 1950: deflate with an Adler-32 check) and base64url-encoded without padding (RFC 4648
//! section 5, whose alphabet needs no escaping in a URL).
//!
//! Kept apart from: the JSON itself (format.rs). The `1` after `w` is the link's encoding;
//! a newer encoding gets a new number, and this reader keeps reading `w1`.
//!
//! Why zlib and not bare deflate: a link cut short or changed on the way must be refused,
//! never read as a different desk, and bare deflate has no check of its own.

use base64::alphabet::URL_SAFE;
use base64::engine::general_purpose::{GeneralPurpose, GeneralPurposeConfig};
use base64::engine::DecodePaddingMode;
use base64::Engine;
use miniz_oxide::inflate::TINFLStatus;

use crate::WorkError;

/// The fragment's mark: `w` (a work), the encoding's number, a dot.
const MARK: &str = "w";
/// The encoding this build writes.
const ENCODING: u64 = 1;

/// The most a link may unpack to (bytes): far above any work the page holds (a 10,000-item
/// file of five years is about 14 MB), low enough that a hostile link cannot exhaust memory.
pub const MAX_UNPACKED: usize = 64_000_000;

/// Links longer than this may be cut by mail programs (common practice: about 2,000
/// characters is the length long kept safe for links in mail and older browsers).
pub const LINK_KEPT_BY_MAIL: usize = 2_000;

/// Links longer than this may be cut by browsers' address bars or chat programs (our choice
/// within "tens of thousands of characters"; Chromium itself keeps 2 MB): past it the page
/// offers the work file instead.
pub const LINK_KEPT_BY_BROWSERS: usize = 32_000;

/// base64url; padding accepted or not (some tools add it), never written.
const BASE64URL: GeneralPurpose = GeneralPurpose::new(
    &URL_SAFE,
    GeneralPurposeConfig::new()
        .with_encode_padding(false)
        .with_decode_padding_mode(DecodePaddingMode::Indifferent),
);

/// `#w1.` + the packed bytes.
pub fn encode(json: &[u8]) -> String {
    let packed = miniz_oxide::deflate::compress_to_vec_zlib(json, 9);
    format!("#{MARK}{ENCODING}.{}", BASE64URL.encode(packed))
}

/// The encoding number and the data of a link's fragment, when `text` is a share link (an
/// address with a `#w<n>.` fragment, its data perhaps broken over lines) or a fragment alone
/// (with or without its `#`; without it, in one piece). Anything else (a history that happens
/// to hold a `#` or start with `w1.`, say) is not a link.
pub fn payload(text: &str) -> Option<(u64, &str)> {
    // A link quoted in a sentence or a mail keeps the punctuation around it; none of these
    // characters is in the base64url alphabet, so they are never the link's own.
    let text = text
        .trim()
        .trim_end_matches(['.', ',', ';', ':', ')', ']', '>', '"', '\''])
        .trim_start_matches(['<', '(', '[', '"', '\'']);
    let fragment = match text.split_once('#') {
        // An address has no spaces or line ends before its fragment.
        Some((address, fragment)) if !address.contains(char::is_whitespace) => fragment,
        Some(_) => return None,
        // A fragment alone is one word: a text of several lines without a '#' is a history
        // (one that starts "w1." say), never a link.
        None if text.contains(char::is_whitespace) => return None,
        None => text,
    };
    let rest = fragment.strip_prefix(MARK)?;
    let (number, data) = rest.split_once('.')?;
    let encoding = number.parse::<u64>().ok()?;
    let link_like = data
        .bytes()
        .all(|b| b.is_ascii_alphanumeric() || b"-_=".contains(&b) || b.is_ascii_whitespace());
    (link_like && !number.is_empty() && number.bytes().all(|b| b.is_ascii_digit()))
        .then_some((encoding, data))
}

/// The JSON a fragment's data carries.
pub fn decode((encoding, data): (u64, &str)) -> Result<String, WorkError> {
    if encoding > ENCODING {
        return Err(WorkError::Newer { version: encoding });
    }
    if encoding != ENCODING {
        return Err(WorkError::Damaged {
            detail: format!("its mark w{encoding} is not one Morrowcast writes"),
        });
    }
    // Mail programs break long links into lines: the alphabet has no white space, so any is
    // theirs.
    let data: String = data.chars().filter(|c| !c.is_ascii_whitespace()).collect();
    let damaged = |detail: String| WorkError::Damaged { detail };
    if data.is_empty() {
        return Err(damaged("it carries no data".into()));
    }
    let packed = BASE64URL.decode(data.as_bytes()).map_err(|e| {
        damaged(match e {
            base64::DecodeError::InvalidByte(at, byte) => format!(
                "the character \"{}\" at place {} of its data cannot be in a link",
                byte as char,
                at + 1
            ),
            _ => "its data ends in the middle of a character group".into(),
        })
    })?;
    let json = miniz_oxide::inflate::decompress_to_vec_zlib_with_limit(&packed, MAX_UNPACKED)
        .map_err(|e| match e.status {
            TINFLStatus::HasMoreOutput => WorkError::TooLarge,
            TINFLStatus::FailedCannotMakeProgress => damaged("its data ends too early".into()),
            TINFLStatus::Adler32Mismatch => {
                damaged("its data does not match its own check sum".into())
            }
            _ => damaged("its data is not in the form Morrowcast writes".into()),
        })?;
    String::from_utf8(json).map_err(|_| damaged("its data is not text".into()))
}
