//! Fast text for the few number formats the advice prose uses (`{:.1}`,
//! `{:.1e}`), byte-identical to the standard formatter. The standard
//! formatter is exact but slow (arbitrary-precision fallback); these write
//! the digits from one rounded integer and fall back to the standard
//! formatter whenever the value is negative or large; near a rounding tie
//! the side is decided exactly with a fused multiply-add.

use std::fmt::Write;

/// Distance from a rounding tie (in units of the last digit) below which
/// the standard formatter decides.
const TIE_GUARD: f64 = 1e-6;

/// Appends `x` as `format!("{x:.1}")` would.
pub(crate) fn push_fixed1(out: &mut String, x: f64) {
    if x.is_finite() && x.is_sign_positive() && x < 1e6 {
        let y = x * 10.0;
        // Truncation is the floor here (0 <= y < 1e7, exact in f64), and
        // cheaper than `floor`/`round`, which are library calls on baseline
        // x86-64.
        let ki = y as u64;
        let k = ki as f64;
        let frac = y - k;
        // Near a tie, the sign of the exact x*10 - (k + 0.5) decides; a
        // fused multiply-add rounds once, so it keeps that sign (zero only
        // for an exact tie).
        let r = if (frac - 0.5).abs() > TIE_GUARD {
            if frac > 0.5 {
                ki + 1
            } else {
                ki
            }
        } else {
            let d = x.mul_add(10.0, -(k + 0.5));
            if d > 0.0 {
                k as u64 + 1
            } else if d < 0.0 {
                k as u64
            } else {
                // An exact tie: the standard formatter rounds half to even
                // (the tests compare every value with it).
                let k = k as u64;
                if k.is_multiple_of(2) {
                    k
                } else {
                    k + 1
                }
            }
        };
        push_u64(out, r / 10);
        out.push('.');
        out.push((b'0' + (r % 10) as u8) as char);
        return;
    }
    let _ = write!(out, "{x:.1}");
}

/// `x` as `format!("{x:.1}")` would.
pub(crate) fn fixed1(x: f64) -> String {
    let mut s = String::with_capacity(8);
    push_fixed1(&mut s, x);
    s
}

/// Appends `x` as `format!("{x:.1e}")` would.
pub(crate) fn push_exp1(out: &mut String, x: f64) {
    if x.is_finite() && x > 1e-250 && x < 1e250 {
        let e = x.log10().floor() as i32;
        let m = x / 10f64.powi(e);
        let y = m * 10.0;
        let frac = y - y.floor();
        let r = y.round() as u64;
        // r outside 10..=99 means log10 was off by one or the mantissa
        // rounds up to 10.0: leave those to the standard formatter.
        if (frac - 0.5).abs() > TIE_GUARD && (10..=99).contains(&r) {
            out.push((b'0' + (r / 10) as u8) as char);
            out.push('.');
            out.push((b'0' + (r % 10) as u8) as char);
            out.push('e');
            if e < 0 {
                out.push('-');
            }
            push_u64(out, e.unsigned_abs() as u64);
            return;
        }
    }
    let _ = write!(out, "{x:.1e}");
}

/// Appends `v` as `format!("{v}")` would.
pub(crate) fn push_usize(out: &mut String, v: usize) {
    push_u64(out, v as u64);
}

fn push_u64(out: &mut String, mut v: u64) {
    let mut buf = [0u8; 20];
    let mut i = buf.len();
    loop {
        i -= 1;
        buf[i] = b'0' + (v % 10) as u8;
        v /= 10;
        if v == 0 {
            break;
        }
    }
    for &b in &buf[i..] {
        out.push(b as char);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Reference: the standard library's own `{:.1}` / `{:.1e}` formatting.
    fn lcg(state: &mut u64) -> f64 {
        *state = state
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        ((*state >> 11) as f64) / ((1u64 << 53) as f64)
    }

    #[test]
    fn push_fixed1_given_many_values_matches_std() {
        let mut s = 1u64;
        let mut vals: Vec<f64> = vec![
            0.0, -0.0, 0.05, 0.25, 0.35, 0.75, 26.25, 26.35, 26.75, 99.95, -3.25, 1e12,
        ];
        for _ in 0..200_000 {
            vals.push(lcg(&mut s) * 120.0 - 20.0);
            vals.push((lcg(&mut s) * 1000.0).round() / 100.0);
            vals.push((lcg(&mut s) * 10000.0).round() / 20.0);
        }
        for x in vals {
            assert_eq!(fixed1(x), format!("{x:.1}"), "value {x:e}");
        }
    }

    #[test]
    fn push_exp1_given_many_values_matches_std() {
        let mut s = 7u64;
        let mut vals: Vec<f64> = vec![0.0, 1e-3, 9.95e-4, 9.96e-4, 1.05e-7, 1e-300, 5e-324];
        for _ in 0..200_000 {
            vals.push(10f64.powf(-lcg(&mut s) * 40.0));
            vals.push(lcg(&mut s) * 1e-3);
        }
        for x in vals {
            let mut got = String::new();
            push_exp1(&mut got, x);
            assert_eq!(got, format!("{x:.1e}"), "value {x:e}");
        }
    }
}
