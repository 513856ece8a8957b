//! A small JSON text writer for the output records: the same bytes as
//! `serde_json`'s compact output, without going through the serde data model.
//!
//! Strings are scanned for the few bytes JSON must escape (`"`, `\` and the
//! controls below U+0020) and copied in one piece when there are none, which
//! is nearly always; a string that needs escaping, every number and every
//! non-finite float goes through `serde_json` itself, so the escaping and the
//! number formatting are `serde_json`'s by construction.

use serde_json::ser::{CompactFormatter, Formatter};

/// True when `s` holds no byte that JSON must escape.
///
/// Long strings go 32 bytes at a time without an early exit inside a block
/// (the compiler makes a few vector instructions of it); the rest 8 bytes at
/// a time as one `u64` word, the last word overlapping the one before or,
/// for a string shorter than 8 bytes, padded with spaces.
fn plain(s: &[u8]) -> bool {
    let bad = |b: u8| (b < 0x20) | (b == b'"') | (b == b'\\');
    let mut blocks = s.chunks_exact(32);
    for block in &mut blocks {
        if block.iter().fold(false, |acc, &b| acc | bad(b)) {
            return false;
        }
    }
    let rest = blocks.remainder();
    if s.len() < 8 {
        return !word_has_bad(short_word(s));
    }
    let mut words = rest.chunks_exact(8);
    for w in &mut words {
        let mut a = [0u8; 8];
        a.copy_from_slice(w);
        if word_has_bad(u64::from_le_bytes(a)) {
            return false;
        }
    }
    // The last word overlaps the bytes already checked.
    words.remainder().is_empty() || !word_has_bad(last_word(s))
}

/// The bytes of `s` (shorter than 8) as one word: two overlapping 4-byte
/// loads from 4 bytes on, else the bytes one by one over spaces.
fn short_word(s: &[u8]) -> u64 {
    let n = s.len();
    match (s.get(..4), s.get(n.saturating_sub(4)..)) {
        (Some(head), Some(tail)) if n >= 4 => {
            let mut a = [0u8; 4];
            let mut b = [0u8; 4];
            a.copy_from_slice(head);
            b.copy_from_slice(tail);
            u64::from(u32::from_le_bytes(a)) | u64::from(u32::from_le_bytes(b)) << 32
        }
        _ => {
            let mut w = u64::from_le_bytes([b' '; 8]);
            for (i, &b) in s.iter().enumerate().take(8) {
                w = (w & !(0xff << (8 * i))) | u64::from(b) << (8 * i);
            }
            w
        }
    }
}

/// The last 8 bytes of `s` (at least 8 long) as a word.
fn last_word(s: &[u8]) -> u64 {
    let mut a = [b' '; 8];
    if let Some(tail) = s.get(s.len().saturating_sub(8)..) {
        let n = tail.len().min(8);
        a[..n].copy_from_slice(&tail[..n]);
    }
    u64::from_le_bytes(a)
}

/// True when a byte of `w` is below 0x20, a quote or a backslash: the exact
/// "has a byte less than n" and "has a zero byte" word tests (Anderson, Bit
/// Twiddling Hacks), which give false positives only in bytes above a true
/// one, never a false answer for the word.
fn word_has_bad(w: u64) -> bool {
    const ONES: u64 = 0x0101_0101_0101_0101;
    const HIGH: u64 = 0x8080_8080_8080_8080;
    let zero = |v: u64| v.wrapping_sub(ONES) & !v & HIGH;
    let below_space = w.wrapping_sub(ONES * 0x20) & !w & HIGH;
    let quote = zero(w ^ (ONES * b'"' as u64));
    let backslash = zero(w ^ (ONES * b'\\' as u64));
    (below_space | quote | backslash) != 0
}

/// Append `s` as a JSON string (quoted, escaped as `serde_json` does).
#[inline]
pub(crate) fn string(out: &mut Vec<u8>, s: &str) {
    if plain(s.as_bytes()) {
        out.reserve(s.len() + 2);
        out.push(b'"');
        out.extend_from_slice(s.as_bytes());
        out.push(b'"');
    } else {
        // Writing a `&str` into a `Vec<u8>` cannot fail.
        let _ = serde_json::to_writer(&mut *out, s);
    }
}

/// Append a JSON string or `null`.
#[inline]
pub(crate) fn opt_string(out: &mut Vec<u8>, s: Option<&str>) {
    match s {
        Some(s) => string(out, s),
        None => out.extend_from_slice(b"null"),
    }
}

