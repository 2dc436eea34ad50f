//! The sizing report: plain data, in SI-derived units named in every field,
//! ready for the renderers (text, JSON, CSV).

use serde::Serialize;

/// One solved operating point as reported.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct OperatingPointRow {
    /// What this point is ("still air", "trip", …).
    pub label: String,
    /// Airflow, m/s.
    pub airflow_m_per_s: f64,
    /// Ambient, °C.
    pub ambient_c: f64,
    /// Element temperature, °C.
    pub element_temperature_c: f64,
    /// Element resistance, ohm.
    pub element_resistance_ohm: f64,
    /// Element current, A.
    pub element_current_a: f64,
    /// Element power, W.
    pub element_power_w: f64,
    /// Sense voltage (across the element), V.
    pub sense_voltage_v: f64,
    /// Overheat ratio `(R − R_amb)/R_amb`.
    pub overheat_ratio: f64,
    /// Lumped thermal time constant, s.
    pub time_constant_s: f64,
}

/// The trip point.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct TripSummary {
    /// Trip direction: "rising" or "falling".
    pub direction: String,
    /// Target trip airflow, m/s.
    pub target_airflow_m_per_s: f64,
    /// The band the trip airflow must stay inside at every condition, m/s.
    pub band_m_per_s: [f64; 2],
    /// Airflow always present (rising trip), m/s.
    pub background_airflow_m_per_s: f64,
    /// Airflow when all is well (falling trip: the running airflow; rising:
    /// the background), m/s.
    pub normal_airflow_m_per_s: f64,
    /// Trip airflow with the reported values and trimmer setting, m/s (null
    /// when it never switches at nominal conditions).
    pub airflow_m_per_s: Option<f64>,
    /// Airflow at which the output releases again (hysteresis), m/s.
    pub release_airflow_m_per_s: Option<f64>,
    /// Reference voltage at the comparator input for the trip, V.
    pub reference_voltage_v: f64,
    /// Sense voltage at the trip airflow, V.
    pub sense_voltage_v: f64,
    /// Sense voltage at the release airflow, V.
    pub release_sense_voltage_v: f64,
    /// dV/dU at the trip airflow, V per m/s.
    pub sensitivity_v_per_m_per_s: f64,
    /// Trimmer setting, % of travel from its grounded end.
    pub trimmer_position_percent: f64,
    /// Trip airflow with the trimmer at its grounded end, m/s (null when
    /// the sense voltage never reaches that level).
    pub airflow_at_trimmer_bottom_m_per_s: Option<f64>,
    /// Trip airflow with the trimmer at its top end, m/s.
    pub airflow_at_trimmer_top_m_per_s: Option<f64>,
    /// What the detector does with the trimmer at its grounded end, in words
    /// ("trips at 0.120 m/s", "always tripped", "never trips").
    pub trimmer_bottom_state: String,
    /// The same with the trimmer at its top end.
    pub trimmer_top_state: String,
    /// How far one percent of trimmer travel moves the trip point, m/s.
    pub airflow_per_percent_travel_m_per_s: f64,
    /// Trip-airflow uncertainty from the comparator's offset, ± m/s
    /// (offset / sensitivity); `null` where the sense voltage does not move
    /// with airflow at the trip point (no sensitivity to divide by).
    pub offset_uncertainty_m_per_s: Option<f64>,
    /// Which signal goes to the non-inverting input.
    pub non_inverting_input: String,
    /// Which signal goes to the inverting input.
    pub inverting_input: String,
    /// Where the hysteresis feedback goes and why.
    pub hysteresis_note: String,
    /// Geometry cooling: the nominal trip airflow of the built circuit under
    /// every rule for combining forced and natural convection (absent for
    /// King's law and the data-sheet form, whose constants are the model).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub model_spread_m_per_s: Option<ModelSpread>,
    /// A wire whose supports follow the fin model: their share of the loss
    /// and the cold length, in still air and at the trip airflow (nominal
    /// ambient).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub support_loss: Option<SupportLoss>,
}

/// The supports' share of the element's loss (fin model).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SupportLoss {
    /// Share of the loss conducted into the supports in still air, 0 … 1.
    pub share_still_air: f64,
    /// Share at the trip airflow, 0 … 1.
    pub share_at_trip: f64,
    /// Cold length √(k_w·d/(4h)) in still air, mm.
    pub cold_length_still_air_mm: f64,
    /// Cold length at the trip airflow, mm.
    pub cold_length_at_trip_mm: f64,
}

