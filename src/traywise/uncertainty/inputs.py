"""The uncertain inputs of a case: which property values are sampled, and by how much.

Each sampled quantity is a relative standard uncertainty u [-] of one property of one
component, applied as a log-normal factor of median 1 and log-standard deviation u
(``perturb.py``; for u up to 20 % the factor's standard deviation is within 2 % of u). Where a
value comes from, per quantity (``basis`` says which, ``default`` marks the stated defaults):

  henry_constant        H at 298.15 K. Default 10 % (common practice: independent measurements
                        of one gas's Henry's constant in water commonly scatter by about this;
                        the compilations the component files cite state no uncertainty per value).
  enthalpy_of_solution  the temperature dependence of H, as the enthalpy of solution at 298.15 K.
                        Default 20 % (common practice: the temperature dependences compiled for
                        one gas scatter more than the values themselves).
  vapour_pressure       the deviation of the correlation from the reference equation of state,
                        as the component file states it; default 2 % (common practice for a
                        handbook correlation inside its range).
  heat_of_vaporisation  the difference from a second, independent value that the component file
                        states; default 1 % (common practice).
  gas_heat_capacity     the median deviation of the independent tabulations the component file
                        lists from the chosen fit; default 1 % (common practice).
  liquid_heat_capacity  default 1 % (common practice); the file states only how closely the fit
                        follows its own source.

Beside the property data, the tray efficiency the case gives (``COLUMN``; component 'column'):

  murphree_efficiency   the Murphree vapour efficiency of every stage, scaled together, capped at 1;
                        sampled when the case gives efficiencies below 1 (real trays).
  overall_efficiency    the theoretical stages per actual tray; sampled only for a design on the
                        stage count, where it turns the stages found into actual trays (a column
                        of fixed theoretical stages solves the same whatever it is).
  Default 10 % on either (common practice: a tray efficiency taken from a correlation or
  from a similar column is commonly trusted to about this, relative); the case may state its own
  (``tray_efficiency``) or 0 % to hold it fixed.

The two Henry's-law parameters are sampled at the reference temperature, where a van 't Hoff fit's
value and slope are least correlated; the sources give no correlation, so the default is 0 and
a case may state one (``correlations``).
"""

import re
from dataclasses import dataclass

from ..properties.component import MODEL_KINDS
from ..properties.constants import T_REFERENCE
from .electrolyte_inputs import DISSOCIATION, data_constant, data_uncertainty

HENRY, SOLUTION = "henry_constant", "enthalpy_of_solution"
# quantity -> (what it is, the equilibrium models that use it, default u, why the default)
QUANTITIES = {
    HENRY: ("Henry's constant at 298.15 K", ("henry", "activity", "electrolyte"), 0.10,
            "default: 10 % on a Henry's constant (common practice); the source states no uncertainty"),
    SOLUTION: ("enthalpy of solution at 298.15 K (temperature dependence of the Henry's constant)",
               ("henry", "activity", "electrolyte"), 0.20,
               "default: 20 % on an enthalpy of solution from a Henry's-constant fit (common practice)"),
    DISSOCIATION: ("first dissociation constant in water (the electrolyte liquid)", ("electrolyte",), None,
                   "from the electrolyte data file (electrolyte_inputs.py)"),
    "vapour_pressure": ("vapour pressure", ("raoult", "activity"), 0.02,
                        "default: 2 % on a vapour-pressure correlation (common practice)"),
    "heat_of_vaporisation": ("heat of vaporisation", ("raoult",), 0.01,
                             "default: 1 % on a heat of vaporisation (common practice)"),
    "gas_heat_capacity": ("ideal-gas heat capacity", MODEL_KINDS, 0.01,
                          "default: 1 % on an ideal-gas heat capacity (common practice)"),
    "liquid_heat_capacity": ("liquid heat capacity", ("raoult", "nonvolatile"), 0.01,
                             "default: 1 % on a liquid heat capacity (common practice)"),
}
ATTRIBUTES = {  # quantity -> the Component attribute it perturbs
    HENRY: "henry_in_water",
    SOLUTION: "henry_in_water",
    "vapour_pressure": "vapour_pressure",
    "heat_of_vaporisation": "heat_of_vaporisation",
    "gas_heat_capacity": "ideal_gas_cp",
    "liquid_heat_capacity": "liquid_cp",
}
COLUMN = "column"  # the component name of the tray-efficiency inputs
MURPHREE, OVERALL = "murphree_efficiency", "overall_efficiency"
TRAY_EFFICIENCY_DEFAULT = 0.10
TRAY_EFFICIENCY_WHY = "default: 10 % on a tray efficiency (common practice); the case states no uncertainty"
SCOPES = ("all", "listed")
REFERENCE_TEMPERATURE = T_REFERENCE  # [K], where the Henry's-law pair is sampled
_NUMBER = r"([+-]?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?) %"