/// Append a float as `serde_json` writes an `f64`: shortest round-trip
/// decimal, `null` when not finite.
#[inline]
pub(crate) fn float(out: &mut Vec<u8>, x: f64) {
    if x.is_finite() {
        // Writing into a `Vec<u8>` cannot fail.
        let _ = CompactFormatter.write_f64(out, x);
    } else {
        out.extend_from_slice(b"null");
    }
}

/// Append a float or `null`.
#[inline]
pub(crate) fn opt_float(out: &mut Vec<u8>, x: Option<f64>) {
    match x {
        Some(x) => float(out, x),
        None => out.extend_from_slice(b"null"),
    }
}

/// Append an unsigned integer.
#[inline]
pub(crate) fn uint(out: &mut Vec<u8>, x: u64) {
    if x < 10 {
        out.push(b'0' + x as u8);
    } else {
        let _ = CompactFormatter.write_u64(out, x);
    }
}

/// Append a signed integer.
pub(crate) fn int(out: &mut Vec<u8>, x: i64) {
    let _ = CompactFormatter.write_i64(out, x);
}

/// Append a boolean.
#[inline]
pub(crate) fn boolean(out: &mut Vec<u8>, b: bool) {
    out.extend_from_slice(if b { b"true" } else { b"false" });
}

/// Append a JSON array, writing each item with `item`.
pub(crate) fn array<T>(out: &mut Vec<u8>, items: &[T], mut item: impl FnMut(&mut Vec<u8>, &T)) {
    out.push(b'[');
    for (i, x) in items.iter().enumerate() {
        if i > 0 {
            out.push(b',');
        }
        item(out, x);
    }
    out.push(b']');
}

/// Append an array of atom indices.
#[inline]
pub(crate) fn indices(out: &mut Vec<u8>, items: &[usize]) {
    array(out, items, |o, &a| uint(o, a as u64));
}

/// Append a `[low, high]` pair of floats.
#[inline]
pub(crate) fn pair(out: &mut Vec<u8>, p: &[f64; 2]) {
    out.push(b'[');
    float(out, p[0]);
    out.push(b',');
    float(out, p[1]);
    out.push(b']');
}

#[cfg(test)]
mod tests {
    use super::*;

    fn via_serde<T: serde::Serialize + ?Sized>(x: &T) -> String {
        serde_json::to_string(x).unwrap_or_default()
    }

    #[test]
    fn string_given_text_that_needs_escaping() {
        // Escapes as RFC 8259 section 7 requires (common practice).
        let cases = [
            "",
            "plain text",
            "a \"quoted\" word",
            "back\\slash",
            "tab\tnew\nline\r",
            "\u{1}\u{1f}\u{7f}",
            "C\u{2013}H and \u{b0}C",
            "a long text without any byte that needs escaping, longer than one block of 32 bytes",
            "a long text that has one \"quote\" after the first block of thirty-two bytes",
        ];
        for s in cases {
            let mut out = Vec::new();
            string(&mut out, s);
            assert_eq!(String::from_utf8(out).unwrap(), via_serde(s), "{s:?}");
        }
    }

    #[test]
    fn plain_given_every_byte_at_every_position() {
        // Reference: the bytes RFC 8259 section 7 requires escaped.
        let naive = |s: &[u8]| !s.iter().any(|&b| b < 0x20 || b == b'"' || b == b'\\');
        for len in 0..80 {
            for pos in 0..len {
                for b in 0..=255u8 {
                    let mut s = vec![b'a'; len];
                    s[pos] = b;
                    assert_eq!(plain(&s), naive(&s), "len {len} pos {pos} byte {b}");
                }
            }
            assert!(plain(&vec![0x7f; len]));
        }
    }

    #[test]
    fn float_given_rounded_and_odd_values() {
        // serde_json's own output is the reference (schema of issue 6).
        for x in [
            0.0,
            -0.0,
            1.0,
            26.4,
            -78.0,
            0.99876,
            7.12346e-4,
            1e-7,
            1234570.0,
            1e300,
            f64::NAN,
            f64::INFINITY,
        ] {
            let mut out = Vec::new();
            float(&mut out, x);
            assert_eq!(String::from_utf8(out).unwrap(), via_serde(&x), "{x}");
        }
    }

    #[test]
    fn uint_given_small_and_large_values() {
        for x in [0u64, 7, 10, 99, 12345, u64::MAX] {
            let mut out = Vec::new();
            uint(&mut out, x);
            assert_eq!(String::from_utf8(out).unwrap(), x.to_string());
        }
    }
}
