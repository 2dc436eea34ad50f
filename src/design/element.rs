//! Reading the `[element]` section: resistance law, cooling law, heat
//! capacity, limits — and the `[[candidate]]` tables of a candidates file
//! for `compare`, which use the same keys plus a `label`.
//!
//! Keys (every dimensional value is a string with its unit):
//! - `[element]`: `name`, `material` (copper, nickel, platinum, tungsten,
//!   iron, nichrome, constantan), `heat_capacity`, `max_temperature`,
//!   `tolerance`; then `[element.resistance]` and `[element.cooling]`, or
//!   `[element.lamp]` (plus an optional `[element.cooling]`).
//! - `[element.resistance]` `law =`
//!   `"linear"` (`r0`, `t0`, `tcr`; `tcr` may come from `material`, `t0`
//!   then defaults to the material's reference temperature),
//!   `"platinum"` (`r0` at `t0`, default 0 °C; IEC 60751 coefficients),
//!   `"tungsten"` (`r0` at `t0`; Forsythe & Worthing table),
//!   `"beta"` (`r0`, `t0` default 25 °C, `beta`),
//!   `"steinhart-hart"` (`a`, `b`, `c` in 1/K, or three `points`; optional
//!   `t_min`, `t_max`, default −55…150 °C),
//!   `"table"` (`points = [["0 degC", "100 ohm"], …]`, rising T).
//! - `[element.cooling]` `law =`
//!   `"king"` (`a`, `b`, `n`),
//!   `"datasheet"` (`dissipation`, `dissipation_moving` at
//!   `moving_airflow`, optional `n` default 0.5, optional `time_constant`),
//!   `"wire"` / `"coil"` (`diameter`, `length`, optional `forced` =
//!   churchill-bernstein | collis-williams, `natural` = churchill-chu |
//!   morgan, `emissivity`, `supports`; coil: `wire_diameter`,
//!   `wire_length` for its heat capacity).
//! - `[element.lamp]`: `voltage`, `power`, `cold_resistance`,
//!   `cold_temperature` (default 20 °C).

use super::diagnostic::Diagnostic;
use super::model::{Design, DriveChoice, DriveSpec, Sizable};
use super::raw::{self, Value};
use super::reader::{Reader, R};
use crate::element::{
    CoolingLaw, DissipationLaw, Element, GeometryCooling, KingsLaw, LinearTcr, ResistanceLaw,
    ResistanceTable, ScaledSteinhartHart, Shape,
};
use crate::physics::convection::{
    FlowDirection, ForcedCorrelation, MixingRule, NaturalCorrelation,
};
use crate::physics::lamp::{coil_note, LampRating};
use crate::physics::materials::Material;
use crate::physics::platinum::CallendarVanDusen;
use crate::physics::thermistor::{BetaThermistor, SteinhartHart, BETA_RANGE_K};
use crate::physics::tungsten::TungstenWire;
use crate::quantity::Dimension;

/// Diameter under which geometry cooling defaults to Morgan's natural
/// convection bands (issue 11: wires under 0.1 mm; draftwire's threshold,
/// no source).
pub const FINE_WIRE_DIAMETER_M: f64 = 1e-4;

const RESISTANCE_LAWS: [&str; 6] = [
    "linear",
    "platinum",
    "tungsten",
    "beta",
    "steinhart-hart",
    "table",
];
const COOLING_LAWS: [&str; 4] = ["king", "datasheet", "wire", "coil"];

/// King's theoretical exponent n = 0.5 (King 1914), the default flow
/// exponent of the data-sheet form.
const DEFAULT_DATASHEET_N: f64 = 0.5;

/// Temperature a lamp's cold resistance is taken to be measured at when the
/// file does not say: 20 °C room temperature (common practice, no source).
const DEFAULT_COLD_TEMPERATURE_K: f64 = 293.15;

/// `[element]`: the element, its tolerance, and whether its cooling asks
/// for the still-air floor `"natural"` (worked out once the drive is known,
/// `design::build`).
pub(crate) fn build_element(rd: &mut Reader<'_>, e: &raw::RawElement) -> R<(Element, f64, bool)> {
    if let Some(l) = &e.label {
        return Err(rd.err(
            Some(l.span()),
            "element.label",
            "`label` belongs only in the [[candidate]] tables of a candidates file; use `name` here"
                .into(),
        ));
    }
    let stray = e
        .overheat_rise
        .as_ref()
        .or(e.overheat_ratio.as_ref())
        .map(|v| v.span())
        .or(e.drive.as_ref().map(|d| d.kind.span()));
    if let Some(span) = stray {
        return Err(rd.err(
            Some(span),
            "element",
            "a drive or an overheat belongs in [drive]; only a [[candidate]] of a candidates file carries its own"
                .into(),
        ));
    }
    build_element_at(rd, e, "element")
}

/// One element read from a candidates file or from another design file.
#[derive(Debug, Clone)]
pub struct Candidate {
    /// The label shown in the comparison.
    pub label: String,
    /// The element.
    pub element: Element,
    /// Its resistance tolerance (fraction).
    pub tolerance: f64,
    /// Its own drive (with its overheat and tolerance), when it carries
    /// one; otherwise it runs in the design's drive.
    pub drive: Option<DriveChoice>,
    /// Defaults taken while reading it.
    pub assumptions: Vec<String>,
}

/// A candidate's own drive: a `[candidate.drive]` table, or an overheat
/// (`overheat_rise` / `overheat_ratio`) for the design's `auto` drive.
fn candidate_drive(
    rd: &mut Reader<'_>,
    c: &raw::RawElement,
    p: &str,
    design: &Design,
) -> R<Option<DriveChoice>> {
    let has_reg = design.supply.regulator.is_some();
    if let Some(d) = &c.drive {
        if let Some(v) = c.overheat_rise.as_ref().or(c.overheat_ratio.as_ref()) {
            return Err(rd.err(
                Some(v.span()),
                p,
                format!(
                    "give the overheat inside [{p}.drive] when the candidate has its own drive"
                ),
            ));
        }
        return super::build::build_drive(rd, d, &format!("{p}.drive"), has_reg, design.e_series)
            .map(Some);
    }
    let (rise, ratio) = (&c.overheat_rise, &c.overheat_ratio);
    let Some(overheat) = super::build::read_overheat(rd, rise, ratio, p)? else {
        return Ok(None);
    };
    let auto = matches!(
        design.drive,
        DriveSpec::SeriesResistor {
            series_ohm: Sizable::Auto,
            ..
        } | DriveSpec::ConstantCurrent {
            current_a: Sizable::Auto
        }
    );
    if !auto {
        let v = rise.as_ref().or(ratio.as_ref()).map(|v| v.span());
        return Err(rd.err(
            v,
            p,
            "a candidate's own overheat needs the design's drive to be \"auto\" (or give the candidate a whole [candidate.drive] table)".into(),
        ));
    }
    Ok(Some(DriveChoice {
        drive: design.drive,
        overheat: Some(overheat),
        tolerance: design.drive_tolerance,
    }))
}

