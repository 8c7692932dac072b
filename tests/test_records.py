"""Design records: round trip with reviews, hash and drift detection, old formats, the commands.

External references: the results snapshot of a two-layer strip is checked against Timoshenko's
bimetal formula (S. Timoshenko, "Analysis of bi-metal thermostats", J. Opt. Soc. Am. 11:233-255,
1925); the inputs hash against an independent SHA-256 (hashlib) of the documented canonical JSON;
files against the TOML 1.0 reader of the standard library (tomllib).
"""
from __future__ import annotations

import hashlib
import json
import re
import shutil
import tomllib
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest

import bilayer as bl
from bilayer.core.cautions import CAUTIONS
from bilayer.cli.entry import main
from bilayer.designs.jobs import cautions_for
from bilayer.designs.design_file import read_design
from bilayer.core.errors import DesignFileError, InputError
from bilayer.core.materials import Material, default_library
from bilayer.designs.sections import section
from bilayer.records.check import Tolerance, check_record, compare_results, input_differences
from bilayer.records.record import RECORD_FORMAT, ReviewEntry, append_review, canonical_inputs, inputs_hash, make_record, read_record, read_record_text, record_to_text, save_record, verify_review_log
from bilayer.thermostat.element import THERMOSTAT_CAUTIONS

ROOT = Path(__file__).resolve().parent.parent
FORMAT1 = Path(__file__).parent / "data" / "record_format1.toml"
EXAMPLE = ROOT / "bilayer" / "examples" / "hive_entrance_strip.record.toml"

# Two constant-CTE materials (demo values, invented) so Timoshenko's closed form applies exactly.
LOW = Material("demo low-expansion metal", 150e9, 0.3, 1.5e-6, key="demo_low",
               sources={"youngs_modulus": "invented demo value"})
HIGH = Material("demo high-expansion metal", 100e9, 0.3, 20e-6, key="demo_high",
                sources={"youngs_modulus": "invented demo value"})


def strip_design(thickness_top: float = 0.6e-3) -> bl.Design:
    return bl.Design(bl.Stack.of((LOW, 0.4e-3, "bottom"), (HIGH, thickness_top, "top")),
                     bl.Temperatures(293.15, 373.15), name="demo strip", notes="invented")


def library_design() -> bl.Design:
    """A thermostat strip from library materials; the section holds its defaults, as read from a file."""
    thermostat = section("thermostat").normalise({"form": "cantilever", "width": 4e-3, "length": 25e-3})
    return bl.Design(bl.Stack.of(("fe36ni", 0.14e-3, "low side"), ("mncuni_72_18_10", 0.15e-3, "high side")),
                     bl.Temperatures(293.15, 313.15), name="cut-out strip (invented)",
                     sections={"thermostat": thermostat})


@pytest.fixture
def reviewed(tmp_path):
    """A library-material record with two reviews, saved to a file."""
    design = library_design()
    record = make_record(design, cautions=cautions_for(design), created="2026-11-30T08:00:00Z")
    record = record.with_review("A. Reviewer", "changes_needed", "Say which side faces the switch.", "2026-11-30")
    record = record.with_review("B. Checker", "accepted_with_notes", 'Fine; "quote" and\nnew line kept.', "2026-12-01")
    path = save_record(record, tmp_path / "strip.record.toml")
    return record, path


# ---------------------------------------------------------------------------------------------
# Round trip


def test_round_trip_keeps_design_results_provenance_and_reviews(reviewed):
    record, path = reviewed
    again = read_record(path)
    assert again.design == record.design
    assert again.results == record.results
    assert again.reviews == record.reviews and len(again.reviews) == 2
    assert again.inputs_hash == record.inputs_hash == inputs_hash(record.design)
    assert again.bilayer_version == bl.__version__ and again.created == "2026-11-30T08:00:00Z"
    assert again.format == RECORD_FORMAT
    assert again.cautions == record.cautions
    assert {k: dict(m.sources) for k, m in again.materials.items()} == \
        {k: dict(m.sources) for k, m in record.materials.items()}
    assert verify_review_log(again.reviews) == []
    assert again.review_state.status == "accepted_with_notes" and again.review_state.current
    # Writing what was read gives the same text (exact numbers, stable order), in SI and in US units.
    assert record_to_text(again) == path.read_text()
    us = read_record_text(record_to_text(record, system="us"))
    assert us.design == record.design and us.results == record.results and us.inputs_hash == record.inputs_hash


