"""Reading text with units into SI: :func:`parse_quantity` and its companions.

See :mod:`pipeins.units` for the rules (bare numbers, compound units, gauge and absolute
pressure, percent, ranges).
"""

from __future__ import annotations

import math
import numbers
import re

from pipeins.errors import InputError, closest_names

from .definitions import (
    FLOORS,
    Flow,
    RANGES,
    _ABSOLUTE_ZERO_C,
    _ATOMS,
    _ATOMS_LOWER,
    _CASE_SENSITIVE,
    _DEGF_DIFFERENCE_K,
    _ENERGY_PRICE_UNITS,
    _Kind,
    _MASS_FLOW,
    _MEGA_LOWER,
    _PRESSURE_LOWER,
    _PRESSURE_MEGA_LOWER,
    _PRESSURE_UNITS,
    _PSI_PA,
    _STANDARD_ATMOSPHERE_PA,
    _TEMPERATURE_UNITS,
    _VOLUME_FLOW,
    _check_system,
    _dim_mul,
    _get_kind,
)
from .display import to_display, unit_label

# --------------------------------------------------------------------------------------
# Reading text
# --------------------------------------------------------------------------------------
_NUMBER_RE = re.compile(
    r"""\s*(?P<sign>[-+−]?)\s*
    (?:
        (?P<whole>\d+)(?:\s+|\s*-\s*)(?P<num>\d+)\s*/\s*(?P<den>\d+)(?![\d.])
      | (?P<fnum>\d+)\s*/\s*(?P<fden>\d+)(?![\d.])
      | (?P<dec>(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)
    )""",
    re.VERBOSE,
)
_UNICODE_FIXES = {
    "²": "2", "³": "3", "·": "*", "⋅": "*", "×": "*", "•": "*", "−": "-",
    "µ": "u", "º": "°", "”": '"', "″": '"', "Δ": "",
}
_WORD_CHARS = "A-Za-z°℃℉\"'%_"
_TOKEN_RE = re.compile(
    rf"\s*(?:(?P<word>[{_WORD_CHARS}]+)|(?P<exp>\^-?\d+|\d+)|(?P<op>[*/-])|(?P<lp>\()|(?P<rp>\)))"
)


class _Unreadable(Exception):
    """Internal: the unit text is not understood (turned into an InputError by the caller)."""


class _MegaCase(Exception):
    """Internal: a mega unit written with a lower-case m."""

    def __init__(self, canonical):
        self.canonical = canonical


def _split_number(text: str):
    """``"1-1/2 in"`` -> (1.5, "in"); None when the text does not start with a number."""
    match = _NUMBER_RE.match(text)
    if not match:
        return None
    g = match.groupdict()
    try:
        if g["whole"] is not None:
            value = int(g["whole"]) + int(g["num"]) / int(g["den"])
        elif g["fnum"] is not None:
            value = int(g["fnum"]) / int(g["fden"])
        else:
            value = float(g["dec"])
    except ZeroDivisionError:
        return None
    except (OverflowError, ValueError):  # digits beyond any float (or Python's int limit)
        value = math.inf
    if g["sign"] in ("-", "−"):
        value = -value
    return value, text[match.end():].strip()


def _normalise(unit: str) -> str:
    for old, new in _UNICODE_FIXES.items():
        unit = unit.replace(old, new)
    return unit.replace("**", "^").strip()


def _lookup_atom(word: str):
    if word in _ATOMS:
        return _ATOMS[word]
    lower = word.lower()
    if lower in _MEGA_LOWER:
        if word.startswith("M"):
            return _ATOMS[_MEGA_LOWER[lower]]
        raise _MegaCase(_MEGA_LOWER[lower])
    if lower in _ATOMS_LOWER:
        return _ATOMS[_ATOMS_LOWER[lower]]
    return None


def _split_word(word: str):
    """A run of letters -> unit atoms, whole word first, else greedy longest prefixes."""
    atom = _lookup_atom(word)
    if atom is not None:
        return [atom]
    atoms, pos = [], 0
    while pos < len(word):
        for end in range(len(word), pos, -1):
            try:
                atom = _lookup_atom(word[pos:end])
            except _MegaCase:
                atom = None  # inside a longer word, never guess a case
            if atom is not None:
                atoms.append(atom)
                pos = end
                break
        else:
            raise _Unreadable(word)
    return atoms


