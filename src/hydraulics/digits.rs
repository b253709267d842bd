//! Numbers written as text, character for character as Rust's own
//! formatting writes an `f64`: [`Fixed`] is `{:.N}`, [`Sci`] is `{:.Ne}`,
//! [`Short`] is `{}` and [`ShortExp`] is `{:e}`. Every number the page
//! shows or writes goes through these.
//!
//! Natively each is `core`'s formatting itself. In the browser `core`'s is
//! left out of the page's module (its shortest and exact algorithms and
//! their tables were about 7 KB gzip): a fixed or scientific figure is
//! rounded here, exactly, in 128-bit whole numbers (the value m·2^e scaled
//! by 10^n, half to even as `core` rounds), and only a figure too large or
//! too small for that, or the shortest form, is asked of the browser
//! (`toFixed`, `toExponential`, `String`, `BigInt`; where a value lies
//! exactly halfway, their choice is then set to `core`'s). `tests/browser.rs` holds every one to `core`'s; the
//! 128-bit rounding is also held to it natively ([`fixed_with`],
//! [`sci_with`]).

use std::fmt;

/// `{:.N}`: `N` decimals, rounded half to even on the exact value.
pub struct Fixed(pub f64, pub usize);

/// `{:.Ne}`: scientific with `N` decimals in the mantissa ("1.25e3").
pub struct Sci(pub f64, pub usize);

/// `{:+.N}`: as [`Fixed`], with a plus sign before a number that has no
/// minus sign (not before NaN).
pub struct Signed(pub f64, pub usize);

impl fmt::Display for Signed {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if !self.0.is_nan() && !self.0.is_sign_negative() {
            f.write_str("+")?;
        }
        Fixed(self.0, self.1).fmt(f)
    }
}

/// `{}`: the shortest decimal that reads back as the same double, written
/// out without an exponent ("0.0000001", "1000000000000000000000").
pub struct Short(pub f64);

/// `{:e}`: the shortest such decimal in scientific form ("1e-7").
pub struct ShortExp(pub f64);

/// `f64::clamp` without its check of the bounds, whose message formats
/// them (and with them `core`'s float formatting) into the page's module.
/// The same value for every `x` (NaN stays NaN) when `lo <= hi`.
pub fn clamp(x: f64, lo: f64, hi: f64) -> f64 {
    if x < lo {
        lo
    } else if x > hi {
        hi
    } else {
        x
    }
}

#[cfg(not(target_arch = "wasm32"))]
mod shown {
    use super::*;

    impl fmt::Display for Fixed {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            write!(f, "{:.*}", self.1, self.0)
        }
    }

    impl fmt::Display for Sci {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            write!(f, "{:.*e}", self.1, self.0)
        }
    }

    impl fmt::Display for Short {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            write!(f, "{}", self.0)
        }
    }

    impl fmt::Display for ShortExp {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            write!(f, "{:e}", self.0)
        }
    }
}

#[cfg(target_arch = "wasm32")]
pub use shown::{browser_fixed, browser_sci};

#[cfg(target_arch = "wasm32")]
mod shown {
    use super::*;
    use js_sys::{BigInt, JsString, Number};

    fn js(s: JsString) -> String {
        s.as_string().unwrap_or_default()
    }

