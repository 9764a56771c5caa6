"""UNIFAC parameters for a set of components, read from thermo's published tables once, when a
property model is built (never in the per-iteration evaluation).

Two published versions:

- 'original': UNIFAC of A. Fredenslund, R. L. Jones, J. M. Prausnitz, AIChE J. 21 (1975) 1086,
  with the group volumes, areas and interaction parameters (a_mn only) of its revisions,
  H. K. Hansen, P. Rasmussen, Aa. Fredenslund, M. Schiller, J. Gmehling, Ind. Eng. Chem. Res.
  30 (1991) 2352 (revision and extension 5) and R. Wittig, J. Lohmann, J. Gmehling, Ind. Eng.
  Chem. Res. 42 (2003) 183 (revision and extension 6);
- 'dortmund': modified UNIFAC (Dortmund) of U. Weidlich, J. Gmehling, Ind. Eng. Chem. Res. 26
  (1987) 1372, with temperature-dependent interaction parameters a + b T + c T**2 of
  J. Gmehling, J. Li, M. Schiller, Ind. Eng. Chem. Res. 32 (1993) 178; J. Gmehling, J. Lohmann,
  A. Jakob, J. Li, R. Joh, Ind. Eng. Chem. Res. 37 (1998) 4876; A. Jakob, H. Grensemann,
  J. Lohmann, J. Gmehling, Ind. Eng. Chem. Res. 45 (2006) 7924.

Both as the publicly released parameter tables shipped in thermo 0.6.1 (C. Bell et al.):
subgroups UFSG / DOUFSG, interaction parameters 'UNIFAC original interaction parameters.tsv'
/ 'UNIFAC modified Dortmund interaction parameters.tsv'; the group assignment of each
component by CAS number from thermo's table of published assignments ('DDBST UNIFAC
assignments'), unless the caller gives the groups.
"""

import numpy as np

from ..errors import InputError
from .activity import Unifac

UNIFAC_VERSIONS = ("original", "dortmund")
_SOURCES = {
    "original": (
        "UNIFAC: A. Fredenslund, R. L. Jones, J. M. Prausnitz, AIChE J. 21 (1975) 1086; parameters of "
        "H. K. Hansen et al., Ind. Eng. Chem. Res. 30 (1991) 2352 and R. Wittig, J. Lohmann, J. Gmehling, "
        "Ind. Eng. Chem. Res. 42 (2003) 183, as shipped in thermo 0.6.1 (C. Bell et al.)"
    ),
    "dortmund": (
        "modified UNIFAC (Dortmund): U. Weidlich, J. Gmehling, Ind. Eng. Chem. Res. 26 (1987) 1372; parameters of "
        "J. Gmehling, J. Li, M. Schiller, Ind. Eng. Chem. Res. 32 (1993) 178, J. Gmehling et al., Ind. Eng. Chem. "
        "Res. 37 (1998) 4876 and A. Jakob et al., Ind. Eng. Chem. Res. 45 (2006) 7924, as shipped in thermo 0.6.1 "
        "(C. Bell et al.)"
    ),
}


def _tables(version):
    """(subgroups, interaction table, thermo's assignment key, exponent) of one version."""
    from thermo import unifac as tables  # heavy import, only when a model is built

    tables.load_unifac_ip()
    if version == "original":
        return tables.UFSG, tables.UFIP, "UNIFAC", 1.0
    return tables.DOUFSG, tables.DOUFIP2016, "MODIFIED_UNIFAC", 0.75


def _assignment(component, key):
    from thermo.unifac import UNIFAC_group_assignment_DDBST

    found = UNIFAC_group_assignment_DDBST(component.cas, key) if component.cas else {}
    if not found:
        raise InputError(
            component.name,
            f"no published UNIFAC group assignment for CAS '{component.cas or '(none)'}'; give its subgroups "
            "(subgroup number: count, e.g. acetone is {1: 1, 18: 1})",
        )
    return found


def unifac(components, *, version="dortmund", groups=None):
    """A ``Unifac`` model for ``components`` (the liquid members, in this order).

    Parameters
    ----------
    components : sequence of Component
    version : str            'dortmund' (default) or 'original', see the module docstring
    groups : dict, optional  Component name -> {subgroup number: count}, replacing the
                             published assignment (needed for components without a CAS number);
                             the model's ``source`` then says so

    Returns
    -------
    Unifac
    """
    if version not in UNIFAC_VERSIONS:
        raise InputError("unifac.version", f"'{version}' unknown; use one of {UNIFAC_VERSIONS}")
    subgroups, interaction_table, key, exponent = _tables(version)
    groups = dict(groups or {})
    given = [c.name for c in components if c.name in groups]
    counts = [groups.pop(c.name) if c.name in groups else _assignment(c, key) for c in components]
    if groups:
        raise InputError("unifac.groups", f"{', '.join(groups)} not among {', '.join(c.name for c in components)}")
    source = _SOURCES[version]
    if given:
        source += f"; subgroups of {', '.join(given)} given by the user, not a published assignment"
    used = sorted({k for found in counts for k in found})
    unknown = [k for k in used if k not in subgroups]
    if unknown:
        raise InputError("unifac.groups", f"subgroups {unknown} are not in the {version} UNIFAC table")
    nu = np.array([[found.get(k, 0) for k in used] for found in counts], dtype=float)
    main = [subgroups[k].main_group_id for k in used]
    interaction = np.zeros((3, len(used), len(used)))
    for m, main_m in enumerate(main):
        for n, main_n in enumerate(main):
            if main_m == main_n:
                continue
            value = interaction_table.get(main_m, {}).get(main_n)
            if value is None:
                raise InputError(
                    "unifac",
                    f"no published {version} UNIFAC parameter between main groups {subgroups[used[m]].main_group} "
                    f"and {subgroups[used[n]].main_group}; use NRTL with fitted parameters instead",
                )
            interaction[:, m, n] = (value, 0.0, 0.0) if version == "original" else value
    return Unifac(
        [c.name for c in components],
        nu,
        [subgroups[k].R for k in used],
        [subgroups[k].Q for k in used],
        interaction,
        volume_exponent=exponent,
        version=version,
        source=source,
    )