/// The trip airflow under every mixing rule of the convection model.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct ModelSpread {
    /// Smallest trip airflow over the rules, m/s.
    pub min: f64,
    /// Largest, m/s.
    pub max: f64,
    /// The rule the design uses.
    pub chosen: String,
    /// Each rule's trip airflow, m/s (`null` where the output never
    /// switches under that rule).
    pub by_rule: std::collections::BTreeMap<String, Option<f64>>,
}

/// One line of the bill of values.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct ValueRow {
    /// Designator: the trade's class letters numbered along the signal
    /// path (docs/cli.md, Designators).
    pub designator: String,
    /// What the part does, in a few words.
    pub function: String,
    /// Generic part class.
    pub part: String,
    /// Chosen value in ohm, for resistors and trimmers.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub value_ohm: Option<f64>,
    /// Chosen value in farad, for capacitors.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub value_f: Option<f64>,
    /// Chosen value in ampere, for a current source.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub value_a: Option<f64>,
    /// Chosen value in volt (ratings of diodes, capacitors).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub value_v: Option<f64>,
    /// The exact computed value before snapping, same unit as the value.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub exact: Option<f64>,
    /// E-series or standard list the value was snapped to.
    pub e_series: String,
    /// The value as printed (RKM code or with unit).
    pub text: String,
    /// Power rating chosen, W, where one applies.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rating_w: Option<f64>,
    /// Worst-case dissipation, W, where one applies.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub dissipation_w: Option<f64>,
    /// Rating in words (voltage, current, …).
    pub rating: String,
    /// Why this part and value.
    pub reason: String,
}

impl ValueRow {
    /// This row with every number rounded to 12 significant digits (no
    /// `0.30000000000000004` where 0.3 is meant; a chosen E-series value is
    /// exact to that precision).
    pub fn cleaned(mut self) -> Self {
        for x in [
            &mut self.value_ohm,
            &mut self.value_f,
            &mut self.value_a,
            &mut self.value_v,
            &mut self.exact,
            &mut self.rating_w,
            &mut self.dissipation_w,
        ] {
            *x = x.map(clean);
        }
        self
    }

    /// A fixed resistor's line of the bill: its value in ohm, RKM text
    /// (IEC 60062), the series it was taken from and the reason.
    pub fn resistor(
        designator: &str,
        value: f64,
        exact: Option<f64>,
        series: &str,
        reason: String,
    ) -> Self {
        Self {
            designator: designator.into(),
            part: "fixed resistor".into(),
            value_ohm: Some(value),
            exact,
            e_series: series.into(),
            text: crate::eseries::format_rkm(value),
            reason,
            ..Self::default()
        }
    }
}

/// A check that passes or fails, judged at its worst condition.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Check {
    /// Stable kebab-case name (documented in docs/cli.md).
    pub id: String,
    /// Short name in words.
    pub name: String,
    /// Whether it passed.
    pub passed: bool,
    /// The worst value found, in `unit` (null when there is none).
    pub value: Option<f64>,
    /// The limit it is held against, in `unit`.
    pub limit: Option<f64>,
    /// How far inside the limit the worst value stays, in `unit` (negative
    /// when the check fails).
    pub margin: Option<f64>,
    /// Unit of value, limit and margin.
    pub unit: String,
    /// The combination of conditions where the value is worst.
    pub condition: String,
    /// What was compared, in words.
    pub detail: String,
}

/// A number rounded to 12 significant digits, so that float noise
/// (`850.0000000000001` for 1123.15 K − 273.15) does not reach a script;
/// the verdict is taken before rounding.
fn clean(x: f64) -> f64 {
    format!("{x:.11e}").parse().unwrap_or(x)
}

