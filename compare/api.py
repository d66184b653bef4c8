"""The Python API: build a case (or load one), analyse it, read the results as attributes, save them.

The same run as the command line: a case built here goes through the case-file parser (same
fields, same units, same checks, same :class:`~fem.errors.InputError` on bad input), is analysed
with the same adaptive refinement and convergence study, and :meth:`Result.to_dict` is the
dictionary ``shaftcheck run`` writes to ``results.json`` (SI base units). ::

    from compare import Case, analyse
    case = Case.keyed(diameter="30 mm", keyways=[dict(width="8 mm", depth="4 mm", fillet="0.4 mm")],
                      torque="180 N*m", material=dict(elastic_modulus="205 GPa", poisson=0.29))
    r = analyse(case)
    r.torsion.J, r.torsion.kts, r.accuracy.met      # SI floats, True/False
    r.q.torsion.J.to("mm**4")                        # pint quantities
    r.save("out/keyed")                              # results.json and section.vtu

The results carry the cautions of the command line (``r.caution``, ``r.warnings`` where given):
read them before a number.
"""
from __future__ import annotations

import copy
import json
from pathlib import Path

import numpy as np

from fem.errors import InputError

from .case.case import Case as CaseSpec
from .case.case import load_case, parse_case
from .case.units import ureg
from .cli.cmd_run import write_outputs
from .output.design_report import report_files
from .output.figure_shaft import shaft_figure_svg
from .output.notebook import result_html
from .output.report import summary
from .output.results import build_results
from .output.vtu import composite_vtu_bytes
from .pipeline import analyse as _analyse

__all__ = ["Case", "Result", "analyse", "InputError"]


