//! The `draftwire` binary run as a process: every example in text and JSON,
//! and bad inputs with their messages and exit status.

use assert_cmd::Command;
use predicates::prelude::*;
use std::path::{Path, PathBuf};

fn draftwire() -> Command {
    let mut c = Command::cargo_bin("draftwire").unwrap();
    c.env_remove("RUST_BACKTRACE");
    c
}

fn examples() -> Vec<PathBuf> {
    let mut v: Vec<PathBuf> =
        std::fs::read_dir(Path::new(env!("CARGO_MANIFEST_DIR")).join("examples"))
            .unwrap()
            .map(|e| e.unwrap().path())
            .filter(|p| p.extension().is_some_and(|e| e == "toml"))
            .collect();
    v.sort();
    v
}

/// A per-test scratch directory holding one design file.
fn write_design(test: &str, text: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("draftwire-cli-{}-{test}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("design.toml");
    std::fs::write(&path, text).unwrap();
    path
}

/// Replace the value of the first line `key = …` in a design file's text.
fn set_key(text: &str, key: &str, value: &str) -> String {
    let mut done = false;
    text.lines()
        .map(|l| {
            if !done && l.trim_start().starts_with(&format!("{key} =")) {
                done = true;
                format!("{key} = {value}")
            } else {
                l.to_string()
            }
        })
        .collect::<Vec<_>>()
        .join("\n")
}

fn greenhouse() -> String {
    std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/greenhouse-fan-alarm.toml"),
    )
    .unwrap()
}

#[test]
fn every_example_sizes_in_text() {
    let all = examples();
    assert!(all.len() >= 2, "at least two bundled examples");
    for ex in all {
        let out = draftwire().arg("size").arg(&ex).output().unwrap();
        let code = out.status.code().unwrap();
        assert!(
            code == 0 || code == 1,
            "{}: exit {code}: {}",
            ex.display(),
            String::from_utf8_lossy(&out.stderr)
        );
        let text = String::from_utf8(out.stdout).unwrap();
        for section in [
            "Element operating points",
            "Trip point",
            "Bill of values",
            "Design checks",
            "Cautions",
        ] {
            assert!(
                text.contains(section),
                "{}: no '{section}' section",
                ex.display()
            );
        }
        assert!(text.contains("flammable"), "ignition caution always shown");
        assert!(
            !text.contains("NaN") && !text.contains("inf "),
            "{}: non-finite number printed",
            ex.display()
        );
        assert_eq!(
            code == 0,
            text.contains("PASS"),
            "{}: exit status agrees with the verdict",
            ex.display()
        );
    }
}

