"""Processes seen through /proc (Linux): the live children of a process, and whether one lives;
for the checks that workers end with their parent."""

from pathlib import Path


def _state_and_parent(pid):
    """(state letter, parent pid) of ``pid`` from /proc/PID/stat, or None when it is gone."""
    try:
        fields = Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()
    except OSError:
        return None
    return fields[0], int(fields[1])


def children(pid):
    """Pids of the live (not zombie) children of ``pid``."""
    found = []
    for entry in Path("/proc").iterdir():
        if entry.name.isdigit():
            seen = _state_and_parent(entry.name)
            if seen is not None and seen[1] == pid and seen[0] != "Z":
                found.append(int(entry.name))
    return found


def alive(pid):
    """Whether ``pid`` runs (exists and is not a zombie)."""
    seen = _state_and_parent(pid)
    return seen is not None and seen[0] != "Z"