def _tokenise(unit: str):
    tokens, pos = [], 0
    while pos < len(unit):
        match = _TOKEN_RE.match(unit, pos)
        if not match or match.end() == pos:
            if unit[pos:].strip() == "":
                break
            raise _Unreadable(unit)
        pos = match.end()
        if match["word"]:
            tokens.extend(("atom", a) for a in _split_word(match["word"]))
        elif match["exp"]:
            tokens.append(("exp", int(match["exp"].lstrip("^"))))
        elif match["op"]:
            tokens.append(("op", "/" if match["op"] == "/" else "*"))
        elif match["lp"]:
            tokens.append(("lp", None))
        else:
            tokens.append(("rp", None))
    return tokens


def _parse_compound(unit: str):
    """Unit text -> (SI factor, dimension).  Multiplication binds tighter than ``/``."""
    tokens = _tokenise(_normalise(unit))
    pos = 0

    def peek():
        return tokens[pos] if pos < len(tokens) else (None, None)

    def power():
        nonlocal pos
        kind, value = peek()
        if kind == "atom":
            pos += 1
            factor, dim = value
        elif kind == "lp":
            pos += 1
            factor, dim = quotient()
            if peek()[0] != "rp":
                raise _Unreadable(unit)
            pos += 1
        else:
            raise _Unreadable(unit)
        if peek()[0] == "exp":
            exponent = peek()[1]
            pos += 1
            factor, dim = factor**exponent, tuple(exponent * x for x in dim)
        return factor, dim

    def product():
        nonlocal pos
        factor, dim = power()
        while True:
            kind, value = peek()
            if kind == "op" and value == "*":
                pos += 1
            elif kind not in ("atom", "lp"):
                return factor, dim
            f2, d2 = power()
            factor, dim = factor * f2, _dim_mul(dim, d2)

    def quotient():
        nonlocal pos
        factor, dim = product()
        while peek() == ("op", "/"):
            pos += 1
            f2, d2 = product()
            factor, dim = factor / f2, _dim_mul(dim, d2, -1)
        return factor, dim

    if not tokens:
        raise _Unreadable(unit)
    result = quotient()
    if pos != len(tokens):
        raise _Unreadable(unit)
    return result


def _cannot_read(option, text, spec: _Kind, extra: str = "") -> InputError:
    return InputError(
        option,
        f'cannot read "{text}" as {spec.article} {spec.noun}{extra}; use e.g. {spec.examples}',
    )


def _parse_temperature(number, unit, text, option, system, spec):
    if unit == "":
        scale = "C" if system == "si" else "F"
    else:
        scale = _TEMPERATURE_UNITS.get(_normalise(unit).replace(" ", "").lower())
        if scale is None:
            raise _cannot_read(option, text, spec)
    temp_c = {
        "C": number,
        "F": (number - 32.0) * _DEGF_DIFFERENCE_K,
        "K": number + _ABSOLUTE_ZERO_C,
        "R": number * _DEGF_DIFFERENCE_K + _ABSOLUTE_ZERO_C,
    }[scale]
    # Allow for the rounding of -459.67 °F and the like.
    if temp_c < _ABSOLUTE_ZERO_C - 1e-9:
        raise InputError(
            option, f'"{text}" is below absolute zero (-273.15 °C, -459.67 °F, 0 K)')
    return max(temp_c, _ABSOLUTE_ZERO_C)


_GAUGE_WORDS = (("absolute", "a"), ("abs", "a"), ("gauge", "g"), ("gage", "g"))
_STEAM_UNITS = {"barg", "bara", "psig", "psia", "kpag", "kpaa", "mpag", "mpaa"}


def _pressure_word(unit: str) -> str:
    """``"bar (g)"`` -> ``"barg"``, ``"bar gauge"`` -> ``"barg"``, ``"MPa(a)"`` -> ``"MPaa"``."""
    word = _normalise(unit).replace(" ", "").replace("(", "").replace(")", "")
    for long, short in _GAUGE_WORDS:
        if word.lower().endswith(long) and len(word) > len(long):
            word = word[: -len(long)] + short
            break
    return word


