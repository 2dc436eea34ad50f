//! The validated design model. Its types hold only valid values, in SI
//! units, with every default that was applied recorded in `assumptions` so
//! the report can echo it. `build.rs` fills it from the raw file.

use crate::element::Element;
use crate::eseries::ESeries;

/// A value the tool may size (`"auto"`) or one the file fixes.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Sizable {
    /// Let draftwire size it.
    Auto,
    /// Fixed by the design file (SI).
    Fixed(f64),
}

/// A supply rail by name.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rail {
    /// The unregulated input.
    Input,
    /// The linear regulator's output.
    Regulated,
}

impl Rail {
    /// Name as written in the file.
    pub fn name(self) -> &'static str {
        match self {
            Rail::Input => "input",
            Rail::Regulated => "regulated",
        }
    }
}

/// Which way the airflow must move to trip the detector.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TripDirection {
    /// Trip when airflow rises past the trip point (draught detector).
    Rising,
    /// Trip when airflow falls below the trip point (loss-of-flow alarm).
    Falling,
}

impl TripDirection {
    /// Name as written in the file.
    pub fn name(self) -> &'static str {
        match self {
            TripDirection::Rising => "rising",
            TripDirection::Falling => "falling",
        }
    }
}

/// The wanted still-air overheat when the drive is sized.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum OverheatTarget {
    /// Temperature rise over ambient, K.
    Rise(f64),
    /// Overheat ratio `(R_hot − R_amb)/R_amb`.
    Ratio(f64),
}

/// The drive as designed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum DriveSpec {
    /// A rail through a series resistor.
    SeriesResistor {
        /// Which rail.
        rail: Rail,
        /// Series resistance, ohm, or auto.
        series_ohm: Sizable,
    },
    /// A constant current.
    ConstantCurrent {
        /// Current, A, or auto.
        current_a: Sizable,
    },
}

/// A drive as read from a drive table: kind and value, the wanted
/// overheat when it is sized, and its tolerance.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DriveChoice {
    /// The drive.
    pub drive: DriveSpec,
    /// Wanted still-air overheat when the drive is `auto`.
    pub overheat: Option<OverheatTarget>,
    /// Tolerance of the series resistor or current source (fraction).
    pub tolerance: f64,
}

/// Wanted hysteresis.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum HysteresisSpec {
    /// No hysteresis network.
    None,
    /// A band in airflow, m/s.
    Airflow(f64),
    /// A band in volts at the sense node.
    Volts(f64),
}

/// Ambient conditions.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Ambient {
    /// Nominal ambient, K.
    pub nominal_k: f64,
    /// Lowest ambient in service, K.
    pub min_k: f64,
    /// Highest ambient in service, K.
    pub max_k: f64,
    /// Air pressure, Pa.
    pub pressure_pa: f64,
}

/// A linear regulator as given (datasheet figures).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RegulatorSpec {
    /// Output voltage, V.
    pub output_v: f64,
    /// Output tolerance over line, load and temperature (fraction): the
    /// furthest any unit's output lies from nominal.
    pub tolerance: f64,
    /// How far one unit's output moves in service (fraction; at most the
    /// tolerance): what is left once the bench trim has taken out where its
    /// own output sits.
    pub regulation: f64,
    /// Dropout voltage, V.
    pub dropout_v: f64,
    /// Quiescent current, A.
    pub quiescent_a: f64,
    /// Junction–ambient thermal resistance, K/W.
    pub theta_ja_k_per_w: f64,
    /// Maximum junction temperature, K.
    pub max_junction_k: f64,
}

/// The supply.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Supply {
    /// Nominal input, V.
    pub input_v: f64,
    /// Lowest input, V.
    pub input_min_v: f64,
    /// Highest input, V.
    pub input_max_v: f64,
    /// Optional regulator.
    pub regulator: Option<RegulatorSpec>,
    /// Decoupling capacitance, F, or auto.
    pub decoupling_f: Sizable,
}