class Case:
    """A checked case, ready for :func:`analyse`. Build it with :meth:`load`, :meth:`keyed`,
    :meth:`round` or :meth:`from_dict`; every value is read exactly as in a case file (a number
    takes the unit system's unit, a string carries its own: ``"30 mm"``, ``"180 N*m"``).

    ``case.spec`` is the parsed case (SI); its fields are also readable here (``case.section``,
    ``case.loads``, ``case.material``, ...). ``case.data`` is the dictionary it was built from (the
    tables of a case file; ``None`` for a file that was loaded).

    >>> c = Case.keyed(diameter="30 mm", keyways=[dict(width="8 mm", depth="4 mm", fillet="0.4 mm")],
    ...                torque="180 N*m", material=dict(elastic_modulus="205 GPa", poisson=0.29))
    >>> round(c.section.diameter, 6), c.loads.torque, round(c.material.shear_modulus / 1e9, 3)
    (0.03, 180.0, 79.457)
    >>> try:
    ...     Case.keyed(diameter="-30 mm", keyways=[dict(width="8 mm", depth="4 mm")], torque="1 N*m",
    ...                material=dict(shear_modulus="80 GPa"))
    ... except InputError as e:
    ...     print(e.field)
    section.diameter
    """

    def __init__(self, spec: CaseSpec, data: dict | None = None):
        if not isinstance(spec, CaseSpec):
            raise InputError("case", spec, "is not a parsed case; use Case.load, Case.keyed or Case.from_dict")
        self.spec = spec
        self.data = data

    # ------------------------------------------------------------------ constructors
    @classmethod
    def load(cls, path: str | Path) -> Case:
        """Read a case file (TOML), as ``shaftcheck run`` does.

        >>> import compare
        >>> cases = Path(compare.__file__).resolve().parents[1] / "cases"
        >>> Case.load(cases / "conveyor_gear_seat.toml").section.kind
        'keyed'
        """
        return cls(load_case(path))

    @classmethod
    def from_dict(cls, data: dict) -> Case:
        """A case from the dictionary a case file gives (its tables: ``case``, ``section``,
        ``loads``, ``material``, ``analysis``, ``fatigue``).

        >>> Case.from_dict({"case": {"units": "mm-N-MPa"}, "section": {"shape": "round", "diameter": 20},
        ...                 "material": {"shear_modulus": 80000}}).section.diameter
        0.02
        """
        if not isinstance(data, dict):
            raise InputError("case", data, "must be a dictionary of the case file's tables")
        data = copy.deepcopy(data)
        return cls(parse_case(copy.deepcopy(data)), data)

    @classmethod
    def keyed(cls, diameter, keyways, torque=None, material=None, *, bore=None, loads=None, analysis=None,
              fatigue=None, title=None, units=None) -> Case:
        """A shaft with keyways: ``keyways`` is a list of dicts with ``width``, ``depth``, ``fillet``
        and ``angle`` (the keys of ``[[section.keyways]]``). ``loads``, ``material``, ``analysis`` and
        ``fatigue`` are the case file's tables as dicts; ``torque`` is ``loads.torque``; ``units``
        is the unit system of plain numbers (``case.units``)."""
        section = {"shape": "keyed", "diameter": diameter, "keyways": keyways}
        if bore is not None:
            section["bore"] = bore
        return cls.from_dict(_tables(section, torque, material, loads, analysis, fatigue, title, units))

    @classmethod
    def flatted(cls, diameter, flats, torque=None, material=None, *, bore=None, loads=None, analysis=None,
                fatigue=None, title=None, units=None) -> Case:
        """A round shaft with flats (a D-cut, a double-D): ``flats`` is a list of dicts with ``depth``
        and ``angle`` (the entries of ``section.flats``); the other arguments as :meth:`keyed`.

        >>> Case.flatted("12 mm", [dict(depth="1 mm")], "9 N*m", dict(shear_modulus="80 GPa")).section.kind
        'flatted'
        """
        section = {"shape": "flatted", "diameter": diameter, "flats": flats}
        if bore is not None:
            section["bore"] = bore
        return cls.from_dict(_tables(section, torque, material, loads, analysis, fatigue, title, units))

    @classmethod
    def round(cls, diameter, torque=None, material=None, *, bore=None, loads=None, analysis=None,
              fatigue=None, title=None, units=None) -> Case:
        """A plain round shaft (or a tube with ``bore``); the other arguments as :meth:`keyed`."""
        section = {"shape": "round", "diameter": diameter}
        if bore is not None:
            section["bore"] = bore
        return cls.from_dict(_tables(section, torque, material, loads, analysis, fatigue, title, units))

    # ------------------------------------------------------------------ reading
    def __getattr__(self, name):
        if name in ("spec", "data"):
            raise AttributeError(name)
        return getattr(self.spec, name)

    def __repr__(self) -> str:
        return f"Case({self.spec.title!r}, section={self.spec.section.kind!r})"


def _tables(section, torque, material, loads, analysis, fatigue, title, units) -> dict:
    data: dict = {"section": section}
    head = {k: v for k, v in (("title", title), ("units", units)) if v is not None}
    if head:
        data["case"] = head
    ld = dict(loads) if isinstance(loads, dict) else loads
    if torque is not None:
        if ld is None:
            ld = {}
        if not isinstance(ld, dict):
            raise InputError("loads", loads, "must be a dictionary (the [loads] table)")
        if "torque" in ld:
            raise InputError("loads.torque", ld["torque"], "is given twice (torque= and loads['torque'])")
        ld["torque"] = torque
    for key, table in (("loads", ld), ("material", material), ("analysis", analysis), ("fatigue", fatigue)):
        if table is not None:
            data[key] = table
    return data


def analyse(case, *, fineness: float | None = None) -> Result:
    """Analyse a case (a :class:`Case`, or the path of a case file) exactly as ``shaftcheck run``
    does: adaptive refinement to the case's accuracy target, the convergence study, the pairs
    against the hand formulas and the checks. Bad input raises :class:`~fem.errors.InputError`."""
    if isinstance(case, (str, Path)):
        case = Case.load(case)
    spec = case.spec if isinstance(case, Case) else case
    if not isinstance(spec, CaseSpec):
        raise InputError("case", case, "is not a case; use Case.load, Case.keyed or Case.from_dict")
    if fineness is not None and (isinstance(fineness, bool) or not isinstance(fineness, (int, float))
                                 or not fineness > 0):
        raise InputError("fineness", fineness, "must be positive")
    a = _analyse(spec, fineness=fineness)
    return Result(a, build_results(a))


