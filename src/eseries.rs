//! IEC 60063 preferred numbers (E-series) and IEC 60062 RKM formatting.
//!
//! Sources:
//! - IEC 60063:2015, *Preferred number series for resistors and capacitors*:
//!   the E6, E12, E24 (two significant digits) and E48, E96, E192 (three
//!   significant digits) values and their associated tolerances. E6…E24 keep
//!   the historical values 27, 30, 33, 36, 39, 43, 47 and 82, which are not
//!   round(10·10^(i/24)); E48…E192 are round(100·10^(i/N)) except E192's 920
//!   (the formula gives 919). The tables below were checked against several
//!   independent public transcriptions of the standard's tables.
//! - IEC 60062:2016, *Marking codes for resistors and capacitors*: the RKM
//!   code, in which the multiplier letter R, K, M, G or T stands for the
//!   decimal point (R47, 4R7, 4K7, 47K, 4M7 are the standard's examples).
//!
//! Every value is `mantissa·10^k` rounded once to the nearest `f64`, the same
//! double that parsing its decimal text gives, so 4700.0 is 4700.0 and
//! `parse_quantity(format_rkm(v))` returns `v` bit for bit.

/// E6 mantissas, IEC 60063.
const E6: [u16; 6] = [10, 15, 22, 33, 47, 68];

/// E12 mantissas, IEC 60063.
const E12: [u16; 12] = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82];

/// E24 mantissas, IEC 60063.
const E24: [u16; 24] = [
    10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91,
];

/// E48 mantissas, IEC 60063.
const E48: [u16; 48] = [
    100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205, 215, 226, 237,
    249, 261, 274, 287, 301, 316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536, 562, 590,
    619, 649, 681, 715, 750, 787, 825, 866, 909, 953,
];

/// E96 mantissas, IEC 60063.
const E96: [u16; 96] = [
    100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154,
    158, 162, 165, 169, 174, 178, 182, 187, 191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243,
    249, 255, 261, 267, 274, 280, 287, 294, 301, 309, 316, 324, 332, 340, 348, 357, 365, 374, 383,
    392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549, 562, 576, 590, 604,
    619, 634, 649, 665, 681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953,
    976,
];

/// E192 mantissas, IEC 60063 (note 920, not the formula's 919).
const E192: [u16; 192] = [
    100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124,
    126, 127, 129, 130, 132, 133, 135, 137, 138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156,
    158, 160, 162, 164, 165, 167, 169, 172, 174, 176, 178, 180, 182, 184, 187, 189, 191, 193, 196,
    198, 200, 203, 205, 208, 210, 213, 215, 218, 221, 223, 226, 229, 232, 234, 237, 240, 243, 246,
    249, 252, 255, 258, 261, 264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309,
    312, 316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361, 365, 370, 374, 379, 383, 388,
    392, 397, 402, 407, 412, 417, 422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487,
    493, 499, 505, 511, 517, 523, 530, 536, 542, 549, 556, 562, 569, 576, 583, 590, 597, 604, 612,
    619, 626, 634, 642, 649, 657, 665, 673, 681, 690, 698, 706, 715, 723, 732, 741, 750, 759, 768,
    777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953, 965,
    976, 988,
];

/// Powers of ten that are exact in `f64` (10^22 is the largest).
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// `mantissa·10^exp10` rounded once to the nearest `f64`: one IEEE
/// multiplication or division of two exact operands is correctly rounded.
/// Outside 10^±22 it parses the decimal text instead (also correctly rounded).
fn scaled(mantissa: u16, exp10: i32) -> f64 {
    let m = f64::from(mantissa);
    match POW10.get(exp10.unsigned_abs() as usize) {
        Some(&p) if exp10 >= 0 => m * p,
        Some(&p) => m / p,
        None => format!("{mantissa}e{exp10}")
            .parse()
            .unwrap_or_else(|_| m * 10f64.powi(exp10)),
    }
}

/// An IEC 60063 preferred-number series.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum ESeries {
    /// 6 values per decade, ±20 %.
    E6,
    /// 12 values per decade, ±10 %.
    E12,
    /// 24 values per decade, ±5 %.
    E24,
    /// 48 values per decade, ±2 %.
    E48,
    /// 96 values per decade, ±1 %.
    E96,
    /// 192 values per decade, ±0.5 %.
    E192,
}