#[test]
fn every_example_sizes_in_json_with_units_in_keys() {
    for ex in examples() {
        let out = draftwire()
            .args(["size", "--format", "json"])
            .arg(&ex)
            .output()
            .unwrap();
        let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        let points = v["operating_points"].as_array().unwrap();
        assert_eq!(points.len(), 4, "still air, ½·trip, trip, 2·trip");
        for key in [
            "airflow_m_per_s",
            "element_temperature_c",
            "element_resistance_ohm",
            "element_current_a",
            "element_power_w",
            "sense_voltage_v",
            "overheat_ratio",
        ] {
            assert!(
                points[0][key].is_number(),
                "{}: operating_points[0].{key}",
                ex.display()
            );
        }
        for key in [
            "airflow_m_per_s",
            "reference_voltage_v",
            "sensitivity_v_per_m_per_s",
        ] {
            assert!(v["trip"][key].is_number(), "{}: trip.{key}", ex.display());
        }
        for row in v["values"].as_array().unwrap() {
            assert!(
                row["designator"].is_string() && row["part"].is_string() && row["text"].is_string()
            );
            assert!(row["e_series"].is_string());
            let has_value = ["value_ohm", "value_a", "value_f", "value_v"]
                .iter()
                .any(|k| row[k].is_number());
            assert!(
                has_value
                    || row["part"].as_str().unwrap().contains("transistor")
                    || row["part"].as_str().unwrap().contains("comparator")
                    || row["part"].as_str().unwrap().contains("regulator")
                    || row["part"].as_str().unwrap().contains("LED")
                    || row["part"].as_str().unwrap().contains("element")
                    || row["part"].as_str().unwrap().contains("diode"),
                "{}: value row {row}",
                ex.display()
            );
        }
        // Every check carries the fields a script reads, its id is
        // documented in docs/cli.md, and no id repeats.
        let docs =
            std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("docs/cli.md"))
                .unwrap();
        let mut ids = std::collections::BTreeSet::new();
        for c in v["checks"].as_array().unwrap() {
            for key in [
                "id",
                "name",
                "passed",
                "value",
                "limit",
                "margin",
                "unit",
                "condition",
                "detail",
            ] {
                assert!(
                    c.get(key).is_some(),
                    "{}: check without {key}: {c}",
                    ex.display()
                );
            }
            let id = c["id"].as_str().unwrap();
            assert!(
                ids.insert(id.to_string()),
                "{}: id {id} twice",
                ex.display()
            );
            let documented = if let Some(rest) = id.strip_prefix("power-rating-") {
                !rest.is_empty() && docs.contains("`power-rating-")
            } else {
                docs.contains(&format!("`{id}`"))
            };
            assert!(documented, "check id {id} is not in docs/cli.md");
            let listed = draftwire::analysis::checks::CHECK_IDS
                .iter()
                .any(|k| *k == id || (k.ends_with('-') && id.starts_with(k)));
            assert!(
                listed,
                "check id {id} is not in analysis::checks::CHECK_IDS"
            );
            assert!(c["passed"].is_boolean());
            for key in ["value", "limit", "margin"] {
                assert!(c[key].is_null() || c[key].as_f64().unwrap().is_finite());
            }
        }
        for key in ["schema_version", "tool_version", "design_file", "passed"] {
            assert!(v.get(key).is_some(), "{}: no {key}", ex.display());
        }
        assert!(v["trip"]["band_m_per_s"].as_array().unwrap().len() == 2);
        assert!(v["trip"]["background_airflow_m_per_s"].is_number());
        for d in v["drift"].as_array().unwrap() {
            for key in [
                "condition",
                "ambient_c",
                "element_rail_v",
                "reference_rail_v",
                "corner",
                "trip_airflow_m_per_s",
            ] {
                assert!(
                    d.get(key).is_some(),
                    "{}: drift row without {key}",
                    ex.display()
                );
            }
        }
        assert!(!v["cautions"].as_array().unwrap().is_empty());
        let passed = v["checks"]
            .as_array()
            .unwrap()
            .iter()
            .all(|c| c["passed"].as_bool().unwrap());
        assert_eq!(out.status.code().unwrap(), if passed { 0 } else { 1 });
    }
}

#[test]
fn csv_tables_have_headers() {
    let ex = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/greenhouse-fan-alarm.toml");
    for (table, header) in [
        ("values", "designator,function,part,value_ohm"),
        ("connections", "designator,pin,node"),
        ("operating-points", "label,airflow_m_per_s"),
        (
            "checks",
            "id,name,passed,value,limit,margin,unit,condition,detail",
        ),
        ("drift", "condition,ambient_c"),
    ] {
        draftwire()
            .args(["size", "--format", "csv", "--table", table])
            .arg(&ex)
            .assert()
            .stdout(predicate::str::starts_with(header));
    }
}

#[test]
fn missing_unit_is_an_input_error_pointing_at_the_value() {
    let text = greenhouse().replace("r0 = \"8 ohm\"", "r0 = \"8\"");
    let path = write_design("missing-unit", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("element.resistance.r0"))
        .stderr(predicate::str::contains("missing unit"))
        .stderr(predicate::str::contains("r0 = \"8\""))
        .stderr(predicate::str::contains("^^^"));
}

#[test]
fn bare_number_is_a_missing_unit() {
    let text = greenhouse().replace("input = \"12 V\"", "input = 12");
    let path = write_design("bare-number", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("supply.input"))
        .stderr(predicate::str::contains("missing unit"));
}