class Record:
    """Attribute access to one table of the results (``r.torsion.J``); ``rec["key"]`` works too,
    and :meth:`to_dict` gives the plain dictionary."""

    def __init__(self, data: dict, path: str = ""):
        self._d, self._path = data, path

    def __getattr__(self, name):
        if name.startswith("_"):
            raise AttributeError(name)
        try:
            return self[name]
        except KeyError:
            raise AttributeError(f"results{self._path} has no {name!r} (keys: {', '.join(self._d)})") from None

    def __getitem__(self, key):
        return _wrap(self._d[key], f"{self._path}.{key}")

    def __contains__(self, key) -> bool:
        return key in self._d

    def __dir__(self):
        return [k for k in self._d if isinstance(k, str) and k.isidentifier()]

    def keys(self):
        return self._d.keys()

    def to_dict(self) -> dict:
        return copy.deepcopy(self._d)

    def __repr__(self) -> str:
        return f"Record(results{self._path}: {', '.join(self._d)})"


def _wrap(v, path):
    if isinstance(v, dict):
        return Record(v, path)
    if isinstance(v, list) and any(isinstance(x, dict) for x in v):
        return [_wrap(x, f"{path}[{i}]") for i, x in enumerate(v)]
    return v


class Result(Record):
    """What :func:`analyse` returns: the ``results.json`` dictionary as attributes (SI floats),
    ``r.q`` the same as pint quantities, ``r.analysis`` the FE objects (mesh, fields) for plots."""

    def __init__(self, analysis, data: dict):
        super().__init__(data)
        self.analysis = analysis

    @property
    def q(self) -> QuantityRecord:
        """The results as pint quantities: ``r.q.torsion.J.to("mm**4")``."""
        return QuantityRecord(self._d)

    @property
    def exit_code(self) -> int:
        """The command line's exit code for this run: 0, or 3 when the accuracy target was not met."""
        return int(self._d.get("exit_code", 0))

    def summary(self) -> str:
        """The terminal summary ``shaftcheck run`` prints, in the case's units."""
        return summary(self._d, self.analysis.case.units)

    def save(self, out: str | Path, vtu: bool = True, report: bool = True) -> Path:
        """Write the files ``shaftcheck run --out`` writes (``results.json``; with ``vtu``,
        ``section.vtu``; with ``report``, ``report.html``, ``results.csv`` and ``figures/``; ``shaft.svg``
        for a layout) into the folder ``out``; nothing is half-written. Returns the folder."""
        out = Path(out)
        files = {"results.json": json.dumps(self._d, indent=2, ensure_ascii=False) + "\n"}
        layout = "shaft" in self.analysis.extra and bool(self._d.get("section_loads"))
        if report and (self.analysis.mesh is not None or layout):  # as `run` without --no-report
            files.update(report_files(self.analysis, self._d))
        if vtu and "composite" in self.analysis.extra:  # a composite section's regions and stresses
            files["section.vtu"] = composite_vtu_bytes(self.analysis)
        if (self._d.get("shaft") or {}).get("diagrams"):  # a layout case: its diagrams too, as the command line writes them
            files["shaft.svg"] = files.get("figures/shaft_diagrams.svg") or shaft_figure_svg(self._d, self.analysis.case.units)
        write_outputs(out, files, self.analysis if vtu and self.analysis.mesh is not None else None)
        return out

    def _repr_html_(self) -> str:
        """In a notebook: the verdict, the headline table and, for a layout, its stations and diagrams."""
        return result_html(self._d, self.analysis.case.units)

    def __repr__(self) -> str:
        return f"Result({self._d['case']['title']!r}: {', '.join(self._d)})"


