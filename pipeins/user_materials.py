"""A user's own insulation materials, and design-conductivity factors.

**Materials file.** A CSV in the shape of ``tables/insulation_materials.csv``: one row per
material and mean temperature with the columns ``key, name, family, mean_temp_c,
conductivity_w_mk, min_temp_c, max_temp_c`` (``density_kg_m3`` and ``source`` optional),
the declared conductivity λ(θ) against the mean temperature, as a product's declaration
gives it (in the manner of EN ISO 13787).  Lines starting with ``#`` are comments.  The
file's materials are found by key or name before the catalogue's (:func:`materials_in_use`).
A material whose rows all declare one conductivity is a constant-conductivity material,
identical to ``k=``.  Conductivity falling with temperature is allowed but warned about
(insulants conduct more when warmer; a falling declaration is usually a typing error).

**Design factors.** The conductivity of an installed system exceeds the declared one:
ageing (cell gas diffusing out of foams), moisture taken up in service, and joints and
gaps between sections.  Each is a named percentage; the design conductivity is

    λ_design(θ) = λ_declared(θ) · (1 + ageing/100) · (1 + moisture/100) · (1 + joints/100)

the product of conversion factors, in the manner of EN ISO 10456 (from memory: take the
factors from the product's declaration, the standard's tables or the owner's rules).  The
fitted curve scales by the same factor, since the least-squares fit is linear in the data.
"""

from __future__ import annotations

import contextlib
import math
from dataclasses import dataclass, replace

from .errors import InputError

__all__ = ["REQUIRED_COLUMNS", "read_materials_file", "parse_materials", "DesignFactors", "design_material",
           "materials_in_use", "DESIGN_FACTOR_BASIS", "project_materials"]

REQUIRED_COLUMNS = ("key", "name", "family", "mean_temp_c", "conductivity_w_mk", "min_temp_c", "max_temp_c")
DESIGN_FACTOR_BASIS = ("design conductivity = declared × (1 + ageing) × (1 + moisture) × (1 + joints), the product "
                       "of conversion factors in the manner of EN ISO 10456 (from memory; take the factors from "
                       "the product's declaration, the standard's tables or the owner's rules)")
#: Largest design factor taken as meant [%].
MAX_FACTOR_PERCENT = 200.0


def _number(text, where: str, column: str, low=None, high=None) -> float:
    try:
        value = float(text)
    except (TypeError, ValueError):
        raise InputError(where, f'{column}: "{text or ""}" is not a number') from None
    if not math.isfinite(value) or (low is not None and value <= low) or (high is not None and value > high):
        raise InputError(where, f"{column}: {value:g} is outside the allowed range "
                                f"(above {low:g}" + (f", at most {high:g})" if high is not None else ")"))
    return value