def _parse_pressure(number, unit, text, option, system, spec, steam=False):
    if steam:
        word = _pressure_word(unit)
        if word.lower() not in _STEAM_UNITS:
            base = {"psi": "psi", "kpa": "kPa", "mpa": "MPa"}.get(word.lower(), "bar")
            shown = f"{number:g}"
            if unit == "":
                head = f'"{text}" needs a unit that says gauge or absolute'
            elif word.lower() in ("bar", "psi", "kpa", "mpa"):
                head = f'"{text}" does not say gauge or absolute'
            else:
                head = f'cannot read "{text}" as a steam pressure, which must say gauge or absolute'
            raise InputError(option, f"{head}; write e.g. {shown} {base}g (gauge) or {shown} {base}a "
                                     f"(absolute)")
        unit = word
    if unit == "":
        pa_per_unit, gauge = (1e3, False) if system == "si" else (_PSI_PA, False)
    else:
        word = _pressure_word(unit)
        if word in _PRESSURE_UNITS:
            pa_per_unit, gauge = _PRESSURE_UNITS[word]
        elif word.lower() in _PRESSURE_MEGA_LOWER:
            canonical = _PRESSURE_MEGA_LOWER[word.lower()]
            if not word.startswith("M"):
                raise _cannot_read(option, text, spec,
                                   f' (write "{canonical}": lower-case m means milli)')
            pa_per_unit, gauge = _PRESSURE_UNITS[canonical]
        elif word.lower() in _PRESSURE_LOWER:
            pa_per_unit, gauge = _PRESSURE_UNITS[_PRESSURE_LOWER[word.lower()]]
        else:
            raise _cannot_read(option, text, spec)
    pressure_pa = number * pa_per_unit + (_STANDARD_ATMOSPHERE_PA if gauge else 0.0)
    if pressure_pa < 0.0:
        raise InputError(
            option,
            f'"{text}" is below zero absolute pressure; bar, psi and kPa mean absolute '
            f"(write barg, psig or kPag for gauge)" if not steam else
            f'"{text}" is below zero absolute pressure',
        )
    return pressure_pa


def _percent_sign(unit: str, text, option, spec) -> bool:
    """True when the unit is ``%``/``percent``, False when bare; anything else is refused."""
    word = unit.replace(" ", "").lower()
    if word not in ("", "%", "percent"):
        raise _cannot_read(option, text, spec)
    return word != ""


def _parse_percent(number, unit, text, option, spec):
    if not _percent_sign(unit, text, option, spec) and 0.0 < abs(number) <= 1.0:
        raise InputError(
            option, f"{text} is read as percent; did you mean {_nice(number * 100.0)} %? "
                    f"(write {text} % if you mean it)")
    return number


def _parse_efficiency(number, unit, text, option, spec):
    value = number / 100.0 if _percent_sign(unit, text, option, spec) or number > 1.0 else number
    if not 0.01 <= value <= 1.0:
        raise InputError(option, f'"{text}" is out of range; an efficiency is from 1 % to 100 % '
                                 "(88 %, 88 and 0.88 all mean 88 %)")
    return value


def _nice(value: float) -> str:
    """A limit or a value for a message: ``10,000``, ``0.1``, ``1e+09``."""
    if value == 0:
        return "0"
    if abs(value) < 1e15 and abs(value - round(value)) <= 1e-9 * abs(value):
        return f"{round(value):,}"
    return f"{value:.5g}"


def _range_text(kind: str, system: str, value: float, low: float, high: float) -> str:
    """``"from 0.1 to 10,000 W/(m²·K)"`` in the unit system's display unit; a range symmetric
    about zero (a sanity bound) is said from the side the value left it: ``"at most 2,000 mm"``."""
    if kind == "percent":
        lo, hi, label = low, high, "%"
    else:
        shown_kind = {"steam_pressure": "pressure"}.get(kind, kind)
        lo = to_display(low, shown_kind, system)
        hi = to_display(high, shown_kind, system)
        label = unit_label(shown_kind, system)
        if shown_kind == "pressure" and not label.endswith("a"):
            label += " absolute"
    if low == -high:
        return f"at most {_nice(hi)} {label}" if value > high else f"at least {_nice(lo)} {label}"
    return f"from {_nice(lo)} to {_nice(hi)} {label}"


def _check_range(value, kind, shown, option, system, spec, low, high, what):
    if not math.isfinite(value):
        raise InputError(option, f'"{shown}" is not a finite {spec.noun}')
    default_low, default_high = RANGES[kind]
    low = default_low if low is None else low
    high = default_high if high is None else high
    floor = FLOORS.get(kind, 0.0)
    if 0.0 < abs(value) < floor:
        label = unit_label(kind, system)
        raise InputError(option, f'"{shown}" is out of range; {what or f"{spec.article} {spec.noun}"} is zero or '
                                 f"at least {_nice(to_display(floor, kind, system))} {label} in size")
    if not low <= value <= high:
        noun = what or f"{spec.article} {spec.noun}"
        raise InputError(option, f'"{shown}" is out of range; {noun} is '
                                 f"{_range_text(kind, system, value, low, high)}")
    return value