impl Supply {
    /// Nominal voltage of a rail.
    pub fn rail_v(&self, rail: Rail) -> f64 {
        match (rail, self.regulator) {
            (Rail::Regulated, Some(r)) => r.output_v,
            _ => self.input_v,
        }
    }
    /// Lowest and highest voltage of a rail over the input range and the
    /// regulator's tolerance.
    pub fn rail_range_v(&self, rail: Rail) -> (f64, f64) {
        match (rail, self.regulator) {
            (Rail::Regulated, Some(r)) => (
                r.output_v * (1.0 - r.tolerance),
                r.output_v * (1.0 + r.tolerance),
            ),
            _ => (self.input_min_v, self.input_max_v),
        }
    }
    /// Lowest and highest voltage of a rail in service around a unit whose
    /// regulator sits at its nominal output: the input range, or the
    /// regulator's regulation band.
    pub fn rail_in_service_v(&self, rail: Rail) -> (f64, f64) {
        match (rail, self.regulator) {
            (Rail::Regulated, Some(r)) => (
                r.output_v * (1.0 - r.regulation),
                r.output_v * (1.0 + r.regulation),
            ),
            _ => (self.input_min_v, self.input_max_v),
        }
    }
    /// The part of the regulator's tolerance that one unit keeps for
    /// life (its initial offset, trimmed out on the bench), fraction.
    pub fn regulator_offset_tolerance(&self) -> f64 {
        self.regulator
            .map_or(0.0, |r| (r.tolerance - r.regulation).max(0.0))
    }
}

/// The detector.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Detector {
    /// Target trip airflow, m/s.
    pub trip_airflow_m_per_s: f64,
    /// Airflow when all is well, m/s: the output must stay idle there. For
    /// a rising trip this is the background airflow.
    pub normal_airflow_m_per_s: f64,
    /// The band the trip airflow must stay inside at every condition, m/s
    /// (low, high).
    pub trip_band_m_per_s: (f64, f64),
    /// Airflow that is always present (rising trip: the detector must never
    /// trip at or below it), m/s.
    pub background_airflow_m_per_s: f64,
    /// Tolerances of the divider's parts (fractions).
    pub divider_tolerances: DividerTolerances,
    /// Trip direction.
    pub trip_on: TripDirection,
    /// Rail of the reference divider.
    pub reference_rail: Rail,
    /// Fixed top resistor.
    pub top_ohm: Sizable,
    /// Trimmer end-to-end resistance.
    pub trimmer_ohm: Sizable,
    /// Fixed bottom resistor.
    pub bottom_ohm: Sizable,
    /// Trimmer position to analyse fixed values at (fraction of travel from
    /// the bottom end); `None` means "find the position that hits target".
    pub trimmer_position: Option<f64>,
    /// Wanted divider current when sizing, A.
    pub divider_current_a: Option<f64>,
    /// How long a false alarm after power-on is accepted, s.
    pub power_on_grace_s: f64,
    /// The power-on hold-off capacitor.
    pub power_on_hold_off: HoldOffSpec,
    /// Wanted hysteresis.
    pub hysteresis: HysteresisSpec,
    /// Feedback resistor.
    pub feedback_ohm: Sizable,
    /// Series input resistor.
    pub input_resistor_ohm: Sizable,
}

/// Tolerances of the reference divider's parts, fractions.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DividerTolerances {
    /// Fixed top resistor.
    pub top: f64,
    /// Trimmer track (end-to-end resistance).
    pub trimmer: f64,
    /// Fixed bottom resistor.
    pub bottom: f64,
}

/// The comparator figures that change over temperature.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ComparatorLimits {
    /// Input offset voltage (magnitude), V.
    pub offset_v: f64,
    /// Input bias current (magnitude), A.
    pub bias_a: f64,
    /// Common-mode headroom below the positive rail, V.
    pub common_mode_headroom_v: f64,
    /// Output low voltage at the sink limit, V.
    pub output_low_v: f64,
}

/// Which set of comparator limits the checks use.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LimitsBasis {
    /// The 25 °C limits: the ambient range stays within 20–30 °C.
    At25C,
    /// The full-temperature-range limits: the ambient range leaves 20–30 °C.
    FullRange,
}

impl LimitsBasis {
    /// In words, for the report.
    pub fn describe(self) -> &'static str {
        match self {
            LimitsBasis::At25C => "25 °C limits (the ambient range stays within 20–30 °C)",
            LimitsBasis::FullRange => {
                "full-temperature-range limits (the ambient range leaves 20–30 °C)"
            }
        }
    }
}

/// Comparator figures (datasheet or typical).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ComparatorSpec {
    /// Supply rail.
    pub rail: Rail,
    /// Input offset voltage (magnitude), V.
    pub offset_v: f64,
    /// Input bias current (magnitude), A.
    pub bias_a: f64,
    /// Lowest common-mode input above ground, V.
    pub common_mode_low_v: f64,
    /// Common-mode headroom below the positive rail, V.
    pub common_mode_headroom_v: f64,
    /// Output sink current limit, A.
    pub sink_max_a: f64,
    /// Output low voltage at the sink limit, V.
    pub output_low_v: f64,
    /// Supply range, V.
    pub supply_min_v: f64,
    /// Supply range, V.
    pub supply_max_v: f64,
    /// Supply current, A.
    pub supply_current_a: f64,
    /// Output pull-up resistor.
    pub pullup_ohm: Sizable,
    /// The 25 °C limits as given.
    pub at_25c: ComparatorLimits,
    /// The full-temperature-range limits as given.
    pub full_range: ComparatorLimits,
    /// Which of the two the fields above hold.
    pub basis: LimitsBasis,
}