/// Read the candidate elements in `source`: either `[[candidate]]` tables
/// (each with the keys of `[element]` plus a `label`) or, when the file has
/// no `candidate` key, a whole design file whose `[element]` is the one
/// candidate (labelled by its `name`, else the design's title).
///
/// `design` is the design the candidates are compared in: a candidate's own
/// drive is read against its supply rails and E-series.
pub fn parse_candidates(
    file: &str,
    source: &str,
    design: &Design,
) -> Result<Vec<Candidate>, Box<Diagnostic>> {
    let toml_err = |e: toml::de::Error| Box::new(super::reader::toml_error(file, source, &e));
    let table: toml::Table = toml::from_str(source).map_err(toml_err)?;
    if !table.contains_key("candidate") {
        // A whole design file: its element runs in the compared design's
        // drive, like every candidate without a drive of its own.
        let other = super::parse_design(file, source)?;
        let label = other
            .element_name
            .clone()
            .unwrap_or_else(|| other.title.clone());
        return Ok(vec![Candidate {
            label,
            element: other.element,
            tolerance: other.element_tolerance,
            drive: None,
            assumptions: other.assumptions,
        }]);
    }
    let raw: raw::RawCandidates = toml::from_str(source).map_err(toml_err)?;
    if raw.candidate.is_empty() {
        return Err(Box::new(Diagnostic::at(
            file,
            source,
            None,
            Some("candidate"),
            "expected at least one [[candidate]] table, found an empty list".into(),
        )));
    }
    let mut out = Vec::with_capacity(raw.candidate.len());
    for (i, c) in raw.candidate.iter().enumerate() {
        let mut rd = Reader {
            file,
            source,
            assumptions: Vec::new(),
        };
        let prefix = format!("candidate[{i}]");
        let label = match &c.label {
            Some(l) => l.get_ref().trim().to_string(),
            None => {
                return Err(Box::new(Diagnostic::at(
                    file,
                    source,
                    None,
                    Some(&format!("{prefix}.label")),
                    format!(
                        "missing: candidate {} needs a label, e.g. label = \"thin nickel\"",
                        i + 1
                    ),
                )))
            }
        };
        let (element, tolerance, _) = build_element_at(&mut rd, c, &prefix)?;
        let drive = candidate_drive(&mut rd, c, &prefix, design)?;
        out.push(Candidate {
            label,
            element,
            tolerance,
            drive,
            assumptions: rd.assumptions,
        });
    }
    Ok(out)
}

fn material_of(rd: &Reader<'_>, e: &raw::RawElement, p: &str) -> R<Option<Material>> {
    let Some(w) = &e.material else {
        return Ok(None);
    };
    let names: Vec<&'static str> = Material::all().iter().map(|m| m.name()).collect();
    match Material::parse(w.get_ref()) {
        Some(m) => Ok(Some(m)),
        None => rd
            .word(w, &format!("{p}.material"), &names)
            .map(Material::parse),
    }
}