#[test]
fn wrong_unit_names_both_dimensions() {
    let text = greenhouse().replace("r0 = \"8 ohm\"", "r0 = \"8 V\"");
    let path = write_design("wrong-unit", &text);
    let line = text.lines().position(|l| l.starts_with("r0 =")).unwrap() + 1;
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains(format!("design.toml:{line}:6")))
        .stderr(predicate::str::contains("voltage"))
        .stderr(predicate::str::contains("resistance"));
}

#[test]
fn unknown_key_gets_a_did_you_mean() {
    let text = greenhouse().replace("series = \"auto\"", "serie = \"auto\"");
    let path = write_design("unknown-key", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("unknown field `serie`"))
        .stderr(predicate::str::contains("did you mean `series`?"));
}

#[test]
fn unknown_word_gets_a_did_you_mean() {
    let text = greenhouse().replace("trip_on = \"falling\"", "trip_on = \"faling\"");
    let path = write_design("unknown-word", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("detector.trip_on"))
        .stderr(predicate::str::contains("did you mean \"falling\"?"));
}

#[test]
fn malformed_toml_is_an_input_error_with_position() {
    let text = greenhouse().replace("nominal = \"22 degC\"", "nominal = \"22 degC");
    let path = write_design("malformed", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("design.toml:"));
}

#[test]
fn missing_file_is_an_input_error() {
    draftwire()
        .args(["size", "no/such/design.toml"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "cannot read design file no/such/design.toml",
        ));
}