impl Check {
    fn base(id: &str, name: &str, passed: bool) -> Self {
        Self {
            id: id.into(),
            name: name.into(),
            passed,
            value: None,
            limit: None,
            margin: None,
            unit: String::new(),
            condition: String::new(),
            detail: String::new(),
        }
    }
    /// A check without a number: passed or not.
    pub fn judged(id: &str, name: &str, passed: bool) -> Self {
        Self::base(id, name, passed)
    }
    /// Passes when `value ≤ limit`; margin = limit − value. A value that
    /// is not finite fails and is reported as null.
    pub fn at_most(id: &str, name: &str, value: f64, limit: f64, unit: &str) -> Self {
        Self::measured(id, name, value, limit, limit - value, unit)
    }
    /// Passes when `value ≥ limit`; margin = value − limit.
    pub fn at_least(id: &str, name: &str, value: f64, limit: f64, unit: &str) -> Self {
        Self::measured(id, name, value, limit, value - limit, unit)
    }
    fn measured(id: &str, name: &str, value: f64, limit: f64, margin: f64, unit: &str) -> Self {
        let finite = value.is_finite() && limit.is_finite() && margin.is_finite();
        Self {
            value: value.is_finite().then_some(clean(value)),
            limit: limit.is_finite().then_some(clean(limit)),
            margin: margin.is_finite().then_some(clean(margin)),
            unit: unit.into(),
            ..Self::base(id, name, finite && margin >= 0.0)
        }
    }
    /// Set the numbers of a judged check (pass/fail stays as judged).
    pub fn numbers(mut self, value: Option<f64>, limit: Option<f64>, unit: &str) -> Self {
        self.value = value.filter(|v| v.is_finite()).map(clean);
        self.limit = limit.filter(|v| v.is_finite()).map(clean);
        self.margin = match (self.value, self.limit) {
            (Some(v), Some(l)) => Some(clean(l - v)),
            _ => None,
        };
        self.unit = unit.into();
        self
    }
    /// Override the verdict (for a check that holds its limit with an
    /// extra condition, e.g. a stated design margin).
    pub fn passed_if(mut self, passed: bool) -> Self {
        self.passed = self.passed && passed;
        self
    }
    /// Where the value is worst.
    pub fn at(mut self, condition: impl Into<String>) -> Self {
        self.condition = condition.into();
        self
    }
    /// What was compared.
    pub fn detail(mut self, detail: impl Into<String>) -> Self {
        self.detail = detail.into();
        self
    }
}

/// Trip-point drift across ambient and supply.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct DriftRow {
    /// Condition, e.g. "ambient 5 °C".
    pub condition: String,
    /// Ambient, °C.
    pub ambient_c: f64,
    /// Rail feeding the element, V.
    pub element_rail_v: f64,
    /// Rail feeding the reference, V.
    pub reference_rail_v: f64,
    /// Which build (part tolerance corner) this row is for.
    pub corner: String,
    /// Comparator offset drift applied, V.
    pub offset_v: f64,
    /// Trip airflow there, m/s (null when the unit does not trip at any airflow).
    pub trip_airflow_m_per_s: Option<f64>,
    /// Release airflow there, m/s (null when it never releases or never trips).
    pub release_airflow_m_per_s: Option<f64>,
    /// Shift from the nominal trip airflow, m/s.
    pub shift_m_per_s: Option<f64>,
    /// With ambient compensation: where the same design without it (a
    /// fixed-ratio divider sized for the same target) trips at this
    /// condition, m/s (null without compensation, or where it never
    /// switches).
    pub uncompensated_trip_airflow_m_per_s: Option<f64>,
    /// With ambient compensation: the uncompensated design's trip at this
    /// condition in words (null without compensation).
    pub uncompensated_note: Option<String>,
    /// Whether the output is tripped in still air.
    pub tripped_in_still_air: bool,
    /// What happens, in words.
    pub note: String,
    /// A what-if row for the ratiometric comparison, not a condition the
    /// design meets in service (left out of the drift checks).
    pub comparison_only: bool,
}

/// Ambient compensation: which, why, and what it buys.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct CompensationSection {
    /// `none`, `twin` or `thermistor`.
    pub kind: String,
    /// Why this kind, in words (what `auto` tried).
    pub why: String,
    /// Largest minus smallest trip airflow of the nominal build over every
    /// ambient and supply condition, m/s (null where some condition never
    /// switches).
    pub drift_span_m_per_s: Option<f64>,
    /// The same for the design without compensation, m/s (null where some
    /// condition never switches or it cannot be sized).
    pub uncompensated_drift_span_m_per_s: Option<f64>,
    /// Trip airflow's slope in ambient at the nominal point, m/s per K
    /// (central difference, rails nominal).
    pub ambient_slope_m_per_s_per_k: Option<f64>,
    /// The same without compensation, m/s per K.
    pub uncompensated_ambient_slope_m_per_s_per_k: Option<f64>,
    /// The compensating parts' designators in the bill.
    pub parts: Vec<String>,
    /// How the compensation was sized, in words.
    pub notes: Vec<String>,
}

