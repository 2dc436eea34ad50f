//! Speed of the two solves that later tolerance runs repeat millions of
//! times: one operating point, one trip airflow. Run with `cargo bench`.

use divan::black_box;
use draftwire::drive::Drive;
use draftwire::element::cooling::{GeometryCooling, Shape};
use draftwire::element::{CoolingLaw, Element, Environment, KingsLaw, LinearTcr, ResistanceLaw};
use draftwire::physics::convection::{ForcedCorrelation, NaturalCorrelation};
use draftwire::physics::materials::Material;
use draftwire::physics::platinum::CallendarVanDusen;
use draftwire::physics::tungsten::TungstenWire;
use draftwire::solve::{airflow_by_search, airflow_for_sense, operating_point};

fn main() {
    divan::main();
}

/// Invented example element: 8 Ω nickel-like wire, King's law.
fn element() -> Element {
    Element::new(
        ResistanceLaw::Linear(LinearTcr::new(8.0, 293.15, 0.006).unwrap()),
        CoolingLaw::King(KingsLaw::new(1.2e-3, 2.4e-3, 0.45).unwrap()),
        0.03,
        None,
    )
    .unwrap()
}

#[divan::bench]
fn operating_point_solve(bencher: divan::Bencher) {
    let el = element();
    let env = Environment::at(295.15);
    let drive = Drive::SeriesResistor {
        rail_v: 5.0,
        series_ohm: 51.0,
    };
    bencher.bench(|| {
        operating_point(
            black_box(&el),
            black_box(&drive),
            black_box(&env),
            black_box(0.5),
        )
        .unwrap()
    });
}

#[divan::bench]
fn trip_airflow_solve(bencher: divan::Bencher) {
    let el = element();
    let env = Environment::at(295.15);
    let drive = Drive::SeriesResistor {
        rail_v: 5.0,
        series_ohm: 51.0,
    };
    let level = operating_point(&el, &drive, &env, 0.5).unwrap().sense_v;
    bencher.bench(|| {
        airflow_for_sense(
            black_box(&el),
            black_box(&drive),
            black_box(&env),
            black_box(level),
            0.4,
        )
        .unwrap()
    });
}

/// The same trip airflow by the bracketed search alone (what the inversion
/// replaced for King's-law cooling; still the path for geometry cooling).
#[divan::bench]
fn trip_airflow_search(bencher: divan::Bencher) {
    let el = element();
    let env = Environment::at(295.15);
    let drive = Drive::SeriesResistor {
        rail_v: 5.0,
        series_ohm: 51.0,
    };
    let level = operating_point(&el, &drive, &env, 0.5).unwrap().sense_v;
    bencher.bench(|| {
        airflow_by_search(
            black_box(&el),
            black_box(&drive),
            black_box(&env),
            black_box(level),
            0.4,
        )
        .unwrap()
    });
}

/// Invented example element: a 25 µm × 30 mm platinum wire (IEC 60751 law)
/// cooled by the geometry model (Churchill & Bernstein, Churchill & Chu,
/// radiation), the costliest cooling law per evaluation.
fn platinum_wire() -> Element {
    let cooling = GeometryCooling::new(
        Shape::StraightWire,
        25e-6,
        30e-3,
        Material::Platinum,
        ForcedCorrelation::ChurchillBernstein,
        NaturalCorrelation::ChurchillChu,
        None,
        0.0,
    )
    .unwrap();
    Element::new(
        ResistanceLaw::Platinum(CallendarVanDusen::iec60751(6.0).unwrap()),
        CoolingLaw::Geometry(cooling),
        4e-5,
        None,
    )
    .unwrap()
}

#[divan::bench]
fn operating_point_solve_geometry(bencher: divan::Bencher) {
    let el = platinum_wire();
    let env = Environment::at(293.15);
    let drive = Drive::SeriesResistor {
        rail_v: 5.0,
        series_ohm: 30.0,
    };
    bencher.bench(|| {
        operating_point(
            black_box(&el),
            black_box(&drive),
            black_box(&env),
            black_box(2.0),
        )
        .unwrap()
    });
}

/// Invented example element: a 10 µm × 20 mm tungsten wire (Forsythe &
/// Worthing table) cooled by Collis & Williams and Morgan, radiation and
/// its supports: the "tungsten wire" case.
fn tungsten_wire() -> Element {
    let cooling = GeometryCooling::new(
        Shape::StraightWire,
        10e-6,
        20e-3,
        Material::Tungsten,
        ForcedCorrelation::CollisWilliams,
        NaturalCorrelation::Morgan,
        None,
        2e-5,
    )
    .unwrap();
    Element::new(
        ResistanceLaw::Tungsten(TungstenWire::new(14.0, 293.15).unwrap()),
        CoolingLaw::Geometry(cooling),
        1e-5,
        None,
    )
    .unwrap()
}

const TUNGSTEN_DRIVE: Drive = Drive::SeriesResistor {
    rail_v: 5.0,
    series_ohm: 47.0,
};

#[divan::bench]
fn operating_point_solve_tungsten(bencher: divan::Bencher) {
    let el = tungsten_wire();
    let env = Environment::at(293.15);
    bencher.bench(|| {
        operating_point(
            black_box(&el),
            black_box(&TUNGSTEN_DRIVE),
            black_box(&env),
            black_box(1.0),
        )
        .unwrap()
    });
}

#[divan::bench]
fn trip_airflow_solve_tungsten(bencher: divan::Bencher) {
    let el = tungsten_wire();
    let env = Environment::at(293.15);
    let level = operating_point(&el, &TUNGSTEN_DRIVE, &env, 1.0)
        .unwrap()
        .sense_v;
    bencher.bench(|| {
        airflow_for_sense(
            black_box(&el),
            black_box(&TUNGSTEN_DRIVE),
            black_box(&env),
            black_box(level),
            0.8,
        )
        .unwrap()
    });
}

#[divan::bench]
fn trip_airflow_solve_geometry(bencher: divan::Bencher) {
    let el = platinum_wire();
    let env = Environment::at(293.15);
    let drive = Drive::SeriesResistor {
        rail_v: 5.0,
        series_ohm: 30.0,
    };
    let level = operating_point(&el, &drive, &env, 2.0).unwrap().sense_v;
    bencher.bench(|| {
        airflow_for_sense(
            black_box(&el),
            black_box(&drive),
            black_box(&env),
            black_box(level),
            1.5,
        )
        .unwrap()
    });
}