#[test]
fn rail_too_low_is_a_design_failure() {
    // Asking for 1500 K of overheat from a 5 V rail cannot be met.
    let text = set_key(&greenhouse(), "overheat_rise", "\"1500 K\"");
    let path = write_design("rail-too-low", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(1)
        .stderr(predicate::str::contains(
            "cannot drive the element to the wanted overheat",
        ));
}

#[test]
fn closed_pipe_is_not_an_error() {
    // `draftwire … | head` must not panic: write to a pipe nobody reads.
    let ex = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/greenhouse-fan-alarm.toml");
    let out = std::process::Command::new(assert_cmd::cargo::cargo_bin("draftwire"))
        .arg("size")
        .arg(&ex)
        .stdout(std::process::Stdio::piped())
        .spawn()
        .and_then(|mut child| {
            drop(child.stdout.take());
            child.wait_with_output()
        })
        .unwrap();
    assert!(!String::from_utf8_lossy(&out.stderr).contains("panicked"));
}

#[test]
fn trimmer_that_cannot_reach_the_target_fails_the_design() {
    // Fixed divider values whose wiper tops out near 1 % of the rail while
    // the trip needs about 15 %: the trimmer cannot reach the target.
    let text = greenhouse()
        .replace("top = \"auto\"", "top = \"470K\"")
        .replace("trimmer = \"auto\"", "trimmer = \"1K\"")
        .replace("bottom = \"auto\"", "bottom = \"4K7\"");
    let path = write_design("trimmer-cannot-reach", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(1)
        .stdout(predicate::str::contains("FAIL trimmer reaches the target"))
        .stdout(predicate::str::contains("outside 0–100 %"));
}

#[test]
fn given_trimmer_position_is_analysed_as_it_is() {
    let text = greenhouse().replace(
        "bottom = \"auto\"",
        "bottom = \"auto\"\ntrimmer_position = \"45 %\"",
    );
    let path = write_design("given-position", &text);
    let out = draftwire()
        .args(["size", "--format", "json"])
        .arg(&path)
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!((v["trip"]["trimmer_position_percent"].as_f64().unwrap() - 45.0).abs() < 1e-9);
    let achieved = v["trip"]["airflow_m_per_s"].as_f64().unwrap();
    // Round trip: with the same parts fixed and the trimmer left to the
    // sizing, a target of the achieved airflow puts the trimmer back at
    // 45 % (the switching level is affine in the wiper position).
    let ohm = |d: &str| {
        let row = v["values"]
            .as_array()
            .unwrap()
            .iter()
            .find(|r| r["function"] == role_function(d))
            .unwrap();
        format!("\"{} ohm\"", row["value_ohm"].as_f64().unwrap())
    };
    let back = greenhouse()
        .replace(
            "trip_airflow = \"0.5 m/s\"",
            &format!("trip_airflow = \"{achieved} m/s\""),
        )
        .replace("series = \"auto\"", &format!("series = {}", ohm("RS1")))
        .replace("overheat_rise = \"150 K\"\n", "")
        .replace("top = \"auto\"", &format!("top = {}", ohm("RR1")))
        .replace("trimmer = \"auto\"", &format!("trimmer = {}", ohm("RV1")))
        .replace(
            "bottom = \"auto\"",
            &format!("bottom = {}\nfeedback = {}", ohm("RR2"), ohm("RF1")),
        );
    let path = write_design("given-position-back", &back);
    let out = draftwire()
        .args(["size", "--format", "json"])
        .arg(&path)
        .output()
        .unwrap();
    let w: serde_json::Value = serde_json::from_slice(&out.stdout)
        .unwrap_or_else(|e| panic!("{e}: {}", String::from_utf8_lossy(&out.stderr)));
    let x = w["trip"]["trimmer_position_percent"].as_f64().unwrap();
    // Within 0.001 % of travel: the sense node's source resistance is
    // taken at the target airflow, which differs between the two runs.
    assert!((x - 45.0).abs() < 1e-3, "{x} %");
}

fn manifest(p: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join(p)
}

#[test]
fn compare_puts_candidates_side_by_side() {
    let out = draftwire()
        .arg("compare")
        .arg(manifest("examples/duct-platinum-wire.toml"))
        .arg("--candidates")
        .arg(manifest("examples/candidates/element-candidates.toml"))
        .output()
        .unwrap();
    let text = String::from_utf8(out.stdout).unwrap();
    for label in [
        "nickel wire 25 um",
        "NTC bead 1k",
        "Pt100 chip",
        "trip drift m/s per K",
        "safe in air",
    ] {
        assert!(text.contains(label), "missing '{label}' in:\n{text}");
    }
    // The Pt100 chip runs in its own constant-current drive, and every
    // candidate is judged by the design checks: the duct design fails its
    // band, so the comparison exits 1.
    assert!(text.contains("(its own)"));
    assert!(text.contains("design checks passed"));
    assert_eq!(out.status.code(), Some(1));
}

#[test]
fn compare_json_and_csv_carry_units_in_their_keys() {
    let args = |fmt: &str| {
        let mut c = draftwire();
        c.arg("compare")
            .arg(manifest("examples/duct-platinum-wire.toml"))
            .arg("--candidates")
            .arg(manifest("examples/candidates/element-candidates.toml"))
            .args(["--format", fmt]);
        c
    };
    let out = args("json").output().unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let rows = v["rows"].as_array().unwrap();
    assert_eq!(
        rows.len(),
        4,
        "the design's own element and three candidates"
    );
    for key in [
        "still_air_temperature_c",
        "still_air_power_w",
        "sensitivity_v_per_m_per_s",
        "trip_drift_m_per_s_per_k",
        "time_constant_s",
    ] {
        assert!(rows[0][key].is_number(), "rows[0].{key}");
    }
    for r in rows {
        assert!(r["checks_total"].as_u64().unwrap() >= 1);
        assert!(r["failed_checks"].is_array() && r["passed"].is_boolean());
    }
    args("csv").assert().stdout(predicate::str::starts_with(
        "label,element,tolerance_percent",
    ));
}

#[test]
fn compare_rejects_a_bad_candidates_file() {
    let path = write_design(
        "bad-candidates",
        "[[candidate]]\nlabel = \"x\"\nmaterial = \"nikel\"\n",
    );
    draftwire()
        .arg("compare")
        .arg(manifest("examples/duct-platinum-wire.toml"))
        .arg("--candidates")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("design.toml:"));
}

#[test]
fn a_key_of_another_load_is_rejected() {
    // The greenhouse output drives a relay; an LED key there is a mistake.
    let text = greenhouse().replace(
        "load = \"relay\"",
        "load = \"relay\"\nled_current = \"5 mA\"",
    );
    let path = write_design("foreign-output-key", &text);
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("output.led_current"))
        .stderr(predicate::str::contains(
            "belongs to a led load, but this output drives a relay",
        ));
}

