"""Write a results folder all at once: into a temporary folder beside it, then renamed into place.

A run that fails part-way leaves no folder that looks complete, and an older complete folder is
replaced only after the new one is complete. The last file written into a results folder is
``MARKER``, the list of every file traywise put there with its SHA-256 digest. An existing
folder is replaced only when it is empty, or when it holds that list and nothing but the files
on it, unchanged: a folder the user made, added a file to or edited a file in is refused and
left as it is. The current folder, a folder holding it, and a folder holding the case file are
never replaced. A symbolic link given as the folder is followed: the folder it points to is
written.

Temporaries are named ``.NAME.writing-PID-*`` (the new folder being filled) and
``.NAME.replaced-PID-*`` (the older folder while the new one takes its place); those of a
process that no longer runs (a killed run) are cleared by the next write of the same folder.
"""

import hashlib
import json
import os
import re
import shutil
import tempfile
from pathlib import Path

from ..errors import CaseError

MARKER = ".traywise-results"  # the list of files traywise wrote, written last
WRITING, REPLACED = "writing", "replaced"  # the two kinds of temporaries
_NEXT_STEP = "nothing was changed; choose another --out folder, or move or delete this one yourself"


def write_results_folder(target, write_files, *, protect=()):
    """Create ``target`` holding the files that ``write_files(folder)`` writes into ``folder``.

    Parameters
    ----------
    target : path-like        The results folder to create or replace (a symbolic link is followed)
    write_files : callable    Called with a temporary folder (pathlib.Path) to fill with files
    protect : sequence of path-like   Files and folders that must survive (the case file)

    Returns
    -------
    pathlib.Path   The results folder

    Raises
    ------
    CaseError   when ``target`` exists and is not a folder traywise may replace
    OSError     when the files cannot be written; nothing is left behind
    """
    target = followed(target)
    clear_stale_temporaries(target)
    check_replaceable(target, protect=protect)
    target.parent.mkdir(parents=True, exist_ok=True)
    temporary = Path(tempfile.mkdtemp(prefix=_temporary_prefix(target, WRITING), dir=target.parent))
    temporary.chmod(0o777 & ~_umask())  # mkdtemp makes it private; a results folder is not
    try:
        write_files(temporary)
        _write_marker(temporary)
        _swap_into_place(temporary, target)
    finally:
        if temporary.exists():
            shutil.rmtree(temporary)
    return target


def followed(target):
    """``target`` as an absolute path, a symbolic link (also one that points nowhere yet) followed."""
    target = Path(target).absolute()
    return target.resolve() if target.is_symlink() else target


def check_replaceable(target, *, protect=()):
    """Raise CaseError unless ``target`` is absent, an empty folder or a results folder that
    traywise wrote and nobody changed since; never the current folder, a folder holding it or
    a folder holding one of ``protect``."""
    target = followed(target)
    for kept, what in [(Path.cwd(), "the current folder"), *((Path(p), f"'{p}'") for p in protect)]:
        kept = kept.resolve()
        if kept == target.resolve() or target.resolve() in kept.parents:
            raise CaseError(str(target), f"is or holds {what}, which traywise never replaces; give --out a new "
                                         "folder name (e.g. CASE-results)")
    if not target.exists():
        return
    if not target.is_dir():
        raise CaseError(str(target), "exists and is not a folder; give --out a folder path")
    entries = {entry.name: entry for entry in target.iterdir()}
    if not entries:
        return
    written = _listed_files(target / MARKER)
    if written is None:
        raise CaseError(str(target), f"exists and is not a traywise results folder (it has no {MARKER} list of "
                                     f"the files traywise wrote; it holds {_names(entries)}); {_NEXT_STEP}")
    added = [name for name, entry in entries.items() if name != MARKER and (name not in written or not _is_file(entry))]
    if added:
        raise CaseError(str(target), f"holds {_names(added)} that traywise did not write there; {_NEXT_STEP}")
    changed = [name for name, entry in entries.items() if name != MARKER and _digest(entry) != written[name]]
    if changed:
        raise CaseError(str(target), f"{_names(changed)} changed since traywise wrote it; {_NEXT_STEP}")


def clear_stale_temporaries(target):
    """Remove the temporaries of ``target`` left by runs that no longer run; when a killed run
    left the older folder retired and no new one in its place, put the older one back first."""
    target = Path(target)
    if not target.parent.is_dir():
        return
    stale = {WRITING: [], REPLACED: []}
    for entry in target.parent.iterdir():
        match = re.fullmatch(re.escape(f".{target.name}.") + r"(writing|replaced)-(?:(\d+)-)?.*", entry.name)
        if match and not _running(match.group(2)):
            stale[match.group(1)].append(entry)
    retired = sorted(stale[REPLACED], key=lambda entry: entry.lstat().st_mtime)
    if retired and not os.path.lexists(target) and retired[-1].is_dir() and not retired[-1].is_symlink():
        os.rename(retired.pop(), target)
    for entry in stale[WRITING] + retired:
        if entry.is_dir() and not entry.is_symlink():
            shutil.rmtree(entry, ignore_errors=True)
        else:
            entry.unlink(missing_ok=True)


def _temporary_prefix(target, kind):
    return f".{target.name}.{kind}-{os.getpid()}-"


def _running(pid):
    """Whether the process ``pid`` (text, or None for a temporary of an older traywise) runs."""
    if pid is None or int(pid) <= 0:
        return False
    try:
        os.kill(int(pid), 0)
    except PermissionError:
        return True  # another user's process
    except (ProcessLookupError, OverflowError):
        return False
    return True


def _write_marker(folder):
    files = {entry.name: _digest(entry) for entry in sorted(folder.iterdir()) if entry.name != MARKER}
    text = json.dumps({"written_by": "traywise", "files": files}, indent=2) + "\n"
    (folder / MARKER).write_text(text, encoding="utf-8")


def _listed_files(marker):
    """name -> SHA-256 of the files a marker lists, or None when it is not traywise's marker."""
    try:
        record = json.loads(marker.read_text(encoding="utf-8"))
        files = record["files"]
        if record["written_by"] == "traywise" and all(isinstance(v, str) for v in files.values()):
            return dict(files)
    except (OSError, ValueError, KeyError, TypeError, AttributeError):
        pass
    return None


def _digest(path):
    hasher = hashlib.sha256()
    with open(path, "rb") as stream:
        for block in iter(lambda: stream.read(1 << 20), b""):
            hasher.update(block)
    return hasher.hexdigest()


def _is_file(entry):
    return entry.is_file() and not entry.is_symlink()


def _names(names):
    names = sorted(names)
    shown = ", ".join(names[:5]) + (f" and {len(names) - 5} more" if len(names) > 5 else "")
    return shown


def _swap_into_place(temporary, target):
    if not target.exists():
        os.rename(temporary, target)
        return
    retired = Path(tempfile.mkdtemp(prefix=_temporary_prefix(target, REPLACED), dir=target.parent))
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