#: SI unit of each numeric key of results.json that has one (keys not here have none recorded, and
#: ``r.q`` refuses them rather than guess). Pairs carry their own ``dimension``.
UNITS = {
    **dict.fromkeys(["J", "J_warping", "J_bracket", "J_mesh", "J_warping_mesh", "boundary_correction", "Ixx", "Iyy",
                     "Ixy", "I1", "I2", "polar"], "m**4"),
    **dict.fromkeys(["area", "shear_area_x", "shear_area_y", "hole_areas"], "m**2"),
    **dict.fromkeys(["centroid", "c_max", "tau_max_at", "tau_max_warping_at", "at", "centre",
                     "centre_offset_from_centroid", "axis", "distance_from_axis", "radius", "element_size",
                     "singular_corners", "sharp_reentrant_corners"], "m"),
    **dict.fromkeys(["torque", "torque_from_axis_offset"], "N*m"),
    **dict.fromkeys(["force"], "N"),
    **dict.fromkeys(["tau_max", "tau_max_warping", "tau_nominal", "von_mises_max", "sigma1_max", "sigma3_min",
                     "tau_abs_max", "Se", "Se_prime", "sigma", "tau", "tau_zx", "tau_zy", "sigma1", "sigma2", "sigma3",
                     "von_mises", "tresca", "tau_max_in_plane", "sigma_a_vm", "sigma_m_vm"], "Pa"),
    **dict.fromkeys(["tau_max_per_torque", "tau_nominal_per_torque"], "Pa/(N*m)"),
    "twist_per_length": "rad/m",
    **dict.fromkeys(["torsional_stiffness_GJ", "GJ", "GJ_warping", "GJ_bracket", "EIxx", "EIyy", "EIxy", "EI1",
                     "EI2"], "N*m**2"),
    "EA": "N", "centroid_weighted": "m", "sigma_max": "Pa", "von_mises_bound": "Pa", "tau_interface_max": "Pa",
    "sigma_max_at": "m", "elastic_modulus": "Pa", "shear_modulus": "Pa", "yield": "Pa",
    # a composite section's transverse shear and fatigue per region (compare/checks/composite_*.py)
    "tau_shear_max": "Pa", "tau_shear_max_at": "m", "tau_shear_interface_max": "Pa", "torque_with_shear": "N*m", "S_f": "Pa", "tensile_strength": "Pa",
    "ultimate": "Pa",
    "section_modulus": "m**3",
    **dict.fromkeys(["kts", "J_relative_gap", "peak_relative_difference", "fe_vs_boundary_integral", "kappa_x",
                     "kappa_y", "kappa_xy", "poisson", "ratio", "factor", "target", "achieved", "design_factor",
                     "margin", "value"], ""),
    "principal_angle_deg": "deg", "angle_deg": "deg",
    "used_at": "m", "z": "m", "self_weight_departure": "N*m",
    # the designer's checklist (keys, splines, press_fits, shaft.bearing_life, shaft.torsional)
    **dict.fromkeys(["shear_stress", "bearing_stress_shaft", "bearing_stress_hub", "contact_pressure", "hub_tangential",
                     "hub_radial", "shaft_tangential", "shaft_radial", "hub_von_mises", "shaft_von_mises", "key_yield",
                     "hub_yield", "shaft_yield", "key_shear_yield", "bearing_shaft_strength", "bearing_hub_strength",
                     "shear_yield", "bearing_pressure", "hub_elastic_modulus", "G"], "Pa"),
    **dict.fromkeys(["interference", "interference_operating", "interference_thermal_change", "hub_diameter", "width",
                     "height", "diameter", "bore", "shaft_engagement", "hub_engagement", "pitch_diameter",
                     "tooth_thickness", "depth", "length"], "m"),
    **dict.fromkeys(["torque_capacity", "torque_per_key"], "N*m"),
    **dict.fromkeys(["axial_capacity", "axial_force", "C", "P", "Fr", "Fa"], "N"),
    **dict.fromkeys(["friction", "hub_poisson", "slip_factor_torque", "slip_factor_axial", "hub_factor", "shaft_factor",
                     "shear_factor", "exponent", "X", "Y", "L10_revolutions", "ratios"], ""),
    **dict.fromkeys(["L10_hours", "required_life_hours"], "hour"),
    "speed": "rad/s", "rotation": "rad",
    # a 3-D segment's study ('segments') and a station's superposed 3-D local stresses (fe_local.summary)
    **dict.fromkeys(["von_mises_peak", "alternating_peak", "alternating_peak_mean", "sigma1_peak"], "Pa"),
    **dict.fromkeys(["von_mises_peak_at", "alternating_peak_at", "sigma1_peak_at", "span"], "m"),
    **dict.fromkeys(["kt_axial", "kt_bending_x", "kt_bending_y", "kt_axial_gci", "kt_bending_x_gci",
                     "kt_bending_y_gci", "kts_gci"], ""),
}
#: Units of keys whose name alone is ambiguous, by their path in the results (the shaft layout's).
PATH_UNITS = {".shaft.max_deflection.value": "m", ".shaft.max_moment.value": "N*m",
              ".shaft.critical_speeds.rayleigh": "rad/s", ".shaft.critical_speeds.values": "rad/s",
              ".shaft.critical_speeds.speed": "rad/s", ".shaft.torsional.frequencies.values": "rad/s",
              # a polymer's check at its service conditions (compare/checks/polymer.py)
              **{f".polymer.strengths.{k}": "Pa" for k in ("tensile_strength", "yield", "elastic_modulus",
                                                           "shear_modulus", "fatigue_strength")},
              ".polymer.fatigue.S_f": "Pa", ".polymer.twist.creep_modulus": "Pa", ".polymer.twist.creep_shear_modulus": "Pa",
              ".polymer.twist.shear_modulus": "Pa", ".polymer.twist.short_term": "rad/m", ".polymer.twist.long_term": "rad/m",
              ".polymer.twist.duration": "s", ".polymer.conditions.life": "s", ".polymer.conditions.speed": "rad/s",
              ".polymer_layout.max_deflection.value": "m", ".polymer_layout.max_deflection.short_term": "m"}