    impl fmt::Display for Fixed {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str(&fixed_with(self.0, self.1, browser_fixed))
        }
    }

    impl fmt::Display for Sci {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str(&sci_with(self.0, self.1, browser_sci))
        }
    }

    impl fmt::Display for Short {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str(&short_from(self.0, browser_shortest, false))
        }
    }

    impl fmt::Display for ShortExp {
        fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str(&short_from(self.0, browser_shortest, true))
        }
    }

    /// `String(x)` of a finite, non-negative x: its shortest digits.
    fn browser_shortest(x: f64) -> String {
        js(Number::from(x).to_string_with_radix(10).unwrap_or_else(|_| JsString::from("")))
    }

    /// |x| to `n` decimals (at most 100) by `toFixed` (exact, ties away
    /// from zero) or, at 10^21 and above where `toFixed` writes an
    /// exponent, `BigInt` (such a double is a whole number); then ties set
    /// half to even. Public for `tests/browser.rs`.
    pub fn browser_fixed(x: f64, n: usize) -> String {
        let a = x.abs();
        let mut s = if a >= 1e21 {
            let whole = BigInt::new(&a.into()).map(|b| js(b.to_string(10).unwrap_or_else(|_| JsString::from(""))));
            let mut s = whole.unwrap_or_default();
            if n > 0 {
                s.push('.');
                s.extend(std::iter::repeat_n('0', n));
            }
            s
        } else {
            js(Number::from(a).to_fixed(n.min(100) as u8).unwrap_or_else(|_| JsString::from("")))
        };
        let (m, e) = parts(a);
        if m != 0 && i64::from(e) + n as i64 == -1 {
            to_even(&mut s);
        }
        s
    }

    /// |x| in scientific form with `p` decimals (at most 100) by
    /// `toExponential`, ties set half to even, the exponent written as
    /// `core` writes it. Public for `tests/browser.rs`.
    pub fn browser_sci(x: f64, p: usize) -> String {
        let a = x.abs();
        let s = js(Number::from(a).to_exponential(p.min(100) as u8).unwrap_or_else(|_| JsString::from("")));
        let (mant, exp) = s.split_once('e').unwrap_or((&s, "0"));
        let k: i32 = exp.trim_start_matches('+').parse().unwrap_or(0);
        let mut mant = mant.to_owned();
        let (m, e) = parts(a);
        // Exactly halfway between two p-decimal mantissas at 10^k: the value
        // times 10^(p-k) is a whole number and a half. (After a carry the
        // written mantissa is 1.00…, so its exponent is one more than the
        // halfway value's; a one-digit "1" can only be such a carry.)
        let n = p as i64 - i64::from(k);
        let carried = p == 0 && mant == "1";
        let tie = |n: i64| {
            m != 0 && i64::from(e) + n == -1 && (n >= 0 || 5u64.checked_pow((-n) as u32).is_some_and(|f| m % f == 0))
        };
        if !carried && tie(n) {
            to_even(&mut mant);
        }
        format!("{mant}e{k}")
    }

    /// A tie rounded away from zero made half to even: an odd last digit
    /// steps down by one (never a borrow: the digit is at least 1).
    fn to_even(s: &mut String) {
        if let Some(last) = s.pop() {
            let d = last as u8;
            s.push(if (d - b'0') % 2 == 1 { (d - 1) as char } else { last });
        }
    }
}

/// m·2^e = |x| with m odd, or (0, 0) for zero.
fn parts(x: f64) -> (u64, i32) {
    let bits = x.to_bits() & !(1 << 63);
    let biased = (bits >> 52) as i32;
    let frac = bits & ((1 << 52) - 1);
    let (m, e) = if biased == 0 { (frac, -1074) } else { (frac | 1 << 52, biased - 1075) };
    if m == 0 {
        return (0, 0);
    }
    let tz = m.trailing_zeros();
    (m >> tz, e + tz as i32)
}

/// m·2^e·10^n rounded to a whole number, half to even; `None` where that
/// does not fit in 128 bits.
fn scaled(m: u64, e: i32, n: i64) -> Option<u128> {
    divided(m, e, n).map(|(q, _)| q)
}

/// m·2^e·10^n when that is a whole number that fits in 128 bits.
fn exact(m: u64, e: i32, n: i64) -> Option<u128> {
    divided(m, e, n).filter(|(_, whole)| *whole).map(|(q, _)| q)
}