def test_record_file_is_plain_toml_and_a_design_file(reviewed):
    record, path = reviewed
    data = tomllib.loads(path.read_text())
    assert data["record"]["format"] == RECORD_FORMAT
    assert [entry["verdict"] for entry in data["review"]] == ["changes_needed", "accepted_with_notes"]
    assert read_design(path).design == record.design  # any design reader can use a record


def test_snapshot_holds_the_engine_answer_timoshenko_1925():
    """Curvature of a free two-layer strip, constant CTEs (Timoshenko 1925, eq. for kappa with m = t1/t2,
    n = E1/E2, h = t1 + t2): kappa = 6 (a2 - a1) dT (1 + m)^2 / (h (3 (1 + m)^2 + (1 + m n)(m^2 + 1/(m n))))."""
    record = read_record_text(record_to_text(make_record(strip_design())))
    t1, t2, E1, E2 = 0.4e-3, 0.6e-3, 150e9, 100e9
    m, n, h, dT = t1 / t2, E1 / E2, t1 + t2, 80.0
    kappa = 6 * (20e-6 - 1.5e-6) * dT * (1 + m) ** 2 / (h * (3 * (1 + m) ** 2 + (1 + m * n) * (m**2 + 1 / (m * n))))
    assert record.results["curvature"] == pytest.approx(kappa, rel=1e-12)


def test_inputs_hash_is_sha256_of_the_documented_canonical_json():
    design = strip_design()
    text = json.dumps(canonical_inputs(design), sort_keys=True, separators=(",", ":"), ensure_ascii=False)
    assert inputs_hash(design) == "sha256:" + hashlib.sha256(text.encode()).hexdigest()
    # name and notes are descriptive and not covered; every computed input is
    assert inputs_hash(design.replace(name="other", notes="")) == inputs_hash(design)
    assert inputs_hash(strip_design(0.6e-3 * (1 + 1e-15))) != inputs_hash(design)
    assert inputs_hash(design.replace(state="plate")) != inputs_hash(design)
    stiffer = replace(HIGH, youngs_modulus=101e9)
    assert inputs_hash(design.replace(stack=design.stack.with_layer(1, bl.Layer(stiffer, 0.6e-3, "top")))) \
        != inputs_hash(design)


def test_custom_materials_round_trip_with_their_copy(tmp_path):
    record = make_record(strip_design())
    path = save_record(record, tmp_path / "custom.toml")
    again = read_record(path)
    assert again.design == record.design
    assert set(again.materials) == {"demo_low", "demo_high"}
    assert check_record(again).ok


# ---------------------------------------------------------------------------------------------
# Tampering and drift


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text()
    assert text.count(old) == 1, old
    path.write_text(text.replace(old, new))


def test_tampered_stored_result_is_detected(reviewed, capsys):
    record, path = reviewed
    curvature = record.results["curvature"]
    _edit(path, f"curvature = {curvature!r}", f"curvature = {curvature * 1.001!r}")
    report = check_record(read_record(path))
    assert report.inputs_match and not report.ok
    assert [d.what for d in report.result_differences] == ["curvature κ"]
    assert main(["check", str(path)]) == 1
    out = capsys.readouterr().out
    assert "FAILED: results drifted" in out
    assert re.search(r"curvature κ: recorded [\d.]+ 1/m, now [\d.]+ 1/m \(difference .* -0\.0999 %\)", out)


def test_tampered_input_is_detected_and_reviews_refused(reviewed, capsys):
    record, path = reviewed
    _edit(path, 'thickness = "0.15 mm"', 'thickness = "0.16 mm"')
    changed = read_record(path)
    report = check_record(changed)
    assert not report.inputs_match and not report.ok
    assert report.review.status == "changed since review"
    assert changed.review_state.status == "changed since review" and not changed.review_state.accepted
    assert main(["check", str(path)]) == 1
    assert "inputs: DO NOT MATCH their hash" in capsys.readouterr().out
    before = path.read_text()
    assert main(["review", str(path), "--reviewer", "C", "--verdict", "accepted"]) == 1
    assert "review refused" in capsys.readouterr().err
    assert path.read_text() == before


def test_tampered_material_copy_is_detected(reviewed):
    record, path = reviewed
    text = path.read_text()
    block = text.index("[record.materials.fe36ni]")
    head, tail = text[:block], text[block:]
    path.write_text(head + tail.replace('youngs_modulus = "141 GPa"', 'youngs_modulus = "150 GPa"', 1))
    report = check_record(read_record(path))
    assert not report.inputs_match