def parse_quantity(text, kind: str, option: str = "", units: str = "si", *,
                   low: float | None = None, high: float | None = None, what: str = ""):
    """Read a value with an optional unit suffix and return it in SI.

    Parameters
    ----------
    text : str or float
        What the user wrote, e.g. ``"1-1/2in"``, ``"350 °F"``, ``"10barg"``, ``"25 m3/h"``.
        A plain ``int``/``float`` (from a project file) is a bare number.
    kind : str
        One of :data:`KINDS`.  SI results: ``temperature`` [°C], ``temperature_difference``
        [K], ``thickness``/``diameter``/``length`` [m], ``speed`` [m/s], ``pressure``
        [Pa, absolute], ``steam_pressure`` [Pa, absolute; the text must say gauge or
        absolute], ``heat_flow_per_length`` [W/m], ``heat_flux`` [W/m²],
        ``heat_transfer_coefficient`` [W/(m²·K)], ``conductivity`` [W/(m·K)],
        ``thermal_resistance_per_length`` [m·K/W], ``time`` [s],
        ``percent`` [%], ``efficiency`` [fraction, 0..1], ``energy`` [J], ``power`` [W],
        ``mass_flow`` [kg/s], ``volume_flow`` [m³/s]; ``flow`` returns a :class:`Flow`
        (mass or volume).
    option : str
        Name of the input for error messages, e.g. ``"--thickness"``.
    units : {"si", "us"}
        Unit system that gives a bare number its unit (the system's display unit, see
        :func:`unit_label`): e.g. a bare thickness is mm in ``si`` and inches in ``us``;
        a bare temperature °C or °F; a bare pressure kPa or psia; a bare conductivity
        W/(m·K) or Btu·in/(h·ft²·°F); a bare coefficient W/(m²·K) or Btu/(h·ft²·°F).
        Time is hours in both.
    low, high : float, optional
        Narrower accepted range in SI (°C, fraction for ``efficiency``) than the kind's
        :data:`RANGES`, for inputs with a physical meaning of their own (a fixed outer
        coefficient, say); *what* names that quantity in the message.

    Returns
    -------
    float or Flow
        The value in SI units (°C for temperatures).

    Raises
    ------
    InputError
        Empty or unreadable text, a unit of the wrong kind, a value that is not finite or
        lies outside the range, a temperature below absolute zero, a negative absolute
        pressure, a flow without a unit, a steam pressure that says neither gauge nor
        absolute, or a bare percentage at most 1.

    Notes
    -----
    ``bar``, ``psi``, ``kPa`` and ``MPa`` are absolute pressures for an air pressure
    (``bara``, ``psia`` are accepted too); gauge readings are ``barg``, ``psig``,
    ``kPag``, ``MPag`` and add one standard atmosphere, 101 325 Pa.  A ``percent`` is a
    percentage: ``80`` and ``80 %`` are 80 %; ``0.5 %`` is half a percent, and a bare
    ``0.5`` is refused (did you mean 50 %?).  Btu is the International Table Btu
    (1055.05585262 J).

    Examples
    --------
    >>> round(parse_quantity("1-1/2in", "thickness"), 6)
    0.0381
    >>> parse_quantity("212 F", "temperature")
    100.0
    >>> round(parse_quantity("2", "thickness", units="us"), 6)
    0.0508
    >>> parse_quantity("0 barg", "pressure")
    101325.0
    >>> parse_quantity("10 barg", "steam_pressure")
    1101325.0
    >>> parse_quantity("88", "efficiency"), parse_quantity("0.88", "efficiency")
    (0.88, 0.88)
    >>> round(parse_quantity("50 Btu/hr-ft", "heat_flow_per_length"), 3)
    48.076
    >>> parse_quantity("5 m3/h", "flow")
    Flow(value_si=0.001388888888888889, basis='volume')
    >>> parse_quantity("5 parsecs", "length", "--length")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --length: cannot read "5 parsecs" as a length; use e.g. 30m, 100ft or 1500mm
    >>> parse_quantity("0.8", "percent", "--rh")
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --rh: 0.8 is read as percent; did you mean 80 %? (write 0.8 % if you mean it)
    """
    spec = _get_kind(kind)
    system = _check_system(units)
    if isinstance(text, bool):
        raise _cannot_read(option, text, spec)
    if isinstance(text, numbers.Real):
        shown = str(text)
        try:
            number, unit = float(text), ""
        except OverflowError:  # an integer beyond any float
            raise InputError(option, f'"{_clip(shown)}" is not a finite {spec.noun}') from None
        if not math.isfinite(number):
            raise InputError(option, f'"{shown}" is not a finite {spec.noun}')
    else:
        shown = "" if text is None else str(text).strip()
        if shown == "":
            raise InputError(option, f"the {spec.noun} is missing; use e.g. {spec.examples}")
        split = _split_number(shown)
        if split is None:
            raise _cannot_read(option, _clip(shown), spec)
        number, unit = split
        if not math.isfinite(number):
            raise InputError(option, f'"{_clip(shown)}" is not a finite {spec.noun}')
    shown = _clip(shown)
    check = lambda value: _check_range(value, kind, shown, option, system, spec, low, high, what)  # noqa: E731

    if kind == "temperature":
        return check(_parse_temperature(number, unit, shown, option, system, spec))
    if kind in ("pressure", "steam_pressure"):
        return check(_parse_pressure(number, unit, shown, option, system, spec, kind == "steam_pressure"))
    if kind == "percent":
        return check(_parse_percent(number, unit, shown, option, spec))
    if kind == "efficiency":
        return check(_parse_efficiency(number, unit, shown, option, spec))
    if unit == "":
        if kind in ("flow", "mass_flow", "volume_flow"):
            raise InputError(option, f'"{shown}" needs a unit; use e.g. {spec.examples}')
        return check(number * spec.display[system][1])
    try:
        factor, dim = _parse_compound(unit)
    except _MegaCase as exc:
        raise _cannot_read(option, shown, spec,
                           f' (write "{exc.canonical}": lower-case m means milli)') from None
    except (_Unreadable, OverflowError, RecursionError, ZeroDivisionError):
        raise _cannot_read(option, shown, spec) from None
    if kind == "flow":
        if dim == _MASS_FLOW:
            value = _check_range(number * factor, "mass_flow", shown, option, system, spec, low, high, what)
            return Flow(value, "mass")
        if dim == _VOLUME_FLOW:
            value = _check_range(number * factor, "volume_flow", shown, option, system, spec, low, high, what)
            return Flow(value, "volume")
        raise _cannot_read(option, shown, spec)
    if dim != spec.dimension:
        raise _cannot_read(option, shown, spec)
    return check(number * factor)