def parse_materials(text: str, name: str) -> tuple[dict, list]:
    """The materials of a materials CSV's *text* (its file *name* for errors), and warnings.

    Returns ``({key: InsulationMaterial}, [note, …])`` (:class:`pipeins.notes.Note`:
    ``materials.conductivity_falls``).  Every problem is one
    :class:`InputError` naming ``FILE:LINE`` and the column.
    """
    import csv
    import io

    from .catalog.materials import MAX_CONSTANT_CONDUCTIVITY_W_MK, InsulationMaterial

    lines = [(n, ln) for n, ln in enumerate(io.StringIO(text), 1) if ln.strip() and not ln.lstrip().startswith("#")]
    if not lines:
        raise InputError(name, "no header line and no materials; give the columns " + ", ".join(REQUIRED_COLUMNS))
    header_line = lines[0][0]
    reader = csv.reader([ln for _, ln in lines])
    header = [h.strip() for h in next(reader)]
    missing = [c for c in REQUIRED_COLUMNS if c not in header]
    if missing:
        raise InputError(f"{name}:{header_line}", f'missing column "{missing[0]}"; the columns are '
                                                  + ", ".join(REQUIRED_COLUMNS) + " (density_kg_m3, source optional)")
    grouped: dict[str, list] = {}
    for (number, _), cells in zip(lines[1:], reader):
        where = f"{name}:{number}"
        if len(cells) != len(header):
            raise InputError(where, f"{len(cells)} cells where the header has {len(header)} columns")
        row = dict(zip(header, (c.strip() for c in cells)))
        for column in ("key", "name", "family"):
            if not row[column]:
                raise InputError(where, f"{column}: empty; give the material's {column}")
        temp = _number(row["mean_temp_c"], where, "mean_temp_c", -273.15, 2000.0)
        k = _number(row["conductivity_w_mk"], where, "conductivity_w_mk", 0.0, MAX_CONSTANT_CONDUCTIVITY_W_MK)
        lo = _number(row["min_temp_c"], where, "min_temp_c", -273.15 - 1e-9, 2000.0)
        hi = _number(row["max_temp_c"], where, "max_temp_c", -273.15, 2000.0)
        if hi <= lo:
            raise InputError(where, f"max_temp_c: {hi:g} must be above min_temp_c {lo:g}")
        density = row.get("density_kg_m3") or "nan"
        try:
            density = float(density)
        except ValueError:
            raise InputError(where, f'density_kg_m3: "{density}" is not a number') from None
        grouped.setdefault(row["key"], []).append((number, row, temp, k, lo, hi, density))
    if not grouped:
        raise InputError(name, "no materials: the file has a header line only")
    materials, warnings = {}, []
    for key, rows in grouped.items():
        first = rows[0]
        for number, row, *_rest, lo, hi, _ in rows[1:]:
            if (row["name"], row["family"], lo, hi) != (first[1]["name"], first[1]["family"], first[4], first[5]):
                raise InputError(f"{name}:{number}", f'material "{key}": name, family, min_temp_c and max_temp_c '
                                                     "must be the same on every row")
        points = sorted((r[2], r[3]) for r in rows)
        temps = [t for t, _ in points]
        if len(set(temps)) != len(temps):
            raise InputError(f"{name}:{rows[-1][0]}", f'mean_temp_c: material "{key}" declares one mean '
                                                      "temperature twice")
        if len({k for _, k in points}) == 1:
            points = [(points[0][0], points[0][1])]  # constant: exactly a k= layer
        elif any(b[1] < a[1] for a, b in zip(points, points[1:])):
            from .notes import note

            warnings.append(note("materials.conductivity_falls", file=name, material=key))
        source = "; ".join(dict.fromkeys(r[1].get("source") or f"user file {name}" for r in rows))
        materials[key] = InsulationMaterial(key=key, name=first[1]["name"], family=first[1]["family"],
                                            points=tuple(points), min_temp_c=first[4], max_temp_c=first[5],
                                            density_kg_m3=first[6], source=source)
    return materials, warnings


def read_materials_file(path) -> tuple[dict, list]:
    """The materials of the CSV file *path* and warnings (see :func:`parse_materials`)."""
    from .fileio import read_text_input

    return parse_materials(read_text_input(path, "--materials"), str(path))


@dataclass(frozen=True)
class DesignFactors:
    """Design-conductivity factors [%]: ageing, moisture, joints (0 where not given)."""

    ageing_percent: float = 0.0
    moisture_percent: float = 0.0
    joints_percent: float = 0.0

    def __post_init__(self):
        for field_name in ("ageing_percent", "moisture_percent", "joints_percent"):
            value = getattr(self, field_name)
            if not (math.isfinite(value) and 0.0 <= value <= MAX_FACTOR_PERCENT):
                raise InputError(field_name, f"the design factor must be from 0 to {MAX_FACTOR_PERCENT:g} % "
                                             f"(got {value:g} %)")

    @property
    def factor(self) -> float:
        """The product (1 + ageing)(1 + moisture)(1 + joints) [–]."""
        return (1 + self.ageing_percent / 100) * (1 + self.moisture_percent / 100) * (1 + self.joints_percent / 100)

    def to_dict(self) -> dict:
        return {"ageing_percent": self.ageing_percent, "moisture_percent": self.moisture_percent,
                "joints_percent": self.joints_percent, "factor": self.factor, "basis": DESIGN_FACTOR_BASIS}


def design_material(material, factors: DesignFactors):
    """*material* with every declared conductivity point times ``factors.factor``."""
    f = factors.factor
    if f == 1.0:
        return material
    return replace(material, key=f"{material.key} (design)", name=f"{material.name} (design)",
                   points=tuple((t, k * f) for t, k in material.points))


