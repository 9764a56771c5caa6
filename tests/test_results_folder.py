"""The results folder never costs a user a file: traywise replaces only a folder it can prove it
wrote (its list of files, written last, matches what the folder holds), never the current
folder or one holding the case file; temporaries of killed runs are cleared; a symbolic link
given as --out is followed.

Runs with click's CliRunner in temporary folders, on the starter case (no plots, about a
second a run), and on write_results_folder directly with a few small files.
"""

import json
import os
import subprocess
import sys

import pytest
from click.testing import CliRunner

from traywise.cli import main
from traywise.errors import CaseError
from traywise.report.folder import MARKER, write_results_folder
from traywise.starter import starter_case


def invoke(*arguments):
    return CliRunner().invoke(main, [str(a) for a in arguments])


def assert_refused(result):
    """Exit 2 with one line on stderr that says nothing was changed, and no traceback."""
    assert result.exit_code == 2, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("traywise: error: "), result.stderr
    assert "Traceback" not in result.output


def snapshot(folder):
    """Every file under ``folder`` with its bytes (hidden ones included)."""
    return {str(p.relative_to(folder)): p.read_bytes() for p in sorted(folder.rglob("*")) if p.is_file()}


@pytest.fixture
def project(tmp_path, monkeypatch):
    """A project folder holding a case file and a document of the user's, as the current folder."""
    folder = tmp_path / "project"
    folder.mkdir()
    (folder / "case.toml").write_text(starter_case(), encoding="utf-8")
    (folder / "design-basis.txt").write_text("the user's own notes", encoding="utf-8")
    monkeypatch.chdir(folder)
    return folder


def small_files(names=("results.json", "stages.csv")):
    def write(folder):
        for name in names:
            (folder / name).write_text(f"{name} (test)", encoding="utf-8")
    return write


def test_the_json_redirect_then_out_dot_sequence_deletes_nothing(project):
    """`traywise run case.toml --json > results.json`, then `traywise run case.toml --out .`: the
    project folder holds a results.json, but traywise did not write the folder."""
    first = invoke("run", "case.toml", "--json", "--no-plots")
    assert first.exit_code == 0, first.output
    (project / "results.json").write_text(first.stdout, encoding="utf-8")
    before = snapshot(project)
    result = invoke("run", "case.toml", "--out", ".", "--no-plots")
    assert_refused(result)
    assert "current folder" in result.stderr and "never replaces" in result.stderr
    assert snapshot(project) == before


def test_a_project_folder_named_from_elsewhere_is_refused(project, tmp_path, monkeypatch):
    (project / "results.json").write_text(json.dumps({"software": {"name": "traywise"}}), encoding="utf-8")
    before = snapshot(project)
    monkeypatch.chdir(tmp_path)
    result = invoke("run", project / "case.toml", "--out", project, "--no-plots")
    assert_refused(result)
    assert "case.toml" in result.stderr
    assert snapshot(project) == before
    other = tmp_path / "case-elsewhere.toml"
    other.write_text(starter_case(), encoding="utf-8")
    result = invoke("run", other, "--out", project, "--no-plots")  # the case file is elsewhere: no marker
    assert_refused(result)
    assert "not a traywise results folder" in result.stderr and "nothing was changed" in result.stderr
    assert snapshot(project) == before
    assert_refused(invoke("run", other, "--out", tmp_path, "--no-plots"))  # a folder holding the current one
    assert snapshot(project) == before


def test_a_results_folder_with_a_file_the_user_added_is_not_emptied(project):
    assert invoke("run", "case.toml", "--no-plots", "--quiet").exit_code == 0
    results = project / "case-results"
    assert (results / MARKER).is_file()
    (results / "review-comments.txt").write_text("keep me", encoding="utf-8")
    before = snapshot(results)
    result = invoke("run", "case.toml", "--no-plots")
    assert_refused(result)
    assert "review-comments.txt" in result.stderr and "did not write" in result.stderr
    assert snapshot(results) == before


def test_a_results_folder_with_an_edited_file_is_not_replaced(project):
    assert invoke("run", "case.toml", "--no-plots", "--quiet").exit_code == 0
    report = project / "case-results" / "report.md"
    report.write_text(report.read_text(encoding="utf-8") + "\nReviewed: OK\n", encoding="utf-8")
    result = invoke("run", "case.toml", "--no-plots")
    assert_refused(result)
    assert "report.md changed" in result.stderr
    assert report.read_text(encoding="utf-8").endswith("Reviewed: OK\n")