/// Supply-current budget.
#[derive(Debug, Clone, PartialEq, Serialize, Default)]
pub struct SupplyBudget {
    /// Current drawn from the input when idle, A.
    pub idle_a: f64,
    /// Current drawn from the input when tripped, A.
    pub tripped_a: f64,
    /// Largest current the regulated rail draws, A (null without a
    /// regulator).
    pub regulator_load_a: Option<f64>,
    /// Regulator dissipation at the worst case, W (null without a
    /// regulator).
    pub regulator_dissipation_w: Option<f64>,
    /// Regulator junction temperature at the worst case, °C.
    pub regulator_junction_c: Option<f64>,
}

/// King's-law constants equivalent to a non-King cooling law around the
/// operating point.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct EquivalentKing {
    /// A, still-air conductance, W/K.
    pub a_w_per_k: f64,
    /// B, conductance added at 1 m/s, W/K.
    pub b_w_per_k: f64,
    /// n, airflow exponent.
    pub n: f64,
    /// Element temperature the fit was made at, °C.
    pub at_temperature_c: f64,
}

/// Version of the JSON report's layout; raised when a field changes
/// meaning or is removed.
pub const SCHEMA_VERSION: u32 = 3;

/// The whole report.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Report {
    /// Layout version of this report ([`SCHEMA_VERSION`]).
    pub schema_version: u32,
    /// draftwire's version.
    pub tool_version: String,
    /// The design file as named on the command line.
    pub design_file: String,
    /// Whether every design check passed (diagnostics do not count).
    pub passed: bool,
    /// Which comparator limits the checks used, in words.
    pub comparator_limits: String,
    /// Design title.
    pub title: String,
    /// Element description.
    pub element: String,
    /// Drive description.
    pub drive: String,
    /// Nominal ambient, °C.
    pub ambient_c: f64,
    /// Air pressure, Pa.
    pub pressure_pa: f64,
    /// King's-law constants equivalent to the cooling model around the trip
    /// point (absent when the cooling law is King's law itself).
    pub equivalent_kings_law: Option<EquivalentKing>,
    /// Operating points: still air, ½·trip, trip, 2·trip (at nominal ambient).
    pub operating_points: Vec<OperatingPointRow>,
    /// The trip point.
    pub trip: TripSummary,
    /// The bill of values.
    pub values: Vec<ValueRow>,
    /// Trip-point drift.
    pub drift: Vec<DriftRow>,
    /// Ambient compensation and what it buys.
    pub compensation: CompensationSection,
    /// Supply budget.
    pub supply: SupplyBudget,
    /// Design checks: the verdict.
    pub checks: Vec<Check>,
    /// Solver self-checks: diagnostics that do not count toward the verdict.
    pub diagnostics: Vec<Check>,
    /// Where a model is used outside its published range, with what to do.
    pub warnings: Vec<String>,
    /// Cautions that apply.
    pub cautions: Vec<String>,
    /// Defaults applied and modelling assumptions.
    pub assumptions: Vec<String>,
    /// The named nodes of the circuit, each with what it is and the pins
    /// on it.
    pub nodes: Vec<NodeRow>,
    /// Every pin of every part and the node it goes to.
    pub connections: Vec<Connection>,
}

/// One pin of one part and the node it connects to.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Connection {
    /// The part's designator, as in the bill.
    pub designator: String,
    /// The pin, by function (`1`/`2` for two-terminal parts, `wiper`,
    /// `base`, `in+`, `cathode`, …).
    pub pin: String,
    /// The node's name (docs/cli.md, Connections).
    pub node: String,
}

/// A named node of the circuit.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct NodeRow {
    /// The node's name.
    pub name: String,
    /// What it is, in words.
    pub what: String,
    /// The pins on it, as `designator.pin`.
    pub parts: Vec<String>,
}

impl Report {
    /// Whether every design check passed.
    pub fn passed(&self) -> bool {
        self.checks.iter().all(|c| c.passed)
    }
    /// The guard against non-finite numbers: every NaN or infinite field
    /// is named in a failing `internal-non-finite` check (a defect of the
    /// tool, not a figure) and set to no value where the field allows one.
    pub fn guarded(mut self) -> Self {
        let bad = crate::render::guard::non_finite_fields(&self);
        if !bad.is_empty() {
            self.checks.push(
                Check::judged(
                    "internal-non-finite",
                    "every figure is a finite number",
                    false,
                )
                .at("the report as computed")
                .detail(format!(
                    "a defect in draftwire: these figures came out as NaN or infinite and are not printed: {}; please report it with the design file",
                    bad.join(", ")
                )),
            );
        }
        self
    }
    /// Set [`Report::passed`] from the checks.
    pub fn with_verdict(mut self) -> Self {
        self.passed = self.passed();
        self
    }
}