@dataclass(frozen=True)
class UncertainInput:
    """One sampled property value.

    component : str      Component name ('column' for a tray efficiency)
    quantity : str       One of ``QUANTITIES``, or 'murphree_efficiency' / 'overall_efficiency'
    relative : float     Relative standard uncertainty u [-]
    basis : str          Where u comes from (source, component-file statement, default, case)
    default : bool       True when u is a stated default, not taken from the value's source
    value : float or None   The nominal overall efficiency [-] for 'overall_efficiency' (the
                            column does not carry it), None otherwise
    """

    component: str
    quantity: str
    relative: float
    basis: str
    default: bool
    value: float | None = None

    @property
    def name(self):
        """'quantity:component', the input's name in tables and plots."""
        return f"{self.quantity}:{self.component}"


@dataclass(frozen=True)
class UncertaintyRequest:
    """What to sample, as a case states it (``case/uncertainty.py`` reads it; all optional).

    samples : int or None        Number of samples (the command's --samples wins)
    seed : int or None           Seed of the Latin hypercube (--seed wins)
    scope : str                  'all': every property value the model uses, with the library's
                                 or the default uncertainty, overridden where listed;
                                 'listed': only the values listed in ``relative``
    relative : dict              (component, quantity) -> u [-] stated in the case
    correlations : dict          component -> correlation coefficient [-] between its
                                 henry_constant and enthalpy_of_solution
    tray_efficiency : float or None   u [-] of the tray efficiency stated in the case (None:
                                 the default with scope 'all', not sampled with 'listed')
    """

    samples: int | None = None
    seed: int | None = None
    scope: str = "all"
    relative: dict = None
    correlations: dict = None
    tray_efficiency: float | None = None


def uncertain_inputs(model, request=UncertaintyRequest(), *, column=None, overall_efficiency=None,
                     stage_design=False):
    """The sampled inputs of a property model (and of the column's tray efficiency) and the
    correlations between them.

    Parameters
    ----------
    model : PropertyModel
    request : UncertaintyRequest
    column : Column, optional        Its Murphree efficiencies are sampled when any is below 1
    overall_efficiency : float, optional   E_o of the case [-]; sampled when ``stage_design``
    stage_design : bool              The case designs the stage count

    Returns
    -------
    (tuple of UncertainInput, tuple of (i, j, rho))   rho between inputs i and j [-]; inputs with
    u = 0 are left out (held at their values).
    """
    stated = dict(request.relative or {})
    inputs = []
    for i, component in enumerate(model.components):
        for quantity in used_quantities(model, i):
            if (component.name, quantity) in stated:
                relative = float(stated[(component.name, quantity)])
                entry = UncertainInput(component.name, quantity, relative, "stated in the case file", False)
            elif request.scope == "listed":
                continue
            else:
                entry = _electrolyte_uncertainty(model, component, quantity) or library_uncertainty(component, quantity)
            if entry.relative > 0.0:
                inputs.append(entry)
    inputs += [e for e in efficiency_inputs(request, column, overall_efficiency, stage_design) if e.relative > 0.0]
    names = [entry.name for entry in inputs]
    correlations = []
    for component, rho in (request.correlations or {}).items():
        pair = (f"{HENRY}:{component}", f"{SOLUTION}:{component}")
        if all(name in names for name in pair) and rho != 0.0:
            correlations.append((names.index(pair[0]), names.index(pair[1]), float(rho)))
    return tuple(inputs), tuple(correlations)