def _clip(text: str, limit: int = 60) -> str:
    """Echo at most *limit* characters of what the user wrote (a 200-digit number, say)."""
    text = str(text)
    return text if len(text) <= limit else text[: limit - 1] + "…"


def parse_number(text, option: str, what: str, low: float | None = None, high: float | None = None,
                 low_open: bool = False) -> float:
    """A plain number (a COP, a count of years, an emittance), finite and in range.

    Parameters
    ----------
    text : str or float
        What the user wrote.
    option : str
        Name of the input for messages.
    what : str
        The quantity with its article, e.g. ``"a coefficient of performance"``.
    low, high : float, optional
        Accepted range, inclusive (exclusive at *low* when *low_open*); without them any
        finite number (the caller checks the range with its own words).

    Examples
    --------
    >>> parse_number("3.5", "--cop", "a coefficient of performance", 0, 50, low_open=True)
    3.5
    >>> parse_number("nan", "--cop", "a coefficient of performance", 0, 50, low_open=True)
    Traceback (most recent call last):
    ...
    pipeins.errors.InputError: --cop: cannot read "nan" as a coefficient of performance; give a number above 0 and at most 50
    """
    if low is None or high is None:
        allowed = "give a finite number"
    else:
        bound = f"above {_nice(low)}" if low_open else f"at least {_nice(low)}"
        allowed = f"give a number {bound} and at most {_nice(high)}"
    shown = _clip("" if text is None else str(text).strip())
    if isinstance(text, bool):
        value = math.nan
    elif isinstance(text, numbers.Real):
        try:
            value = float(text)
        except OverflowError:
            value = math.inf
    else:
        split = _split_number(shown)
        value = split[0] if split is not None and split[1] == "" else math.nan
    if math.isnan(value) or (low is None and math.isinf(value)):
        raise InputError(option, f'cannot read "{shown}" as {what}; {allowed}')
    if low is None or high is None:
        return value
    if not (low < value if low_open else low <= value) or not value <= high:
        raise InputError(option, f'"{shown}" is out of range for {what}; {allowed}')
    return value


