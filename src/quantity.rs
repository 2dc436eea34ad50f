//! Engineering quantities with units, as written in draftwire design files.
//!
//! Every dimensional value in a design file is a string that carries its unit
//! ("68 ohm", "4k7", "0.5 m/s", "25 degC", "5 %"). [`parse_quantity`] turns
//! such a string into an SI `f64` for the [`Dimension`] the field expects; a
//! missing or wrong unit is an error, never a guess. [`format_engineering`]
//! writes an SI value back with an SI prefix.
//!
//! Sources:
//! - SI prefixes p n µ m k M G on V, A, W, F, Pa, s, m and ohm, plus the
//!   spelled-out units cm, hPa, mbar, bar, atm, in, min, h and the RKM letters
//!   R K M G T for resistance:
//!   BIPM, *The International System of Units (SI)*, 9th ed. (2019), Table 7
//!   (prefixes; table number from memory); degree Celsius, t/°C = T/K − 273.15
//!   (same brochure, section 2.3.1, memory for the section number); minute,
//!   hour and bar as non-SI units accepted for use with the SI (same brochure,
//!   Table 8, memory).
//! - RKM codes: IEC 60062:2016, *Marking codes for resistors and capacitors*:
//!   the letter stands for the decimal point and the multiplier (R47, 4R7,
//!   4K7, 47K, 4M7 are the standard's own examples; the capacitor letters p n
//!   µ m F, e.g. 4n7, are from the same standard, memory).
//! - Foot and inch: international yard and pound agreement (1959),
//!   1 yd = 0.9144 m exactly, hence 1 ft = 0.3048 m, 1 in = 0.0254 m and
//!   1 ft/min = 0.3048/60 m/s = 0.00508 m/s exactly.
//! - Degree Fahrenheit: T/K = (t/°F − 32)·5/9 + 273.15 and
//!   1 °F (difference) = 5/9 K, NIST SP 811 (2008), appendix B.8 (memory).
//! - Standard atmosphere 101 325 Pa exactly (NIST SP 811 (2008), B.8, memory).
//!
//! Accepted spellings (whitespace between number and unit is optional):
//! - numbers `12`, `-5`, `+5`, `0.45`, `.5`, `1e-3`, `4.7e3` (decimal point,
//!   never a comma);
//! - the micro sign as `µ` (U+00B5), `μ` (U+03BC) or `u`; ohm as `ohm`,
//!   `Ohm`, `ohms`, `Ω` (U+2126 or U+03A9); the degree as `°`, `deg` or the
//!   single characters `℃`/`℉`; a product of units with a space, `·`, `⋅` or `*`
//!   (`ohm m`, `ohm·m`);
//! - resistance: `68 ohm`, `68 Ω`, `68R`, `4.7 kohm`, `4.7k`, `1M`,
//!   `2.2 mohm` (milliohm only with the ohm written out) and RKM codes with
//!   the letters R K k M G T (`R47`, `4R7`, `4k7`, `4K7`, `47K`, `1M0`, `2G2`);
//!   a bare `m` (`1m`, `4m7`) is rejected as ambiguous (milli or mega);
//! - capacitance: `F` with prefixes and RKM codes / bare prefixes p n u m
//!   (`4n7`, `47u`, `100p`);
//! - temperature: `K`, `degC`, `°C`, `degF`, `°F`. A bare `C` (`25 C`) is
//!   rejected as ambiguous: in the SI, C is the coulomb.
//!
//! Exactness: a decimal prefix is applied to the text of the number, which is
//! then parsed once ("4k7" → "4.7e3", "R47" → "0.47e0"), so the result is the
//! double nearest to the decimal value written; multiplying after parsing
//! (0.47·1 or 470·1e-3) can be off in the last bit.

use std::fmt;

/// The physical dimension a design-file field expects.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Dimension {
    /// Electrical resistance, ohm.
    Resistance,
    /// Voltage, V.
    Voltage,
    /// Current, A.
    Current,
    /// Power, W.
    Power,
    /// Velocity (airflow), m/s.
    Velocity,
    /// Absolute temperature, returned in K.
    Temperature,
    /// Temperature difference, K.
    TemperatureDifference,
    /// Thermal conductance (e.g. a dissipation constant), W/K.
    ThermalConductance,
    /// Thermal resistance, K/W.
    ThermalResistance,
    /// Heat capacity, J/K.
    HeatCapacity,
    /// Dimensionless fraction: "5 %" is 0.05; a bare number is allowed.
    Fraction,
    /// Temperature coefficient, 1/K.
    TemperatureCoefficient,
    /// Capacitance, F.
    Capacitance,
    /// Length, m.
    Length,
    /// Time, s.
    Time,
    /// Pressure, Pa.
    Pressure,
    /// Electrical resistivity, ohm·m.
    Resistivity,
}

impl Dimension {
    /// The plausible magnitudes of any quantity of this dimension in a
    /// detector design, SI: (smallest non-zero, largest). A value outside is
    /// refused at the door, whatever its key (draftwire's bounds, no source:
    /// each spans several decades beyond the parts this tool sizes; docs/
    /// design-file.md, Units, lists them). Keys with tighter physical ranges
    /// check those as well.
    pub fn plausible_magnitude(self) -> (f64, f64) {
        match self {
            Dimension::Resistance => (1e-6, 1e10),
            Dimension::Voltage => (1e-6, 1e3),
            Dimension::Current => (1e-12, 100.0),
            Dimension::Power => (1e-12, 1e4),
            Dimension::Velocity => (1e-9, 100.0),
            Dimension::Temperature => (1.0, 4000.0),
            Dimension::TemperatureDifference => (1e-6, 1e4),
            Dimension::ThermalConductance => (1e-9, 1e3),
            Dimension::ThermalResistance => (1e-6, 1e6),
            Dimension::HeatCapacity => (1e-12, 100.0),
            Dimension::Fraction => (1e-12, 1e3),
            Dimension::TemperatureCoefficient => (1e-9, 1.0),
            Dimension::Capacitance => (1e-15, 10.0),
            Dimension::Length => (1e-8, 100.0),
            Dimension::Time => (1e-9, 1e6),
            Dimension::Pressure => (1.0, 1e7),
            Dimension::Resistivity => (1e-12, 1.0),
        }
    }