_PAIR_DIMENSIONS = {"second_moment": "m**4", "area": "m**2", "stress": "Pa", "length": "m", "rigidity": "N*m**2",
                    "twist": "rad/m",
                    "per_cubic": "Pa/(N*m)", "dimensionless": ""}


class QuantityRecord:
    """``r.q``: the results with their SI units as pint quantities (lists become array quantities)."""

    def __init__(self, data: dict, path: str = ""):
        self._d, self._path = data, path

    def __getattr__(self, name):
        if name.startswith("_"):
            raise AttributeError(name)
        if name not in self._d:
            raise AttributeError(f"results{self._path} has no {name!r}")
        v = self._d[name]
        path = f"{self._path}.{name}"
        if isinstance(v, dict):
            return QuantityRecord(v, path)
        if isinstance(v, list) and v and all(isinstance(x, dict) for x in v):
            return [QuantityRecord(x, f"{path}[{i}]") for i, x in enumerate(v)]
        unit = PATH_UNITS.get(path, UNITS.get(name))
        if name in ("fe", "classic") and "dimension" in self._d:
            unit = _PAIR_DIMENSIONS.get(self._d["dimension"])
        if unit is None:
            raise AttributeError(f"no unit is recorded for results{path}; read the SI value without .q")
        if v is None or isinstance(v, bool):
            return v
        if isinstance(v, dict):  # pragma: no cover - handled above
            return QuantityRecord(v, path)
        return ureg().Quantity(np.asarray(v, dtype=float) if isinstance(v, list) else float(v), unit)

    def __dir__(self):
        return [k for k in self._d if isinstance(k, str) and k.isidentifier()]