def material_in_si(text, units: str = "si", option: str = "--layer") -> str:
    """A material as the library takes it: ``k=<value>`` turned into W/(m·K), names kept.

    A constant conductivity ``k=<value>`` may carry a unit (``k=0.25Btu·in/(h·ft²·°F)``,
    ``k=0.25 Btu-in/hr-ft2-F``, ``k=0.036W/mK``); a bare value is in the unit system's
    conductivity unit, W/(m·K) in ``si`` and Btu·in/(h·ft²·°F) in ``us``.  Any other text
    (a catalogue name) is returned unchanged.

    Examples
    --------
    >>> material_in_si("k=0.25", "us")
    'k=0.036057'
    >>> material_in_si("k=0.036 W/mK", "us")
    'k=0.036'
    >>> material_in_si("mineral wool", "us")
    'mineral wool'
    """
    text = str(text)
    match = re.match(r"\s*k\s*=(.*)$", text, re.I | re.S)
    if not match:
        return text
    value = parse_quantity(match.group(1), "conductivity", option, units,
                           what="a constant conductivity")
    return f"k={value:.6g}"


def energy_unit_joules(name: str) -> float:
    """Joules in one energy unit named for a price, e.g. ``"kWh"`` -> 3.6e6.

    Parameters
    ----------
    name : str
        ``kWh``, ``MWh``, ``Wh``, ``J``, ``kJ``, ``MJ``, ``GJ``, ``Btu``, ``kBtu``,
        ``MMBtu`` (10⁶ Btu) or ``therm`` (10⁵ Btu); Btu is the International Table Btu.
        Case-insensitive, except that ``MJ``/``MWh`` need a capital M (m means milli).

    Returns
    -------
    float
        Energy of one unit [J].

    Examples
    --------
    >>> energy_unit_joules("kWh")
    3600000.0
    >>> energy_unit_joules("therm")
    105505585.262
    """
    word = _normalise(str(name)).replace(" ", "")
    if word in _ENERGY_PRICE_UNITS:
        return _ATOMS[word][0]
    by_lower = {u.lower(): u for u in _ENERGY_PRICE_UNITS}
    if word.lower() in by_lower and (by_lower[word.lower()] not in _CASE_SENSITIVE
                                     or word.startswith("M")):
        return _ATOMS[by_lower[word.lower()]][0]
    raise InputError(
        "energy unit", f'unknown energy unit "{name}"; {closest_names(word, _ENERGY_PRICE_UNITS)}')


_PRICE_PATTERN = (r"^\s*[$€£¥]?\s*(?P<number>(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*[$€£¥]?\s*"
                  r"(?:/|\bper\b)\s*(?P<unit>\S+)\s*$")  # compiled on the first price (re caches it)


def parse_money_per_energy(text, option: str = "--energy-price") -> float:
    """Read an energy price such as ``"0.12/kWh"`` and return money per joule.

    Parameters
    ----------
    text : str
        A price, ``<number>/<energy unit>`` or ``<number> per <energy unit>``; an optional
        currency sign (``$ € £ ¥``) before or after the number is ignored.  Units as in
        :func:`energy_unit_joules`.
    option : str
        Name of the input for error messages.

    Returns
    -------
    float
        Price per joule [currency/J], in whatever currency the number is in.

    Examples
    --------
    >>> round(parse_money_per_energy("0.12/kWh") * 3.6e6, 6)
    0.12
    >>> round(parse_money_per_energy("$1.05 per therm") * 1e9, 4)
    9.9521
    """
    examples = "use e.g. 0.12/kWh, 1.05/therm or 9/GJ"
    shown = "" if text is None else str(text).strip()
    if shown == "":
        raise InputError(option, f"the energy price is missing; {examples}")
    unreadable = InputError(option, f'cannot read "{shown}" as an energy price; {examples}')
    match = re.match(_PRICE_PATTERN, shown, re.IGNORECASE)
    if not match:
        raise unreadable
    try:
        joules = energy_unit_joules(match["unit"])
    except InputError:
        raise unreadable from None
    value = float(match["number"]) / joules
    if not math.isfinite(value):
        raise InputError(option, f'"{_clip(shown)}" is not a finite number per unit of energy')
    if value * 3.6e6 > MAX_PER_KWH:
        raise InputError(option, f'"{_clip(shown)}" is out of range; give at most {_nice(MAX_PER_KWH)} per kWh '
                                 "(in any currency or kg)")
    return value


#: Largest price (or emission factor) per kWh read by :func:`parse_money_per_energy`: far above
#: any energy price in any currency (a unit slip or an overflow, not a price).
MAX_PER_KWH = 1e6