/// m·2^e·10^n as num/den in 128 bits: the quotient rounded half to even,
/// and whether nothing was left over.
fn divided(m: u64, e: i32, n: i64) -> Option<(u128, bool)> {
    let mut num = u128::from(m);
    let mut den: u128 = 1;
    let five = 5u128.checked_pow(u32::try_from(n.unsigned_abs()).ok()?)?;
    if n >= 0 {
        num = num.checked_mul(five)?;
    } else {
        den = five;
    }
    let a = i64::from(e) + n;
    let shift = u32::try_from(a.unsigned_abs()).ok().filter(|s| *s < 128)?;
    if a >= 0 {
        if num.leading_zeros() < shift {
            return None;
        }
        num <<= shift;
    } else {
        if den.leading_zeros() <= shift {
            return None;
        }
        den <<= shift;
    }
    let (mut q, r) = (num / den, num % den);
    if r > den - r || (r == den - r && q & 1 == 1) {
        q += 1;
    }
    Some((q, r == 0))
}

/// A whole number's decimal digits.
fn digits(q: u128) -> String {
    match u64::try_from(q) {
        Ok(small) => small.to_string(),
        Err(_) => {
            let (hi, lo) = (q / 10_000_000_000_000_000_000, (q % 10_000_000_000_000_000_000) as u64);
            format!("{}{lo:019}", digits(hi))
        }
    }
}

fn special(x: f64) -> Option<&'static str> {
    if x.is_nan() {
        Some("NaN")
    } else if x.is_infinite() {
        Some(if x < 0.0 { "-inf" } else { "inf" })
    } else {
        None
    }
}

/// [`Fixed`] by 128-bit rounding, or `slow` (given |x|) where that does not
/// fit. Public so that the tests can hold it to `core` natively.
pub fn fixed_with(x: f64, n: usize, slow: fn(f64, usize) -> String) -> String {
    if let Some(s) = special(x) {
        return s.to_owned();
    }
    let sign = if x.is_sign_negative() { "-" } else { "" };
    let (m, e) = parts(x);
    let q = if m == 0 { Some(0) } else { i64::try_from(n).ok().and_then(|n| scaled(m, e, n)) };
    let Some(q) = q else {
        return format!("{sign}{}", slow(x.abs(), n));
    };
    let mut d = digits(q);
    if d.len() <= n {
        d.insert_str(0, &"0".repeat(n + 1 - d.len()));
    }
    if n > 0 {
        d.insert(d.len() - n, '.');
    }
    format!("{sign}{d}")
}

/// [`Sci`] by 128-bit rounding, or `slow` (given |x|) where that does not
/// fit. Public so that the tests can hold it to `core` natively.
pub fn sci_with(x: f64, p: usize, slow: fn(f64, usize) -> String) -> String {
    if let Some(s) = special(x) {
        return s.to_owned();
    }
    let sign = if x.is_sign_negative() { "-" } else { "" };
    let (m, e) = parts(x);
    let zeros = || "0".repeat(p);
    if m == 0 {
        return if p == 0 { format!("{sign}0e0") } else { format!("{sign}0.{}e0", zeros()) };
    }
    let powers = u32::try_from(p).ok().and_then(|p| Some((10u128.checked_pow(p)?, 10u128.checked_pow(p + 1)?)));
    let (Ok(pi), Some((low, high))) = (i64::try_from(p), powers) else {
        return format!("{sign}{}", slow(x.abs(), p));
    };
    // The power of ten of the first digit: log10's guess, then moved by one
    // while the rounded mantissa falls outside [10^p, 10^(p+1)).
    let mut k = x.abs().log10().floor() as i64;
    for _ in 0..4 {
        let Some(q) = scaled(m, e, pi - k) else { break };
        if q >= high {
            k += 1;
        } else if q < low {
            k -= 1;
        } else {
            let d = digits(q);
            let (first, rest) = d.split_at(1);
            return if p == 0 { format!("{sign}{first}e{k}") } else { format!("{sign}{first}.{rest}e{k}") };
        }
    }
    format!("{sign}{}", slow(x.abs(), p))
}

