//! Stage one of reading a design file: plain serde structs that mirror the
//! TOML text, with every value kept beside its byte span so that later
//! checks can point at it. Unknown keys are rejected here.

use serde::Deserialize;
use toml::Spanned;

/// A scalar as written: a number or a string (quantities are strings with
/// units; a bare number in a dimensional field is reported as a missing
/// unit by the validation stage, not as a type error).
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(untagged)]
pub enum Scalar {
    /// A TOML integer or float.
    Number(f64),
    /// A TOML string.
    Text(String),
}

/// A scalar with its span in the source.
pub type Value = Spanned<Scalar>;

/// A string with its span in the source.
pub type Word = Spanned<String>;

/// The whole design file.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawDesign {
    /// `[design]`: title and series.
    pub design: Option<RawMeta>,
    /// `[ambient]`.
    pub ambient: RawAmbient,
    /// `[supply]`.
    pub supply: RawSupply,
    /// `[element]`.
    pub element: RawElement,
    /// `[drive]`.
    pub drive: RawDrive,
    /// `[detector]`.
    pub detector: RawDetector,
    /// `[comparator]`.
    pub comparator: Option<RawComparator>,
    /// `[output]`.
    pub output: Option<RawOutput>,
    /// `[ratings]`.
    pub ratings: Option<RawRatings>,
}

/// `[design]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawMeta {
    /// Free text title.
    pub title: Option<Word>,
    /// E-series for sized resistors.
    pub e_series: Option<Word>,
}

/// `[ambient]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawAmbient {
    /// Nominal ambient temperature.
    pub nominal: Value,
    /// Lowest ambient in service.
    pub min: Option<Value>,
    /// Highest ambient in service.
    pub max: Option<Value>,
    /// Absolute air pressure.
    pub pressure: Option<Value>,
    /// Altitude (standard atmosphere) instead of a pressure.
    pub altitude: Option<Value>,
}

/// `[supply]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawSupply {
    /// Nominal input voltage.
    pub input: Value,
    /// Lowest input voltage.
    pub input_min: Option<Value>,
    /// Highest input voltage.
    pub input_max: Option<Value>,
    /// `[supply.regulator]`.
    pub regulator: Option<RawRegulator>,
    /// `[supply.decoupling]`.
    pub decoupling: Option<Value>,
}

/// `[supply.regulator]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawRegulator {
    /// Output voltage.
    pub output: Value,
    /// Output tolerance.
    pub tolerance: Option<Value>,
    /// Dropout voltage.
    pub dropout: Option<Value>,
    /// Quiescent current.
    pub quiescent: Option<Value>,
    /// Thermal resistance junction–ambient.
    pub theta_ja: Option<Value>,
    /// Maximum junction temperature.
    pub max_junction: Option<Value>,
}

/// `[element]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawElement {
    /// Free text description.
    pub name: Option<Word>,
    /// Lumped heat capacity.
    pub heat_capacity: Value,
    /// Maximum safe temperature.
    pub max_temperature: Option<Value>,
    /// Tolerance of the element's resistance.
    pub tolerance: Option<Value>,
    /// `[element.resistance]`.
    pub resistance: RawResistance,
    /// `[element.cooling]`.
    pub cooling: RawCooling,
}

/// `[element.resistance]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawResistance {
    /// Which law.
    pub law: Word,
    /// R0.
    pub r0: Option<Value>,
    /// T0.
    pub t0: Option<Value>,
    /// α.
    pub tcr: Option<Value>,
}

/// `[element.cooling]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawCooling {
    /// Which law.
    pub law: Word,
    /// King's A.
    pub a: Option<Value>,
    /// King's B.
    pub b: Option<Value>,
    /// King's n.
    pub n: Option<Value>,
}

/// `[drive]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawDrive {
    /// `series-resistor` or `constant-current`.
    pub kind: Word,
    /// Rail feeding the series resistor.
    pub rail: Option<Word>,
    /// Series resistance or `auto`.
    pub series: Option<Value>,
    /// Drive current or `auto`.
    pub current: Option<Value>,
    /// Wanted still-air temperature rise when sizing.
    pub overheat_rise: Option<Value>,
    /// Wanted still-air overheat ratio when sizing.
    pub overheat_ratio: Option<Value>,
    /// Tolerance of the series resistor or current.
    pub tolerance: Option<Value>,
}