def test_an_unchanged_results_folder_is_replaced_and_lists_its_files(project):
    for _ in range(2):
        assert invoke("run", "case.toml", "--no-plots", "--quiet").exit_code == 0
    results = project / "case-results"
    listed = json.loads((results / MARKER).read_text(encoding="utf-8"))
    assert listed["written_by"] == "traywise"
    assert set(listed["files"]) == {"results.json", "stages.csv", "report.md", "report.html"}
    assert sorted(json.loads((results / "results.json").read_text())["files"]) == sorted(p.name for p in results.iterdir())


def test_a_results_folder_with_a_file_removed_is_replaced(tmp_path):
    target = write_results_folder(tmp_path / "r", small_files())
    (target / "stages.csv").unlink()  # deleting costs the user nothing on the next write
    write_results_folder(target, small_files(("results.json",)))
    assert sorted(p.name for p in target.iterdir()) == [MARKER, "results.json"]


def test_a_forged_or_damaged_marker_proves_nothing(tmp_path):
    target = tmp_path / "r"
    target.mkdir()
    (target / "thesis.txt").write_text("precious")
    for text in ("not json", json.dumps({"files": {}}), json.dumps({"written_by": "traywise", "files": {}})):
        (target / MARKER).write_text(text)
        with pytest.raises(CaseError):
            write_results_folder(target, small_files())
        assert (target / "thesis.txt").read_text() == "precious"


def test_a_subfolder_the_user_made_is_never_deleted(tmp_path):
    target = write_results_folder(tmp_path / "r", small_files())
    (target / "old-runs").mkdir()
    with pytest.raises(CaseError, match="old-runs"):
        write_results_folder(target, small_files())
    assert (target / "old-runs").is_dir()


def test_temporaries_of_killed_runs_are_cleared_by_the_next_run(tmp_path):
    """A run killed while filling its folder leaves `.NAME.writing-PID-*`; one killed while
    swapping leaves `.NAME.replaced-PID-*`. A temporary of a process still running is kept."""
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True,
                          text=True, check=True).stdout.strip()
    alive = subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])
    try:
        target = write_results_folder(tmp_path / "r", small_files())
        stale = [tmp_path / f".r.writing-{dead}-abc", tmp_path / ".r.writing-k3x9q2",  # the second: older traywise
                 tmp_path / f".r.replaced-{dead}-def"]
        for folder in stale:
            folder.mkdir()
            (folder / "stages.csv").write_text("half")
        running = tmp_path / f".r.writing-{alive.pid}-ghi"
        running.mkdir()
        write_results_folder(target, small_files())
        assert [p.name for p in tmp_path.iterdir() if p.name.startswith(".")] == [running.name]
    finally:
        alive.kill()
        alive.wait()


def test_a_run_killed_between_the_renames_gets_its_older_folder_back(tmp_path):
    """Killed after the older folder was moved aside and before the new one took its place: the
    next write restores the older folder first, then replaces it by the usual rules."""
    dead = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"], capture_output=True,
                          text=True, check=True).stdout.strip()
    target = write_results_folder(tmp_path / "r", small_files())
    retired = tmp_path / f".r.replaced-{dead}-xyz"
    os.rename(target, retired)
    (retired / "notes.txt").write_text("added by the user")
    with pytest.raises(CaseError, match="notes.txt"):
        write_results_folder(target, small_files())
    assert (target / "notes.txt").read_text() == "added by the user"
    assert not retired.exists()


def test_a_symbolic_link_as_out_is_followed(project, tmp_path):
    real = tmp_path / "elsewhere" / "results"
    real.parent.mkdir()
    link = project / "link"
    link.symlink_to(real, target_is_directory=True)
    for _ in range(2):  # written through the link, then replaced through it
        result = invoke("run", "case.toml", "--out", link, "--no-plots", "--quiet")
        assert result.exit_code == 0, result.output
    assert link.is_symlink() and (real / "results.json").is_file()
    assert not [p for p in (*project.iterdir(), *real.parent.iterdir()) if ".replaced-" in p.name or ".writing-" in p.name]


def test_a_symbolic_link_to_a_file_as_out_is_refused(project):
    (project / "link").symlink_to(project / "design-basis.txt")
    before = snapshot(project)
    result = invoke("run", "case.toml", "--out", project / "link", "--no-plots")
    assert result.exit_code == 2 and "Traceback" not in result.output  # click's usage error
    assert "is a file" in result.stderr
    assert snapshot(project) == before and (project / "link").is_symlink()