#[test]
fn auto_output_stage_is_explained_in_the_assumptions() {
    let out = draftwire()
        .args(["size", "--format", "json"])
        .arg(manifest("examples/greenhouse-fan-alarm.toml"))
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let assumptions: Vec<&str> = v["assumptions"]
        .as_array()
        .unwrap()
        .iter()
        .map(|a| a.as_str().unwrap())
        .collect();
    assert!(
        assumptions
            .iter()
            .any(|a| a.starts_with("output.stage \"auto\": an NPN low-side switch")),
        "{assumptions:?}"
    );
}

#[test]
fn a_key_the_law_does_not_take_is_rejected_where_it_stands() {
    // King's law takes a, b, n; a wire diameter there is a mistake.
    let text = greenhouse().replace("n = 0.45", "n = 0.45\ndiameter = \"25 um\"");
    let path = write_design("unused-law-key", &text);
    let line = text
        .lines()
        .position(|l| l.starts_with("diameter ="))
        .unwrap()
        + 1;
    draftwire()
        .arg("size")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains(format!(
            "design.toml:{line}:12: element.cooling.diameter"
        )))
        .stderr(predicate::str::contains(
            "`diameter` is not used by law \"king\"",
        ));
}

/// A design path of `-` reads standard input; `-o FILE` writes the result
/// to the file and nothing to standard output; errors name `<stdin>`.
#[test]
fn design_from_stdin_and_output_to_a_file() {
    let text = std::fs::read_to_string(manifest("examples/server-cabinet-airflow.toml")).unwrap();
    let dir = std::env::temp_dir().join("draftwire-cli-stdin");
    std::fs::create_dir_all(&dir).unwrap();
    let out_file = dir.join("report.json");
    let out = draftwire()
        .args(["size", "-", "--format", "json", "-o"])
        .arg(&out_file)
        .write_stdin(text)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(0));
    assert!(out.stdout.is_empty());
    let v: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&out_file).unwrap()).unwrap();
    assert_eq!(v["design_file"], "<stdin>");
    assert_eq!(v["passed"], true);
    draftwire()
        .args(["size", "-"])
        .write_stdin("x = 1\n")
        .assert()
        .code(2)
        .stderr(predicate::str::contains("<stdin>:1:1"));
}

/// Every id in the code's list is documented in docs/cli.md, and every
/// id the list names is unique.
#[test]
fn every_listed_check_id_is_documented() {
    let docs =
        std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("docs/cli.md")).unwrap();
    let ids = draftwire::analysis::checks::CHECK_IDS;
    let mut seen = std::collections::BTreeSet::new();
    for id in ids {
        assert!(seen.insert(*id), "{id} listed twice");
        assert!(
            docs.contains(&format!("`{id}")),
            "{id} is not in docs/cli.md"
        );
    }
    for id in ["energy-balance", "trip-on-target"] {
        assert!(
            docs.contains(&format!("`{id}`")),
            "diagnostic {id} is not in docs/cli.md"
        );
    }
}

/// `--set` gives the same report as editing the file, apart from the
/// assumptions that list the override; a bad override points at itself.
#[test]
fn set_overrides_match_an_edited_file() {
    let text = greenhouse();
    let edited = text.replace("trip_airflow = \"0.5 m/s\"", "trip_airflow = \"0.6 m/s\"");
    assert_ne!(text, edited);
    let a = draftwire()
        .args(["size", "--format", "json"])
        .arg(write_design("set-edited", &edited))
        .output()
        .unwrap();
    let path = write_design("set-override", &text);
    let b = draftwire()
        .args([
            "size",
            "--format",
            "json",
            "--set",
            "detector.trip_airflow=0.6 m/s",
        ])
        .arg(&path)
        .output()
        .unwrap();
    let mut va: serde_json::Value = serde_json::from_slice(&a.stdout).unwrap();
    let mut vb: serde_json::Value = serde_json::from_slice(&b.stdout).unwrap();
    let notes = vb["assumptions"].as_array().unwrap().clone();
    assert!(notes
        .iter()
        .any(|n| n == "detector.trip_airflow = 0.6 m/s (set on the command line)"));
    for v in [&mut va, &mut vb] {
        v["assumptions"] = serde_json::Value::Null;
        v["design_file"] = serde_json::Value::Null;
    }
    assert_eq!(va, vb);
    draftwire()
        .args(["size", "--set", "detector.trip_airflow=0.6 furlongs"])
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("--set:1:23"))
        .stderr(predicate::str::contains(
            "detector.trip_airflow=0.6 furlongs",
        ));
    draftwire()
        .args(["size", "--set", "no-equals-sign"])
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("expected KEY=VALUE"));
}

