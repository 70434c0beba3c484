"""Code-minimum duct insulation: R-value rule sets by location, service and climate zone.

A duct rule set is a CSV table ``tables/duct_code_*.csv`` (one row per service, location
and band of climate zones) giving the least R-value of the duct insulation, read here in the
manner of :mod:`pipeins.codes` for pipes.  The tables are named ``duct_code_*`` rather than
``code_*`` because :mod:`pipeins.codes` reads every ``code_*`` table as a pipe rule set.

Shipped rule sets (values from memory; the adopted edition or the law in force governs):

``iecc-2018-c403``
    IECC 2018 section C403.11.1, commercial supply and return ducts and plenums: R-6 in
    unconditioned space; outdoors and within the building envelope assembly R-8 in climate
    zones 1–4 and R-12 in zones 5–8; none inside conditioned space; exempt where the design
    temperature difference across the duct wall is at most 15 °F (8.3 K).

Table shape
-----------
``rule_set``, ``service`` (``supply`` / ``return``), ``location`` (:data:`LOCATIONS`),
``climate_zone_range`` (``[1..4]``: climate zone numbers, brackets as in :mod:`pipeins.codes`),
``r_value_h_ft2_f_btu`` (or ``r_value_m2k_w``), optional ``exempt_max_temp_difference_f`` (or
``_k``), and ``source``.  Bands of one rule set must not overlap for the same service and
location (checked on loading).

The R-value a code states is the rated value of the insulation as a flat layer, R = t/k
with k at the rating mean temperature (75 °F, 23.9 °C, the usual rating point of US
R-value labels; from memory); :func:`least_thickness` turns it into the least thickness of
a catalogue material, with the blanket-wrap compression allowance where asked.
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass

import numpy as np

from pipeins.errors import InputError, closest_names

__all__ = ["LOCATIONS", "SERVICES", "RATING_MEAN_TEMP_C", "DuctRuleRow", "DuctCodeRequirement", "ThicknessForR",
           "load_duct_rule_sets", "parse_climate_zone", "minimum_r_value", "least_thickness", "r_value_si",
           "list_duct_rules"]

#: Duct locations a rule set may name: inside conditioned space, in an unconditioned space (an
#: attic, a plant room that is not heated or cooled, a crawl space), outside the building, and
#: within a building envelope assembly (a wall, roof or floor build-up).
LOCATIONS = ("conditioned", "unconditioned", "outdoors", "envelope")
#: Duct services.
SERVICES = ("supply", "return")
#: Mean temperature at which US R-value labels rate insulation, 75 °F [°C] (from memory).
RATING_MEAN_TEMP_C = (75.0 - 32.0) * 5.0 / 9.0
_CODE = "--code"
_ZONE_RE = re.compile(r"^\s*(?:climate\s+zone|zone|cz)?\s*([0-8])\s*([abc])?\s*$", re.I)
_LOCATION_WORDS = {"inside": "conditioned", "indoors": "conditioned", "conditioned space": "conditioned",
                   "unconditioned space": "unconditioned", "attic": "unconditioned", "outside": "outdoors",
                   "outdoor": "outdoors", "exterior": "outdoors", "envelope assembly": "envelope"}


@functools.cache
def _r_factor_si() -> float:
    """m²·K/W of one h·ft²·°F/Btu, from pipeins.units (the inverse of a Btu/(h·ft²·°F))."""
    from pipeins.units import from_display

    return 1.0 / float(from_display(1.0, "heat_transfer_coefficient", "us"))


def r_value_si(r_value_h_ft2_f_btu):
    """An R-value in h·ft²·°F/Btu as m²·K/W (1 h·ft²·°F/Btu = 0.17611 m²·K/W).

    >>> round(float(r_value_si(6.0)), 4)
    1.0567
    """
    return np.asarray(r_value_h_ft2_f_btu, dtype=float) * _r_factor_si()


@dataclass(frozen=True)
class DuctRuleRow:
    """One row of a duct rule set (R in m²·K/W and as written)."""

    rule_set: str
    service: str
    location: str
    zones: object  # pipeins.codes.Interval
    r_value_m2k_w: float
    r_value_as_written: float
    r_unit: str  # "h·ft²·°F/Btu" or "m²·K/W"
    exempt_max_temp_difference_k: float | None
    source: str
    origin: str


@dataclass(frozen=True)
class DuctCodeRequirement:
    """What a duct rule set asks of one duct.

    Attributes
    ----------
    r_value_m2k_w : float or None
        Least R-value of the insulation [m²·K/W]; 0 where none is required; None when not covered.
    r_value_as_written : float or None
        The same in the table's unit (``r_unit``), e.g. 6 for R-6 h·ft²·°F/Btu.
    r_unit : str
    covered : bool
        False when no row covers the duct (``reason`` says why).
    exempt : bool
        True when the design temperature difference is within the rule set's exemption.
    reason : str
    source : str
    rule_set : str
    """

    r_value_m2k_w: float | None
    r_value_as_written: float | None
    r_unit: str
    covered: bool
    exempt: bool
    reason: str
    source: str
    rule_set: str


def _parse_rows(rows, where: str) -> list[DuctRuleRow]:
    from pipeins.codes import Interval

    out = []
    for n, row in enumerate(rows, start=1):
        origin = f"{where} row {n}"
        try:
            if row.get("r_value_h_ft2_f_btu", "").strip():
                written, unit = float(row["r_value_h_ft2_f_btu"]), "h·ft²·°F/Btu"
                r_si = float(r_value_si(written))
            else:
                written, unit = float(row["r_value_m2k_w"]), "m²·K/W"
                r_si = written
            exempt_f = (row.get("exempt_max_temp_difference_f") or "").strip()
            exempt_k = (row.get("exempt_max_temp_difference_k") or "").strip()
            exempt = float(exempt_f) * 5.0 / 9.0 if exempt_f else (float(exempt_k) if exempt_k else None)
            zones = Interval.parse(row["climate_zone_range"])
            service, location = row["service"].strip(), row["location"].strip()
        except (KeyError, ValueError, TypeError) as exc:
            raise InputError("duct_code_table", f"{origin}: {exc}") from None
        if service not in SERVICES or location not in LOCATIONS or not (math.isfinite(r_si) and r_si >= 0):
            raise InputError("duct_code_table", f"{origin}: service must be one of {', '.join(SERVICES)}, location one "
                                                f"of {', '.join(LOCATIONS)}, and the R-value 0 or more")
        if not row.get("source", "").strip():
            raise InputError("duct_code_table", f"{origin}: every row needs a source")
        out.append(DuctRuleRow(row["rule_set"].strip(), service, location, zones, r_si, written, unit, exempt,
                               row["source"].strip(), origin))
    return out


@functools.cache
def load_duct_rule_sets() -> dict[str, tuple[DuctRuleRow, ...]]:
    """Every shipped duct rule set by name (``tables/duct_code_*.csv``).

    Raises
    ------
    InputError
        A malformed row, or two rows of one rule set, service and location whose
        climate-zone bands overlap.

    >>> sorted(load_duct_rule_sets())
    ['iecc-2018-c403']
    """
    from pipeins.tables import read_table, table_names

    sets: dict[str, list[DuctRuleRow]] = {}
    for table in table_names():
        if table.startswith("duct_code_"):
            for row in _parse_rows(read_table(table), f"{table}.csv"):
                sets.setdefault(row.rule_set, []).append(row)
    for members in sets.values():
        for i, a in enumerate(members):
            for b in members[i + 1:]:
                if (a.service, a.location) == (b.service, b.location) and a.zones.overlaps(b.zones):
                    raise InputError("duct_code_table", f"{b.origin} overlaps {a.origin} in climate zones")
    return {name: tuple(rows) for name, rows in sets.items()}


def parse_climate_zone(zone) -> int:
    """The climate zone number of ``4``, ``"4A"``, ``"5B"``, ``"zone 6"``, ``"CZ 7"`` [-].

    The moisture letter (A humid, B dry, C marine) does not change a duct R-value and is
    dropped.

    >>> parse_climate_zone("4A"), parse_climate_zone(7), parse_climate_zone("Climate zone 3C")
    (4, 7, 3)
    """
    if isinstance(zone, bool):
        zone = str(zone)
    if isinstance(zone, (int, np.integer)) and 0 <= int(zone) <= 8:
        return int(zone)
    match = _ZONE_RE.match(str(zone))
    if not match:
        raise InputError("climate_zone", f'cannot read "{str(zone).strip()}" as a climate zone; '
                                         "use a zone number 0 to 8 with an optional letter, e.g. 4A or 6")
    return int(match.group(1))


def _word(value, allowed, name, aliases=None):
    text = " ".join(str(value).strip().lower().replace("_", " ").split())
    text = (aliases or {}).get(text, text)
    if text not in allowed:
        raise InputError(name, f'unknown {name.replace("_", " ")} "{str(value).strip()}"; '
                               f"{closest_names(text, allowed)}")
    return text


def minimum_r_value(rule_set, location, service, climate_zone, temp_difference_k=None,
                    units: str = "si") -> DuctCodeRequirement:
    """Least R-value of the insulation a duct rule set requires for one duct.

    Parameters
    ----------
    rule_set : str
        Name from :func:`load_duct_rule_sets`, e.g. ``"iecc-2018-c403"``.
    location : str
        One of :data:`LOCATIONS` (``conditioned``, ``unconditioned``, ``outdoors``,
        ``envelope``); ``outside``/``exterior``, ``attic``, ``inside`` are understood.
    service : str
        ``supply`` or ``return``.
    climate_zone : int or str
        Climate zone, e.g. ``4`` or ``"5A"`` (:func:`parse_climate_zone`).
    temp_difference_k : float, optional
        Design temperature difference between the duct air and the surroundings [K]; at or
        below the rule set's exemption (15 °F = 8.3 K in IECC 2018) no insulation is required.
    units : str
        Unit system of the reason's temperature differences ("si": K, "us": °F); the row's
        R-value is quoted as the table writes it.

    Returns
    -------
    DuctCodeRequirement
        ``r_value_m2k_w`` [m²·K/W] and ``r_value_as_written`` in the table's unit (h·ft²·°F/Btu).
        A zone no row covers gives ``covered=False`` and the reason, never a guess.

    Raises
    ------
    InputError
        ``--code`` unknown rule set; ``location``, ``service`` or ``climate_zone`` unknown.

    Examples
    --------
    A supply duct on the roof in climate zone 5A: R-12.

    >>> req = minimum_r_value("iecc-2018-c403", "outdoors", "supply", "5A")
    >>> req.r_value_as_written, round(req.r_value_m2k_w, 3)
    (12.0, 2.113)
    >>> minimum_r_value("iecc-2018-c403", "unconditioned", "return", 3, temp_difference_k=5.0).exempt
    True
    >>> minimum_r_value("iecc-2018-c403", "unconditioned", "return", 3, 5.0, units="us").reason.split("; ")[-1]
    'exempt: the design temperature difference 9 °F is at most 15 °F'
    """
    sets = load_duct_rule_sets()
    if rule_set not in sets:
        raise InputError(_CODE, f'unknown duct rule set "{rule_set}"; {closest_names(str(rule_set), sets)}')
    rows = sets[rule_set]
    location = _word(location, LOCATIONS, "location", _LOCATION_WORDS)
    service = _word(service, SERVICES, "service")
    zone = parse_climate_zone(climate_zone)
    matches = [r for r in rows if r.location == location and r.service == service and r.zones.contains(zone)]
    unit = rows[0].r_unit
    if not matches:
        reason = f"{rule_set}: no {service} row for {location} ducts covers climate zone {zone}"
        return DuctCodeRequirement(None, None, unit, False, False, reason, "", rule_set)
    row = matches[0]
    head = f"{rule_set} {service} duct, {location}, climate zone {zone} (row {row.zones}): R-{row.r_value_as_written:g} {row.r_unit}"
    if temp_difference_k is not None:
        difference = abs(float(temp_difference_k))
        if not math.isfinite(difference):
            raise InputError("temp_difference_k", "the design temperature difference must be a finite number")
        limit = row.exempt_max_temp_difference_k
        if limit is not None and difference <= limit + 1e-9:
            from .units import to_display, unit_label

            unit = unit_label("temperature_difference", units)
            said = [float(to_display(x, "temperature_difference", units)) for x in (difference, limit)]
            reason = f"{head}; exempt: the design temperature difference {said[0]:.3g} {unit} is at most {said[1]:.3g} {unit}"
            return DuctCodeRequirement(0.0, 0.0, row.r_unit, True, True, reason, f"{row.source} ({row.origin})", rule_set)
    return DuctCodeRequirement(row.r_value_m2k_w, row.r_value_as_written, row.r_unit, True, False, head,
                               f"{row.source} ({row.origin})", rule_set)


@dataclass(frozen=True)
class ThicknessForR:
    """The least thickness of a material that meets an R-value.

    Attributes
    ----------
    installed_thickness_m : numpy.ndarray
        Thickness as installed that gives the R-value [m] (R·k).
    nominal_thickness_m : numpy.ndarray
        Thickness to order [m]: the installed thickness over (1 − compression).
    conductivity_w_mk : numpy.ndarray
        k of the material at the mean temperature [W/(m·K)].
    mean_temp_c : numpy.ndarray
        Mean temperature used [°C].
    compression_percent : float
        Compression allowed for [%].
    """

    installed_thickness_m: np.ndarray
    nominal_thickness_m: np.ndarray
    conductivity_w_mk: np.ndarray
    mean_temp_c: np.ndarray
    compression_percent: float


def least_thickness(r_value_m2k_w, material, mean_temp_c=RATING_MEAN_TEMP_C, compression_percent=0.0) -> ThicknessForR:
    """Least thickness of *material* whose flat-layer R-value t/k(T_mean) meets *r_value_m2k_w*.

    Parameters
    ----------
    r_value_m2k_w : float or array_like
        Required R-value [m²·K/W], 0 or more.
    material : str or InsulationMaterial
        A catalogue material or ``"k=<W/(m·K)>"`` (:func:`pipeins.catalog.materials.lookup_material`);
        its fitted k(T) (:func:`pipeins.physics.conduction.conductivity_of`) is taken at *mean_temp_c*.
    mean_temp_c : float or array_like
        Mean temperature of the layer [°C]; default the 75 °F rating point of R-value labels.
    compression_percent : float
        Compression of a blanket wrap as installed [%] (0 for board;
        :data:`pipeins.catalog.ducts.WRAP_COMPRESSION_PERCENT` = 25 % for wrap, common practice).

    Returns
    -------
    ThicknessForR

    Raises
    ------
    InputError
        ``r_value_m2k_w`` negative or not finite; an unknown material; a compression outside 0 to below 100 %.

    Examples
    --------
    R-6 (1.057 m²·K/W) of a wrap with k = 0.040 W/(m·K), 25 % compressed: 42.3 mm installed, 56.4 mm nominal.

    >>> t = least_thickness(r_value_si(6.0), "k=0.040", compression_percent=25)
    >>> round(float(t.installed_thickness_m) * 1000, 1), round(float(t.nominal_thickness_m) * 1000, 1)
    (42.3, 56.4)
    """
    from pipeins.catalog.ducts import nominal_wrap_thickness_m
    from pipeins.catalog.materials import lookup_material
    from pipeins.physics.conduction import conductivity_of

    r = np.asarray(r_value_m2k_w, dtype=float)
    if not np.all(np.isfinite(r) & (r >= 0)):
        raise InputError("r_value_m2k_w", "the R-value must be 0 or more m²·K/W")
    mean = np.asarray(mean_temp_c, dtype=float)
    if not np.all(np.isfinite(mean)):
        raise InputError("mean_temp_c", "the mean temperature must be a finite number in °C")
    k = np.asarray(conductivity_of(lookup_material(material)).conductivity(mean), dtype=float)
    installed = r * k
    nominal = nominal_wrap_thickness_m(installed, compression_percent)
    return ThicknessForR(installed, nominal, k, mean, float(compression_percent))


def list_duct_rules() -> tuple[dict, ...]:
    """Every row of every duct rule set as plain values (for a table printout).

    >>> list_duct_rules()[2]["location"], list_duct_rules()[2]["r_value"]
    ('unconditioned', 6.0)
    """
    return tuple({"rule_set": r.rule_set, "service": r.service, "location": r.location,
                  "climate_zones": str(r.zones), "r_value": r.r_value_as_written, "r_unit": r.r_unit,
                  "r_value_m2k_w": r.r_value_m2k_w, "source": r.source}
                 for rows in load_duct_rule_sets().values() for r in rows)