fn build_element_at(rd: &mut Reader<'_>, e: &raw::RawElement, p: &str) -> R<(Element, f64, bool)> {
    let mut material = material_of(rd, e, p)?;
    let mut notes: Vec<String> = Vec::new();
    let mut plausibility: Vec<String> = Vec::new();
    // Heat capacity derived from the cooling data or the lamp, if any:
    // (value J/K, how it was found).
    let mut derived_c: Option<(f64, String)> = None;

    let (resistance, lamp_cooling) = match (&e.lamp, &e.resistance) {
        (Some(_), Some(r)) => {
            return Err(rd.err(
                Some(r.law.span()),
                &format!("{p}.resistance"),
                "give either [element.lamp] or [element.resistance], not both: a lamp's resistance law is inferred from its rating".into(),
            ))
        }
        (None, None) => {
            return Err(rd.err(
                None,
                &format!("{p}.resistance"),
                "missing: an [element.resistance] table (or [element.lamp] for a lamp filament)"
                    .into(),
            ))
        }
        (Some(l), None) => {
            if let (Some(m), Some(w)) = (material, &e.material) {
                if m != Material::Tungsten {
                    return Err(rd.err(
                        Some(w.span()),
                        &format!("{p}.material"),
                        format!("a lamp filament is tungsten, but material = \"{}\" was given; leave `material` out or write \"tungsten\"", m.name()),
                    ));
                }
            }
            let (law, cooling, c, lamp_notes, lamp_warnings) = lamp(rd, l, p)?;
            material = Some(Material::Tungsten);
            notes.extend(lamp_notes);
            plausibility.extend(lamp_warnings);
            derived_c = Some(c);
            (law, Some(cooling))
        }
        (None, Some(r)) => (resistance(rd, r, p, material)?, None),
    };
    // A material preset must not contradict a law that fixes the metal.
    if let (Some(m), Some(w)) = (material, &e.material) {
        let law_metal = match resistance {
            ResistanceLaw::Platinum(_) => Some(Material::Platinum),
            ResistanceLaw::Tungsten(_) => Some(Material::Tungsten),
            _ => None,
        };
        if let Some(lm) = law_metal.filter(|lm| *lm != m) {
            return Err(rd.err(
                Some(w.span()),
                &format!("{p}.material"),
                format!(
                    "the {} resistance law is for {}, but material = \"{}\" was given (its emissivity and limit in air would be used with {}'s resistance): leave `material` out or write \"{}\"",
                    resistance.name(),
                    lm.name(),
                    m.name(),
                    lm.name(),
                    lm.name()
                ),
            ));
        }
    }
    if material.is_none() {
        material = match resistance {
            ResistanceLaw::Platinum(_) => Some(Material::Platinum),
            ResistanceLaw::Tungsten(_) => Some(Material::Tungsten),
            _ => None,
        };
    }
    let mut natural_floor = false;
    let cooling =
        match (&e.cooling, lamp_cooling) {
            (Some(c), _) => {
                let (law, c_derived, natural) = cooling(rd, c, p, material)?;
                natural_floor = natural;
                if c_derived.is_some() {
                    derived_c = c_derived;
                }
                law
            }
            (None, Some(law)) => law,
            (None, None) => return Err(rd.err(
                None,
                &format!("{p}.cooling"),
                "missing: an [element.cooling] table with its law (king, datasheet, wire or coil)"
                    .into(),
            )),
        };

    let heat_capacity = match (&e.heat_capacity, derived_c) {
        (Some(v), _) => rd.positive(v, &format!("{p}.heat_capacity"), Dimension::HeatCapacity)?,
        (None, Some((c, how))) => {
            rd.assumptions
                .push(format!("{p}.heat_capacity not given: {how} = {:.4e} J/K", c));
            c
        }
        (None, None) => {
            return Err(rd.err(
                None,
                &format!("{p}.heat_capacity"),
                "missing: the element's heat capacity, e.g. heat_capacity = \"30 mJ/K\" (it can be left out for a straight wire of a known material, a lamp, or a data-sheet time constant)".into(),
            ))
        }
    };

    let (lo_k, hi_k) = resistance.valid_range_k();
    let max_t = match &e.max_temperature {
        Some(v) => Some(rd.quantity(v, &format!("{p}.max_temperature"), Dimension::Temperature)?),
        None => match material {
            Some(m) => {
                let t = m.max_temperature_in_air_k().min(hi_k);
                rd.assumptions.push(format!(
                    "{p}.max_temperature not given: {:.0} °C for bare {} in air ({}){}",
                    t - 273.15,
                    m.name(),
                    m.max_temperature_source(),
                    if t < m.max_temperature_in_air_k() {
                        ", lowered to the top of the resistance law's range"
                    } else {
                        ""
                    }
                ));
                Some(t)
            }
            None if matches!(
                resistance,
                ResistanceLaw::Beta(_) | ResistanceLaw::SteinhartHart(_)
            ) =>
            {
                rd.assumptions.push(format!(
                    "{p}.max_temperature not given: {:.0} °C, the top of the thermistor law's range (the usual rated range of leaded NTC discs, common practice)",
                    hi_k - 273.15
                ));
                Some(hi_k)
            }
            None => None,
        },
    };
    let _ = lo_k;
    let tolerance = rd.or_default(
        &e.tolerance,
        0.0,
        &format!("{p}.tolerance not given: the element's resistance is taken as exact (0 %)"),
        |r, v| r.fraction_in(v, &format!("{p}.tolerance"), 0.0, 0.5),
    )?;
    let element = Element::new(resistance, cooling, heat_capacity, max_t)
        .map_err(|er| {
            rd.err(
                e.max_temperature
                    .as_ref()
                    .or(e.heat_capacity.as_ref())
                    .map(|v| v.span()),
                p,
                er.to_string(),
            )
        })?
        .with_notes(notes)
        .with_plausibility_warnings(plausibility);
    let element = match e.cooling.as_ref().and_then(|c| c.calibrated_range.as_ref()) {
        None => element,
        Some(range) => {
            let field = format!("{p}.cooling.calibrated_range");
            let items = range.get_ref();
            if items.len() != 2 {
                return Err(rd.err(
                    Some(range.span()),
                    &field,
                    format!(
                        "expected two airflows, lowest and highest read, such as [\"0 m/s\", \"3 m/s\"]; found {} item(s)",
                        items.len()
                    ),
                ));
            }
            let lo = rd.non_negative(&items[0], &field, Dimension::Velocity)?;
            let hi = rd.positive(&items[1], &field, Dimension::Velocity)?;
            if !(lo < hi && hi <= 100.0) {
                return Err(rd.err(
                    Some(range.span()),
                    &field,
                    format!("expected lowest < highest ≤ 100 m/s, found {lo} – {hi} m/s"),
                ));
            }
            element.with_calibrated_range(lo, hi)
        }
    };
    Ok((element, tolerance, natural_floor))
}

fn req<'v>(
    rd: &Reader<'_>,
    v: &'v Option<Value>,
    field: &str,
    near: &raw::Word,
    what: &str,
) -> R<&'v Value> {
    rd.required(v, field, Some(near.span()), what)
}