/// Completions for every shell clap_complete knows and the roff manual are
/// generated non-empty and name the commands.
#[test]
fn completions_and_manual_are_generated() {
    for shell in ["bash", "zsh", "fish", "powershell", "elvish"] {
        let out = draftwire().args(["completions", shell]).output().unwrap();
        assert_eq!(out.status.code(), Some(0), "{shell}");
        let text = String::from_utf8(out.stdout).unwrap();
        assert!(
            text.contains("spread") && text.contains("compare"),
            "{shell}"
        );
    }
    let out = draftwire().arg("man").output().unwrap();
    assert_eq!(out.status.code(), Some(0));
    let roff = String::from_utf8(out.stdout).unwrap();
    assert!(roff.contains(".TH draftwire 1") && roff.contains("spread"));
}

/// With `--format json`, bad input still gives JSON on stdout (an error
/// object with its position) beside the message on stderr, and exit 2.
#[test]
fn bad_input_with_json_gives_a_json_error_object() {
    let out = draftwire()
        .args(["size", "-", "--format", "json"])
        .write_stdin("[ambient]\nnominal = 20\n")
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(v["passed"], false);
    assert_eq!(v["error"]["kind"], "input");
    assert_eq!(v["error"]["file"], "<stdin>");
    assert!(v["error"]["line"].is_number());
    assert!(!out.stderr.is_empty());
}

/// `draftwire new` writes a starter design that `size` reads (exit 0 or 1,
/// never 2) for every element and load, and refuses to overwrite a file
/// unless --force is given.
#[test]
fn starter_designs_are_accepted_and_not_overwritten() {
    let dir = std::env::temp_dir().join(format!("draftwire-new-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    for element in ["lamp", "wire", "thermistor"] {
        for load in ["led", "buzzer", "relay"] {
            let f = dir.join(format!("{element}-{load}.toml"));
            let _ = std::fs::remove_file(&f);
            draftwire()
                .args(["new", "--element", element, "--load", load, "-o"])
                .arg(&f)
                .assert()
                .code(0);
            let out = draftwire().arg("size").arg(&f).output().unwrap();
            let code = out.status.code().unwrap();
            assert!(
                code == 0 || code == 1,
                "{element}/{load}: exit {code}: {}",
                String::from_utf8_lossy(&out.stderr)
            );
        }
    }
    let f = dir.join("wire-led.toml");
    draftwire()
        .args(["new", "-o"])
        .arg(&f)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("--force"));
    draftwire()
        .args(["new", "--force", "-o"])
        .arg(&f)
        .assert()
        .code(0);
}

