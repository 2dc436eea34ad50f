//! Drift of the trip point with ambient temperature, supply and part
//! tolerances, read off the condition grid, and what a ratiometric
//! reference cancels.

use super::assemble::to_c;
use super::compensation::{Reference, Sensing};
use super::corners::{tripped_sign, unit_rail_v, Grid, Outcome, Site, Switching};
use super::size::{drive_with, element_rail, SizedCore};
use crate::design::model::Design;
use crate::element::Environment;
use crate::report::DriftRow;

fn row(design: &Design, core: &SizedCore, grid: &Grid, o: &Outcome, label: String) -> DriftRow {
    let site = &grid.sites[o.site];
    let u_nom = core.trip_airflow_m_per_s;
    let u = o.trip.airflow();
    // The rails this unit sees: its own regulator's offset included.
    let b = &grid.builds[o.build];
    DriftRow {
        condition: label,
        ambient_c: to_c(site.ambient_k),
        element_rail_v: unit_rail_v(design, b, element_rail(design), site.element_rail_v),
        reference_rail_v: unit_rail_v(
            design,
            b,
            Some(design.detector.reference_rail),
            site.reference_rail_v,
        ),
        corner: grid.builds[o.build].label.clone(),
        offset_v: o.offset_v,
        trip_airflow_m_per_s: u,
        // A condition that never trips cannot release.
        release_airflow_m_per_s: u.and(o.release.airflow()),
        shift_m_per_s: u.zip(u_nom).map(|(u, n)| u - n),
        tripped_in_still_air: tripped_still(&o.trip),
        note: note(design, &o.trip, u_nom),
        comparison_only: false,
        uncompensated_trip_airflow_m_per_s: None,
        uncompensated_note: None,
    }
}

/// Whether still air lies on the tripped side.
fn tripped_still(s: &Switching) -> bool {
    match s {
        Switching::AlwaysTripped => true,
        Switching::At(u) => *u <= 0.0,
        _ => false,
    }
}

fn note(design: &Design, s: &Switching, nominal: Option<f64>) -> String {
    let (lo, hi) = design.detector.trip_band_m_per_s;
    match s {
        Switching::At(u) => {
            let where_ = if *u < lo {
                "below the band"
            } else if *u > hi {
                "above the band"
            } else {
                "inside the band"
            };
            match nominal {
                Some(n) if (u - n).abs() >= 1e-4 => format!(
                    "{where_}; {} by {:.3} m/s",
                    if *u > n { "rises" } else { "falls" },
                    (u - n).abs()
                ),
                _ => where_.to_string(),
            }
        }
        other => other.describe(),
    }
}

/// Where the nominal build, trimmed on target, trips at every site.
pub fn nominal_at_sites(design: &Design, core: &SizedCore, sites: &[Site]) -> Vec<Switching> {
    let sigma = tripped_sign(design, core);
    let u_t = design.detector.trip_airflow_m_per_s;
    let value = super::corners::drive_value(core);
    sites
        .iter()
        .map(|site| {
            let drive = drive_with(&design.drive, value, site.element_rail_v);
            let env = Environment {
                ambient_k: site.ambient_k,
                ..core.env
            };
            let sensing = Sensing {
                element: &core.element,
                drive: &drive,
                env: &env,
            };
            core.reference(site.reference_rail_v).switching(
                &sensing,
                core.idle_state,
                0.0,
                u_t,
                sigma,
            )
        })
        .collect()
}

/// The drift span: the largest minus the smallest trip airflow of the
/// nominal build over every site (`None` when some site never switches).
pub fn span(trips: &[Switching]) -> Option<f64> {
    let us: Option<Vec<f64>> = trips.iter().map(|s| s.airflow()).collect();
    let us = us?;
    let lo = us.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = us.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    (lo <= hi).then_some(hi - lo)
}

/// The nominal build's trips at every site, read off the grid.
pub fn grid_nominal(grid: &Grid) -> Vec<Switching> {
    grid.outcomes
        .iter()
        .filter(|o| o.build == 0 && o.offset_v == 0.0)
        .map(|o| o.trip.clone())
        .collect()
}