/// [`Short`] (`exp` false) or [`ShortExp`] from `shortest`, the shortest
/// digits of |x| as JavaScript's `String` writes them ("123.4", "1e+21",
/// "1.5e-7"), rewritten as `core` writes them.
pub fn short_from(x: f64, shortest: fn(f64) -> String, exp: bool) -> String {
    if let Some(s) = special(x) {
        return s.to_owned();
    }
    let sign = if x.is_sign_negative() { "-" } else { "" };
    if x == 0.0 {
        return format!("{sign}{}", if exp { "0e0" } else { "0" });
    }
    let s = shortest(x.abs());
    let (mant, power) = s.split_once('e').unwrap_or((&s, "0"));
    let power: i64 = power.trim_start_matches('+').parse().unwrap_or(0);
    let point = mant.find('.').unwrap_or(mant.len()) as i64;
    let all: String = mant.chars().filter(char::is_ascii_digit).collect();
    let lead = all.len() - all.trim_start_matches('0').len();
    let mut d = all.trim_matches('0').to_owned();
    // The value is 0.d × 10^at.
    let mut at = point + power - lead as i64;
    // Where two shortest forms are equally near (the double is exactly
    // halfway between them), JavaScript takes the even one and `core` the
    // one above: 165793407361858.125 is "…58.12" in JavaScript, "…58.13" in
    // Rust.
    let (m, e) = parts(x);
    let last = at - d.len() as i64;
    let whole: Option<u64> = d.parse().ok();
    if let (Some(w), Some(twice)) = (whole, last.checked_neg().and_then(|n| exact(m, e + 1, n))) {
        if twice == 2 * u128::from(w) + 1 {
            d = (w + 1).to_string();
            if d.len() as i64 > at - last {
                at += 1;
            }
            d = d.trim_end_matches('0').to_owned();
        }
    }
    let d = d.as_str();
    if exp {
        let (first, rest) = d.split_at(1);
        let dot = if rest.is_empty() { "" } else { "." };
        return format!("{sign}{first}{dot}{rest}e{}", at - 1);
    }
    let len = d.len() as i64;
    if at <= 0 {
        format!("{sign}0.{}{d}", "0".repeat((-at) as usize))
    } else if at >= len {
        format!("{sign}{d}{}", "0".repeat((at - len) as usize))
    } else {
        let (a, b) = d.split_at(at as usize);
        format!("{sign}{a}.{b}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A fixed-seed generator (xorshift).
    fn rng(mut x: u64) -> impl FnMut() -> u64 {
        move || {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            x
        }
    }

    fn core_fixed(x: f64, n: usize) -> String {
        format!("{x:.n$}")
    }

    fn core_sci(x: f64, p: usize) -> String {
        format!("{x:.p$e}")
    }

    /// The doubles the tests write: hand-picked ties and edges, then
    /// random bit patterns and random decimals of every magnitude.
    fn doubles() -> Vec<f64> {
        let mut v = vec![
            0.0,
            -0.0,
            0.5,
            1.5,
            2.5,
            -2.5,
            0.25,
            0.75,
            0.125,
            0.375,
            9.5,
            99.5,
            95.0,
            25.0,
            0.05,
            0.15,
            0.35,
            1e21,
            1e22,
            1.5e300,
            -1.5e-300,
            5e-324,
            2.2250738585072014e-308,
            f64::MAX,
            f64::MIN_POSITIVE,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
            9.96,
            99.96,
            0.999_999,
            123456.0,
            1e-30,
            18.5,
            1.0,
        ];
        let mut next = rng(0x853c_49e6_748f_ea9b);
        for _ in 0..20_000 {
            v.push(f64::from_bits(next()));
            let mant = (next() % 1_000_000) as f64;
            v.push(mant * 10f64.powi((next() % 40) as i32 - 20) / 1000.0);
            // Halves, quarters, eighths: ties at some precision.
            v.push((next() % 100_000) as f64 / f64::from(1 << (next() % 8)));
        }
        v
    }

    #[test]
    fn fixed_decimals_are_cores_character_for_character() {
        // The reference: core's `{:.N}` (Rust's standard library).
        let (mut slow, mut all) = (0, 0);
        for x in doubles() {
            for n in [0, 1, 2, 3, 4, 6, 9, 17] {
                let ours = fixed_with(x, n, |a, n| format!("{a:.n$}"));
                assert_eq!(ours, core_fixed(x, n), "{x:e} .{n}");
                slow += usize::from(fixed_with(x, n, |_, _| "slow".into()).ends_with("slow"));
                all += 1;
            }
        }
        // Only doubles far outside a figure's range (random bit patterns
        // mostly are) need the fallback.
        assert!(slow * 2 < all, "{slow} of {all}");
    }

    #[test]
    fn scientific_figures_are_cores_character_for_character() {
        let (mut slow, mut all) = (0, 0);
        for x in doubles() {
            for p in [0, 1, 2, 3, 5, 16] {
                let ours = sci_with(x, p, |a, p| format!("{a:.p$e}"));
                assert_eq!(ours, core_sci(x, p), "{x:e} .{p}e");
                slow += usize::from(sci_with(x, p, |_, _| "slow".into()).ends_with("slow"));
                all += 1;
            }
        }
        assert!(slow * 2 < all, "{slow} of {all}");
    }

    /// 165793407361858.125, exactly: halfway between two 17-digit forms.
    const TIE: f64 = 165_793_407_361_858.0 + 0.125;

    #[test]
    fn shortest_forms_are_rewritten_as_core_writes_them() {
        // What JavaScript's String writes for these values (ECMA-262
        // Number::toString: exponent form from 1e21 up and below 1e-6),
        // rewritten, against core's `{}` and `{:e}`.
        let js = |x: f64| -> String {
            match x {
                1e21 => "1e+21".into(),
                1e-7 => "1e-7".into(),
                1.5e-7 => "1.5e-7".into(),
                1.5e300 => "1.5e+300".into(),
                // Halfway between two 17-digit forms: JavaScript takes the
                // even one (ECMA-262 Number::toString), core the one above.
                x if x == TIE => "165793407361858.12".into(),
                0.5 => "0.5".into(),
                5e-324 => "5e-324".into(),
                123456789012345680000.0 => "123456789012345680000".into(),
                0.000001 => "0.000001".into(),
                _ => format!("{x}"),
            }
        };
        for x in
            [1e21, 1e-7, 1.5e-7, 1.5e300, 5e-324, 123456789012345680000.0, 0.000001, 1.0, 0.1, 18.5, 100.0, TIE, 0.5]
        {
            for neg in [false, true] {
                let x = if neg { -x } else { x };
                assert_eq!(short_from(x, js, false), format!("{x}"), "{x:e}");
                assert_eq!(short_from(x, js, true), format!("{x:e}"), "{x:e}");
            }
        }
        for x in [0.0, -0.0, f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
            assert_eq!(short_from(x, js, false), format!("{x}"));
            assert_eq!(short_from(x, js, true), format!("{x:e}"));
        }
    }

    #[test]
    fn signed_decimals_are_cores() {
        for x in [0.0, -0.0, 5.4, -5.6, 0.5, -0.4, f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
            assert_eq!(Signed(x, 0).to_string(), format!("{x:+.0}"), "{x}");
            assert_eq!(Signed(x, 1).to_string(), format!("{x:+.1}"), "{x}");
        }
    }

    #[test]
    fn clamp_is_f64_clamp() {
        for x in [-1.0, 0.0, 0.5, 1.0, 2.0, f64::NAN, f64::INFINITY, -0.0] {
            assert_eq!(clamp(x, 0.0, 1.0).to_bits(), x.clamp(0.0, 1.0).to_bits(), "{x}");
        }
    }
}
