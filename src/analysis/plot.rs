//! The data behind the pictures: the transfer curve (sense voltage against
//! airflow with the switching levels) and the trip airflow against ambient
//! at the rail ends, for the nominal parts. Renderers draw them
//! (`render::svg`).

use super::compensation::Sensing;
use super::corners::{drive_value, tripped_sign};
use super::size::{drive_with, element_rail, SizedCore};
use crate::design::Design;
use crate::element::Environment;
use crate::solve::operating_point;

/// Points along each curve.
pub const CURVE_POINTS: usize = 160;

/// What `size --format svg` draws.
#[derive(Debug, Clone, PartialEq)]
pub struct TransferPlot {
    /// Design title.
    pub title: String,
    /// Airflow of each point, m/s.
    pub airflow_m_per_s: Vec<f64>,
    /// Sense voltage there at nominal ambient and supply, V (`None` where
    /// the element has no steady state).
    pub sense_v: Vec<Option<f64>>,
    /// Sense level at which it trips, V.
    pub trip_level_v: f64,
    /// Sense level at which it releases, V.
    pub release_level_v: f64,
    /// Trip airflow, m/s.
    pub trip_airflow_m_per_s: Option<f64>,
    /// Release airflow, m/s.
    pub release_airflow_m_per_s: Option<f64>,
    /// The trip band, m/s.
    pub band_m_per_s: (f64, f64),
    /// Ambient of each drift point, °C.
    pub ambient_c: Vec<f64>,
    /// Trip airflow at the low rail end, m/s.
    pub trip_low_rail_m_per_s: Vec<Option<f64>>,
    /// Trip airflow at the high rail end, m/s.
    pub trip_high_rail_m_per_s: Vec<Option<f64>>,
}

/// The transfer curve and the drift with ambient for a sized design.
pub fn transfer_plot(design: &Design, core: &SizedCore) -> TransferPlot {
    let (lo, hi) = design.detector.trip_band_m_per_s;
    let u_max = (3.0 * design.detector.trip_airflow_m_per_s).max(1.5 * hi);
    let src = core.drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let airflow: Vec<f64> = (0..CURVE_POINTS)
        .map(|i| u_max * i as f64 / (CURVE_POINTS - 1) as f64)
        .collect();
    let sense = airflow
        .iter()
        .map(|&u| {
            operating_point(&core.element, &core.drive, &core.env, u)
                .ok()
                .map(|p| p.sense_v)
        })
        .collect();
    let sigma = tripped_sign(design, core);
    let u_t = design.detector.trip_airflow_m_per_s;
    let s = &design.supply;
    let rail_end = |high: bool, rail| {
        let (a, b) = s.rail_in_service_v(rail);
        if high {
            b
        } else {
            a
        }
    };
    let n = 41;
    let ambient_k: Vec<f64> = (0..n)
        .map(|i| {
            design.ambient.min_k
                + (design.ambient.max_k - design.ambient.min_k) * i as f64 / (n - 1) as f64
        })
        .collect();
    let trip_at = |t: f64, high: bool| {
        let el_v = element_rail(design).map_or(0.0, |r| rail_end(high, r));
        let drive = drive_with(&design.drive, drive_value(core), el_v);
        let reference = core.reference(rail_end(high, design.detector.reference_rail));
        let env = Environment {
            ambient_k: t,
            ..core.env
        };
        let sensing = Sensing {
            element: &core.element,
            drive: &drive,
            env: &env,
        };
        reference
            .switching(&sensing, core.idle_state, 0.0, u_t, sigma)
            .airflow()
    };
    let bench = core.compensation.front_at(&core.front, &core.env, u_t);
    TransferPlot {
        title: design.title.clone(),
        airflow_m_per_s: airflow,
        sense_v: sense,
        trip_level_v: bench.switching_sense_v(core.trimmer_x, core.idle_state, src),
        release_level_v: bench.switching_sense_v(core.trimmer_x, core.idle_state.other(), src),
        trip_airflow_m_per_s: core.trip_airflow_m_per_s,
        release_airflow_m_per_s: core.release_airflow_m_per_s,
        band_m_per_s: (lo, hi),
        ambient_c: ambient_k.iter().map(|t| t - 273.15).collect(),
        trip_low_rail_m_per_s: ambient_k.iter().map(|&t| trip_at(t, false)).collect(),
        trip_high_rail_m_per_s: ambient_k.iter().map(|&t| trip_at(t, true)).collect(),
    }
}