    /// Lower-case English name, e.g. "resistance".
    pub fn name(self) -> &'static str {
        match self {
            Dimension::Resistance => "resistance",
            Dimension::Voltage => "voltage",
            Dimension::Current => "current",
            Dimension::Power => "power",
            Dimension::Velocity => "velocity",
            Dimension::Temperature => "temperature",
            Dimension::TemperatureDifference => "temperature difference",
            Dimension::ThermalConductance => "thermal conductance",
            Dimension::ThermalResistance => "thermal resistance",
            Dimension::HeatCapacity => "heat capacity",
            Dimension::Fraction => "fraction",
            Dimension::TemperatureCoefficient => "temperature coefficient",
            Dimension::Capacitance => "capacitance",
            Dimension::Length => "length",
            Dimension::Time => "time",
            Dimension::Pressure => "pressure",
            Dimension::Resistivity => "resistivity",
        }
    }

    /// Symbol of the SI unit [`parse_quantity`] returns values in.
    pub fn si_unit(self) -> &'static str {
        match self {
            Dimension::Resistance => "Ω",
            Dimension::Voltage => "V",
            Dimension::Current => "A",
            Dimension::Power => "W",
            Dimension::Velocity => "m/s",
            Dimension::Temperature | Dimension::TemperatureDifference => "K",
            Dimension::ThermalConductance => "W/K",
            Dimension::ThermalResistance => "K/W",
            Dimension::HeatCapacity => "J/K",
            Dimension::Fraction => "1",
            Dimension::TemperatureCoefficient => "1/K",
            Dimension::Capacitance => "F",
            Dimension::Length => "m",
            Dimension::Time => "s",
            Dimension::Pressure => "Pa",
            Dimension::Resistivity => "Ω·m",
        }
    }

    /// Example spellings for error messages, already quoted.
    pub fn examples(self) -> &'static str {
        match self {
            Dimension::Resistance => "\"4k7\", \"68 ohm\" or \"4.7 kohm\"",
            Dimension::Voltage => "\"12 V\" or \"330 mV\"",
            Dimension::Current => "\"35 mA\" or \"1.2 A\"",
            Dimension::Power => "\"0.5 W\" or \"250 mW\"",
            Dimension::Velocity => "\"0.5 m/s\", \"30 cm/s\" or \"100 ft/min\"",
            Dimension::Temperature => "\"25 degC\", \"25 °C\", \"298.15 K\" or \"77 degF\"",
            Dimension::TemperatureDifference => "\"10 K\", \"10 degC\" or \"18 degF\"",
            Dimension::ThermalConductance => "\"1.5 mW/K\" or \"1.5 mW/degC\"",
            Dimension::ThermalResistance => "\"65 K/W\" or \"65 degC/W\"",
            Dimension::HeatCapacity => "\"15 mJ/K\" or \"0.2 J/K\"",
            Dimension::Fraction => "\"5 %\", \"500 ppm\" or \"0.05\"",
            Dimension::TemperatureCoefficient => "\"3900 ppm/K\", \"0.39 %/K\" or \"0.0039 1/K\"",
            Dimension::Capacitance => "\"100 nF\", \"4n7\" or \"47 uF\"",
            Dimension::Length => "\"25 um\", \"12 mm\" or \"0.5 in\"",
            Dimension::Time => "\"2 s\", \"150 ms\" or \"5 min\"",
            Dimension::Pressure => "\"101.3 kPa\", \"1013 hPa\" or \"1 atm\"",
            Dimension::Resistivity => "\"5.65 uohm cm\" or \"5.65e-8 ohm m\"",
        }
    }
}

impl fmt::Display for Dimension {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

/// Why a quantity string was rejected; each message says what to write.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum QuantityError {
    /// Nothing but whitespace.
    #[error(
        "empty quantity: write a number followed by its unit, such as \"68 ohm\" or \"0.5 m/s\""
    )]
    Empty,
    /// No number could be read at the start of the text.
    #[error("malformed number in \"{text}\": write a number such as 12, -5, 0.45, .5 or 1e-3 (with a decimal point, not a comma), then its unit")]
    MalformedNumber {
        /// The text as given.
        text: String,
    },
    /// A bare number where a unit is required.
    #[error("missing unit in \"{text}\": expected a {expected} such as {}", .expected.examples())]
    MissingUnit {
        /// The text as given.
        text: String,
        /// The dimension the field expects.
        expected: Dimension,
    },
    /// A unit this parser does not know.
    #[error("unknown unit \"{unit}\" in \"{text}\": expected a {expected} such as {}", .expected.examples())]
    UnknownUnit {
        /// The text as given.
        text: String,
        /// The unit part that was not recognised.
        unit: String,
        /// The dimension the field expects.
        expected: Dimension,
    },
    /// A known unit of another dimension.
    #[error("\"{text}\" is a {found} (unit \"{unit}\"), but a {expected} was expected, such as {}", .expected.examples())]
    WrongDimension {
        /// The text as given.
        text: String,
        /// The unit part of the text.
        unit: String,
        /// The dimension of that unit.
        found: Dimension,
        /// The dimension the field expects.
        expected: Dimension,
    },
    /// A spelling with more than one reasonable meaning.
    #[error("\"{text}\" is ambiguous: {hint}")]
    Ambiguous {
        /// The text as given.
        text: String,
        /// How to write the intended meaning unambiguously.
        hint: String,
    },
    /// A value that cannot be physical or cannot be represented.
    #[error("\"{text}\" is out of range: {reason}")]
    OutOfRange {
        /// The text as given.
        text: String,
        /// Why the value is out of range.
        reason: String,
    },
}

/// How a unit's number becomes the SI value.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Conv {
    /// Exact decimal scale, applied to the number's text before parsing.
    Pow10(i32),
    /// SI value = number·num/den (non-decimal factors: inch, minute, km/h).
    Ratio(f64, f64),
    /// Degrees Celsius to kelvin: T = t + 273.15 (SI Brochure 9th ed.).
    Celsius,
    /// Degrees Fahrenheit to kelvin: T = (t − 32)·5/9 + 273.15 (NIST SP 811).
    Fahrenheit,
}

/// SI prefixes accepted on prefixable units (SI Brochure, 9th ed., 2019).
const PREFIXES: [(&str, i32); 7] = [
    ("p", -12),
    ("n", -9),
    ("u", -6),
    ("m", -3),
    ("k", 3),
    ("M", 6),
    ("G", 9),
];

/// Units that take any of [`PREFIXES`].
const PREFIXABLE: [(&str, Dimension); 8] = [
    ("ohm", Dimension::Resistance),
    ("V", Dimension::Voltage),
    ("A", Dimension::Current),
    ("W", Dimension::Power),
    ("F", Dimension::Capacitance),
    ("m", Dimension::Length),
    ("s", Dimension::Time),
    ("Pa", Dimension::Pressure),
];

