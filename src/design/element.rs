//! Reading the `[element]` section: resistance law, cooling law, heat
//! capacity, limits.

use super::model::{Reader, R};
use super::raw;
use crate::element::{CoolingLaw, Element, KingsLaw, LinearTcr, ResistanceLaw};
use crate::quantity::Dimension;

pub(crate) fn build_element(rd: &mut Reader<'_>, e: &raw::RawElement) -> R<(Element, f64)> {
    let laws = ["linear"];
    let res = &e.resistance;
    let resistance =
        match rd.word(&res.law, "element.resistance.law", &laws)? {
            _ => {
                let near = Some(res.law.span());
                let r0 = rd.positive(
                    rd.required(
                        &res.r0,
                        "element.resistance.r0",
                        near.clone(),
                        "R0, e.g. r0 = \"10 ohm\"",
                    )?,
                    "element.resistance.r0",
                    Dimension::Resistance,
                )?;
                let t0 = rd.quantity(
                    rd.required(
                        &res.t0,
                        "element.resistance.t0",
                        near.clone(),
                        "the temperature R0 is given at, e.g. t0 = \"20 degC\"",
                    )?,
                    "element.resistance.t0",
                    Dimension::Temperature,
                )?;
                let tcr_v = rd.required(
                    &res.tcr,
                    "element.resistance.tcr",
                    near,
                    "the temperature coefficient, e.g. tcr = \"4500 ppm/K\"",
                )?;
                let tcr = rd.quantity(
                    tcr_v,
                    "element.resistance.tcr",
                    Dimension::TemperatureCoefficient,
                )?;
                ResistanceLaw::Linear(LinearTcr::new(r0, t0, tcr).map_err(|er| {
                    rd.err(Some(tcr_v.span()), "element.resistance", er.to_string())
                })?)
            }
        };
    let c = &e.cooling;
    let cooling = match rd.word(&c.law, "element.cooling.law", &["king"])? {
        _ => {
            let near = Some(c.law.span());
            let a = rd.non_negative(
                rd.required(
                    &c.a,
                    "element.cooling.a",
                    near.clone(),
                    "King's A (still-air conductance), e.g. a = \"1.2 mW/K\"",
                )?,
                "element.cooling.a",
                Dimension::ThermalConductance,
            )?;
            let b = rd.positive(
                rd.required(
                    &c.b,
                    "element.cooling.b",
                    near.clone(),
                    "King's B (conductance added at 1 m/s), e.g. b = \"2.5 mW/K\"",
                )?,
                "element.cooling.b",
                Dimension::ThermalConductance,
            )?;
            let n_v = rd.required(
                &c.n,
                "element.cooling.n",
                near,
                "King's exponent n, e.g. n = 0.45",
            )?;
            let n = rd.quantity(n_v, "element.cooling.n", Dimension::Fraction)?;
            CoolingLaw::King(
                KingsLaw::new(a, b, n)
                    .map_err(|er| rd.err(Some(n_v.span()), "element.cooling", er.to_string()))?,
            )
        }
    };
    let heat_capacity = rd.positive(
        &e.heat_capacity,
        "element.heat_capacity",
        Dimension::HeatCapacity,
    )?;
    let max_t = rd.opt(&e.max_temperature, |r, v| {
        r.quantity(v, "element.max_temperature", Dimension::Temperature)
    })?;
    let tolerance = rd.or_default(
        &e.tolerance,
        0.0,
        "element.tolerance not given: the element's resistance is taken as exact (0 %)",
        |r, v| r.fraction_in(v, "element.tolerance", 0.0, 0.5),
    )?;
    let element = Element::new(resistance, cooling, heat_capacity, max_t).map_err(|er| {
        rd.err(
            e.max_temperature
                .as_ref()
                .map(|v| v.span())
                .or(Some(e.heat_capacity.span())),
            "element",
            er.to_string(),
        )
    })?;
    Ok((element, tolerance))
}