/// A 20-point sweep: 20 rows, the end point exact, a failing point kept as
/// a row; `--hold-values` keeps the sized parts constant while the sweep
/// without it re-sizes them; an empty range is refused before running.
#[test]
fn sweep_rows_ends_and_held_values() {
    let ex = manifest("examples/server-cabinet-airflow.toml");
    let out = draftwire()
        .args(["sweep"])
        .arg(&ex)
        .args([
            "detector.trip_airflow",
            "0.5 m/s",
            "1.5 m/s",
            "--points",
            "20",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let rows = v["rows"].as_array().unwrap();
    assert_eq!(rows.len(), 20);
    assert_eq!(rows[0]["values"][0], 0.5);
    assert_eq!(rows[19]["values"][0], 1.5);
    assert_eq!(v["axes"][0]["column"], "detector.trip_airflow_m_per_s");
    // Targets near the band's edges fail trip-band and stay rows.
    assert!(rows.iter().any(|r| r["passed"] == false));
    assert_eq!(out.status.code(), Some(1));
    let rs1 = |r: &serde_json::Value| {
        r["parts"]
            .as_array()
            .unwrap()
            .iter()
            // The divider's top: R2 in the server cabinet's signal-path order.
            .find(|p| p["designator"] == "R2")
            .unwrap()["value"]
            .as_f64()
            .unwrap()
    };
    let resized: std::collections::BTreeSet<u64> = rows.iter().map(|r| rs1(r).to_bits()).collect();
    assert!(resized.len() > 1, "each point is sized afresh");
    let out = draftwire()
        .args(["sweep"])
        .arg(&ex)
        .args([
            "detector.trip_airflow",
            "0.5 m/s",
            "1.5 m/s",
            "--points",
            "5",
            "--hold-values",
            "--format",
            "json",
        ])
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let held: std::collections::BTreeSet<u64> = v["rows"]
        .as_array()
        .unwrap()
        .iter()
        .map(|r| rs1(r).to_bits())
        .collect();
    assert_eq!(held.len(), 1, "parts held");
    draftwire()
        .args(["sweep"])
        .arg(&ex)
        .args(["supply.input", "12 V", "12 V"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("the range is empty"));
}

/// The text reports fit the terminal: `compare` puts candidates side by
/// side when that fits `COLUMNS`, one block per candidate otherwise; `size`
/// wraps its running text to `COLUMNS`.
#[test]
fn text_fits_the_terminal_width() {
    let run = |cols: &str, args: &[&str]| {
        let out = draftwire()
            .env("COLUMNS", cols)
            .args(args)
            .output()
            .unwrap();
        String::from_utf8(out.stdout).unwrap()
    };
    let design = manifest("examples/workshop-door-draught.toml");
    let cands = manifest("examples/candidates/element-candidates.toml");
    let args = [
        "compare",
        design.to_str().unwrap(),
        "--candidates",
        cands.to_str().unwrap(),
    ];
    let wide = run("400", &args);
    let narrow = run("80", &args);
    assert!(wide
        .lines()
        .any(|l| l.contains("nickel wire 25 um") && l.contains("Pt100 chip")));
    assert!(narrow.lines().any(|l| l == "Pt100 chip"));
    assert!(!narrow
        .lines()
        .any(|l| l.contains("nickel wire 25 um") && l.contains("Pt100 chip")));
    let text = run("60", &["size", design.to_str().unwrap()]);
    // The cautions are running text: every line of that section fits.
    let cautions: Vec<&str> = text
        .lines()
        .skip_while(|l| *l != "Cautions")
        .skip(2)
        .take_while(|l| !l.is_empty())
        .collect();
    assert!(cautions.len() > 3);
    assert!(
        cautions.iter().all(|l| l.chars().count() <= 60),
        "{cautions:#?}"
    );
}

/// `--airflow-unit ft/min` shows every airflow of the text report in
/// ft/min: 0.3 m/s = 0.3/0.00508 = 59.06 ft/min (1 ft/min = 0.00508 m/s
/// exactly, yard and pound agreement 1959), and no m/s is left.
#[test]
fn text_report_in_feet_per_minute() {
    let out = draftwire()
        .args(["size", "--airflow-unit", "ft/min"])
        .arg(manifest("examples/workshop-door-draught.toml"))
        .output()
        .unwrap();
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(
        text.contains("target                         59.1 ft/min"),
        "{text}"
    );
    assert!(!text.contains("m/s"), "{text}");
    // JSON stays in m/s.
    let out = draftwire()
        .args(["size", "--format", "json", "--airflow-unit", "ft/min"])
        .arg(manifest("examples/workshop-door-draught.toml"))
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(v["trip"]["target_airflow_m_per_s"], 0.3);
}

/// The bill row's function for a sizing role (designators depend on which
/// parts a design has; the function column does not).
fn role_function(internal: &str) -> &'static str {
    draftwire::analysis::wiring::Role::from_internal(internal)
        .unwrap_or_else(|| panic!("no role {internal}"))
        .function()
}