/// Units matched literally (after normalisation), each with its meaning.
const EXACT: [(&str, Dimension, Conv); 22] = [
    ("K", Dimension::Temperature, Conv::Pow10(0)),
    ("K", Dimension::TemperatureDifference, Conv::Pow10(0)),
    ("degC", Dimension::Temperature, Conv::Celsius),
    ("degC", Dimension::TemperatureDifference, Conv::Pow10(0)),
    ("degF", Dimension::Temperature, Conv::Fahrenheit),
    // 1 °F difference = 5/9 K (NIST SP 811, memory).
    (
        "degF",
        Dimension::TemperatureDifference,
        Conv::Ratio(5.0, 9.0),
    ),
    ("%", Dimension::Fraction, Conv::Pow10(-2)),
    ("ppm", Dimension::Fraction, Conv::Pow10(-6)),
    ("R", Dimension::Resistance, Conv::Pow10(0)),
    ("Kohm", Dimension::Resistance, Conv::Pow10(3)),
    // 1 km/h = 1000/3600 m/s = 5/18 m/s.
    ("km/h", Dimension::Velocity, Conv::Ratio(5.0, 18.0)),
    // 1 ft/min = 0.3048/60 m/s = 508/100000 m/s (yard and pound agreement, 1959).
    ("ft/min", Dimension::Velocity, Conv::Ratio(508.0, 100_000.0)),
    // fpm is the HVAC trade's spelling of ft/min.
    ("fpm", Dimension::Velocity, Conv::Ratio(508.0, 100_000.0)),
    // 1 mph = 1609.344 m/3600 s = 0.44704 m/s = 44704/100000 m/s exactly
    // (international mile, yard and pound agreement, 1959).
    ("mph", Dimension::Velocity, Conv::Ratio(44_704.0, 100_000.0)),
    ("cm", Dimension::Length, Conv::Pow10(-2)),
    // 1 in = 0.0254 m = 254/10000 m (yard and pound agreement, 1959).
    ("in", Dimension::Length, Conv::Ratio(254.0, 10_000.0)),
    ("min", Dimension::Time, Conv::Ratio(60.0, 1.0)),
    ("h", Dimension::Time, Conv::Ratio(3600.0, 1.0)),
    ("hPa", Dimension::Pressure, Conv::Pow10(2)),
    ("bar", Dimension::Pressure, Conv::Pow10(5)),
    ("mbar", Dimension::Pressure, Conv::Pow10(2)),
    ("atm", Dimension::Pressure, Conv::Ratio(101_325.0, 1.0)),
];

/// A decimal number as written: sign, integer digits, fraction digits and a
/// power-of-ten exponent.
struct Number<'a> {
    negative: bool,
    int: &'a str,
    frac: &'a str,
    exp10: i64,
}

impl Number<'_> {
    /// The number times 10^`shift`, from a single parse of the composed text
    /// (e.g. "4", "7", shift 3 → "4.7e3"), so the result is the double
    /// nearest the exact decimal value.
    fn value(&self, shift: i32) -> f64 {
        let exp = self
            .exp10
            .saturating_add(i64::from(shift))
            .clamp(-100_000, 100_000);
        let int = if self.int.is_empty() { "0" } else { self.int };
        let frac = if self.frac.is_empty() { "0" } else { self.frac };
        let sign = if self.negative { "-" } else { "" };
        // The composed text is always a valid float literal; NaN cannot occur
        // and would be caught by the finiteness check anyway.
        format!("{sign}{int}.{frac}e{exp}")
            .parse()
            .unwrap_or(f64::NAN)
    }
}

/// End index of the run of ASCII digits starting at `from`.
fn digits_end(s: &str, from: usize) -> usize {
    from + s[from..].bytes().take_while(u8::is_ascii_digit).count()
}

/// Split a leading sign off `s`.
fn split_sign(s: &str) -> (bool, &str) {
    if let Some(rest) = s.strip_prefix('-') {
        (true, rest)
    } else {
        (false, s.strip_prefix('+').unwrap_or(s))
    }
}

/// Read a decimal number at the start of `s`; returns it and the rest, with
/// leading whitespace removed. `None` if there is no digit.
fn split_number(s: &str) -> Option<(Number<'_>, &str)> {
    let (negative, body) = split_sign(s);
    let b = body.as_bytes();
    let mut i = digits_end(body, 0);
    let int = &body[..i];
    let mut frac = "";
    if b.get(i) == Some(&b'.') {
        let start = i + 1;
        i = digits_end(body, start);
        frac = &body[start..i];
    }
    if int.is_empty() && frac.is_empty() {
        return None;
    }
    let mut exp10 = 0_i64;
    if matches!(b.get(i), Some(b'e' | b'E')) {
        let (exp_negative, exp_body) = split_sign(&body[i + 1..]);
        let n = digits_end(exp_body, 0);
        if n > 0 {
            // Longer exponents than this overflow or underflow any f64 anyway.
            let magnitude = exp_body[..n].parse::<i64>().unwrap_or(1_000_000);
            exp10 = if exp_negative { -magnitude } else { magnitude };
            i = body.len() - (exp_body.len() - n);
        }
    }
    let number = Number {
        negative,
        int,
        frac,
        exp10,
    };
    Some((number, body[i..].trim_start()))
}

/// An RKM code split into its parts: digits, letter, digits, rest.
struct Rkm<'a> {
    number: Number<'a>,
    letter: char,
    rest: &'a str,
}

/// Recognise the RKM shape `[sign]digits* LETTER digits+ [unit]`, e.g. "4k7",
/// "R47", "4n7 F". The letter is an ASCII letter other than `e`/`E`.
fn split_rkm(s: &str) -> Option<Rkm<'_>> {
    let (negative, body) = split_sign(s);
    let int_end = digits_end(body, 0);
    let letter = body[int_end..].chars().next()?;
    if !letter.is_ascii_alphabetic() || matches!(letter, 'e' | 'E') {
        return None;
    }
    let frac_start = int_end + 1;
    let frac_end = digits_end(body, frac_start);
    if frac_end == frac_start {
        return None;
    }
    Some(Rkm {
        number: Number {
            negative,
            int: &body[..int_end],
            frac: &body[frac_start..frac_end],
            exp10: 0,
        },
        letter,
        rest: body[frac_end..].trim_start(),
    })
}

