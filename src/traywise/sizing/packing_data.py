"""The packing data file (``packings.toml`` beside this module): geometry and correlation constants."""

import functools
import tomllib
from dataclasses import dataclass
from pathlib import Path

from .errors import SizingInputError

PACKING_FILE = Path(__file__).with_name("packings.toml")
PACKING_TYPES = ("random", "structured")
# Critical surface tension of the packing material [N/m] for Onda's wetted area: K. Onda,
# H. Takeuchi, Y. Okumoto, J. Chem. Eng. Jpn. 1 (1968) 56, Table (values recalled from memory).
CRITICAL_SURFACE_TENSION = {"ceramic": 0.061, "steel": 0.075, "glass": 0.073, "carbon": 0.056,
                            "pvc": 0.040, "polyethylene": 0.033, "polypropylene": 0.033}


@dataclass(frozen=True)
class Packing:
    """One packing: type 'random' or 'structured', material, nominal_size [m], specific_area
    [m2/m3], voidage [-], Stichlmair's C1, C2, C3 [-], Robbins' F_pd [1/ft] or None; source
    (full citation) and note."""

    name: str
    type: str
    material: str
    nominal_size: float
    specific_area: float
    voidage: float
    stichlmair: tuple
    robbins_fpd: float | None
    source: str
    note: str

    @property
    def critical_surface_tension(self):
        """[N/m] for Onda's wetted area."""
        return CRITICAL_SURFACE_TENSION[self.material]


@functools.cache
def packings(path=PACKING_FILE):
    """{name: Packing} of the packing data file."""
    data = tomllib.loads(Path(path).read_text(encoding="utf-8"))
    sources = data["sources"]
    found = {}
    for name, entry in data["packing"].items():
        where = f"{path}: packing.{name}"
        if entry.get("type") not in PACKING_TYPES or entry.get("material") not in CRITICAL_SURFACE_TENSION:
            raise SizingInputError(where, f"type must be one of {PACKING_TYPES} and material one of {tuple(CRITICAL_SURFACE_TENSION)}")
        if entry.get("source") not in sources or len(entry.get("stichlmair", ())) != 3:
            raise SizingInputError(where, "needs a source key of [sources] and stichlmair = [C1, C2, C3]")
        found[name] = Packing(
            name=name, type=entry["type"], material=entry["material"], nominal_size=float(entry["nominal_size"]),
            specific_area=float(entry["specific_area"]), voidage=float(entry["voidage"]),
            stichlmair=tuple(float(c) for c in entry["stichlmair"]),
            robbins_fpd=float(entry["robbins_fpd"]) if "robbins_fpd" in entry else None,
            source=sources[entry["source"]], note=entry.get("note", ""),
        )
    return found


def find_packing(name):
    """The Packing called ``name``; SizingInputError('packing') lists the known ones otherwise."""
    known = packings()
    if name not in known:
        raise SizingInputError("packing", f"'{name}' is not in the packing data file; known: {', '.join(sorted(known))}")
    return known[name]