/// Reject keys that the chosen law does not use, so a misplaced key is an
/// error rather than silently ignored.
/// A key of a law table and where it stands in the file (`None`: absent).
type Key = (&'static str, Option<std::ops::Range<usize>>);

fn at<T>(v: &Option<toml::Spanned<T>>) -> Option<std::ops::Range<usize>> {
    v.as_ref().map(|v| v.span())
}

/// Every optional key of `[element.resistance]`.
fn resistance_keys(r: &raw::RawResistance) -> [Key; 10] {
    [
        ("r0", at(&r.r0)),
        ("t0", at(&r.t0)),
        ("tcr", at(&r.tcr)),
        ("beta", at(&r.beta)),
        ("a", at(&r.a)),
        ("b", at(&r.b)),
        ("c", at(&r.c)),
        ("points", at(&r.points)),
        ("t_min", at(&r.t_min)),
        ("t_max", at(&r.t_max)),
    ]
}

/// Every optional key of `[element.cooling]`.
fn cooling_keys(c: &raw::RawCooling) -> [Key; 20] {
    [
        ("a", at(&c.a)),
        ("b", at(&c.b)),
        ("n", at(&c.n)),
        ("dissipation", at(&c.dissipation)),
        ("dissipation_moving", at(&c.dissipation_moving)),
        ("moving_airflow", at(&c.moving_airflow)),
        ("time_constant", at(&c.time_constant)),
        ("diameter", at(&c.diameter)),
        ("length", at(&c.length)),
        ("wire_diameter", at(&c.wire_diameter)),
        ("wire_length", at(&c.wire_length)),
        ("forced", at(&c.forced)),
        ("natural", at(&c.natural)),
        ("emissivity", at(&c.emissivity)),
        ("supports", at(&c.supports)),
        (
            "calibrated_range",
            c.calibrated_range.as_ref().map(|v| v.span()),
        ),
        ("mixing", at(&c.mixing)),
        ("mixing_exponent", at(&c.mixing_exponent)),
        ("still_air_floor", at(&c.still_air_floor)),
        ("flow", at(&c.flow)),
    ]
}

/// Reject the first key present in `keys` that `law` does not take,
/// pointing at it.
fn only(rd: &Reader<'_>, keys: &[Key], takes: &[&str], law: &str, p: &str) -> R<()> {
    for (k, span) in keys {
        if let (Some(span), false) = (span, takes.contains(k)) {
            return Err(rd.err(
                Some(span.clone()),
                &format!("{p}.{k}"),
                format!("`{k}` is not used by law \"{law}\"; remove it or choose another law"),
            ));
        }
    }
    Ok(())
}

fn resistance(
    rd: &mut Reader<'_>,
    r: &raw::RawResistance,
    p: &str,
    material: Option<Material>,
) -> R<ResistanceLaw> {
    let pre = format!("{p}.resistance");
    let f = |k: &str| format!("{pre}.{k}");
    let law = rd.word(&r.law, &f("law"), &RESISTANCE_LAWS)?;
    let near = &r.law;
    let keys = resistance_keys(r);
    let phys = |rd: &Reader<'_>, msg: String| rd.err(Some(near.span()), &pre, msg);
    let temp = |rd: &Reader<'_>, v: &Value, k: &str| rd.quantity(v, &f(k), Dimension::Temperature);
    let ohm = |rd: &Reader<'_>, v: &Value, k: &str| rd.positive(v, &f(k), Dimension::Resistance);
    match law {
        "linear" => {
            only(rd, &keys, &["r0", "t0", "tcr"], law, &pre)?;
            let r0 = ohm(
                rd,
                req(rd, &r.r0, &f("r0"), near, "R0, e.g. r0 = \"10 ohm\"")?,
                "r0",
            )?;
            match (&r.tcr, material) {
                (Some(tcr_v), _) => {
                    let t0 = temp(
                        rd,
                        req(rd, &r.t0, &f("t0"), near, "the temperature R0 is given at, e.g. t0 = \"20 degC\"")?,
                        "t0",
                    )?;
                    let tcr = rd.quantity(tcr_v, &f("tcr"), Dimension::TemperatureCoefficient)?;
                    LinearTcr::new(r0, t0, tcr)
                        .map(ResistanceLaw::Linear)
                        .map_err(|er| rd.err(Some(tcr_v.span()), &pre, er.to_string()))
                }
                (None, Some(m)) => {
                    let t0 = match &r.t0 {
                        Some(v) => temp(rd, v, "t0")?,
                        None => {
                            rd.assumptions.push(format!(
                                "{pre}.t0 not given: R0 taken at {:.0} °C, the reference temperature of {}'s TCR",
                                m.tcr_reference_temperature_k() - 273.15,
                                m.name()
                            ));
                            m.tcr_reference_temperature_k()
                        }
                    };
                    rd.assumptions.push(format!(
                        "{pre}.tcr not given: {:.0} ppm/K at {:.0} °C for {} ({})",
                        m.tcr_per_k() * 1e6,
                        m.tcr_reference_temperature_k() - 273.15,
                        m.name(),
                        m.tcr_source()
                    ));
                    LinearTcr::for_material(m, r0, t0)
                        .map(ResistanceLaw::Linear)
                        .map_err(|er| phys(rd, er.to_string()))
                }
                (None, None) => Err(rd.err(
                    Some(near.span()),
                    &f("tcr"),
                    "missing: the temperature coefficient, e.g. tcr = \"4500 ppm/K\", or a material in [element], e.g. material = \"nickel\"".into(),
                )),
            }
        }
        "platinum" | "tungsten" => {
            only(rd, &keys, &["r0", "t0"], law, &pre)?;
            let r0 = ohm(
                rd,
                req(
                    rd,
                    &r.r0,
                    &f("r0"),
                    near,
                    "the resistance at t0, e.g. r0 = \"100 ohm\"",
                )?,
                "r0",
            )?;
            if law == "platinum" {
                let t0 = match &r.t0 {
                    Some(v) => temp(rd, v, "t0")?,
                    None => {
                        rd.assumptions.push(format!(
                            "{}.t0 not given: r0 taken at 0 °C, the reference temperature of IEC 60751",
                            f("r0").trim_end_matches(".r0")
                        ));
                        273.15
                    }
                };
                // R0 at 0 °C from the resistance at t0: R(t0)/W(t0), with
                // W(t) = R(t)/R0 from the IEC 60751 equation.
                let unit =
                    CallendarVanDusen::iec60751(1.0).map_err(|er| phys(rd, er.to_string()))?;
                let ratio = unit.resistance_ohm(t0);
                if !(ratio > 0.0 && (73.15..=1123.15).contains(&t0)) {
                    return Err(rd.err(
                        r.t0.as_ref().map(|v| v.span()),
                        &f("t0"),
                        format!(
                            "t0 must lie in −200…850 °C (IEC 60751), found {:.2} °C",
                            t0 - 273.15
                        ),
                    ));
                }
                CallendarVanDusen::iec60751(r0 / ratio)
                    .map(ResistanceLaw::Platinum)
                    .map_err(|er| phys(rd, er.to_string()))
            } else {
                let t0 = temp(
                    rd,
                    req(
                        rd,
                        &r.t0,
                        &f("t0"),
                        near,
                        "the temperature r0 is measured at, e.g. t0 = \"20 degC\"",
                    )?,
                    "t0",
                )?;
                TungstenWire::new(r0, t0)
                    .map(ResistanceLaw::Tungsten)
                    .map_err(|er| phys(rd, er.to_string()))
            }
        }
        "beta" => {
            only(rd, &keys, &["r0", "t0", "beta"], law, &pre)?;
            let r0 = ohm(
                rd,
                req(rd, &r.r0, &f("r0"), near, "R0, e.g. r0 = \"10 kohm\"")?,
                "r0",
            )?;
            let t0 = match &r.t0 {
                Some(v) => temp(rd, v, "t0")?,
                None => {
                    rd.assumptions.push(format!(
                        "{pre}.t0 not given: R0 taken at 25 °C, the usual NTC rating temperature (IEC 60539-1)"
                    ));
                    298.15
                }
            };
            let beta = rd.positive(
                req(
                    rd,
                    &r.beta,
                    &f("beta"),
                    near,
                    "the B constant, e.g. beta = \"3950 K\"",
                )?,
                &f("beta"),
                Dimension::TemperatureDifference,
            )?;
            BetaThermistor::new(r0, t0, beta)
                .map(ResistanceLaw::Beta)
                .map_err(|er| phys(rd, er.to_string()))
        }
        "steinhart-hart" => {
            only(
                rd,
                &keys,
                &["a", "b", "c", "points", "t_min", "t_max"],
                law,
                &pre,
            )?;
            let t_min = match &r.t_min {
                Some(v) => temp(rd, v, "t_min")?,
                None => BETA_RANGE_K.0,
            };
            let t_max = match &r.t_max {
                Some(v) => temp(rd, v, "t_max")?,
                None => BETA_RANGE_K.1,
            };
            if r.t_min.is_none() || r.t_max.is_none() {
                rd.assumptions.push(format!(
                    "{pre}: range not fully given, used {:.0}…{:.0} °C (the usual rated range of leaded NTC discs, common practice)",
                    t_min - 273.15,
                    t_max - 273.15
                ));
            }
            let (a, b, c) = match (&r.points, &r.a, &r.b, &r.c) {
                (Some(pts), None, None, None) => {
                    let rows = points(rd, pts, &f("points"))?;
                    if rows.len() != 3 {
                        return Err(rd.err(
                            Some(pts.span()),
                            &f("points"),
                            format!("a Steinhart–Hart fit needs exactly three [T, R] points, found {}", rows.len()),
                        ));
                    }
                    let fit = SteinhartHart::fit_three_points([rows[0], rows[1], rows[2]])
                        .map_err(|er| rd.err(Some(pts.span()), &f("points"), er.to_string()))?;
                    fit.coefficients()
                }
                (None, Some(a), Some(b), Some(c)) => {
                    let tc = Dimension::TemperatureCoefficient;
                    (
                        rd.quantity(a, &f("a"), tc)?,
                        rd.quantity(b, &f("b"), tc)?,
                        rd.quantity(c, &f("c"), tc)?,
                    )
                }
                _ => {
                    return Err(rd.err(
                        Some(near.span()),
                        &pre,
                        "give either a, b and c (e.g. a = \"1.1292e-3 1/K\") or three points = [[\"0 degC\", \"32.6 kohm\"], …], not a mix".into(),
                    ))
                }
            };
            SteinhartHart::new(a, b, c, (t_min, t_max))
                .map(|law| ResistanceLaw::SteinhartHart(ScaledSteinhartHart { law, scale: 1.0 }))
                .map_err(|er| phys(rd, er.to_string()))
        }
        _ => {
            only(rd, &keys, &["points"], law, &pre)?;
            let Some(pts) = &r.points else {
                return Err(rd.err(
                    Some(near.span()),
                    &f("points"),
                    "missing: the table rows, e.g. points = [[\"0 degC\", \"100 ohm\"], [\"100 degC\", \"138.5 ohm\"]]".into(),
                ));
            };
            let rows = points(rd, pts, &f("points"))?;
            let (ts, rs): (Vec<f64>, Vec<f64>) = rows.into_iter().unzip();
            ResistanceTable::new(ts, rs)
                .map(ResistanceLaw::Table)
                .map_err(|er| rd.err(Some(pts.span()), &f("points"), er.to_string()))
        }
    }
}

fn points(
    rd: &Reader<'_>,
    pts: &toml::Spanned<Vec<raw::RawPoint>>,
    field: &str,
) -> R<Vec<(f64, f64)>> {
    pts.get_ref()
        .iter()
        .enumerate()
        .map(|(i, [t, r])| {
            Ok((
                rd.quantity(t, &format!("{field}[{i}][0]"), Dimension::Temperature)?,
                rd.positive(r, &format!("{field}[{i}][1]"), Dimension::Resistance)?,
            ))
        })
        .collect()
}

type Derived = Option<(f64, String)>;

/// What `still_air_floor` asks for.
#[derive(Debug, Clone, Copy, PartialEq)]
enum FloorRequest {
    /// Given as a velocity, m/s (applied here).
    Velocity(f64),
    /// "natural": computed from the drive's overheat once it is known.
    Natural,
}

/// The still-air floor asked for, if any: "none" (the default), "natural"
/// or a velocity within its per-key range.
fn still_air_floor_request(
    rd: &mut Reader<'_>,
    c: &raw::RawCooling,
    p: &str,
) -> R<Option<FloorRequest>> {
    let field = format!("{p}.cooling.still_air_floor");
    let Some(v) = &c.still_air_floor else {
        return Ok(None);
    };
    if let raw::Scalar::Text(t) = v.get_ref() {
        match t.trim().to_ascii_lowercase().as_str() {
            "none" => return Ok(None),
            "natural" => return Ok(Some(FloorRequest::Natural)),
            _ => {}
        }
    }
    let u = rd.positive(v, &field, Dimension::Velocity).map_err(|mut e| {
        e.message = format!(
            "{} (or \"none\", or \"natural\" for the free-convection velocity at the drive's overheat)",
            e.message
        );
        e
    })?;
    Ok(Some(FloorRequest::Velocity(u)))
}

fn cooling(
    rd: &mut Reader<'_>,
    c: &raw::RawCooling,
    p: &str,
    material: Option<Material>,
) -> R<(CoolingLaw, Derived, bool)> {
    let (law, derived) = cooling_law_of(rd, c, p, material)?;
    match still_air_floor_request(rd, c, p)? {
        Some(FloorRequest::Natural) if p != "element" => Err(rd.err(
            c.still_air_floor.as_ref().map(|v| v.span()),
            &format!("{p}.cooling.still_air_floor"),
            "\"natural\" is worked out from the design's drive for [element] only; give a candidate's floor as a velocity, e.g. still_air_floor = \"4 cm/s\"".into(),
        )),
        Some(FloorRequest::Velocity(u)) => {
            let floored = law.with_still_air_floor(u).ok_or_else(|| {
                rd.err(
                    c.still_air_floor.as_ref().map(|v| v.span()),
                    &format!("{p}.cooling.still_air_floor"),
                    "only King's law and the data-sheet form take a still-air floor; geometry cooling has its own natural-convection term".into(),
                )
            })?;
            Ok((floored, derived, false))
        }
        Some(FloorRequest::Natural) => Ok((law, derived, true)),
        None => Ok((law, derived, false)),
    }
}

fn cooling_law_of(
    rd: &mut Reader<'_>,
    c: &raw::RawCooling,
    p: &str,
    material: Option<Material>,
) -> R<(CoolingLaw, Derived)> {
    let pre = format!("{p}.cooling");
    let f = |k: &str| format!("{pre}.{k}");
    let law = rd.word(&c.law, &f("law"), &COOLING_LAWS)?;
    let near = &c.law;
    let keys = cooling_keys(c);
    let g = Dimension::ThermalConductance;
    match law {
        "king" => {
            only(
                rd,
                &keys,
                &["a", "b", "n", "calibrated_range", "still_air_floor"],
                law,
                &pre,
            )?;
            let a = rd.non_negative(
                req(
                    rd,
                    &c.a,
                    &f("a"),
                    near,
                    "King's A (still-air conductance), e.g. a = \"1.2 mW/K\"",
                )?,
                &f("a"),
                g,
            )?;
            let b = rd.positive(
                req(
                    rd,
                    &c.b,
                    &f("b"),
                    near,
                    "King's B (conductance added at 1 m/s), e.g. b = \"2.5 mW/K\"",
                )?,
                &f("b"),
                g,
            )?;
            let n_v = req(rd, &c.n, &f("n"), near, "King's exponent n, e.g. n = 0.45")?;
            let n = rd.quantity(n_v, &f("n"), Dimension::Fraction)?;
            let k = KingsLaw::new(a, b, n)
                .map_err(|er| rd.err(Some(n_v.span()), &pre, er.to_string()))?;
            Ok((CoolingLaw::King(k), None))
        }
        "datasheet" => {
            only(
                rd,
                &keys,
                &[
                    "n",
                    "dissipation",
                    "dissipation_moving",
                    "moving_airflow",
                    "time_constant",
                    "still_air_floor",
                ],
                law,
                &pre,
            )?;
            let d0 = rd.positive(
                req(
                    rd,
                    &c.dissipation,
                    &f("dissipation"),
                    near,
                    "the still-air dissipation constant, e.g. dissipation = \"1.5 mW/K\"",
                )?,
                &f("dissipation"),
                g,
            )?;
            let d1_v = req(
                rd,
                &c.dissipation_moving,
                &f("dissipation_moving"),
                near,
                "the dissipation constant in moving air, e.g. dissipation_moving = \"3 mW/K\"",
            )?;
            let d1 = rd.positive(d1_v, &f("dissipation_moving"), g)?;
            let u1 = rd.positive(
                req(
                    rd,
                    &c.moving_airflow,
                    &f("moving_airflow"),
                    near,
                    "the airflow dissipation_moving is given at, e.g. moving_airflow = \"1 m/s\"",
                )?,
                &f("moving_airflow"),
                Dimension::Velocity,
            )?;
            let n = match &c.n {
                Some(v) => rd.quantity(v, &f("n"), Dimension::Fraction)?,
                None => {
                    rd.assumptions
                        .push(format!("{pre}.n not given: flow exponent 0.5 (King 1914)"));
                    DEFAULT_DATASHEET_N
                }
            };
            let law = DissipationLaw::new(d0, d1, u1, n)
                .map_err(|er| rd.err(Some(d1_v.span()), &pre, er.to_string()))?;
            let derived = match &c.time_constant {
                Some(v) => {
                    let tau = rd.positive(v, &f("time_constant"), Dimension::Time)?;
                    Some((
                        law.heat_capacity_from_time_constant(tau),
                        format!("C = τ·δ0 = {tau} s × {:.4e} W/K from the data-sheet time constant (MIL-PRF-23648, IEC 60539-1 definitions)", d0),
                    ))
                }
                None => None,
            };
            Ok((CoolingLaw::Datasheet(law), derived))
        }
        _ => {
            let mut takes = vec![
                "diameter",
                "length",
                "forced",
                "natural",
                "emissivity",
                "supports",
                "mixing",
                "mixing_exponent",
                "flow",
            ];
            if law == "coil" {
                takes.extend(["wire_diameter", "wire_length"]);
            }
            only(rd, &keys, &takes, law, &pre)?;
            let shape = if law == "wire" {
                Shape::StraightWire
            } else {
                Shape::CoilEnvelope
            };
            let Some(m) = material else {
                return Err(rd.err(
                    Some(near.span()),
                    &format!("{p}.material"),
                    "missing: geometry cooling needs the wire's material in [element], e.g. material = \"nickel\" (for emissivity, heat capacity and its limit in air)".into(),
                ));
            };
            let len = Dimension::Length;
            let d = rd.positive(
                req(
                    rd,
                    &c.diameter,
                    &f("diameter"),
                    near,
                    "the diameter, e.g. diameter = \"25 um\"",
                )?,
                &f("diameter"),
                len,
            )?;
            let l_v = req(
                rd,
                &c.length,
                &f("length"),
                near,
                "the length, e.g. length = \"40 mm\"",
            )?;
            let l = rd.positive(l_v, &f("length"), len)?;
            let forced = match &c.forced {
                Some(w) => {
                    match rd.word(w, &f("forced"), &["churchill-bernstein", "collis-williams"])? {
                        "collis-williams" => ForcedCorrelation::CollisWilliams,
                        _ => ForcedCorrelation::ChurchillBernstein,
                    }
                }
                None => {
                    rd.assumptions.push(format!(
                        "{pre}.forced not given: Churchill & Bernstein (1977) forced convection"
                    ));
                    ForcedCorrelation::ChurchillBernstein
                }
            };
            let natural = match &c.natural {
                Some(w) => match rd.word(w, &f("natural"), &["churchill-chu", "morgan"])? {
                    "morgan" => NaturalCorrelation::Morgan,
                    _ => NaturalCorrelation::ChurchillChu,
                },
                // Morgan's bands for fine wires: Churchill & Chu is stated for
                // Ra ≥ 1e-5 and gives 8–35 % more still-air Nusselt number
                // than Morgan at 100–5 µm (docs/model.md §12, computed).
                None if d < FINE_WIRE_DIAMETER_M => {
                    rd.assumptions.push(format!("{pre}.natural not given: Morgan (1975) natural convection, the bands that reach the very low Rayleigh numbers of a wire under 0.1 mm"));
                    NaturalCorrelation::Morgan
                }
                None => {
                    rd.assumptions.push(format!("{pre}.natural not given: Churchill & Chu (1975) natural convection (smooth in Ra, so smooth derivatives)"));
                    NaturalCorrelation::ChurchillChu
                }
            };
            let emissivity = match &c.emissivity {
                Some(v) => Some(rd.fraction_in(v, &f("emissivity"), 0.0, 1.0)?),
                None => {
                    rd.assumptions.push(format!(
                        "{pre}.emissivity not given: the {} preset's emissivity{}",
                        m.name(),
                        if m == Material::Tungsten {
                            " (temperature dependent, Forsythe & Watson 1934)"
                        } else {
                            ""
                        }
                    ));
                    None
                }
            };
            let fin = matches!(
                c.supports.as_ref().map(|v| v.get_ref()),
                Some(raw::Scalar::Text(t)) if t.trim().eq_ignore_ascii_case("fin")
            );
            let supports = if fin {
                0.0
            } else {
                rd.or_default(
                    &c.supports,
                    0.0,
                    &format!("{pre}.supports not given: no heat conducted to the supports"),
                    |r, v| {
                        r.non_negative(v, &f("supports"), g).map_err(|mut e| {
                            e.message = format!(
                                "{} (or \"fin\": the ends in supports at ambient, the end loss from the wire's conductivity)",
                                e.message
                            );
                            e
                        })
                    },
                )?
            };
            if shape == Shape::CoilEnvelope {
                rd.assumptions.push(format!(
                    "{pre}: the coil is treated as a solid cylinder of its envelope ({:.3} mm × {:.1} mm) for convection and radiation (simplification: the turns shade each other)",
                    d * 1e3,
                    l * 1e3
                ));
            }
            let geo = GeometryCooling::new(shape, d, l, m, forced, natural, emissivity, supports)
                .map_err(|er| rd.err(Some(l_v.span()), &pre, er.to_string()))?;
            let geo = if fin {
                rd.assumptions.push(format!(
                    "{pre}.supports = \"fin\": the wire's ends sit in supports at ambient; the end loss follows the fin model with the {} wire's thermal conductivity, {} W/(m·K) near 300 K",
                    m.name(),
                    m.thermal_conductivity_w_per_m_k()
                ));
                geo.with_fin_supports().map_err(|er| {
                    rd.err(
                        c.supports.as_ref().map(|v| v.span()),
                        &f("supports"),
                        er.to_string(),
                    )
                })?
            } else {
                geo
            };
            let derived = match shape {
                Shape::StraightWire => Some((
                    geo.wire_heat_capacity_j_per_k(),
                    format!(
                        "ρ·c·volume of the {} wire (ρ, c near 300 K, Incropera 6th ed. Table A.1)",
                        m.name()
                    ),
                )),
                Shape::CoilEnvelope => match (&c.wire_diameter, &c.wire_length) {
                    (Some(dv), Some(lv)) => {
                        let wd = rd.positive(dv, &f("wire_diameter"), len)?;
                        let wl = rd.positive(lv, &f("wire_length"), len)?;
                        Some((
                            m.density_kg_per_m3()
                                * m.specific_heat_j_per_kg_k()
                                * std::f64::consts::FRAC_PI_4
                                * wd
                                * wd
                                * wl,
                            format!("ρ·c·volume of the coil's {} wire", m.name()),
                        ))
                    }
                    (None, None) => None,
                    (Some(v), None) | (None, Some(v)) => {
                        return Err(rd.err(
                            Some(v.span()),
                            &pre,
                            "give both wire_diameter and wire_length (the coil's own wire, for its heat capacity), or neither".into(),
                        ))
                    }
                },
            };
            let mixing = read_mixing(rd, c, &f)?;
            let law = CoolingLaw::Geometry(geo);
            let law = law.with_mixing(mixing).unwrap_or(law);
            Ok((law, derived))
        }
    }
}

/// `mixing` (and `mixing_exponent` for Churchill–Usagi) of a geometry
/// cooling law; draftwire's own rule when absent (echoed).
fn read_mixing(
    rd: &mut Reader<'_>,
    c: &raw::RawCooling,
    f: &dyn Fn(&str) -> String,
) -> R<MixingRule> {
    let word = match &c.mixing {
        Some(w) => Some(rd.word(
            w,
            &f("mixing"),
            &[
                "intercept-removed",
                "churchill-usagi",
                "larger",
                "effective-velocity",
            ],
        )?),
        None => None,
    };
    let flow = match &c.flow {
        Some(w) if w.get_ref().trim().eq_ignore_ascii_case("opposing") => {
            return Err(rd.err(
                Some(w.span()),
                &f("flow"),
                "opposing flow (air moving down past the wire, against its rising plume) is not modelled: the loss first falls, then rises with airflow, so one sense voltage would mean two airflows; mount the wire so the air crosses it or rises past it".into(),
            ));
        }
        Some(w) => {
            let dir = rd.word(w, &f("flow"), &["cross", "assisting"])?;
            if word != Some("effective-velocity") {
                return Err(rd.err(
                    Some(w.span()),
                    &f("flow"),
                    "flow belongs to mixing = \"effective-velocity\": the other rules add the forced and natural terms with the + sign the sources give for both cross and assisting flow, so the direction does not change them".into(),
                ));
            }
            if dir == "assisting" {
                FlowDirection::Assisting
            } else {
                FlowDirection::Cross
            }
        }
        None => FlowDirection::Cross,
    };
    if let (Some(v), false) = (&c.mixing_exponent, word == Some("churchill-usagi")) {
        return Err(rd.err(
            Some(v.span()),
            &f("mixing_exponent"),
            "mixing_exponent belongs to mixing = \"churchill-usagi\"".into(),
        ));
    }
    Ok(match word {
        None => {
            rd.assumptions.push(format!(
                "{} not given: {} (draftwire's rule; the report gives the trip airflow under every rule)",
                f("mixing"),
                MixingRule::InterceptRemoved.describe()
            ));
            MixingRule::InterceptRemoved
        }
        Some("churchill-usagi") => {
            let exponent = match &c.mixing_exponent {
                Some(v) => {
                    let x = rd.quantity(v, &f("mixing_exponent"), Dimension::Fraction)?;
                    if !(1.0..=6.0).contains(&x) {
                        return Err(rd.err(
                            Some(v.span()),
                            &f("mixing_exponent"),
                            format!(
                                "expected an exponent of 1 to 6, found {}",
                                crate::quantity::format_sig(x, 6)
                            ),
                        ));
                    }
                    x
                }
                None => 3.0,
            };
            MixingRule::ChurchillUsagi { exponent }
        }
        Some("larger") => MixingRule::Larger,
        Some("effective-velocity") => {
            if c.flow.is_none() {
                rd.assumptions.push(format!(
                    "{} not given: cross flow (the airflow crosses the horizontal wire)",
                    f("flow")
                ));
            }
            MixingRule::EffectiveVelocity { flow }
        }
        _ => MixingRule::InterceptRemoved,
    })
}

/// What a lamp gives: its resistance law, its cooling, its heat capacity
/// (value, how found) and notes for the report.
type LampParts = (
    ResistanceLaw,
    CoolingLaw,
    (f64, String),
    Vec<String>,
    Vec<String>,
);

/// A lamp filament from its rating: tungsten resistance law referred to the
/// measured cold point, straight-wire geometry cooling of the inferred wire
/// (Churchill & Bernstein, Churchill & Chu, tungsten emissivity), ρ·c·V heat
/// capacity, and notes on the inference.
fn lamp(rd: &mut Reader<'_>, l: &raw::RawLamp, p: &str) -> R<LampParts> {
    let pre = format!("{p}.lamp");
    let f = |k: &str| format!("{pre}.{k}");
    let v = rd.positive(&l.voltage, &f("voltage"), Dimension::Voltage)?;
    let w = rd.positive(&l.power, &f("power"), Dimension::Power)?;
    let r = rd.positive(
        &l.cold_resistance,
        &f("cold_resistance"),
        Dimension::Resistance,
    )?;
    let t = rd.or_default(
        &l.cold_temperature,
        DEFAULT_COLD_TEMPERATURE_K,
        &format!(
            "{pre}.cold_temperature not given: the cold resistance is taken as measured at 20 °C"
        ),
        |rd, v| rd.quantity(v, &f("cold_temperature"), Dimension::Temperature),
    )?;
    let here = Some(l.cold_resistance.span());
    let fil = LampRating::new(v, w, r, t)
        .and_then(|rating| rating.infer())
        .map_err(|er| rd.err(here.clone(), &pre, er.to_string()))?;
    let geo = GeometryCooling::new(
        Shape::StraightWire,
        fil.diameter_m,
        fil.length_m,
        Material::Tungsten,
        ForcedCorrelation::ChurchillBernstein,
        // A filament is far under 0.1 mm: Morgan's bands (see the wire law).
        NaturalCorrelation::Morgan,
        None,
        0.0,
    )
    .map_err(|er| rd.err(here, &pre, er.to_string()))?;
    rd.assumptions.push(format!(
        "{pre}: the inferred filament's convection combines forced and natural terms by {} (draftwire's rule; the report gives the trip airflow under every rule; an [element.cooling] table with `mixing` replaces it)",
        MixingRule::InterceptRemoved.describe()
    ));
    let pl = &fil.plausibility;
    let range = format!(
        "the {:.4}–{:.4} ohm expected for a lamp running at {:.0}–{:.0} K",
        pl.expected_cold_resistance_range_ohm.0,
        pl.expected_cold_resistance_range_ohm.1,
        pl.typical_operating_range_k.0,
        pl.typical_operating_range_k.1
    );
    let agreement = if pl.cold_resistance_in_range {
        format!("the measured cold resistance {r:.4} ohm lies inside {range}")
    } else {
        format!("the measured cold resistance {r:.4} ohm lies outside {range} (see the warnings)")
    };
    let warnings = if pl.cold_resistance_in_range {
        Vec::new()
    } else {
        vec![format!(
            "lamp filament: the measured cold resistance {r:.4} ohm lies {:+.1} % outside {range}, so the rating and the measurement disagree. The inferred wire (diameter, length, hot temperature) rests on both, and with it the cooling and the trip airflow: treat the trip point as uncertain by at least that much, check the measurement (lead resistance, meter zero) and the rating, and calibrate the trip point on the bench",
            pl.cold_resistance_deviation * 100.0
        )]
    };
    let notes = vec![
        format!(
            "lamp filament inferred from its rating ({v} V, {w} W, {r} ohm cold at {:.1} °C): hot resistance {:.4} ohm, hot/cold ratio {:.2}, filament at {:.0} K at rated voltage, equivalent straight tungsten wire {:.2} um × {:.1} mm; {agreement}",
            t - 273.15,
            fil.hot_resistance_ohm,
            fil.hot_to_cold_ratio,
            fil.operating_temperature_k,
            fil.diameter_m * 1e6,
            fil.length_m * 1e3
        ),
        format!("coiled filament: {}", coil_note()),
    ];
    for n in &notes {
        rd.assumptions.push(n.clone());
    }
    let c = geo.wire_heat_capacity_j_per_k();
    Ok((
        ResistanceLaw::Tungsten(fil.wire),
        CoolingLaw::Geometry(geo),
        (
            c,
            "ρ·c·volume of the inferred straight tungsten wire".into(),
        ),
        notes,
        warnings,
    ))
}

#[cfg(test)]
mod tests {
    use crate::design::parse_design;
    use crate::element::{CoolingLaw, ResistanceLaw};

    const REST: &str = r#"
[ambient]
nominal = "20 degC"
[supply]
input = "12 V"
[drive]
kind = "series-resistor"
rail = "input"
series = "100 ohm"
[detector]
trip_airflow = "0.5 m/s"
trip_on = "falling"
"#;

    fn parse(element: &str) -> Result<crate::design::Design, String> {
        parse_design("t.toml", &format!("{REST}\n{element}")).map_err(|d| d.to_string())
    }

    #[test]
    fn material_gives_tcr_and_limit() {
        let d = parse(
            r#"[element]
material = "nickel"
heat_capacity = "10 mJ/K"
[element.resistance]
law = "linear"
r0 = "10 ohm"
[element.cooling]
law = "king"
a = "1 mW/K"
b = "2 mW/K"
n = 0.45
"#,
        )
        .unwrap();
        let ResistanceLaw::Linear(l) = d.element.resistance_law() else {
            panic!("linear expected")
        };
        // physics::materials nickel preset: 0.0060 /K at 20 °C, 600 °C limit.
        assert!((l.alpha_per_k() - 0.006).abs() < 1e-15);
        assert_eq!(d.element.max_temperature_k(), Some(873.15));
        assert!(d.assumptions.iter().any(|a| a.contains("max_temperature")));
    }

    #[test]
    fn misplaced_key_is_rejected_with_field() {
        let e = parse(
            r#"[element]
heat_capacity = "10 mJ/K"
[element.resistance]
law = "beta"
r0 = "10 kohm"
beta = "3950 K"
tcr = "4000 ppm/K"
[element.cooling]
law = "king"
a = "1 mW/K"
b = "2 mW/K"
n = 0.45
"#,
        )
        .unwrap_err();
        assert!(e.contains("element.resistance.tcr"), "{e}");
    }

    #[test]
    fn unknown_key_still_rejected() {
        let e = parse(
            r#"[element]
heat_capacity = "10 mJ/K"
[element.resistance]
law = "linear"
r0 = "10 ohm"
t0 = "20 degC"
tcr = "4000 ppm/K"
colour = "red"
[element.cooling]
law = "king"
a = "1 mW/K"
b = "2 mW/K"
n = 0.45
"#,
        )
        .unwrap_err();
        assert!(e.contains("colour"), "{e}");
    }

    #[test]
    fn datasheet_time_constant_gives_heat_capacity() {
        // C = τ·δ0 (MIL-PRF-23648 definitions): 10 s × 1.5 mW/K = 15 mJ/K.
        let d = parse(
            r#"[element]
[element.resistance]
law = "beta"
r0 = "10 kohm"
beta = "3950 K"
[element.cooling]
law = "datasheet"
dissipation = "1.5 mW/K"
dissipation_moving = "3 mW/K"
moving_airflow = "1 m/s"
time_constant = "10 s"
"#,
        )
        .unwrap();
        assert!((d.element.heat_capacity_j_per_k() - 0.015).abs() < 1e-15);
        assert!(matches!(d.element.cooling_law(), CoolingLaw::Datasheet(_)));
    }
}
