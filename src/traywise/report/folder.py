"""Write a results folder all at once: into a temporary folder beside it, then renamed into place.

A run that fails part-way leaves no folder that looks complete, and an older complete folder is
replaced only after the new one is complete. An existing folder is replaced only when it is
empty or was written by traywise (it holds a results.json or, for a sweep or an uncertainty run, a
sweep.json or uncertainty.json naming traywise), so that ``--out`` pointed at the wrong place cannot delete someone's files.
"""

import json
import os
import shutil
import tempfile
from pathlib import Path

from ..errors import CaseError

MARKERS = ("results.json", "sweep.json", "uncertainty.json")  # files naming traywise as the writer of a results folder


def write_results_folder(target, write_files):
    """Create ``target`` holding the files that ``write_files(folder)`` writes into ``folder``.

    Parameters
    ----------
    target : path-like        The results folder to create or replace
    write_files : callable    Called with a temporary folder (pathlib.Path) to fill

    Returns
    -------
    pathlib.Path   The results folder

    Raises
    ------
    CaseError   when ``target`` exists and is not a folder traywise may replace
    OSError     when the files cannot be written; nothing is left behind
    """
    target = Path(target)
    check_replaceable(target)
    target.parent.mkdir(parents=True, exist_ok=True)
    temporary = Path(tempfile.mkdtemp(prefix=f".{target.name}.writing-", dir=target.parent))
    temporary.chmod(0o777 & ~_umask())  # mkdtemp makes it private; a results folder is not
    try:
        write_files(temporary)
        _swap_into_place(temporary, target)
    finally:
        if temporary.exists():
            shutil.rmtree(temporary)
    return target


def _swap_into_place(temporary, target):
    if not target.exists():
        os.rename(temporary, target)
        return
    retired = Path(tempfile.mkdtemp(prefix=f".{target.name}.replaced-", dir=target.parent))
    retired.rmdir()
    os.rename(target, retired)
    try:
        os.rename(temporary, target)
    except OSError:
        os.rename(retired, target)  # put the older complete folder back
        raise
    shutil.rmtree(retired)


def _umask():
    mask = os.umask(0o022)
    os.umask(mask)
    return mask


def check_replaceable(target):
    """Raise CaseError unless ``target`` is absent, an empty folder or a traywise results folder."""
    target = Path(target)
    if not target.exists():
        return
    if not target.is_dir():
        raise CaseError(str(target), "exists and is not a folder; give --out a folder path")
    if not any(target.iterdir()):
        return
    if not any(_written_by_traywise(target / marker) for marker in MARKERS):
        raise CaseError(
            str(target),
            "exists and is not a traywise results folder (no results.json or sweep.json written by traywise); "
            "choose another --out folder or move it away",
        )


def _written_by_traywise(marker):
    try:
        return json.loads(marker.read_text(encoding="utf-8"))["software"]["name"] == "traywise"
    except (OSError, ValueError, KeyError, TypeError):
        return False
