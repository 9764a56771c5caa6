"""The ``[liquid_model]`` table of a case: an activity-coefficient model of the liquid (UNIFAC
with its published parameters, or NRTL with the user's), turned into the ``Unifac`` or ``Nrtl``
object that ``PropertyModel(activity=...)`` takes. Format: cases/README.md."""

from dataclasses import dataclass

from ..errors import CaseError, InputError
from ..properties.activity import Nrtl
from ..properties.constants import GAS_CONSTANT
from ..properties.unifac_parameters import UNIFAC_VERSIONS, unifac
from .reader import Section, suggestion, where

LIQUID_MODEL_KEYS = ("activity", "version", "members", "groups", "a", "b", "alpha", "source")
ACTIVITY_MODELS = ("unifac", "nrtl")
MEMBER_KINDS = ("raoult", "activity", "nonvolatile")  # equilibrium models of the liquid model's members
_ONLY = {"unifac": ("version", "groups"), "nrtl": ("a", "b", "alpha", "source")}


@dataclass(frozen=True)
class LiquidModel:
    """The activity model (``Unifac`` or ``Nrtl``) and its echo (SI, for results.json)."""

    activity: object
    echo: dict


def read_liquid_model(top, components):
    """The ``[liquid_model]`` table of the top-level Section, for ``components`` (Component
    records whose ``equilibrium`` is the case's model), or None without the table.

    Raises CaseError naming the key when the table is malformed, and when a component uses
    equilibrium 'activity' without it.
    """
    section = top.table("liquid_model", LIQUID_MODEL_KEYS)
    if section is None:
        for component in components:
            if component.equilibrium == "activity":
                path = f"{Section({}, 'component', top.file).key_path(component.name)}.equilibrium"
                raise CaseError(where(top.file, path), "'activity' needs an activity model of the liquid: add a "
                                "[liquid_model] table, e.g. activity = \"unifac\"")
        return None
    kind = section.text("activity", choices=ACTIVITY_MODELS)
    for other, keys in _ONLY.items():
        for key in keys:
            if other != kind and key in section:
                section.fail(key, f"applies only with activity = '{other}', not '{kind}'")
    members = _members(section, components)
    names = [components[i].name for i in members]
    echo = {"activity": kind, "members": names}
    if kind == "unifac":
        activity = _unifac(section, components, members, echo)
    else:
        activity = _nrtl(section, components, members, echo)
    return LiquidModel(activity, echo)


def _find(components, text):
    """Index of the component named by ``text`` (name, alias, formula, CAS), or None."""
    for i, component in enumerate(components):
        if component.name == text or component.matches(text):
            return i
    return None


def _member(section, text, components, members):
    """Position in ``members`` of the component named by the key ``text`` of ``section``."""
    i = _find(components, text)
    if i is None or i not in members:
        names = ", ".join(f"'{components[j].name}'" for j in members)
        section.fail(text, f"'{text}' is not a member of the liquid model; its members are {names}")
    return members.index(i)


def _members(section, components):
    """Indices of the members: as listed, or every 'raoult', 'activity' and 'nonvolatile' component."""
    if "members" not in section:
        members = [i for i, c in enumerate(components) if c.equilibrium in MEMBER_KINDS]
    else:
        listed = section.raw("members")
        if not isinstance(listed, list) or not all(isinstance(n, str) for n in listed):
            section.fail("members", f"found {listed!r}; expected a list of component names, e.g. [\"water\", \"acetone\"]")
        members = []
        for j, text in enumerate(listed):
            i = _find(components, text)
            names = ", ".join(f"'{c.name}'" for c in components)
            if i is None:
                section.fail(f"members[{j}]", f"'{text}' is not a component of this case; its components are {names}"
                             f"{suggestion(text, [c.name for c in components])}")
            if i in members:
                section.fail(f"members[{j}]", f"'{text}' is listed twice")
            if components[i].equilibrium not in MEMBER_KINDS:
                section.fail(f"members[{j}]", f"'{components[i].name}' has equilibrium '{components[i].equilibrium}'; "
                             f"members of the liquid model need one of {MEMBER_KINDS}")
            members.append(i)
        members.sort()  # component order, as every table shows them
    if len(members) < 2:
        section.fail("members", f"found {[components[i].name for i in members]}; an activity model needs at least two "
                     f"liquid components (equilibrium one of {MEMBER_KINDS})")
    outside = [c.name for i, c in enumerate(components) if c.equilibrium == "activity" and i not in members]
    if outside:
        section.fail("members", f"leaves out {', '.join(outside)}, whose equilibrium is 'activity'; add them to the members")
    anchored = any(components[i].equilibrium == "activity" for i in members)
    if anchored and not any(components[i].is_water for i in members):
        section.fail("members", "anchors solutes to their Henry's constants in water (equilibrium 'activity'), so "
                     "water must be a member; for a solute in another solvent use equilibrium 'raoult' with the model")
    return members