def test_changed_library_data_is_drift_and_explained(reviewed):
    record, path = reviewed
    library = default_library()
    softer = replace(library["fe36ni"], youngs_modulus=130e9)
    changed = library.with_materials(softer, replace=True)
    report = check_record(read_record(path, library=changed), library=changed)
    assert report.inputs_match  # the file and its copy are untouched
    assert [d.what for d in report.material_differences] == ["material fe36ni.youngs_modulus"]
    assert report.material_differences[0].recorded == 141e9 and report.material_differences[0].current == 130e9
    assert report.result_differences and report.reproduces_with_recorded_materials is True
    assert "the change comes from the material data" in report.text()


def test_edited_or_removed_review_breaks_the_chain(reviewed):
    record, path = reviewed
    _edit(path, 'comment = "Say which side faces the switch."', 'comment = "Looks fine."')
    report = check_record(read_record(path))
    assert not report.ok and len(report.review_problems) == 1 and "review 1" in report.review_problems[0]
    # removing the first entry breaks the second one's link
    entries = list(record.reviews)
    assert verify_review_log(entries[1:]) and verify_review_log(entries) == []


def test_tolerance_is_relative_to_the_scale_of_each_kind():
    record = make_record(strip_design())
    results = dict(record.results)
    small = dict(results, curvature=results["curvature"] * (1 + 5e-7))
    assert compare_results(small, record.design.evaluate(), Tolerance(1e-6))[0] == []
    assert compare_results(small, record.design.evaluate(), Tolerance(1e-7))[0] != []
    # a value near zero is judged against the largest stress, not against itself
    layers = [dict(entry) for entry in results["layers"]]
    peak = max(abs(v) for entry in layers for v in (entry["stress_bottom"], entry["stress_top"]))
    layers[0]["transverse_stress_top"] = 1e-7 * peak  # engine gives 0 in the narrow state
    assert compare_results(dict(results, layers=layers), record.design.evaluate())[0] == []
    with pytest.raises(InputError):
        Tolerance(-1.0)


def test_engine_fields_added_later_are_not_drift():
    record = make_record(strip_design())
    older = {k: v for k, v in record.results.items() if k != "strain_energy"}
    differences, _ = compare_results(older, record.design.evaluate())
    assert differences == []


def test_input_differences_name_the_changed_inputs():
    record = make_record(library_design())
    design = record.design
    thicker = design.replace(stack=design.stack.with_thickness(1, 0.16e-3),
                             temperatures=bl.Temperatures(293.15, 323.15))
    names = [d.what for d in input_differences(record, thicker)]
    assert names == ["conditions.operating_temperature", "layers.layer 2.thickness"]
    assert "recorded 0.15 mm, now 0.16 mm" in input_differences(record, thicker)[1].text()
    assert input_differences(record, design.replace(name="renamed")) == []


# ---------------------------------------------------------------------------------------------
# Older record formats


def test_format1_record_loads_and_checks(tmp_path):
    record = read_record(FORMAT1)
    assert record.format == 1 and record.bilayer_version == "0.1.0.dev1"
    assert [(r.reviewer, r.date, r.verdict) for r in record.reviews] == [
        ("J. Lindqvist", "2026-06-02", "changes_needed"), ("J. Lindqvist", "2026-06-09", "accepted")]
    assert all(r.inputs_hash == record.inputs_hash for r in record.reviews)
    assert verify_review_log(record.reviews) == []
    assert any("migrated from record format 1" in note for note in record.notes)
    report = check_record(record)
    assert report.ok, report.text()
    assert report.review.status == "accepted"


def test_format1_record_with_edited_inputs_fails_after_migration(tmp_path):
    path = tmp_path / "old.toml"
    path.write_text(FORMAT1.read_text().replace('thickness = "2 mm"', 'thickness = "2.5 mm"'))
    record = read_record(path)
    assert record.inputs_hash.startswith("sha256-v1:")
    assert not check_record(record).inputs_match


def test_review_of_a_format1_record_upgrades_it_keeping_the_log(tmp_path):
    path = tmp_path / "old.toml"
    shutil.copy(FORMAT1, path)
    record = append_review(path, "K. Osei", "accepted", "re-checked after migration", "2026-12-02")
    assert record.format == RECORD_FORMAT and len(record.reviews) == 3
    again = read_record(path)
    assert again.format == RECORD_FORMAT
    assert [r.reviewer for r in again.reviews] == ["J. Lindqvist", "J. Lindqvist", "K. Osei"]
    assert check_record(again).ok