/// Dimension and decimal exponent of an RKM letter (IEC 60062): R K k M G T
/// for resistors, p n u F for capacitors. `m` is handled by the caller.
fn rkm_letter(letter: char) -> Option<(Dimension, i32)> {
    match letter {
        'R' => Some((Dimension::Resistance, 0)),
        'K' | 'k' => Some((Dimension::Resistance, 3)),
        'M' => Some((Dimension::Resistance, 6)),
        'G' => Some((Dimension::Resistance, 9)),
        'T' => Some((Dimension::Resistance, 12)),
        'p' => Some((Dimension::Capacitance, -12)),
        'n' => Some((Dimension::Capacitance, -9)),
        'u' => Some((Dimension::Capacitance, -6)),
        'F' => Some((Dimension::Capacitance, 0)),
        _ => None,
    }
}

/// Canonical spelling: micro → `u`, ohm signs → `ohm`, degree signs → `deg`,
/// product signs → one space, no spaces around `/` or after `deg`.
fn normalize(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 8);
    for c in s.chars() {
        match c {
            '\u{b5}' | '\u{3bc}' => out.push('u'),
            '\u{2126}' | '\u{3a9}' => out.push_str("ohm"),
            '℃' => out.push_str("degC"),
            '℉' => out.push_str("degF"),
            '°' | 'º' => out.push_str("deg"),
            '·' | '⋅' | '*' => out.push(' '),
            c if c.is_whitespace() => out.push(' '),
            c => out.push(c),
        }
    }
    out.split(' ')
        .filter(|w| !w.is_empty())
        .collect::<Vec<_>>()
        .join(" ")
        .replace(" /", "/")
        .replace("/ ", "/")
        .replace("deg ", "deg")
        .replace("Ohm", "ohm")
        .replace("ohms", "ohm")
}

/// Decimal exponent of `unit` as `base` with an optional SI prefix
/// ("mW" of "W" → −3).
fn prefixed(unit: &str, base: &str) -> Option<i32> {
    if unit == base {
        return Some(0);
    }
    let prefix = unit.strip_suffix(base)?;
    PREFIXES.iter().find(|(p, _)| *p == prefix).map(|&(_, e)| e)
}

/// Every (dimension, conversion) a normalised unit spelling can mean,
/// independent of the field's expected dimension.
fn candidates(unit: &str) -> Vec<(Dimension, Conv)> {
    let mut out: Vec<(Dimension, Conv)> = EXACT
        .iter()
        .filter(|(u, _, _)| *u == unit)
        .map(|&(_, d, c)| (d, c))
        .collect();
    if !out.is_empty() {
        return out;
    }
    for (base, dim) in PREFIXABLE {
        if let Some(e) = prefixed(unit, base) {
            out.push((dim, Conv::Pow10(e)));
        }
    }
    if let Some((num, den)) = unit.split_once('/') {
        let per_kelvin = den == "K" || den == "degC";
        if per_kelvin {
            if let Some(e) = prefixed(num, "W") {
                out.push((Dimension::ThermalConductance, Conv::Pow10(e)));
            }
            if let Some(e) = prefixed(num, "J") {
                out.push((Dimension::HeatCapacity, Conv::Pow10(e)));
            }
            let tc = match num {
                "" | "1" => Some(0),
                "%" => Some(-2),
                "ppm" => Some(-6),
                _ => None,
            };
            if let Some(e) = tc {
                out.push((Dimension::TemperatureCoefficient, Conv::Pow10(e)));
            }
        }
        if num == "K" || num == "degC" {
            if let Some(e) = prefixed(den, "W") {
                out.push((Dimension::ThermalResistance, Conv::Pow10(-e)));
            }
        }
        if den == "s" {
            let length = if num == "cm" {
                Some(-2)
            } else {
                prefixed(num, "m")
            };
            if let Some(e) = length {
                out.push((Dimension::Velocity, Conv::Pow10(e)));
            }
        }
    }
    if let Some((ohm, per)) = unit.split_once(' ') {
        let length = match per {
            "m" => Some(0),
            "cm" => Some(-2),
            // ohm·mm²/m = 1e-6 ohm·m (wire tables)
            "mm2/m" | "mm^2/m" | "mm²/m" => Some(-6),
            _ => None,
        };
        if let (Some(e), Some(l)) = (prefixed(ohm, "ohm"), length) {
            out.push((Dimension::Resistivity, Conv::Pow10(e + l)));
        }
    }
    out
}

fn ambiguous_milli_mega(text: &str) -> QuantityError {
    QuantityError::Ambiguous {
        text: text.to_string(),
        hint: "in a resistance a lower-case m could mean milli or mega; write \"2.2 mohm\" \
               for milliohms or \"2.2M\" / \"2.2 Mohm\" for megohms"
            .to_string(),
    }
}

/// Apply a conversion to the number and check the result.
fn convert(
    number: &Number<'_>,
    conv: Conv,
    text: &str,
    expected: Dimension,
) -> Result<f64, QuantityError> {
    let below_zero = || QuantityError::OutOfRange {
        text: text.to_string(),
        reason: "below absolute zero (0 K = -273.15 °C = -459.67 °F)".to_string(),
    };
    let value = match conv {
        Conv::Pow10(e) => number.value(e),
        Conv::Ratio(num, den) => number.value(0) * num / den,
        Conv::Celsius => {
            let t = number.value(0);
            if t < -273.15 {
                return Err(below_zero());
            }
            t + 273.15
        }
        Conv::Fahrenheit => {
            let t = number.value(0);
            if t < -459.67 {
                return Err(below_zero());
            }
            // max: -459.67 °F may round a hair below 0 K.
            ((t - 32.0) * 5.0 / 9.0 + 273.15).max(0.0)
        }
    };
    if !value.is_finite() {
        return Err(QuantityError::OutOfRange {
            text: text.to_string(),
            reason: "too large to represent".to_string(),
        });
    }
    if expected == Dimension::Temperature && value < 0.0 {
        return Err(below_zero());
    }
    Ok(value)
}

