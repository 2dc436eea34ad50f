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
    /// `[spread]`.
    pub spread: Option<RawSpread>,
    /// `[compensation]`.
    pub compensation: Option<RawCompensation>,
}

/// `[compensation]`: ambient compensation of the reference.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawCompensation {
    /// `none`, `twin`, `thermistor` or `auto`.
    pub kind: Option<Word>,
    /// The twin's resistance at the nominal ambient, or `auto`.
    pub twin_resistance: Option<Value>,
    /// The twin's resistance tolerance.
    pub twin_tolerance: Option<Value>,
    /// Largest self-heating rise of the twin, as a share of the sensing
    /// element's overheat.
    pub twin_max_rise: Option<Value>,
    /// The thermistor's resistance at 25 °C, or `auto`.
    pub thermistor_r25: Option<Value>,
    /// The thermistor's beta constant.
    pub thermistor_beta: Option<Value>,
    /// Tolerance of the thermistor's R25.
    pub thermistor_tolerance: Option<Value>,
    /// Tolerance of the thermistor's beta.
    pub thermistor_beta_tolerance: Option<Value>,
    /// The thermistor's dissipation constant in still air.
    pub thermistor_dissipation: Option<Value>,
    /// The linearising resistor across the thermistor, or `auto`.
    pub linearising: Option<Value>,
}

/// `[spread]`: the tolerance run's settings.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawSpread {
    /// Model tolerance on the cooling law's airflow term.
    pub cooling: Option<Value>,
    /// `uniform` or `normal`.
    pub distribution: Option<Word>,
    /// Least share of builds the trimmer must bring to target.
    pub min_trimmable: Option<Value>,
    /// Largest share of trimmed builds allowed to false-trip.
    pub max_false_trip: Option<Value>,
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
    /// Decoupling capacitance or `auto` (a key, not a table).
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
    /// How far one unit's output moves in service (line, load and
    /// temperature), after the bench trim has taken out its initial offset.
    pub regulation: Option<Value>,
    /// Dropout voltage.
    pub dropout: Option<Value>,
    /// Quiescent current.
    pub quiescent: Option<Value>,
    /// Thermal resistance junction–ambient.
    pub theta_ja: Option<Value>,
    /// Maximum junction temperature.
    pub max_junction: Option<Value>,
}

/// `[element]` (and each `[[candidate]]` table of a candidates file).
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawElement {
    /// Free text description.
    pub name: Option<Word>,
    /// Label of a `[[candidate]]` (rejected in a design's `[element]`).
    pub label: Option<Word>,
    /// A `[[candidate]]`'s own drive (rejected in a design's `[element]`).
    pub drive: Option<RawDrive>,
    /// A `[[candidate]]`'s own wanted still-air rise, with the design's
    /// `auto` drive (rejected in a design's `[element]`).
    pub overheat_rise: Option<Value>,
    /// A `[[candidate]]`'s own wanted overheat ratio, likewise.
    pub overheat_ratio: Option<Value>,
    /// Material preset (TCR, emissivity, heat capacity, limit in air).
    pub material: Option<Word>,
    /// Lumped heat capacity (optional when it can be derived).
    pub heat_capacity: Option<Value>,
    /// Maximum safe temperature.
    pub max_temperature: Option<Value>,
    /// Tolerance of the element's resistance.
    pub tolerance: Option<Value>,
    /// `[element.resistance]`.
    pub resistance: Option<RawResistance>,
    /// `[element.cooling]`.
    pub cooling: Option<RawCooling>,
    /// `[element.lamp]`: a lamp filament known by its rating.
    pub lamp: Option<RawLamp>,
}

/// One `[T, R]` row of a table, as written.
pub type RawPoint = [Value; 2];