def test_newer_or_broken_record_formats_are_refused(reviewed):
    record, path = reviewed
    text = path.read_text()
    with pytest.raises(DesignFileError, match="newer bilayer"):
        read_record_text(text.replace(f"format = {RECORD_FORMAT}", "format = 99"))
    with pytest.raises(DesignFileError, match="verdict"):
        read_record_text(text.replace('verdict = "changes_needed"', 'verdict = "fine"'))
    with pytest.raises(DesignFileError, match=r"line \d+ \[\[review\]\] 1: reviewer"):
        read_record_text(text.replace('reviewer = "A. Reviewer"\n', ""))
    with pytest.raises(DesignFileError, match="plain design file"):
        read_record_text(text[: text.index("\n[record]\n")])


# ---------------------------------------------------------------------------------------------
# Appending reviews


def test_append_review_adds_one_block_and_changes_nothing_above(reviewed):
    record, path = reviewed
    path.chmod(0o640)
    before = path.read_text()
    updated = append_review(path, "D. Third", "rejected", "Wrong alloy pair for this span.", "2026-12-02T10:00Z")
    after = path.read_text()
    assert after.startswith(before) and after[len(before):].count("[[review]]") == 1
    assert updated.reviews[:2] == record.reviews and updated.reviews[2].verdict == "rejected"
    assert verify_review_log(updated.reviews) == []
    assert path.stat().st_mode & 0o777 == 0o640
    assert [p.name for p in path.parent.iterdir()] == [path.name]  # no temporary file left behind


def test_review_entries_are_validated():
    with pytest.raises(InputError, match="verdict"):
        ReviewEntry("A", "2026-12-01", "approved")
    with pytest.raises(InputError, match="date"):
        ReviewEntry("A", "1 Dec 2026", "accepted")
    with pytest.raises(InputError, match="date"):
        ReviewEntry("A", "2026-02-30", "accepted")
    with pytest.raises(InputError, match="reviewer"):
        ReviewEntry("  ", "2026-12-01", "accepted")


def test_rerecording_keeps_the_log_and_marks_it_as_for_other_inputs(reviewed, capsys):
    record, path = reviewed
    _edit(path, 'length = "25 mm"', 'length = "30 mm"')
    assert main(["record", str(path)]) == 0
    again = read_record(path)
    assert again.reviews == record.reviews and again.inputs_hash != record.inputs_hash
    assert again.review_state.status == "changed since review"
    assert main(["check", str(path)]) == 0
    assert "changed since review" in capsys.readouterr().out


# ---------------------------------------------------------------------------------------------
# Cautions and sources in records


def test_records_carry_cautions_and_full_material_sources(reviewed):
    record, path = reviewed
    text = path.read_text()
    data = tomllib.loads(text)
    for caution in (*CAUTIONS, *THERMOSTAT_CAUTIONS):
        assert caution in data["record"]["cautions"]
    sources = data["record"]["materials"]["fe36ni"]["sources"]
    citation = default_library().citations["callister2008"]
    assert sources["youngs_modulus"].startswith(citation)  # "[callister2008] Table B.2" expanded
    assert data["record"]["materials"]["mncuni_72_18_10"]["sources"]["cte"]


# ---------------------------------------------------------------------------------------------
# The example that ships with the project (what a CI drift job runs)


def test_example_record_checks_clean_and_has_a_review(capsys):
    assert main(["check", str(EXAMPLE)]) == 0, capsys.readouterr().out
    record = read_record(EXAMPLE)
    assert len(record.reviews) >= 1 and record.review_state.accepted
    assert "thermostat" in record.design.sections  # so its cautions include the thermostat ones
    assert set(THERMOSTAT_CAUTIONS) <= set(record.cautions)


def test_check_reports_each_record_and_unreadable_files(tmp_path, capsys):
    bad = tmp_path / "bad.toml"
    bad.write_text("format_version = 1\n")
    assert main(["check", str(EXAMPLE), str(bad)]) == 2
    out = capsys.readouterr().out
    assert f"{EXAMPLE}: OK" in out and "bad.toml: UNREADABLE" in out and "1 of 2 records OK" in out


def test_operating_temperature_lists_round_trip(tmp_path):
    design = strip_design().replace(temperatures=bl.Temperatures(293.15, np.array([253.15, 353.15])))
    path = save_record(make_record(design), tmp_path / "two.toml")
    again = read_record(path)
    assert isinstance(again.results["curvature"], list) and len(again.results["curvature"]) == 2
    assert check_record(again).ok