def named_design_material(material, factors: DesignFactors):
    """*material* at its design conductivity for a project service: the declared points times
    ``factors.factor``, its key and name saying the basis (``design ×1.155: mineral wool pipe
    section (ageing 10 %, moisture 5 %)``) so that every report names it; *material* itself when
    every factor is 0."""
    f = factors.factor
    if f == 1.0:
        return material
    parts = [f"{word} {value:g} %" for word, value in (("ageing", factors.ageing_percent),
                                                        ("moisture", factors.moisture_percent),
                                                        ("joints", factors.joints_percent)) if value]
    basis = f"{', '.join(parts)}"
    # the name starts with "design", so that the plain name ("mineral wool") never finds it by its leading words
    return replace(material, key=f"design ×{f:.4g}: {material.key} ({basis})",
                   name=f"design ×{f:.4g}: {material.name} ({basis})",
                   points=tuple((t, k * f) for t, k in material.points),
                   source=f"{material.source}; declared conductivity × {f:.4g} ({DESIGN_FACTOR_BASIS})")


@contextlib.contextmanager
def materials_in_use(materials: dict | None = None, factors: DesignFactors | None = None):
    """Within the block, material names find *materials* (a user file's) before the
    catalogue, and every material found carries the design *factors*."""
    from .catalog import materials as catalogue

    global _ACTIVE
    users = materials if materials is not None else {}   # the caller's dict: design materials join it

    def hook(spec, option):
        found = catalogue._match(spec, users) if users else None
        if found is None:
            found = catalogue._lookup(spec, option)
        return found if factors is None else design_material(found, factors)

    previous, previous_active = catalogue._HOOK, _ACTIVE
    catalogue._HOOK, _ACTIVE = hook, users
    try:
        yield
    finally:
        catalogue._HOOK, _ACTIVE = previous, previous_active


#: The user materials of the innermost :func:`materials_in_use` block (None outside one).
_ACTIVE = None


def register_design_material(material, factors: DesignFactors) -> str:
    """A service's design material (:func:`named_design_material`) put among the materials in
    use (a project's, with its ``materials_file``), so that its name finds it; returns that name
    (the material's own name when every factor is 0)."""
    derived = named_design_material(material, factors)
    if derived is material:
        return material.name
    if _ACTIVE is None:
        raise InputError("ageing_percent", "design factors of a service need the project's materials in use")
    _ACTIVE[derived.key] = derived
    return derived.key


def project_materials(text: str, file_name: str, base_dir, data: dict | None = None) -> tuple[dict, list[str], str | None]:
    """The user materials a project file names with ``[project] materials_file`` (a CSV of the
    shape of ``check --materials``, resolved relative to the project file).

    Returns ``(materials, warnings, problem)``: ``problem`` is the one-line message to report
    against the key (a missing or malformed file), else None; a project without the key, or
    whose TOML does not read (reported by the project reader), gives ``({}, [], None)``.
    *data* is the file already read (``tomllib``), when the caller has it.
    """
    from pathlib import Path

    from .fileio import load_toml

    try:
        head = (data if data is not None else load_toml(text, file_name)).get("project")
    except Exception:  # the project reader reports it, with its position
        return {}, [], None
    if not isinstance(head, dict) or "materials_file" not in head:
        return {}, [], None
    item = head["materials_file"]
    if not isinstance(item, str) or not item.strip() or "\x00" in item:
        return {}, [], 'materials_file must be a file name, e.g. "our_materials.csv"'
    path = Path(base_dir) / item
    if not path.is_file():
        return {}, [], f'file "{item}" not found next to {file_name}'
    try:
        materials, warnings = read_materials_file(path)
    except InputError as exc:
        where = exc.name.replace(str(path), item) if exc.name else item
        return {}, [], f"{where}: {exc.message}".replace(str(path), item)
    return materials, [_renamed(w, str(path), item) for w in warnings], None


def _renamed(warning, path: str, item: str):
    """*warning* (a note or a text) with the file's *path* said as the project names it, *item*."""
    if isinstance(warning, str):
        return warning.replace(path, item)
    from dataclasses import replace

    return replace(warning, words=tuple((k, v.replace(path, item)) for k, v in warning.words))