/// Drift rows: the nominal parts at every site (beside the uncompensated
/// design's trip there, when compensated), the builds that trip lowest and
/// highest anywhere, and the ratiometric comparison.
pub fn drift(
    design: &Design,
    core: &SizedCore,
    grid: &Grid,
    uncompensated: Option<&[Switching]>,
) -> Vec<DriftRow> {
    // A site that differs from an earlier one only in a rail the trip
    // point does not see (the comparator's own supply) repeats its row.
    let mut seen: Vec<(f64, f64, f64)> = Vec::new();
    let mut rows: Vec<DriftRow> = grid
        .outcomes
        .iter()
        .filter(|o| o.build == 0 && o.offset_v == 0.0)
        .filter(|o| {
            let s = &grid.sites[o.site];
            let key = (s.ambient_k, s.element_rail_v, s.reference_rail_v);
            let new = !seen.contains(&key);
            seen.push(key);
            new
        })
        .map(|o| {
            let mut r = row(design, core, grid, o, grid.sites[o.site].label.clone());
            r.uncompensated_trip_airflow_m_per_s = uncompensated
                .and_then(|u| u.get(o.site))
                .and_then(|s| s.airflow());
            r.uncompensated_note = uncompensated
                .and_then(|u| u.get(o.site))
                .map(|s| note(design, s, Some(design.detector.trip_airflow_m_per_s)));
            r
        })
        .collect();
    // The extremes over every build, site and offset drift.
    let key = |o: &&Outcome| match o.trip {
        Switching::At(u) => u,
        Switching::AlwaysTripped => f64::NEG_INFINITY,
        Switching::NeverTrips | Switching::Unsolved(_) => f64::INFINITY,
    };
    // The first of near-equal outcomes (float noise between builds that
    // trim to the same point) is kept, so the row does not flip.
    let tie = super::checks::trip::TIE_M_PER_S;
    let pick = |better: &dyn Fn(f64, f64) -> bool| {
        grid.outcomes
            .iter()
            .fold(None::<&Outcome>, |best, o| match best {
                Some(b) if !better(key(&o), key(&b)) => Some(b),
                _ => Some(o),
            })
    };
    if let Some(o) = pick(&|a, b| a < b - tie) {
        let label = format!("lowest trip point: {}", grid.sites[o.site].label);
        rows.push(row(design, core, grid, o, label));
    }
    if let Some(o) = pick(&|a, b| a > b + tie) {
        let label = format!("highest trip point: {}", grid.sites[o.site].label);
        rows.push(row(design, core, grid, o, label));
    }
    rows.extend(ratiometric_rows(design, core));
    rows
}

/// The element rail at its low end with the reference (a) tracking it, (b)
/// held at its nominal voltage: what a ratiometric reference cancels.
fn ratiometric_rows(design: &Design, core: &SizedCore) -> Vec<DriftRow> {
    let s = &design.supply;
    let Some(er) = element_rail(design) else {
        return Vec::new();
    };
    let ref_rail = design.detector.reference_rail;
    // The rail's in-service low end (a regulator's own offset is trimmed
    // out on the bench).
    let (lo, _) = s.rail_in_service_v(er);
    if lo == s.rail_v(er) {
        return Vec::new();
    }
    let nominal_ref = s.rail_v(ref_rail);
    let sigma = tripped_sign(design, core);
    let u_t = design.detector.trip_airflow_m_per_s;
    let src = core.drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let value = super::corners::drive_value(core);
    let drive = drive_with(&design.drive, value, lo);
    let env = Environment {
        ambient_k: design.ambient.nominal_k,
        ..core.env
    };
    let mut out = Vec::new();
    for (label, ref_v, comparison_only) in [
        (
            "element rail low, reference tracking it (ratiometric)",
            nominal_ref * lo / s.rail_v(er),
            er != ref_rail,
        ),
        (
            "element rail low, reference held (not ratiometric)",
            nominal_ref,
            er == ref_rail,
        ),
    ] {
        let reference = Reference {
            sense_source_ohm: src,
            ..core.reference(ref_v)
        };
        let sensing = Sensing {
            element: &core.element,
            drive: &drive,
            env: &env,
        };
        let trip = reference.switching(&sensing, core.idle_state, 0.0, u_t, sigma);
        let release = reference.switching(&sensing, core.idle_state.other(), 0.0, u_t, sigma);
        let u = trip.airflow();
        out.push(DriftRow {
            condition: label.into(),
            ambient_c: to_c(env.ambient_k),
            element_rail_v: lo,
            reference_rail_v: ref_v,
            corner: "nominal parts".into(),
            offset_v: 0.0,
            trip_airflow_m_per_s: u,
            release_airflow_m_per_s: u.and(release.airflow()),
            shift_m_per_s: u.zip(core.trip_airflow_m_per_s).map(|(u, n)| u - n),
            tripped_in_still_air: tripped_still(&trip),
            note: note(design, &trip, core.trip_airflow_m_per_s),
            comparison_only,
            uncompensated_trip_airflow_m_per_s: None,
            uncompensated_note: None,
        });
    }
    out
}

/// Trip-point drift with ambient, m/s per K: the comparator's switching
/// level (trimmer held at its sized setting, rails nominal) is held and the
/// trip airflow re-solved at ambient ± 1 K; central difference.
pub fn ambient_slope(design: &Design, core: &SizedCore) -> Option<f64> {
    let value = match core.drive {
        crate::drive::Drive::SeriesResistor { series_ohm, .. } => series_ohm,
        crate::drive::Drive::ConstantCurrent { current_a } => current_a,
    };
    let rail_v = match core.drive {
        crate::drive::Drive::SeriesResistor { rail_v, .. } => rail_v,
        crate::drive::Drive::ConstantCurrent { .. } => 0.0,
    };
    let drive = drive_with(&design.drive, value, rail_v);
    let src = drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let reference = Reference {
        sense_source_ohm: src,
        ..core.reference(core.front.reference_rail_v)
    };
    let sigma = super::corners::tripped_sign(design, core);
    let at = |dt: f64| {
        let env = Environment {
            ambient_k: core.env.ambient_k + dt,
            ..core.env
        };
        let sensing = Sensing {
            element: &core.element,
            drive: &drive,
            env: &env,
        };
        reference
            .switching(
                &sensing,
                core.idle_state,
                0.0,
                core.trip_airflow_m_per_s
                    .unwrap_or(design.detector.trip_airflow_m_per_s),
                sigma,
            )
            .airflow()
    };
    match (at(1.0), at(-1.0)) {
        (Some(hi), Some(lo)) => Some(0.5 * (hi - lo)),
        _ => None,
    }
}