/// The output stage kind, as resolved while reading the file (`"auto"`
/// has already been turned into one of these).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StageKind {
    /// The comparator output drives the load directly.
    Direct,
    /// NPN low-side switch.
    NpnLowSide,
    /// PNP high-side switch.
    PnpHighSide,
}

/// The load the output drives.
#[derive(Debug, Clone, PartialEq)]
pub enum Load {
    /// An LED with forward voltage and wanted current.
    Led {
        /// Forward voltage, V.
        forward_v: f64,
        /// Wanted current, A.
        current_a: f64,
    },
    /// A buzzer drawing a current at the rail voltage.
    Buzzer {
        /// Current, A.
        current_a: f64,
    },
    /// A relay coil.
    Relay {
        /// Coil rated voltage, V.
        coil_v: f64,
        /// Coil resistance, ohm.
        coil_ohm: f64,
        /// Contact rating as written.
        contact_rating: Option<String>,
        /// Whether the contacts switch mains.
        switches_mains: bool,
    },
}

/// Transistor figures.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TransistorSpec {
    /// Vce max, V.
    pub vce_max_v: f64,
    /// Ic max, A.
    pub ic_max_a: f64,
    /// P max, W.
    pub power_max_w: f64,
    /// hFE min.
    pub hfe_min: f64,
    /// Vce(sat), V.
    pub vce_sat_v: f64,
    /// Vbe(on), V.
    pub vbe_on_v: f64,
    /// Maximum junction temperature, K: `power_max_w` holds at 25 °C and
    /// derates linearly to zero here.
    pub max_junction_k: f64,
}

impl TransistorSpec {
    /// Allowed dissipation at ambient `ambient_k`: the data-sheet linear
    /// derating above 25 °C, `P(Ta) = P_max·(Tj,max − Ta)/(Tj,max − 25 °C)`
    /// (small-signal transistor data sheets give it as mW/°C above 25 °C).
    pub fn allowed_power_w(&self, ambient_k: f64) -> f64 {
        let t25 = 298.15;
        if ambient_k <= t25 {
            self.power_max_w
        } else {
            (self.power_max_w * (self.max_junction_k - ambient_k) / (self.max_junction_k - t25))
                .max(0.0)
        }
    }
}

/// Diode figures.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DiodeSpec {
    /// Reverse voltage rating, V.
    pub reverse_max_v: f64,
    /// Forward current rating, A.
    pub forward_max_a: f64,
}

/// The output stage as designed.
#[derive(Debug, Clone, PartialEq)]
pub struct OutputSpec {
    /// Stage kind.
    pub stage: StageKind,
    /// Load.
    pub load: Load,
    /// Rail feeding the load.
    pub rail: Rail,
    /// Forced current gain.
    pub forced_gain: f64,
    /// Transistor figures.
    pub transistor: TransistorSpec,
    /// Flyback diode figures.
    pub diode: DiodeSpec,
}

/// Derating policy.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RatingsSpec {
    /// Fraction of a resistor's rated power it may dissipate.
    pub resistor_derating: f64,
    /// Trimmer rated power, W.
    pub trimmer_power_w: f64,
    /// Smallest fixed-resistor rating to choose (e.g. 1/4 W for
    /// through-hole parts), W; `None`: the smallest standard rating.
    pub resistor_min_w: Option<f64>,
}

/// How a tolerance is drawn in the Monte Carlo of `spread`.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SpreadDistribution {
    /// Uniform over ± the tolerance.
    Uniform,
    /// Normal with the tolerance as 3σ, truncated at ± the tolerance.
    Normal,
}

impl SpreadDistribution {
    /// Name as written in the file.
    pub fn name(self) -> &'static str {
        match self {
            SpreadDistribution::Uniform => "uniform",
            SpreadDistribution::Normal => "normal",
        }
    }
}

/// The power-on hold-off capacitor on the reference node
/// (`[detector] power_on_hold_off`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum HoldOffSpec {
    /// Sized when a power-on false alarm exceeds the grace.
    Auto,
    /// None fitted, whatever happens at power-on.
    None,
    /// This capacitance, F (its end, rail or ground, is chosen).
    Fixed(f64),
}