impl ESeries {
    /// Every series, coarsest first.
    pub const ALL: [ESeries; 6] = [
        ESeries::E6,
        ESeries::E12,
        ESeries::E24,
        ESeries::E48,
        ESeries::E96,
        ESeries::E192,
    ];

    /// The series' name, e.g. "E24".
    pub fn name(self) -> &'static str {
        match self {
            ESeries::E6 => "E6",
            ESeries::E12 => "E12",
            ESeries::E24 => "E24",
            ESeries::E48 => "E48",
            ESeries::E96 => "E96",
            ESeries::E192 => "E192",
        }
    }

    /// Parse a series name, any case, surrounding whitespace ignored
    /// ("E24", "e24"); `None` for anything else.
    pub fn parse(name: &str) -> Option<Self> {
        let name = name.trim();
        ESeries::ALL
            .into_iter()
            .find(|s| s.name().eq_ignore_ascii_case(name))
    }

    /// The mantissas of one decade as IEC 60063 lists them: two digits
    /// (10…91) for E6…E24, three digits (100…988) for E48…E192.
    pub fn mantissas(self) -> &'static [u16] {
        match self {
            ESeries::E6 => &E6,
            ESeries::E12 => &E12,
            ESeries::E24 => &E24,
            ESeries::E48 => &E48,
            ESeries::E96 => &E96,
            ESeries::E192 => &E192,
        }
    }

    /// The tolerance associated with the series in IEC 60063, as a fraction
    /// (E24 → 0.05).
    pub fn tolerance(self) -> f64 {
        match self {
            ESeries::E6 => 0.20,
            ESeries::E12 => 0.10,
            ESeries::E24 => 0.05,
            ESeries::E48 => 0.02,
            ESeries::E96 => 0.01,
            ESeries::E192 => 0.005,
        }
    }

    /// Digits in a mantissa minus one: value = mantissa·10^(decade − this).
    fn mantissa_exp(self) -> i32 {
        match self {
            ESeries::E6 | ESeries::E12 | ESeries::E24 => 1,
            _ => 2,
        }
    }

    /// The preferred value at `index` in the decade [10^decade, 10^(decade+1)).
    fn value_at(self, decade: i32, index: usize) -> f64 {
        scaled(self.mantissas()[index], decade - self.mantissa_exp())
    }

    /// Decades to search around `value`: floor(log10) can be off by one
    /// near a power of ten, so one decade either side is included.
    fn decades(value: f64) -> std::ops::RangeInclusive<i32> {
        let d = value.log10().floor() as i32;
        d - 1..=d + 1
    }

    /// Position (decade, index) of the smallest preferred value ≥ `value`.
    fn first_at_or_above(self, value: f64) -> Option<(i32, usize)> {
        if !(value > 0.0 && value.is_finite()) {
            return None;
        }
        let n = self.mantissas().len();
        let decades = Self::decades(value);
        let last = *decades.end();
        decades
            .flat_map(|d| (0..n).map(move |i| (d, i)))
            .find(|&(d, i)| self.value_at(d, i) >= value)
            .or(Some((last + 1, 0)))
    }

    /// Position (decade, index) of the largest preferred value ≤ `value`.
    fn last_at_or_below(self, value: f64) -> Option<(i32, usize)> {
        if !(value > 0.0 && value.is_finite()) {
            return None;
        }
        let n = self.mantissas().len();
        let decades = Self::decades(value);
        let first = *decades.start();
        decades
            .rev()
            .flat_map(|d| (0..n).rev().map(move |i| (d, i)))
            .find(|&(d, i)| self.value_at(d, i) <= value)
            .or(Some((first - 1, n - 1)))
    }

    /// The preferred value nearest `value` in log ratio (max(v/x, x/v)
    /// smallest), across decades: E24 nearest(9.9e3) = 10e3. A tie goes to
    /// the lower value. `value` must be positive and finite; otherwise NaN.
    pub fn nearest(self, value: f64) -> f64 {
        let below = self.at_or_below(value);
        let above = self.at_or_above(value);
        if value / below <= above / value {
            below
        } else {
            above
        }
    }

    /// The smallest preferred value ≥ `value`. `value` must be positive and
    /// finite; otherwise NaN.
    pub fn at_or_above(self, value: f64) -> f64 {
        self.first_at_or_above(value)
            .map_or(f64::NAN, |(d, i)| self.value_at(d, i))
    }

    /// The largest preferred value ≤ `value`. `value` must be positive and
    /// finite; otherwise NaN.
    pub fn at_or_below(self, value: f64) -> f64 {
        self.last_at_or_below(value)
            .map_or(f64::NAN, |(d, i)| self.value_at(d, i))
    }

    /// Every preferred value in [`lo`, `hi`], ascending. Empty unless
    /// `lo` is positive and finite and `hi ≥ lo`.
    pub fn values_between(self, lo: f64, hi: f64) -> impl Iterator<Item = f64> {
        let n = self.mantissas().len();
        let mut next = self.first_at_or_above(lo);
        std::iter::from_fn(move || {
            let (decade, index) = next?;
            let v = self.value_at(decade, index);
            if !(v <= hi && v.is_finite()) {
                next = None;
                return None;
            }
            next = Some(if index + 1 == n {
                (decade + 1, 0)
            } else {
                (decade, index + 1)
            });
            Some(v)
        })
    }
}