def used_quantities(model, i):
    """The quantities (``QUANTITIES``) of component i that the model uses: by its equilibrium
    model, with a value to perturb; for an 'electrolyte' solute the Henry's constant of its
    molecular form, its temperature dependence where the component file holds it, and its first
    dissociation constant where it has one (``electrolyte_inputs``)."""
    kind, component = model.equilibrium[i], model.components[i]
    found = []
    for quantity, (_, kinds, _, _) in QUANTITIES.items():
        if kind not in kinds:
            continue
        if kind == "electrolyte" and quantity in (HENRY, SOLUTION, DISSOCIATION):
            in_data = data_constant(component, DISSOCIATION if quantity == DISSOCIATION else HENRY,
                                    model.electrolyte.data) is not None
            own = component.henry_in_water is not None
            # the temperature dependence of a data-file constant is not sampled
            used = {HENRY: in_data or own, SOLUTION: own and not in_data, DISSOCIATION: in_data}[quantity]
        else:
            used = getattr(component, ATTRIBUTES[quantity]) is not None
        if used:
            found.append(quantity)
    return found


def _electrolyte_uncertainty(model, component, quantity):
    """The ``UncertainInput`` of a data-file constant of the electrolyte liquid, or None where the
    value is the component file's."""
    if model.electrolyte is None or model.equilibrium[model.names.index(component.name)] != "electrolyte":
        return None
    constant = data_constant(component, quantity, model.electrolyte.data)
    if constant is None:
        return None
    relative, basis = data_uncertainty(constant, model.electrolyte.data)
    return UncertainInput(component.name, quantity, relative, basis, False)


def efficiency_inputs(request, column, overall_efficiency, stage_design):
    """The tray-efficiency inputs (module docstring): u as the case states it, else the default
    (scope 'all'), else none (scope 'listed')."""
    if request.tray_efficiency is not None:
        relative, basis, default = float(request.tray_efficiency), "stated in the case file", False
    elif request.scope == "listed":
        return []
    else:
        relative, basis, default = TRAY_EFFICIENCY_DEFAULT, TRAY_EFFICIENCY_WHY, True
    found = []
    if column is not None and (column.murphree < 1.0).any():
        found.append(UncertainInput(COLUMN, MURPHREE, relative, basis, default))
    if overall_efficiency is not None and stage_design:
        found.append(UncertainInput(COLUMN, OVERALL, relative, basis, default, float(overall_efficiency)))
    return found


def library_uncertainty(component, quantity):
    """The ``UncertainInput`` of one property value of a component as its data state it: from
    the component file's statement where it has one, else the quantity's default."""
    prop = getattr(component, ATTRIBUTES[quantity])
    note = component.notes.get(ATTRIBUTES[quantity], "") if prop.source in component.sources else ""
    if prop.source == "user":
        note = ""
    found = _stated(quantity, note)
    if found is None:
        _, _, relative, why = QUANTITIES[quantity]
        if prop.source == "user":
            why += " (value given in the case file)"
        return UncertainInput(component.name, quantity, relative, why, True)
    relative, basis = found
    return UncertainInput(component.name, quantity, relative, f"{basis} ({prop.source}, component file note)", False)


def _stated(quantity, note):
    """(u, basis) read from a component file's note on the property, or None."""
    if quantity == "vapour_pressure":
        match = re.search(rf"reference equation of state[^.]*? by at most {_NUMBER}", note)
        if match:
            return abs(float(match.group(1))) / 100.0, "largest deviation from the reference equation of state"
        match = re.search(rf"agrees with (IAPWS-95) within about {_NUMBER}", note)
        if match:
            return abs(float(match.group(2))) / 100.0, f"stated agreement with {match.group(1)}"
    if quantity == "heat_of_vaporisation":
        match = re.search(rf"The (.+?) value via thermo .*? differs by {_NUMBER}", note)
        if match:
            return abs(float(match.group(2))) / 100.0, f"difference from the {match.group(1)} value"
    if quantity == "gas_heat_capacity":
        deviations = sorted(abs(float(x)) for x in re.findall(rf"'[A-Z_]+' by {_NUMBER}", note))
        if deviations:
            middle = len(deviations) // 2
            median = deviations[middle] if len(deviations) % 2 else 0.5 * (deviations[middle - 1] + deviations[middle])
            return median / 100.0, f"median deviation of the {len(deviations)} independent tabulations listed"
    return None


def describe(entry):
    """One line: 'name: u = 10 % (basis)'."""
    return f"{entry.name}: u = {100.0 * entry.relative:.3g} % ({entry.basis})"