/// `[element.resistance]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawResistance {
    /// Which law.
    pub law: Word,
    /// R0 (or the reference resistance).
    pub r0: Option<Value>,
    /// T0 (or the reference temperature).
    pub t0: Option<Value>,
    /// α.
    pub tcr: Option<Value>,
    /// NTC B constant.
    pub beta: Option<Value>,
    /// Steinhart–Hart a.
    pub a: Option<Value>,
    /// Steinhart–Hart b.
    pub b: Option<Value>,
    /// Steinhart–Hart c.
    pub c: Option<Value>,
    /// `[T, R]` rows: three for a Steinhart–Hart fit, or a table.
    pub points: Option<Spanned<Vec<RawPoint>>>,
    /// Low end of a Steinhart–Hart law's range.
    pub t_min: Option<Value>,
    /// High end of a Steinhart–Hart law's range.
    pub t_max: Option<Value>,
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
    /// King's n (also the data-sheet form's exponent).
    pub n: Option<Value>,
    /// Still-air dissipation constant.
    pub dissipation: Option<Value>,
    /// Dissipation constant at `moving_airflow`.
    pub dissipation_moving: Option<Value>,
    /// Airflow of `dissipation_moving`.
    pub moving_airflow: Option<Value>,
    /// Thermal time constant (data sheet).
    pub time_constant: Option<Value>,
    /// Wire (or coil envelope) diameter.
    pub diameter: Option<Value>,
    /// Wire (or coil envelope) length.
    pub length: Option<Value>,
    /// Coil: the wire's diameter (for its heat capacity).
    pub wire_diameter: Option<Value>,
    /// Coil: the wire's length (for its heat capacity).
    pub wire_length: Option<Value>,
    /// Forced-convection correlation.
    pub forced: Option<Word>,
    /// Natural-convection correlation.
    pub natural: Option<Word>,
    /// Emissivity instead of the material's.
    pub emissivity: Option<Value>,
    /// Conductance to the supports.
    pub supports: Option<Value>,
    /// The airflow range King's constants were calibrated over.
    pub calibrated_range: Option<Spanned<Vec<Value>>>,
    /// King or data-sheet form: the still-air floor, "none", "natural" or
    /// a velocity.
    pub still_air_floor: Option<Value>,
    /// Geometry cooling: how the forced and natural terms are combined.
    pub mixing: Option<Word>,
    /// Geometry cooling: the Churchill–Usagi exponent.
    pub mixing_exponent: Option<Value>,
    /// Geometry cooling, effective-velocity rule: the airflow's direction
    /// relative to the buoyant flow.
    pub flow: Option<Word>,
}

/// `[element.lamp]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawLamp {
    /// Rated voltage.
    pub voltage: Value,
    /// Rated power.
    pub power: Value,
    /// Measured cold resistance.
    pub cold_resistance: Value,
    /// Temperature of the cold measurement.
    pub cold_temperature: Option<Value>,
}

/// A candidates file: `[[candidate]]` tables, each an `[element]` section
/// plus a `label`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawCandidates {
    /// The candidates.
    pub candidate: Vec<RawElement>,
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
    /// Airflow when all is well (fan running): falling trip only.
    pub normal_airflow: Option<Value>,
    /// Airflow always present (room air): rising trip only.
    pub background_airflow: Option<Value>,
    /// The band the trip airflow must stay inside: `["low", "high"]`.
    pub trip_band: Option<Spanned<Vec<Value>>>,
    /// Tolerance of the fixed top resistor.
    pub top_tolerance: Option<Value>,
    /// Tolerance of the trimmer track.
    pub trimmer_tolerance: Option<Value>,
    /// Tolerance of the fixed bottom resistor.
    pub bottom_tolerance: Option<Value>,
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
    /// How long a false alarm after power-on is accepted.
    pub power_on_grace: Option<Value>,
    /// The power-on hold-off capacitor: `auto`, `none` or a capacitance.
    pub power_on_hold_off: Option<Value>,
}

/// `[comparator]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawComparator {
    /// Rail the comparator is supplied from.
    pub rail: Option<Word>,
    /// Input offset voltage.
    pub offset: Option<Value>,
    /// Input offset voltage over the full temperature range.
    pub offset_full_range: Option<Value>,
    /// Input bias current over the full temperature range.
    pub bias_current_full_range: Option<Value>,
    /// Common-mode headroom over the full temperature range.
    pub common_mode_headroom_full_range: Option<Value>,
    /// Output low voltage over the full temperature range.
    pub output_low_full_range: Option<Value>,
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
    pub switches_mains: Option<Spanned<bool>>,
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
    /// Maximum junction temperature (the power rating derates linearly
    /// to zero there from 25 °C).
    pub max_junction: Option<Value>,
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
    /// Smallest fixed-resistor power rating to build with.
    pub resistor_min: Option<Value>,
}