/// `[detector]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawDetector {
    /// Target trip airflow.
    pub trip_airflow: Value,
    /// `rising` or `falling`.
    pub trip_on: Word,
    /// Rail the reference divider hangs from.
    pub reference_rail: Option<Word>,
    /// Fixed top resistor or `auto`.
    pub top: Option<Value>,
    /// Trimmer or `auto`.
    pub trimmer: Option<Value>,
    /// Fixed bottom resistor or `auto`.
    pub bottom: Option<Value>,
    /// Trimmer setting to analyse fixed values at (fraction of travel).
    pub trimmer_position: Option<Value>,
    /// Wanted divider current when sizing.
    pub divider_current: Option<Value>,
    /// Wanted hysteresis: an airflow or a voltage, or `none`.
    pub hysteresis: Option<Value>,
    /// Feedback resistor or `auto`.
    pub feedback: Option<Value>,
    /// Series input resistor or `auto`.
    pub input_resistor: Option<Value>,
}

/// `[comparator]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawComparator {
    /// Rail the comparator is supplied from.
    pub rail: Option<Word>,
    /// Input offset voltage.
    pub offset: Option<Value>,
    /// Input bias current.
    pub bias_current: Option<Value>,
    /// Lowest common-mode input above the negative rail.
    pub common_mode_low: Option<Value>,
    /// Headroom of the common-mode range below the positive rail.
    pub common_mode_headroom: Option<Value>,
    /// Output sink current limit.
    pub sink_max: Option<Value>,
    /// Output low voltage.
    pub output_low: Option<Value>,
    /// Lowest supply.
    pub supply_min: Option<Value>,
    /// Highest supply.
    pub supply_max: Option<Value>,
    /// Supply current.
    pub supply_current: Option<Value>,
    /// Output pull-up resistor or `auto`.
    pub pullup: Option<Value>,
}

/// `[output]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawOutput {
    /// `auto`, `direct`, `npn-low-side` or `pnp-high-side`.
    pub stage: Option<Word>,
    /// `led`, `buzzer` or `relay`.
    pub load: Word,
    /// Rail the load is fed from.
    pub rail: Option<Word>,
    /// LED forward voltage.
    pub led_forward: Option<Value>,
    /// Wanted LED current.
    pub led_current: Option<Value>,
    /// Buzzer current at its rated voltage.
    pub buzzer_current: Option<Value>,
    /// Relay coil resistance.
    pub coil_resistance: Option<Value>,
    /// Relay coil rated voltage.
    pub coil_voltage: Option<Value>,
    /// Relay contact rating (text echoed in the report).
    pub contact_rating: Option<Word>,
    /// Whether the relay contacts switch mains.
    pub switches_mains: Option<bool>,
    /// Forced current gain for a transistor stage.
    pub forced_gain: Option<Value>,
    /// Transistor ratings.
    pub transistor: Option<RawTransistor>,
    /// Flyback diode ratings.
    pub diode: Option<RawDiode>,
}

/// `[output.transistor]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawTransistor {
    /// Vce max.
    pub vce_max: Option<Value>,
    /// Ic max.
    pub ic_max: Option<Value>,
    /// P max.
    pub power_max: Option<Value>,
    /// hFE min.
    pub hfe_min: Option<Value>,
    /// Vce(sat).
    pub vce_sat: Option<Value>,
    /// Vbe(on).
    pub vbe_on: Option<Value>,
}

/// `[output.diode]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawDiode {
    /// Repetitive reverse voltage rating.
    pub reverse_max: Option<Value>,
    /// Average forward current rating.
    pub forward_max: Option<Value>,
}

/// `[ratings]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawRatings {
    /// Fraction of a resistor's rating it may use.
    pub resistor_derating: Option<Value>,
    /// Power rating of the trimmer.
    pub trimmer_power: Option<Value>,
}