/// Parse `text` as a quantity of dimension `expected`, returning its value in
/// the SI unit [`Dimension::si_unit`] (absolute temperatures in K).
///
/// A bare number is accepted only for [`Dimension::Fraction`]. See the module
/// documentation for every accepted spelling.
pub fn parse_quantity(text: &str, expected: Dimension) -> Result<f64, QuantityError> {
    let text = text.trim();
    if text.is_empty() {
        return Err(QuantityError::Empty);
    }
    // A power written as builders buy it: "1/4 W", "1/8 W".
    if expected == Dimension::Power {
        if let Some(v) = fraction_power(text) {
            return v;
        }
    }
    let norm = normalize(text);

    if let Some(rkm) = split_rkm(&norm) {
        let found = match (rkm.letter, expected) {
            ('m', Dimension::Resistance) => return Err(ambiguous_milli_mega(text)),
            ('m', Dimension::Capacitance) => Some((Dimension::Capacitance, -3)),
            (letter, _) => rkm_letter(letter),
        };
        if let Some((dim, e)) = found {
            if dim != expected {
                return Err(QuantityError::WrongDimension {
                    text: text.to_string(),
                    unit: rkm.letter.to_string(),
                    found: dim,
                    expected,
                });
            }
            let base = if dim == Dimension::Resistance {
                "ohm"
            } else {
                "F"
            };
            if !rkm.rest.is_empty() && rkm.rest != base {
                return Err(QuantityError::UnknownUnit {
                    text: text.to_string(),
                    unit: rkm.rest.to_string(),
                    expected,
                });
            }
            return convert(&rkm.number, Conv::Pow10(e), text, expected);
        }
    }

    let Some((number, unit)) = split_number(&norm) else {
        return Err(QuantityError::MalformedNumber {
            text: text.to_string(),
        });
    };
    let starts_malformed = unit.starts_with(['.', ',', '+', '-'])
        || (unit.starts_with(|c: char| c.is_ascii_digit()) && !unit.starts_with("1/"));
    if starts_malformed {
        return Err(QuantityError::MalformedNumber {
            text: text.to_string(),
        });
    }
    if unit.is_empty() {
        if expected == Dimension::Fraction {
            return convert(&number, Conv::Pow10(0), text, expected);
        }
        return Err(QuantityError::MissingUnit {
            text: text.to_string(),
            expected,
        });
    }

    // Spellings whose meaning depends on the field.
    let contextual = match (expected, unit) {
        (Dimension::Resistance, "k" | "K") => Some(3),
        (Dimension::Resistance, "M") => Some(6),
        (Dimension::Resistance, "G") => Some(9),
        (Dimension::Resistance, "T") => Some(12),
        (Dimension::Resistance, "m") => return Err(ambiguous_milli_mega(text)),
        (Dimension::Capacitance, "p") => Some(-12),
        (Dimension::Capacitance, "n") => Some(-9),
        (Dimension::Capacitance, "u") => Some(-6),
        (Dimension::Capacitance, "m") => Some(-3),
        (Dimension::Temperature | Dimension::TemperatureDifference, "C" | "F") => {
            return Err(QuantityError::Ambiguous {
                text: text.to_string(),
                hint: format!(
                    "a bare \"{unit}\" is the SI symbol of the {}; write \"deg{unit}\" or \"°{unit}\"",
                    if unit == "C" { "coulomb" } else { "farad" }
                ),
            })
        }
        _ => None,
    };
    if let Some(e) = contextual {
        return convert(&number, Conv::Pow10(e), text, expected);
    }

    let found = candidates(unit);
    if let Some(&(_, conv)) = found.iter().find(|(d, _)| *d == expected) {
        return convert(&number, conv, text, expected);
    }
    match found.first() {
        Some(&(dim, _)) => Err(QuantityError::WrongDimension {
            text: text.to_string(),
            unit: unit.to_string(),
            found: dim,
            expected,
        }),
        None => Err(QuantityError::UnknownUnit {
            text: text.to_string(),
            unit: unit.to_string(),
            expected,
        }),
    }
}

/// A signed number as the reports write it: "+" or a typographic minus
/// ("−", U+2212), then `x`'s magnitude with `significant_digits`.
pub fn format_signed(x: f64, significant_digits: usize) -> String {
    format!("{}{}", sign_of(x), format_sig(x.abs(), significant_digits))
}

/// "+" or the typographic minus "−" (U+2212) for `x`.
pub fn sign_of(x: f64) -> &'static str {
    if x < 0.0 {
        "−"
    } else {
        "+"
    }
}

/// A plain number rounded to `significant_digits` without trailing zeros
/// and without float noise: `(0.21000000000000002, 3)` → "0.21",
/// `(6.393, 2)` → "6.4". A non-finite value is written "—" (never
/// printed as a number; the report's guard names it).
pub fn format_sig(value: f64, significant_digits: usize) -> String {
    if !value.is_finite() {
        return "—".into();
    }
    let digits = significant_digits.clamp(1, 17);
    let rounded: f64 = format!("{:.*e}", digits - 1, value)
        .parse()
        .unwrap_or(value);
    // Shortest text that reads back as the rounded value.
    let text = format!("{rounded}");
    if text == "-0" {
        "0".into()
    } else {
        text
    }
}

/// `"a/b UNIT"` with whole a and b > 0: the fraction times one UNIT;
/// `None` when the text is not a fraction.
fn fraction_power(text: &str) -> Option<Result<f64, QuantityError>> {
    let (num, rest) = text.split_once('/')?;
    let num = num.trim();
    if num.is_empty() || !num.chars().all(|c| c.is_ascii_digit()) {
        return None;
    }
    let rest = rest.trim_start();
    let digits: String = rest.chars().take_while(char::is_ascii_digit).collect();
    if digits.is_empty() {
        return None;
    }
    let unit = rest[digits.len()..].trim();
    let (a, b): (f64, f64) = (num.parse().ok()?, digits.parse().ok()?);
    if b == 0.0 {
        return Some(Err(QuantityError::MalformedNumber {
            text: text.to_string(),
        }));
    }
    Some(parse_quantity(&format!("1 {unit}"), Dimension::Power).map(|w| w * a / b))
}

