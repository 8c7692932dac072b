"""The review panel driven from Python: review state, on-screen differences, saving with the log kept.

What the panel shows is checked against direct calls of bilayer.records / bilayer.records.check on
the same files (the panel must agree with the command line).
"""
from __future__ import annotations

import shutil
from pathlib import Path

import pytest

pytest.importorskip("ipywidgets")
pytest.importorskip("matplotlib")

from bilayer.cli.entry import main
from bilayer.panels import DesignModel, StackExplorer
from bilayer.panels.review import ReviewPanel
from bilayer.records.check import check_record, input_differences
from bilayer.records.record import read_record, verify_review_log

EXAMPLE = Path(__file__).resolve().parent.parent / "bilayer" / "examples" / "hive_entrance_strip.record.toml"


@pytest.fixture
def record_file(tmp_path) -> Path:
    path = tmp_path / "hive.record.toml"
    shutil.copy(EXAMPLE, path)
    return path


@pytest.fixture
def panel(record_file) -> ReviewPanel:
    record = read_record(record_file)
    panel = ReviewPanel(DesignModel(record.design), str(record_file))
    assert panel.open_record()
    return panel


def test_opened_record_shows_its_review_state_and_no_differences(panel, record_file):
    record = read_record(record_file)
    assert record.review_state.text() in panel.state.value.replace("&#x27;", "'")
    assert panel.input_changes == [] and panel.result_changes == []
    assert "is the recorded design" in panel.differences.value
    assert panel.review_log.value.count("<tr>") == 1 + len(record.reviews)


def test_editing_on_screen_lists_the_changed_inputs_and_results(panel, record_file):
    model = panel.model
    changed = model.design.replace(stack=model.design.stack.with_thickness(0, 0.12e-3))
    assert model.propose(changed) == ""
    expected = input_differences(read_record(record_file), changed)
    assert [d.what for d in panel.input_changes] == [d.what for d in expected] == ["layers.layer 1.thickness"]
    assert "recorded 0.1 mm, now 0.12 mm" in panel.differences.value
    assert any(d.what.startswith("curvature") for d in panel.result_changes)
    model.system = "us"
    assert "recorded 3.937008 mil, now 4.724409 mil" in panel.differences.value
    assert panel.show_recorded() and panel.input_changes == []


def test_add_review_only_for_the_recorded_design(panel, record_file):
    before = record_file.read_text()
    panel.model.propose(panel.model.design.replace(stack=panel.model.design.stack.with_thickness(0, 0.12e-3)))
    panel.reviewer.value, panel.verdict.value = "P. Panel", "rejected"
    assert not panel.add_review()
    assert "differs from the recorded one" in panel.message.value and record_file.read_text() == before
    panel.show_recorded()
    panel.comment.value = "checked on screen"
    assert panel.add_review()
    again = read_record(record_file)
    assert again.reviews[-1].reviewer == "P. Panel" and again.reviews[-1].comment == "checked on screen"
    assert record_file.read_text().startswith(before)


def test_save_keeps_the_review_log_including_reviews_added_meanwhile(panel, record_file):
    old = read_record(record_file)
    # a colleague adds a review from the command line after the panel opened the file
    assert main(["review", str(record_file), "--reviewer", "Q. Colleague", "--verdict", "accepted",
                 "--date", "2026-12-02"]) == 0
    panel.model.propose(panel.model.design.replace(stack=panel.model.design.stack.with_thickness(0, 0.12e-3)))
    panel.model.strip_length = 0.035
    assert panel.save(), panel.message.value
    saved = read_record(record_file)
    assert saved.reviews[: len(old.reviews)] == old.reviews
    assert saved.reviews[-1].reviewer == "Q. Colleague" and len(saved.reviews) == len(old.reviews) + 1
    assert verify_review_log(saved.reviews) == []
    assert saved.design == panel.model.design and saved.strip_length == 0.035
    report = check_record(saved)
    assert report.ok and report.review.status == "changed since review"
    assert "changed since review" in panel.state.value and panel.input_changes == []


def test_save_refuses_to_overwrite_a_file_it_cannot_read(panel, record_file):
    record_file.write_text(record_file.read_text().replace("\n[[review]]\n", "\n[[reviews]]\n", 1))
    before = record_file.read_text()
    assert not panel.save()
    assert "Not saved" in panel.message.value and record_file.read_text() == before


def test_panel_as_a_tab_of_the_explorer(record_file, tmp_path):
    explorer = StackExplorer(read_record(record_file).design)
    panel = ReviewPanel(explorer.model, str(tmp_path / "new.record.toml"),
                        pending_error=explorer.editor.pending_error, support=lambda: explorer.shape.support.value)
    explorer.add_view("review", panel)
    assert "no record open" in panel.state.value
    assert panel.save() and read_record(tmp_path / "new.record.toml").support == "cantilever"
    assert "not reviewed" in panel.state.value