/// Which ambient compensation the reference gets (`[compensation] kind`).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CompensationKind {
    /// A fixed-ratio reference divider: the trip point follows ambient.
    None,
    /// An unheated twin of the sensing element in the reference divider's
    /// bottom leg: a Wheatstone bridge.
    Twin,
    /// An NTC thermistor with a linearising resistor in one leg of the
    /// reference divider.
    Thermistor,
    /// Whichever of the three holds the trip band at every condition with
    /// the fewest parts.
    Auto,
}

impl CompensationKind {
    /// The name used in the design file and the report.
    pub fn name(self) -> &'static str {
        match self {
            CompensationKind::None => "none",
            CompensationKind::Twin => "twin",
            CompensationKind::Thermistor => "thermistor",
            CompensationKind::Auto => "auto",
        }
    }
}

/// The unheated twin element's settings.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TwinSpec {
    /// The twin's resistance at the nominal ambient, ohm (`Auto`: sized so
    /// its self-heating stays within half its limit).
    pub resistance_ohm: Sizable,
    /// Its resistance tolerance (fraction), independent of the sensing
    /// element's: the mismatch between the two is an error source.
    pub tolerance: f64,
    /// Largest self-heating rise, as a share of the sensing element's
    /// overheat at the trip airflow.
    pub max_rise_share: f64,
}

/// The compensating thermistor's settings.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ThermistorSpec {
    /// Resistance at 25 °C, ohm.
    pub r25_ohm: Sizable,
    /// Beta constant, K.
    pub beta_k: f64,
    /// R25 tolerance (fraction).
    pub r25_tolerance: f64,
    /// Beta tolerance (fraction).
    pub beta_tolerance: f64,
    /// Dissipation constant in still air, W/K.
    pub dissipation_w_per_k: f64,
    /// The linearising resistor across it, ohm.
    pub linearising_ohm: Sizable,
}

/// `[compensation]`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CompensationSpec {
    /// Which variant.
    pub kind: CompensationKind,
    /// The twin's settings (used when the kind is `Twin` or `Auto`).
    pub twin: TwinSpec,
    /// The thermistor's settings (used when the kind is `Thermistor` or
    /// `Auto`).
    pub thermistor: ThermistorSpec,
}

/// The tolerance run's settings (`[spread]`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SpreadSpec {
    /// Model tolerance on the cooling law's airflow term (fraction; 0 =
    /// none).
    pub cooling_tolerance: f64,
    /// Distribution of every tolerance.
    pub distribution: SpreadDistribution,
    /// Least share of builds the trimmer must bring to target.
    pub min_trimmable: f64,
    /// Largest share of trimmed builds allowed to false-trip.
    pub max_false_trip: f64,
}

/// Defaults of `[spread]` (draftwire's choices, no source): no cooling
/// tolerance, uniform, at least 99 % trimmable, at most 1 % false trips.
pub const SPREAD_DEFAULTS: SpreadSpec = SpreadSpec {
    cooling_tolerance: 0.0,
    distribution: SpreadDistribution::Uniform,
    min_trimmable: 0.99,
    max_false_trip: 0.01,
};

/// A validated design.
#[derive(Debug, Clone, PartialEq)]
pub struct Design {
    /// Title.
    pub title: String,
    /// The name of the design file as given to the reader.
    pub design_file: String,
    /// The element's free-text name, when the file gives one.
    pub element_name: Option<String>,
    /// E-series for sized resistors.
    pub e_series: ESeries,
    /// Ambient.
    pub ambient: Ambient,
    /// Supply.
    pub supply: Supply,
    /// The element.
    pub element: Element,
    /// Element resistance tolerance (fraction).
    pub element_tolerance: f64,
    /// Drive.
    pub drive: DriveSpec,
    /// Drive tolerance (series resistor or current source), fraction.
    pub drive_tolerance: f64,
    /// Wanted overheat when the drive is sized.
    pub overheat: Option<OverheatTarget>,
    /// Detector.
    pub detector: Detector,
    /// Comparator.
    pub comparator: ComparatorSpec,
    /// Output stage, when the file has one.
    pub output: Option<OutputSpec>,
    /// Derating policy.
    pub ratings: RatingsSpec,
    /// The tolerance run's settings.
    pub spread: SpreadSpec,
    /// Ambient compensation of the reference.
    pub compensation: CompensationSpec,
    /// Defaults that were applied, in words, for the report.
    pub assumptions: Vec<String>,
}