/// Write `value_si` with an SI prefix (p n µ m k M G; SI Brochure, 9th ed.,
/// 2019) in front of `unit_symbol`, rounded to `significant_digits`
/// (clamped to 1..=17): `(0.0352, "A", 3)` → "35.2 mA",
/// `(4700.0, "Ω", 2)` → "4.7 kΩ".
///
/// The mantissa keeps its significant digits (trailing zeros included). The
/// digits come from one correctly rounded decimal conversion and are only
/// shifted, never rescaled in floating point, so the text parses back to the
/// rounded value. Values beyond the prefix range are written with p or G
/// ("0.001 pA", "1000 GΩ"). Never prints a non-finite number: it writes
/// "—" (the report's guard names such a field as a defect).
pub fn format_engineering(value_si: f64, unit_symbol: &str, significant_digits: usize) -> String {
    let join = |number: &str, prefix: &str| {
        if unit_symbol.is_empty() && prefix.is_empty() {
            number.to_string()
        } else {
            format!("{number} {prefix}{unit_symbol}")
        }
    };
    // A non-finite figure is never printed: the report's guard names it
    // as a defect (`Report::guarded`).
    if !value_si.is_finite() {
        return "—".to_string();
    }
    if value_si == 0.0 {
        return join("0", "");
    }
    let digits = significant_digits.clamp(1, 17);
    let sci = format!("{:.*e}", digits - 1, value_si.abs());
    let (mantissa, exp) = sci.split_once('e').unwrap_or((&sci, "0"));
    let exp: i32 = exp.parse().unwrap_or(0);
    let digit_text: String = mantissa.chars().filter(char::is_ascii_digit).collect();
    let eng = (exp.div_euclid(3) * 3).clamp(-12, 9);
    // Digits before the decimal point once the prefix is applied.
    let int_len = exp - eng + 1;
    let len = digit_text.len() as i32;
    let number = if int_len <= 0 {
        format!(
            "0.{}{digit_text}",
            "0".repeat(int_len.unsigned_abs() as usize)
        )
    } else if int_len >= len {
        format!("{digit_text}{}", "0".repeat((int_len - len) as usize))
    } else {
        let (a, b) = digit_text.split_at(int_len as usize);
        format!("{a}.{b}")
    };
    let prefix = match eng {
        -12 => "p",
        -9 => "n",
        -6 => "µ",
        -3 => "m",
        3 => "k",
        6 => "M",
        9 => "G",
        _ => "",
    };
    let sign = if value_si < 0.0 { "-" } else { "" };
    join(&format!("{sign}{number}"), prefix)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;
    use proptest::prelude::*;
    use Dimension::*;

    fn p(text: &str, dim: Dimension) -> f64 {
        match parse_quantity(text, dim) {
            Ok(v) => v,
            Err(e) => panic!("{text:?} as {dim}: {e}"),
        }
    }

    /// Every spelling in `texts` gives exactly `expected`.
    fn all_exact(texts: &[&str], dim: Dimension, expected: f64) {
        for t in texts {
            assert_eq!(p(t, dim), expected, "{t:?}");
        }
    }

    /// Every spelling in `texts` gives `expected` within 1e-12 relative.
    fn all_close(texts: &[&str], dim: Dimension, expected: f64) {
        for t in texts {
            let v = p(t, dim);
            assert!(
                (v - expected).abs() <= 1e-12 * expected.abs(),
                "{t:?}: {v} vs {expected}"
            );
        }
    }

    #[test]
    fn resistance_spellings() {
        // U+03A9 and U+2126 ohm signs, written out.
        all_exact(
            &[
                "68 ohm",
                "68ohm",
                "68 Ohm",
                "68 ohms",
                "68 \u{3a9}",
                "68 \u{2126}",
                "68Ω",
                "68R",
                "68 R",
            ],
            Resistance,
            68.0,
        );
        all_exact(
            &[
                "4.7 kohm", "4.7 kΩ", "4.7k", "4.7K", "4k7", "4K7", "4.7 kOhm",
            ],
            Resistance,
            4700.0,
        );
        all_exact(&["47K", "47k", "47 kohm"], Resistance, 47_000.0);
        all_exact(&["1 Mohm", "1M", "1M0", "1 MΩ"], Resistance, 1e6);
        all_exact(&["4M7"], Resistance, 4.7e6);
        all_exact(&["2G2", "2.2 Gohm"], Resistance, 2.2e9);
        all_exact(&["2.2 mohm", "2.2mΩ"], Resistance, 2.2e-3);
        all_exact(&["4R7", "4.7 ohm"], Resistance, 4.7);
        all_exact(&["47R"], Resistance, 47.0);
        all_exact(&["4k7 ohm", "4K7Ω"], Resistance, 4700.0);
    }

    #[test]
    fn rkm_codes_are_exact() {
        // IEC 60062:2016 examples R47, 4R7, 4K7, 47K, 4M7: the letter marks the
        // decimal point, so the value is the decimal written, to the last bit.
        assert_eq!(p("R47", Resistance), 0.47);
        assert_eq!(p("4R7", Resistance), 4.7);
        assert_eq!(p("4K7", Resistance), 4700.0);
        assert_eq!(p("4k7", Resistance), 4700.0);
        assert_eq!(p("47K", Resistance), 47_000.0);
        assert_eq!(p("4M7", Resistance), 4_700_000.0);
        assert_eq!(p("4.7 kohm", Resistance), 4700.0);
        // Multiplying after parsing is not exact (why the text is composed):
        // 470·1e-3 and 0.47 differ in the last bit.
        assert_ne!(470.0 * 1e-3, 0.47);
        assert_eq!(p("470 mohm", Resistance), 0.47);
    }

    #[test]
    fn bare_lower_case_m_in_a_resistance_is_ambiguous() {
        for t in ["1m", "4m7", "2.2 m"] {
            match parse_quantity(t, Resistance) {
                Err(QuantityError::Ambiguous { hint, .. }) => {
                    assert!(hint.contains("mohm") && hint.contains("Mohm"))
                }
                other => panic!("{t}: {other:?}"),
            }
        }
    }

    #[test]
    fn voltage_current_power_spellings() {
        all_exact(&["12 V", "12V", "+12 V", "12e0 V"], Voltage, 12.0);
        all_exact(&["330 mV"], Voltage, 0.33);
        all_exact(&["1.5 kV"], Voltage, 1500.0);
        all_exact(&["50 µV", "50 μV", "50 uV"], Voltage, 50e-6);
        all_exact(&["-5 V"], Voltage, -5.0);
        all_exact(&[".5 V", "0.5 V", "5e-1 V", "5.e-1 V"], Voltage, 0.5);
        all_exact(&["1.2 A"], Current, 1.2);
        all_exact(&["35 mA", "35mA", "3.5e1 mA"], Current, 0.035);
        all_exact(&["20 µA", "20 μA", "20 uA"], Current, 20e-6);
        all_exact(&["1e-3 A"], Current, 1e-3);
        all_exact(&["50 nA"], Current, 50e-9);
        all_exact(&["0.5 W", "500 mW"], Power, 0.5);
        all_exact(&["2 kW"], Power, 2000.0);
        all_exact(&["250 µW", "250 uW"], Power, 250e-6);
        all_exact(&["4.7e3 ohm"], Resistance, 4700.0);
    }

    #[test]
    fn capacitance_spellings() {
        // 4n7 = 4.7 nF, 47u = 47 µF, 100p = 100 pF: IEC 60062 capacitor
        // letters (memory).
        all_exact(&["4n7", "4.7 nF", "4n7 F", "4.7n"], Capacitance, 4.7e-9);
        all_exact(
            &["47u", "47 uF", "47 µF", "47 μF", "47µ"],
            Capacitance,
            47e-6,
        );
        all_exact(&["100p", "100 pF"], Capacitance, 100e-12);
        all_exact(&["100 nF"], Capacitance, 100e-9);
        all_exact(&["1 F", "1F0"], Capacitance, 1.0);
        all_exact(&["2.2 mF", "2m2"], Capacitance, 2.2e-3);
        all_exact(&["p47"], Capacitance, 0.47e-12);
    }

    #[test]
    fn velocity_spellings() {
        all_exact(
            &["0.5 m/s", "50 cm/s", "500 mm/s", "0.5 m / s"],
            Velocity,
            0.5,
        );
        // 36 km/h = 36·1000/3600 m/s = 10 m/s (hand calculation).
        all_exact(&["36 km/h"], Velocity, 10.0);
        // 100 ft/min = 100·0.3048/60 = 0.508 m/s (yard and pound agreement,
        // 1959: 1 ft = 0.3048 m exactly).
        all_exact(&["100 ft/min", "100 fpm"], Velocity, 0.508);
        // 1 mph = 0.44704 m/s exactly (international mile = 1609.344 m).
        all_exact(&["1 mph"], Velocity, 0.44704);
        all_exact(&["1 ft/min"], Velocity, 0.00508);
    }

    #[test]
    fn temperature_spellings() {
        // 25 °C = 298.15 K (SI Brochure 9th ed.: T/K = t/°C + 273.15);
        // 77 °F = (77 − 32)·5/9 °C = 25 °C (hand calculation).
        all_close(
            &[
                "25 degC", "25 °C", "25°C", "25 ° C", "25 deg C", "25 ℃", "298.15 K", "298.15K",
                "77 degF", "77 °F", "77°F", "77 ℉",
            ],
            Temperature,
            298.15,
        );
        assert_eq!(p("-273.15 degC", Temperature), 0.0);
        assert_eq!(p("-459.67 degF", Temperature), 0.0);
        assert_eq!(p("0 K", Temperature), 0.0);
        // 10 K = 10 °C difference; 18 °F difference = 18·5/9 = 10 K.
        all_exact(
            &["10 K", "10 degC", "10 °C", "18 degF", "18 °F"],
            TemperatureDifference,
            10.0,
        );
        all_exact(&["-10 degC"], TemperatureDifference, -10.0);
    }

    #[test]
    fn bare_c_is_ambiguous_and_below_absolute_zero_is_out_of_range() {
        for (t, d) in [("25 C", Temperature), ("10 C", TemperatureDifference)] {
            assert!(
                matches!(parse_quantity(t, d), Err(QuantityError::Ambiguous { .. })),
                "{t}"
            );
        }
        for t in ["-1 K", "-300 degC", "-273.16 °C", "-500 degF"] {
            match parse_quantity(t, Temperature) {
                Err(QuantityError::OutOfRange { reason, .. }) => {
                    assert!(reason.contains("absolute zero"))
                }
                other => panic!("{t}: {other:?}"),
            }
        }
    }

    #[test]
    fn thermal_spellings() {
        all_exact(&["2 W/K", "2 W/degC", "2000 mW/K"], ThermalConductance, 2.0);
        all_exact(
            &[
                "1.5 mW/K",
                "1.5 mW/degC",
                "1.5 mW/°C",
                "1.5mW/K",
                "1500 µW/K",
                "1500 uW/K",
            ],
            ThermalConductance,
            1.5e-3,
        );
        all_exact(
            &["65 K/W", "65 degC/W", "65 °C/W", "65 ℃/W"],
            ThermalResistance,
            65.0,
        );
        all_exact(&["0.2 J/K", "200 mJ/K", "200 mJ/degC"], HeatCapacity, 0.2);
        all_exact(
            &["15 mJ/K", "15 mJ/degC", "15000 µJ/K"],
            HeatCapacity,
            15e-3,
        );
    }

    #[test]
    fn fraction_and_temperature_coefficient_spellings() {
        all_exact(&["5 %", "5%", "0.05", "50000 ppm"], Fraction, 0.05);
        all_exact(&["500 ppm"], Fraction, 5e-4);
        all_exact(&["0.3"], Fraction, 0.3);
        all_exact(
            &[
                "3900 ppm/K",
                "3900 ppm/degC",
                "3900 ppm/°C",
                "0.39 %/K",
                "0.39 %/degC",
                "0.0039 /K",
                "0.0039/K",
                "0.0039 1/K",
                "0.0039 1/degC",
            ],
            TemperatureCoefficient,
            0.0039,
        );
    }

    #[test]
    fn length_time_pressure_resistivity_spellings() {
        all_exact(&["12 mm", "1.2 cm", "0.012 m"], Length, 0.012);
        all_exact(&["25 µm", "25 um", "25 μm"], Length, 25e-6);
        // 1 in = 0.0254 m exactly (yard and pound agreement, 1959).
        all_exact(&["1 in"], Length, 0.0254);
        all_exact(&["2 s", "2000 ms"], Time, 2.0);
        all_exact(&["150 ms"], Time, 0.15);
        all_exact(&["20 µs", "20 us"], Time, 20e-6);
        all_exact(&["5 min", "300 s"], Time, 300.0);
        all_exact(&["2 h"], Time, 7200.0);
        // 1 atm = 101 325 Pa exactly; 1 bar = 1e5 Pa (NIST SP 811, memory).
        all_close(
            &[
                "101325 Pa",
                "1013.25 hPa",
                "101.325 kPa",
                "1.01325 bar",
                "1013.25 mbar",
                "1 atm",
            ],
            Pressure,
            101_325.0,
        );
        // Tungsten near 300 K, 5.65 µΩ·cm = 5.65e-8 Ω·m (Forsythe & Worthing
        // 1925; here only a spelling check).
        all_exact(
            &[
                "5.65 µohm cm",
                "5.65 uohm·cm",
                "5.65 µΩ·cm",
                "5.65 μΩ cm",
                "5.65e-8 ohm m",
                "5.65e-8 ohm·m",
                "5.65e-8 Ω*m",
                "0.0565 ohm mm2/m",
            ],
            Resistivity,
            5.65e-8,
        );
    }

    #[test]
    fn error_empty_and_malformed() {
        assert_eq!(parse_quantity("", Voltage), Err(QuantityError::Empty));
        assert_eq!(parse_quantity("   ", Voltage), Err(QuantityError::Empty));
        for t in ["abc V", "V", "1,5 V", "1.2.3 V", "-", ".", "- 5 V", "1 2 V"] {
            assert_eq!(
                parse_quantity(t, Voltage),
                Err(QuantityError::MalformedNumber {
                    text: t.to_string()
                }),
                "{t}"
            );
        }
    }

    #[test]
    fn error_missing_unit_says_what_to_write() {
        let e = parse_quantity("12", Voltage).unwrap_err();
        assert_eq!(
            e,
            QuantityError::MissingUnit {
                text: "12".into(),
                expected: Voltage
            }
        );
        assert!(e
            .to_string()
            .contains("missing unit in \"12\": expected a voltage such as \"12 V\""));
        assert!(matches!(
            parse_quantity("68", Resistance),
            Err(QuantityError::MissingUnit { .. })
        ));
    }

    #[test]
    fn error_unknown_unit() {
        let e = parse_quantity("12 Vx", Voltage).unwrap_err();
        assert_eq!(
            e,
            QuantityError::UnknownUnit {
                text: "12 Vx".into(),
                unit: "Vx".into(),
                expected: Voltage
            }
        );
        assert!(e.to_string().contains("\"12 V\""));
        assert!(matches!(
            parse_quantity("4k7J", Resistance),
            Err(QuantityError::UnknownUnit { .. })
        ));
        assert!(matches!(
            parse_quantity("12 k", Voltage),
            Err(QuantityError::UnknownUnit { .. })
        ));
    }

    #[test]
    fn error_wrong_dimension_names_both() {
        let e = parse_quantity("12 V", Resistance).unwrap_err();
        assert_eq!(
            e,
            QuantityError::WrongDimension {
                text: "12 V".into(),
                unit: "V".into(),
                found: Voltage,
                expected: Resistance
            }
        );
        let msg = e.to_string();
        assert!(msg.contains("is a voltage") && msg.contains("a resistance was expected"));
        let cases = [
            ("4k7", Voltage, Resistance),
            ("4n7", Resistance, Capacitance),
            ("25 degC", Resistance, Temperature),
            ("5 %", TemperatureCoefficient, Fraction),
            ("1.5 mW/K", ThermalResistance, ThermalConductance),
        ];
        for (t, expected, found) in cases {
            match parse_quantity(t, expected) {
                Err(QuantityError::WrongDimension { found: f, .. }) => assert_eq!(f, found, "{t}"),
                other => panic!("{t}: {other:?}"),
            }
        }
    }

    #[test]
    fn error_out_of_range_when_not_finite() {
        for t in ["1e400 V", "1e99999999999999999999 V"] {
            match parse_quantity(t, Voltage) {
                Err(QuantityError::OutOfRange { reason, .. }) => {
                    assert!(reason.contains("too large"))
                }
                other => panic!("{t}: {other:?}"),
            }
        }
        assert!(matches!(parse_quantity("1e308 V", Voltage), Ok(v) if v == 1e308));
    }

    #[test]
    fn format_engineering_examples() {
        // Spec examples, by hand: 0.0352 A = 35.2 mA; 4700 Ω = 4.70 kΩ.
        assert_eq!(format_engineering(0.0352, "A", 3), "35.2 mA");
        assert_eq!(format_engineering(4700.0, "Ω", 3), "4.70 kΩ");
        assert_eq!(format_engineering(4700.0, "Ω", 2), "4.7 kΩ");
        assert_eq!(format_engineering(47_000.0, "Ω", 1), "50 kΩ");
        assert_eq!(format_engineering(999.96, "V", 3), "1.00 kV");
        assert_eq!(format_engineering(-2.5e-6, "A", 2), "-2.5 µA");
        assert_eq!(format_engineering(12.0, "V", 3), "12.0 V");
        assert_eq!(format_engineering(0.0, "W", 3), "0 W");
        assert_eq!(format_engineering(1e12, "Ω", 2), "1000 GΩ");
        assert_eq!(format_engineering(1e-15, "A", 1), "0.001 pA");
        assert_eq!(format_engineering(1500.0, "", 2), "1.5 k");
        assert_eq!(format_engineering(1.5, "", 2), "1.5");
        // Never printed: the report's guard names the field instead.
        assert_eq!(format_engineering(f64::NAN, "V", 3), "—");
        assert_eq!(format_engineering(f64::INFINITY, "V", 3), "—");
        assert_eq!(format_engineering(f64::NEG_INFINITY, "V", 3), "—");
        assert_eq!(format_engineering(0.0352, "A", 0), "40 mA");
    }

    #[test]
    fn dimension_texts() {
        assert_eq!(Resistance.name(), "resistance");
        assert_eq!(Resistance.to_string(), "resistance");
        assert_eq!(Resistivity.si_unit(), "Ω·m");
        // Every example spelling parses in its own dimension.
        let all = [
            Resistance,
            Voltage,
            Current,
            Power,
            Velocity,
            Temperature,
            TemperatureDifference,
            ThermalConductance,
            ThermalResistance,
            HeatCapacity,
            Fraction,
            TemperatureCoefficient,
            Capacitance,
            Length,
            Time,
            Pressure,
            Resistivity,
        ];
        for d in all {
            for ex in d.examples().split('"').skip(1).step_by(2) {
                assert!(parse_quantity(ex, d).is_ok(), "{d}: {ex}");
            }
        }
    }

    proptest! {
        #[test]
        fn format_then_parse_round_trips(
            mantissa in 1.0f64..10.0,
            exp in -13i32..13,
            negative in any::<bool>(),
            which in 0usize..3,
        ) {
            let sign = if negative { -1.0 } else { 1.0 };
            let value = sign * mantissa * 10f64.powi(exp);
            let (dim, unit) = [(Resistance, "Ω"), (Voltage, "V"), (Current, "A")][which];
            let text = format_engineering(value, unit, 12);
            let back = parse_quantity(&text, dim).map_err(|e| TestCaseError::fail(e.to_string()))?;
            assert_relative_eq!(back, value, max_relative = 1e-9);
        }
    }

    #[test]
    fn power_fractions_as_builders_write_them() {
        // 1/4 W = 0.25 W, 1/8 W = 0.125 W, 1/16 W = 0.0625 W (arithmetic).
        assert_eq!(parse_quantity("1/4 W", Power).unwrap(), 0.25);
        assert_eq!(parse_quantity("1/8W", Power).unwrap(), 0.125);
        assert_eq!(parse_quantity("1/16 W", Power).unwrap(), 0.0625);
        assert_eq!(parse_quantity("1/2 kW", Power).unwrap(), 500.0);
        assert!(parse_quantity("1/0 W", Power).is_err());
        assert!(parse_quantity("1/4 V", Power).is_err());
        // Only powers take fractions.
        assert!(parse_quantity("1/4 V", Voltage).is_err());
    }
}