/// Write a resistance as an IEC 60062 RKM code, rounded to three significant
/// digits with trailing zeros dropped; the letter R, K, M, G or T marks the
/// decimal point and the multiplier: 0.47 → "R47", 4.7 → "4R7", 47 → "47R",
/// 470 → "470R", 4700 → "4K7", 47000 → "47K", 100e3 → "100K",
/// 4.99e3 → "4K99", 2.2e9 → "2G2".
///
/// A single-digit integer part is followed by a 0 ("1K0", "1M0", the
/// standard's practice); values below 1 Ω keep R as the decimal point
/// ("R047" for 47 mΩ). Negative values get a leading "-", zero is "0R",
/// non-finite values are written "invalid".
pub fn format_rkm(ohms: f64) -> String {
    if !ohms.is_finite() {
        return "invalid".to_string();
    }
    if ohms == 0.0 {
        return "0R".to_string();
    }
    let sci = format!("{:.2e}", ohms.abs());
    let (mantissa, exp) = sci.split_once('e').unwrap_or((&sci, "0"));
    let exp: i32 = exp.parse().unwrap_or(0);
    let mut digits: String = mantissa.chars().filter(char::is_ascii_digit).collect();
    while digits.len() > 1 && digits.ends_with('0') {
        digits.pop();
    }
    let group = (exp.div_euclid(3) * 3).clamp(0, 12);
    let letter = match group {
        0 => 'R',
        3 => 'K',
        6 => 'M',
        9 => 'G',
        _ => 'T',
    };
    // Digits before the decimal point (≤ 0 below 1 Ω).
    let int_len = exp - group + 1;
    let len = digits.len() as i32;
    let sign = if ohms < 0.0 { "-" } else { "" };
    let code = if int_len <= 0 {
        let zeros = "0".repeat(int_len.unsigned_abs() as usize);
        format!("{letter}{zeros}{digits}")
    } else if int_len >= len {
        let int = format!("{digits}{}", "0".repeat((int_len - len) as usize));
        if int.len() == 1 {
            format!("{int}{letter}0")
        } else {
            format!("{int}{letter}")
        }
    } else {
        let (a, b) = digits.split_at(int_len as usize);
        format!("{a}{letter}{b}")
    };
    format!("{sign}{code}")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::quantity::{parse_quantity, Dimension};
    use proptest::prelude::*;

    #[test]
    fn e6_e12_e24_match_iec_60063() {
        // IEC 60063:2015 E6, E12, E24 decade values.
        assert_eq!(ESeries::E6.mantissas(), &[10, 15, 22, 33, 47, 68]);
        assert_eq!(
            ESeries::E12.mantissas(),
            &[10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82]
        );
        assert_eq!(
            ESeries::E24.mantissas(),
            &[
                10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68,
                75, 82, 91
            ]
        );
        // E12 is every second E24 value and E6 every second E12 value
        // (IEC 60063 nesting).
        let every_second = |s: &[u16]| s.iter().step_by(2).copied().collect::<Vec<_>>();
        assert_eq!(every_second(&E24), E12);
        assert_eq!(every_second(&E12), E6);
    }

    #[test]
    fn e24_departs_from_the_geometric_series_exactly_at_the_historical_values() {
        // IEC 60063: 27 30 33 36 39 43 47 82 are not round(10·10^(i/24)).
        let off: Vec<u16> = E24
            .iter()
            .enumerate()
            .filter(|&(i, &m)| (10.0 * 10f64.powf(i as f64 / 24.0)).round() as u16 != m)
            .map(|(_, &m)| m)
            .collect();
        assert_eq!(off, [27, 30, 33, 36, 39, 43, 47, 82]);
    }

    #[test]
    fn e48_e96_e192_follow_the_rounded_geometric_series_except_920() {
        // IEC 60063: E48…E192 are round(100·10^(i/N)); the one exception is
        // E192 index 185, listed as 920 where the formula gives 919.
        for s in [ESeries::E48, ESeries::E96, ESeries::E192] {
            let n = s.mantissas().len();
            for (i, &m) in s.mantissas().iter().enumerate() {
                let formula = (100.0 * 10f64.powf(i as f64 / n as f64)).round() as u16;
                if s == ESeries::E192 && i == 185 {
                    assert_eq!((m, formula), (920, 919));
                } else {
                    assert_eq!(m, formula, "{} index {i}", s.name());
                }
            }
        }
        // E96 is every second E192 value, E48 every fourth (IEC 60063 nesting).
        assert!(E96.iter().zip(E192.iter().step_by(2)).all(|(a, b)| a == b));
        assert!(E48.iter().zip(E192.iter().step_by(4)).all(|(a, b)| a == b));
    }

    #[test]
    fn names_parse_and_tolerances() {
        for s in ESeries::ALL {
            assert_eq!(ESeries::parse(s.name()), Some(s));
            assert_eq!(ESeries::parse(&s.name().to_lowercase()), Some(s));
            assert!(s.mantissas().windows(2).all(|w| w[0] < w[1]));
        }
        assert_eq!(ESeries::parse(" e24 "), Some(ESeries::E24));
        assert_eq!(ESeries::parse("E3"), None);
        assert_eq!(ESeries::parse("E 24"), None);
        // IEC 60063 associated tolerances.
        let tol: Vec<f64> = ESeries::ALL.iter().map(|s| s.tolerance()).collect();
        assert_eq!(tol, [0.20, 0.10, 0.05, 0.02, 0.01, 0.005]);
    }

    #[test]
    fn values_are_exact() {
        assert_eq!(ESeries::E12.nearest(4700.0), 4700.0);
        assert_eq!(ESeries::E24.nearest(4.7), 4.7);
        assert_eq!(ESeries::E24.nearest(0.47), 0.47);
        assert_eq!(ESeries::E96.nearest(4.99e3), 4990.0);
        assert_eq!(ESeries::E192.nearest(1.01e-3), 0.00101);
        assert_eq!(ESeries::E6.nearest(2.2e9), 2.2e9);
        assert_eq!(ESeries::E6.nearest(2.2e30), 2.2e30);
    }

    #[test]
    fn nearest_and_neighbours_across_decades() {
        let s = ESeries::E24;
        // 9.9k: 10k/9.9k = 1.0101 < 9.9k/9.1k = 1.0879 (hand calculation).
        assert_eq!(s.nearest(9.9e3), 10e3);
        assert_eq!(s.at_or_above(9.2e3), 10e3);
        assert_eq!(s.at_or_below(9.99e3), 9.1e3);
        assert_eq!(s.at_or_below(10e3), 10e3);
        assert_eq!(s.at_or_above(10e3), 10e3);
        assert_eq!(s.at_or_below(0.999), 0.91);
        assert_eq!(s.at_or_above(0.92), 1.0);
        // 1.04: 1.04/1.0 = 1.04 < 1.1/1.04 = 1.0577 (hand calculation).
        assert_eq!(s.nearest(1.04), 1.0);
        assert_eq!(ESeries::E6.at_or_below(0.99), 0.68);
        assert_eq!(ESeries::E6.at_or_above(70.0), 100.0);
        // 97: 100/97 = 1.031 < 97/82 = 1.183 (hand calculation).
        assert_eq!(ESeries::E12.nearest(97.0), 100.0);
        assert_eq!(ESeries::E96.at_or_above(9.77e5), 1e6);
        assert_eq!(ESeries::E192.nearest(9.2), 9.2);
        assert_eq!(ESeries::E192.at_or_below(9.195), 9.09);
        for bad in [0.0, -1.0, f64::NAN, f64::INFINITY] {
            assert!(ESeries::E24.nearest(bad).is_nan());
            assert!(ESeries::E24.at_or_above(bad).is_nan());
        }
    }

    #[test]
    fn values_between_lists_each_value_once() {
        let v: Vec<f64> = ESeries::E12.values_between(1000.0, 10_000.0).collect();
        assert_eq!(
            v,
            [
                1000.0, 1200.0, 1500.0, 1800.0, 2200.0, 2700.0, 3300.0, 3900.0, 4700.0, 5600.0,
                6800.0, 8200.0, 10_000.0
            ]
        );
        let v: Vec<f64> = ESeries::E6.values_between(0.5, 3.0).collect();
        assert_eq!(v, [0.68, 1.0, 1.5, 2.2]);
        assert_eq!(
            ESeries::E192.values_between(1.0, 1000.0).count(),
            3 * 192 + 1
        );
        assert_eq!(ESeries::E24.values_between(5.0, 4.0).count(), 0);
        assert_eq!(ESeries::E24.values_between(-1.0, 4.0).count(), 0);
        assert_eq!(ESeries::E24.values_between(4.8, 5.0).count(), 0);
    }

    #[test]
    fn rkm_examples() {
        // IEC 60062 examples R47, 4R7, 4K7, 47K, 4M7; the others follow the
        // same rule (letter = decimal point and multiplier).
        let cases = [
            (0.47, "R47"),
            (4.7, "4R7"),
            (47.0, "47R"),
            (470.0, "470R"),
            (4700.0, "4K7"),
            (47e3, "47K"),
            (4.7e6, "4M7"),
            (1e6, "1M0"),
            (1e3, "1K0"),
            (1.0, "1R0"),
            (4.99e3, "4K99"),
            (2.2e9, "2G2"),
            (100e3, "100K"),
            (10e3, "10K"),
            (0.047, "R047"),
            (1.2e12, "1T2"),
            (4701.0, "4K7"),
            (9996.0, "10K"),
            (0.0, "0R"),
            (-4700.0, "-4K7"),
            (f64::NAN, "invalid"),
        ];
        for (ohms, code) in cases {
            assert_eq!(format_rkm(ohms), code, "{ohms}");
        }
    }

    #[test]
    fn every_preferred_value_formats_to_rkm_and_parses_back_exactly() {
        for s in ESeries::ALL {
            for v in s.values_between(0.1, 1e10) {
                let code = format_rkm(v);
                let back = parse_quantity(&code, Dimension::Resistance);
                assert_eq!(back, Ok(v), "{} {v} -> {code}", s.name());
            }
        }
    }

    /// Largest ratio between neighbouring values of a series, wrap-around
    /// into the next decade included.
    fn largest_step(s: ESeries) -> f64 {
        let m = s.mantissas();
        let decade = 10f64.powi(s.mantissa_exp() + 1);
        m.windows(2)
            .map(|w| f64::from(w[1]) / f64::from(w[0]))
            .fold(decade / f64::from(m[m.len() - 1]), f64::max)
    }

    proptest! {
        #[test]
        fn nearest_is_within_half_a_step(x in 1e-3f64..1e9, which in 0usize..6) {
            let s = ESeries::ALL[which];
            let v = s.nearest(x);
            let half_step = largest_step(s).sqrt();
            prop_assert!((v / x).max(x / v) <= half_step * (1.0 + 1e-12), "{} {x} -> {v}", s.name());
            let (lo, hi) = (s.at_or_below(x), s.at_or_above(x));
            prop_assert!(lo <= x && x <= hi);
            prop_assert!(v == lo || v == hi);
        }
    }
}
