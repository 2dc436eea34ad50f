//! A fast cube root for the convection correlations' fractional powers.
//!
//! The standard library's `f64::cbrt` links here to a correctly rounded
//! software routine that costs about as much as a whole air-property lookup;
//! the correlations take up to three cube roots per heat-loss evaluation.
//! This is the classic algorithm of FreeBSD's msun `s_cbrt.c` (Bruce D.
//! Evans, 2009; also musl's `cbrt.c`): a first guess good to about 5 bits
//! from the exponent divided by three, a degree-4 polynomial refinement to
//! about 23 bits, rounding to 23 bits, and one Newton step to 53 bits, with
//! an error below 0.667 ulp (stated in that source). Tested against
//! `f64::cbrt` (a correctly rounded reference) to within one ulp.

/// (1023 − 1023/3 − 0.03306235651)·2²⁰: the exponent bias left after the
/// division by three, with the constant that centres the first guess's
/// error (s_cbrt.c).
const B1: u32 = 715_094_163;
/// The same for subnormal input scaled by 2⁵⁴: B1 − (54/3)·2²⁰.
const B2: u32 = 696_219_795;
// The refinement polynomial of s_cbrt.c, t·P(r) with r = t³/x, its
// coefficients as printed there (more digits than an f64 holds; B1, B2 and
// these checked against musl's src/math/cbrt.c, which prints the same).
#[allow(clippy::excessive_precision)]
const P0: f64 = 1.87595182427177009643;
#[allow(clippy::excessive_precision)]
const P1: f64 = -1.88497979543377169875;
#[allow(clippy::excessive_precision)]
const P2: f64 = 1.621429720105354466140;
#[allow(clippy::excessive_precision)]
const P3: f64 = -0.758397934778766047437;
#[allow(clippy::excessive_precision)]
const P4: f64 = 0.145996192886612446982;

/// ∛x for any f64 (negative, zero, subnormal, infinite and NaN input as
/// `f64::cbrt` treats them), within one ulp of the correctly rounded value.
#[inline]
pub fn cbrt(x: f64) -> f64 {
    let bits = x.to_bits();
    let sign = bits & 0x8000_0000_0000_0000;
    let high = ((bits >> 32) as u32) & 0x7fff_ffff;
    if high >= 0x7ff0_0000 {
        // NaN or ±∞.
        return x + x;
    }
    let guess_high = if high < 0x0010_0000 {
        if bits << 1 == 0 {
            // ±0.
            return x;
        }
        // Subnormal: scale by 2⁵⁴ so the exponent trick applies.
        let scaled = x * f64::from_bits(0x4350_0000_0000_0000);
        (((scaled.to_bits() >> 32) as u32) & 0x7fff_ffff) / 3 + B2
    } else {
        high / 3 + B1
    };
    let mut t = f64::from_bits(sign | (u64::from(guess_high) << 32));
    // Polynomial refinement to about 23 bits.
    let r = (t * t) * (t / x);
    t *= (P0 + r * (P1 + r * P2)) + ((r * r) * r) * (P3 + r * P4);
    // Round to 23 bits (away from zero), so t·t is exact below.
    t = f64::from_bits(t.to_bits().wrapping_add(0x8000_0000) & 0xffff_ffff_c000_0000);
    // One Newton step to 53 bits: t + t·(x/t² − t)/(2t + x/t²).
    let s = t * t;
    let r = x / s;
    let w = t + t;
    let r = (r - t) / (w + r);
    t + t * r
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    /// Units in the last place between two finite values of one sign.
    fn ulps(a: f64, b: f64) -> u64 {
        a.to_bits().abs_diff(b.to_bits())
    }

    #[test]
    fn exact_cubes_and_special_values() {
        // Exact cubes have exact roots (arithmetic).
        for (x, root) in [
            (8.0, 2.0),
            (27.0, 3.0),
            (-64.0, -4.0),
            (0.125, 0.5),
            (1.0, 1.0),
        ] {
            assert_eq!(cbrt(x), root, "∛{x}");
        }
        // IEEE 754 conventions, as f64::cbrt.
        assert_eq!(cbrt(0.0).to_bits(), 0.0f64.to_bits());
        assert_eq!(cbrt(-0.0).to_bits(), (-0.0f64).to_bits());
        assert_eq!(cbrt(f64::INFINITY), f64::INFINITY);
        assert_eq!(cbrt(f64::NEG_INFINITY), f64::NEG_INFINITY);
        assert!(cbrt(f64::NAN).is_nan());
    }

    #[test]
    fn subnormals_within_one_ulp() {
        // Reference: f64::cbrt (correctly rounded).
        for x in [f64::MIN_POSITIVE / 3.0, 5e-324, 1e-310, -2.5e-320] {
            assert!(
                ulps(cbrt(x), x.cbrt()) <= 1,
                "∛{x}: {} vs {}",
                cbrt(x),
                x.cbrt()
            );
        }
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(20_000))]

        /// Any finite normal number: within one ulp of the correctly
        /// rounded cube root (reference: `f64::cbrt`).
        #[test]
        fn within_one_ulp_of_reference(bits in 0x0010_0000_0000_0000u64..0x7ff0_0000_0000_0000u64, negative: bool) {
            let x = f64::from_bits(bits) * if negative { -1.0 } else { 1.0 };
            prop_assert!(ulps(cbrt(x), x.cbrt()) <= 1, "∛{}: {} vs {}", x, cbrt(x), x.cbrt());
        }

        /// The range the correlations use (Prandtl ratios, Rayleigh numbers).
        #[test]
        fn within_one_ulp_on_correlation_range(x in 1e-12f64..1e12) {
            prop_assert!(ulps(cbrt(x), x.cbrt()) <= 1);
        }
    }
}