def _unifac(section, components, members, echo):
    version = section.text("version", "dortmund", choices=UNIFAC_VERSIONS)
    groups = _groups(section, components, members)
    for i in members:
        if components[i].name not in groups and not components[i].cas:
            section.fail("groups", f"missing the subgroups of '{components[i].name}', which has no CAS number to look "
                         f"up a published assignment; e.g. [liquid_model.groups] \"{components[i].name}\" = "
                         "{ 1 = 1, 18 = 1 } (subgroup number = count)")
    echo.update(version=version, groups={name: {str(k): v for k, v in found.items()} for name, found in groups.items()})
    try:
        return unifac([components[i] for i in members], version=version, groups=groups)
    except InputError as error:
        key = "groups" if error.quantity == "unifac.groups" else None
        found = error.message if error.quantity.startswith("unifac") else str(error)
        section.fail(key, f"{found}; write subgroups as [liquid_model.groups] \"name\" = {{ 1 = 1, 18 = 1 }}")


def _groups(section, components, members):
    """{member name: {subgroup number: count}} from ``groups``."""
    table = section.table("groups")
    if table is None:
        return {}
    groups = {}
    for text in table.data:
        name = components[members[_member(table, text, components, members)]].name
        if name in groups:
            table.fail(text, f"names {name} a second time")
        row = table.table(text)
        if not row.data:
            row.fail(None, "is empty; expected subgroup number = count, e.g. { 1 = 1, 18 = 1 }")
        found = {}
        for number, count in row.data.items():
            if not number.isdigit() or int(number) < 1:
                row.fail(number, f"'{number}' is not a subgroup number; expected whole numbers >= 1 as keys, "
                         "e.g. { 1 = 1, 18 = 1 }")
            found[int(number)] = row.integer(number, minimum=1)
        groups[name] = found
    return groups


def _nrtl(section, components, members, echo):
    names = [components[i].name for i in members]
    source = section.source("the NRTL parameters", "publication, or the plant data and fit behind them")
    b = _pair_matrix(section, "b", components, members, required=True, kinds=("temperature_difference", "molar_energy"))
    a = _pair_matrix(section, "a", components, members, required=False, kinds="fraction")
    alpha = _alpha(section, components, members)
    echo.update(a=_matrix_echo(a, names), b_K=_matrix_echo(b, names), alpha=_matrix_echo(alpha, names), source=source)
    return Nrtl(names, a, b, alpha, source=source)



def _pair_matrix(section, key, components, members, *, required, kinds):
    """m x m matrix of parameters given per ordered pair, ``key.i.j`` (zero diagonal); every
    off-diagonal pair is needed when the table is given. Energies per mole are divided by R."""
    m = len(members)
    matrix = [[0.0] * m for _ in range(m)]
    if required and key not in section:
        section.raw(key, expected=f"a table of {key}_ij for every ordered pair of members, e.g. "
                    f"{key} = {{ water = {{ acetone = \"350 K\" }}, acetone = {{ water = \"-60 K\" }} }}")
    table = section.table(key)
    if table is None:
        return matrix
    given = set()
    for row_text in table.data:
        i = _member(table, row_text, components, members)
        row = table.table(row_text)
        for column_text, value in row.data.items():
            j = _member(row, column_text, components, members)
            if i == j:
                row.fail(column_text, f"tau_ii is zero by definition; leave {key} of a member with itself out")
            if (i, j) in given:
                row.fail(column_text, "names a pair given already")
            number, kind = row.convert(column_text, value, kinds)
            matrix[i][j] = number / GAS_CONSTANT if kind == "molar_energy" else number
            given.add((i, j))
    missing = [(i, j) for i in range(m) for j in range(m) if i != j and (i, j) not in given]
    if missing:
        i, j = missing[0]
        names = [components[k].name for k in members]
        table.fail(None, f"has no value for the pair ({names[i]}, {names[j]}); give {key} for every ordered pair of "
                   f"members, e.g. {key}.\"{names[i]}\".\"{names[j]}\"")
    return matrix


def _alpha(section, components, members):
    """Symmetric m x m non-randomness matrix: one number for every pair, or ``alpha.i.j`` per pair."""
    m = len(members)
    if "alpha" not in section:
        section.raw("alpha", expected="a number such as 0.3 (every pair), or a table alpha.\"i\".\"j\" per pair")
    value = section.data["alpha"]
    if not isinstance(value, dict):
        number = section.fraction("alpha")
        return [[0.0 if i == j else number for j in range(m)] for i in range(m)]
    table = section.table("alpha")
    matrix = [[None] * m for _ in range(m)]
    for row_text in table.data:
        i = _member(table, row_text, components, members)
        row = table.table(row_text)
        for column_text in row.data:
            j = _member(row, column_text, components, members)
            if i == j:
                row.fail(column_text, "a member has no non-randomness with itself; leave it out")
            number = row.fraction(column_text)
            if matrix[j][i] is not None and matrix[j][i] != number:
                row.fail(column_text, f"found {number:g}, but the reverse pair has {matrix[j][i]:g}; alpha is the same "
                         "both ways")
            matrix[i][j] = matrix[j][i] = number
    names = [components[k].name for k in members]
    for i in range(m):
        for j in range(i + 1, m):
            if matrix[i][j] is None:
                table.fail(None, f"has no value for the pair ({names[i]}, {names[j]}); give alpha for every pair of members")
        matrix[i][i] = 0.0
    return matrix


def _matrix_echo(matrix, names):
    return {row: {column: matrix[i][j] for j, column in enumerate(names) if j != i} for i, row in enumerate(names)}
