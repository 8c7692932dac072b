"""Material library: the built-in data file, user material files, and lookup by key or name.

File format (TOML; see docs/materials.md)::

    [sources]                      # citation key -> full citation
    callister2008 = "W. D. Callister Jr. and D. G. Rethwisch, ..."

    [materials.my_alloy]           # short key
    name = "My alloy"
    youngs_modulus = 150e9         # SI number, or a unit string such as "150 GPa"
    poisson_ratio = 0.3
    cte = 12e-6                    # a constant, or a table: see below
    temperature_range_C = [-40, 150]   # keys ending in _C take plain numbers in degC
    [materials.my_alloy.sources]   # where each value comes from; [key] refers to [sources]
    youngs_modulus = "[callister2008] Table B.2"

CTE tables: ``kind = "constant"`` (``value``, optional ``measured``/``valid_range``),
``"mean_table"`` (``reference``, ``temperatures``, ``values``), ``"instantaneous_table"``
(``temperatures``, ``values``), ``"silicon_okada_tokumaru"``. Temperatures as kelvin numbers or
unit strings, or with the ``_C`` suffix in degC.
"""
from __future__ import annotations


import math
import os
import re
from functools import lru_cache
from pathlib import Path
from types import MappingProxyType
from typing import Iterable, Iterator, Mapping

from ..errors import DesignFileError, InputError, UnknownMaterialError
from ..files import write_text_atomic
from ..toml_text import dumps
from ..units import to_si
from .cte import CTEModel, ConstantCTE, InstantaneousCTETable, MeanCTETable, SiliconCTE
from .material import Material

__all__ = [
    "MaterialLibrary",
    "default_library",
    "get_material",
    "load_material_file",
    "write_material_file",
    "material_to_table",
    "normalize_name",
]

LIBRARY_FILE = Path(__file__).with_name("library.toml")

_MATERIAL_KEYS = {
    # file key (= Material field) -> unit kind passed to bilayer.core.units.parse for unit strings
    "youngs_modulus": "modulus",
    "poisson_ratio": "dimensionless",
    "density": "density",
    "strength": "stress",
}
_TEMPERATURE_KEYS = ("glass_transition", "solidus")
_TEXT_KEYS = ("name", "category", "composition", "strength_kind", "notes")
_CITATION = re.compile(r"\[([A-Za-z0-9_\-]+)\]")


def normalize_name(text: str) -> str:
    """Lookup form of a key or name: case-folded, letters and digits only ("Fe-36Ni" -> "fe36ni")."""
    return "".join(ch for ch in str(text).casefold() if ch.isalnum())


def _hint_of(error: InputError) -> str:
    """The hint part of an InputError message, to carry it over when the error is re-raised."""
    base = f"{error.field}: {error.value!r} is not valid; expected {error.valid}"
    message = error.args[0] if error.args else ""
    return message[len(base) + 2:-1] if message.startswith(base + " (") else ""


def _key_from_name(name: str) -> str:
    return re.sub(r"[^0-9a-z]+", "_", name.casefold()).strip("_") or "material"


# --- reading values ---------------------------------------------------------------------------------
class _Reader:
    """Turns one TOML table into SI values, raising DesignFileError that names the file and key."""

    def __init__(self, where: str):
        self.where = where

    def error(self, key: str, value: object, valid: str, hint: str = "") -> DesignFileError:
        return DesignFileError(f"{self.where}: {key}", value, valid, hint)

    def quantity(self, key: str, value: object, kind: str) -> float:
        """An SI number as is, or a unit string converted by bilayer.core.units."""
        if isinstance(value, bool):
            raise self.error(key, value, f"a number (SI) or a text with a unit ({kind})")
        if isinstance(value, (int, float)):
            if not math.isfinite(value):
                raise self.error(key, value, "a finite number")
            return float(value)
        if isinstance(value, str):
            return self._from_unit_string(key, value, kind)
        raise self.error(key, value, f"a number (SI) or a text with a unit ({kind})")

    def _from_unit_string(self, key: str, value: str, kind: str) -> float:
        # The only place where unit strings enter; bilayer.core.units (pint) loads on first use.
        from ..units import parse

        try:
            return parse(value, kind, f"{self.where}: {key}")
        except InputError as exc:
            raise self.error(key, value, exc.valid, _hint_of(exc)) from None

    def temperature(self, table: Mapping, key: str) -> float | None:
        """Absolute temperature [K] from ``key`` (K number or unit string) or ``key_C`` (degC number)."""
        values = self.temperatures(table, key, scalar=True)
        return None if values is None else values[0]

    def temperatures(self, table: Mapping, key: str, scalar: bool = False) -> list[float] | None:
        plain, celsius = table.get(key), table.get(f"{key}_C")
        if plain is not None and celsius is not None:
            raise self.error(key, (plain, celsius), f"either {key} or {key}_C, not both")
        if plain is None and celsius is None:
            return None
        raw = plain if plain is not None else celsius
        items = [raw] if scalar else raw
        if not isinstance(items, list) or (scalar and isinstance(raw, list)):
            raise self.error(key if plain is not None else f"{key}_C", raw,
                             "a temperature" if scalar else "a list of temperatures")
        if celsius is not None:
            result = []
            for i, item in enumerate(items):
                name = f"{key}_C" if scalar else f"{key}_C[{i}]"
                if isinstance(item, bool) or not isinstance(item, (int, float)):
                    raise self.error(name, item, "a plain number in degC")
                result.append(to_si(item, "temperature", "degC"))  # reads back as the degC typed
            return result
        return [self.quantity(key if scalar else f"{key}[{i}]", item, "temperature") for i, item in enumerate(items)]

    def text(self, table: Mapping, key: str) -> str:
        value = table.get(key, "")
        if not isinstance(value, str):
            raise self.error(key, value, "a text")
        return value

    def check_keys(self, table: Mapping, allowed: Iterable[str], what: str) -> None:
        allowed = set(allowed)
        for key in table:
            if key not in allowed:
                raise self.error(key, table[key], f"one of the {what} keys: {', '.join(sorted(allowed))}")


_CTE_KEYS = {
    "constant": ("kind", "value", "measured", "measured_C", "valid_range", "valid_range_C"),
    "mean_table": ("kind", "reference", "reference_C", "temperatures", "temperatures_C", "values",
                   "valid_range", "valid_range_C"),
    "instantaneous_table": ("kind", "temperatures", "temperatures_C", "values", "valid_range", "valid_range_C"),
    "silicon_okada_tokumaru": ("kind",),
}


def _read_pair(reader: _Reader, table: Mapping, key: str) -> tuple[float, float] | None:
    values = reader.temperatures(table, key)
    if values is None:
        return None
    if len(values) != 2:
        raise reader.error(key, values, "a pair [low, high]")
    return (values[0], values[1])


def _read_cte(reader: _Reader, raw: object, default_range: tuple[float, float] | None) -> CTEModel:
    if not isinstance(raw, Mapping):
        return ConstantCTE(reader.quantity("cte", raw, "cte"), valid_range=default_range)
    sub = _Reader(f"{reader.where}.cte")
    kind = raw.get("kind")
    if kind not in _CTE_KEYS:
        raise sub.error("kind", kind, f"one of {', '.join(_CTE_KEYS)}")
    sub.check_keys(raw, _CTE_KEYS[kind], f"cte ({kind})")
    if kind == "silicon_okada_tokumaru":
        return SiliconCTE()
    valid = _read_pair(sub, raw, "valid_range")
    if kind == "constant":
        if "value" not in raw:
            raise sub.error("value", None, "a CTE value [1/K]")
        return ConstantCTE(
            sub.quantity("value", raw["value"], "cte"),
            valid_range=valid if valid is not None else default_range,
            reference_range=_read_pair(sub, raw, "measured"),
        )
    temperatures = sub.temperatures(raw, "temperatures")
    values = raw.get("values")
    if temperatures is None or not isinstance(values, list):
        raise sub.error("temperatures/values", values, "two lists of equal length")
    values = [sub.quantity(f"values[{i}]", v, "cte") for i, v in enumerate(values)]
    if kind == "mean_table":
        reference = sub.temperature(raw, "reference")
        if reference is None:
            raise sub.error("reference", None, "the reference temperature of the mean values")
        return MeanCTETable(reference, tuple(temperatures), tuple(values), valid_range=valid)
    return InstantaneousCTETable(tuple(temperatures), tuple(values), valid_range=valid)


_MATERIAL_FILE_KEYS = (
    *_TEXT_KEYS, *_MATERIAL_KEYS, "cte", "sources", "temperature_range", "temperature_range_C",
    *_TEMPERATURE_KEYS, *(f"{k}_C" for k in _TEMPERATURE_KEYS),
)


def _read_material(key: str, table: object, where: str) -> Material:
    reader = _Reader(f"{where} [materials.{key}]")
    if not isinstance(table, Mapping):
        raise reader.error("", table, "a table of material properties")
    reader.check_keys(table, _MATERIAL_FILE_KEYS, "material")
    for required in ("name", "youngs_modulus", "poisson_ratio", "cte"):
        if required not in table:
            raise reader.error(required, None, "a value (required)")
    sources = table.get("sources", {})
    if not isinstance(sources, Mapping) or not all(isinstance(v, str) for v in sources.values()):
        raise reader.error("sources", sources, "a table of field = source text")
    temperature_range = _read_pair(reader, table, "temperature_range")
    values = {name: reader.quantity(name, table[name], kind) for name, kind in _MATERIAL_KEYS.items() if name in table}
    try:
        return Material(
            key=key,
            cte=_read_cte(reader, table["cte"], temperature_range),
            temperature_range=temperature_range,
            glass_transition=reader.temperature(table, "glass_transition"),
            solidus=reader.temperature(table, "solidus"),
            sources=dict(sources),
            **{name: reader.text(table, name) for name in _TEXT_KEYS},
            **values,
        )
    except DesignFileError:
        raise
    except InputError as exc:
        raise DesignFileError(f"{reader.where}: {exc.field}", exc.value, exc.valid, _hint_of(exc)) from None


def _parse_document(document: Mapping, where: str) -> "MaterialLibrary":
    reader = _Reader(where)
    reader.check_keys(document, ("format", "sources", "materials"), "top-level")
    citations = document.get("sources", {})
    if not isinstance(citations, Mapping) or not all(isinstance(v, str) for v in citations.values()):
        raise reader.error("[sources]", citations, "a table of citation key = full citation text")
    materials = document.get("materials", {})
    if not isinstance(materials, Mapping):
        raise reader.error("[materials]", materials, "a table of material tables")
    parsed = [_read_material(key, table, where) for key, table in materials.items()]
    try:
        return MaterialLibrary(parsed, citations)
    except DesignFileError:
        raise
    except InputError as exc:
        raise DesignFileError(f"{where}: {exc.field}", exc.value, exc.valid, _hint_of(exc)) from None


# --- the library -----------------------------------------------------------------------------------
class MaterialLibrary(Mapping[str, Material]):
    """Immutable mapping of key -> Material with forgiving lookup.

    ``library[name]`` accepts a key or a name, ignoring case, spaces, underscores and punctuation
    ("Fe-36Ni", "FE_36NI" and "fe36ni" all match); an unknown name raises UnknownMaterialError with
    close matches. New libraries come from ``with_materials``, ``with_file`` and ``from_toml``.
    """

    __slots__ = ("_materials", "_index", "_citations")

    def __init__(self, materials: Iterable[Material] = (), citations: Mapping[str, str] | None = None):
        ordered: dict[str, Material] = {}
        index: dict[str, str] = {}
        for material in materials:
            if not isinstance(material, Material):
                raise InputError("materials", material, "Material objects")
            if not material.key:
                material = material.with_changes(key=_key_from_name(material.name))
            for label in {normalize_name(material.key), normalize_name(material.name)}:
                other = index.get(label)
                if other is not None and other != material.key:
                    raise InputError(
                        "materials", material.key, "keys and names that are unique in the library",
                        f"{material.key!r} ({material.name}) clashes with the entry {other!r}",
                    )
                index[label] = material.key
            if material.key in ordered:
                raise InputError("materials", material.key, "unique keys", "the key appears twice")
            ordered[material.key] = material
        object.__setattr__(self, "_materials", MappingProxyType(ordered))
        object.__setattr__(self, "_index", MappingProxyType(index))
        object.__setattr__(self, "_citations", MappingProxyType(dict(citations or {})))

    def __setattr__(self, name, value):
        raise AttributeError("MaterialLibrary is immutable; use with_materials()")

    # Mapping interface
    def __getitem__(self, name: str) -> Material:
        key = self._index.get(normalize_name(name)) if isinstance(name, str) else None
        if key is None:
            raise self._unknown(name)
        return self._materials[key]

    def __iter__(self) -> Iterator[str]:
        return iter(self._materials)

    def __len__(self) -> int:
        return len(self._materials)

    def __repr__(self) -> str:
        return f"MaterialLibrary({len(self)} materials)"

    def _unknown(self, name: object) -> UnknownMaterialError:
        import difflib

        wanted = normalize_name(name) if isinstance(name, str) else ""
        labels = list(self._index)
        close = difflib.get_close_matches(wanted, labels, n=3, cutoff=0.6) if wanted else []
        close += [label for label in labels if wanted and wanted in label and label not in close]
        keys = list(dict.fromkeys(self._index[label] for label in close))[:3]
        if keys:
            hint = "did you mean " + ", ".join(f"{k!r} ({self._materials[k].name})" for k in keys) + "?"
        else:
            hint = "the library uses generic names; MaterialLibrary.search(text) lists partial matches"
        return UnknownMaterialError("material", name, "a key or name from the material library", hint)

    # queries
    @property
    def citations(self) -> Mapping[str, str]:
        """Citation key -> full citation, from the files' [sources] tables."""
        return self._citations

    def search(self, text: str) -> tuple[Material, ...]:
        """Materials whose key, name or category contains ``text`` (ignoring case and punctuation)."""
        wanted = normalize_name(text)
        return tuple(
            m for m in self._materials.values()
            if wanted in normalize_name(m.key) or wanted in normalize_name(m.name)
            or wanted in normalize_name(m.category)
        )

    def expand_source(self, text: str) -> str:
        """Replace each [citation_key] in a source text by the full citation when it is known."""
        return _CITATION.sub(lambda m: self._citations.get(m.group(1), m.group(0)), text)

    # new libraries
    def with_materials(self, *materials: Material, replace: bool = False,
                       citations: Mapping[str, str] | None = None) -> "MaterialLibrary":
        """A new library with ``materials`` added (``replace=True`` lets them override same keys)."""
        incoming = [m if m.key else m.with_changes(key=_key_from_name(m.name)) for m in materials]
        for material in incoming:
            warn_if_unit_slip(material, self)
        new_keys = {m.key for m in incoming}
        clashes = [k for k in new_keys if k in self._materials]
        if clashes and not replace:
            raise InputError("materials", clashes[0], "a key not yet in the library",
                             "pass replace=True to override the library entry")
        kept = [m for k, m in self._materials.items() if k not in new_keys]
        return MaterialLibrary([*kept, *incoming], {**self._citations, **dict(citations or {})})

    def with_file(self, path: str | os.PathLike, replace: bool = False) -> "MaterialLibrary":
        """A new library with the materials of a user file added."""
        extra = MaterialLibrary.from_toml(path)
        return self.with_materials(*extra.values(), replace=replace, citations=extra.citations)

    @classmethod
    def from_toml(cls, path: str | os.PathLike) -> "MaterialLibrary":
        """Read a material file (format in the module docstring); errors name the file and key."""
        path = Path(path)
        try:
            text = path.read_text(encoding="utf-8")
        except OSError as exc:
            raise DesignFileError(str(path), str(path), "a readable material file", exc.strerror or "") from None
        return cls.from_toml_text(text, where=str(path))

    @classmethod
    def from_document(cls, document: Mapping, where: str = "<text>") -> "MaterialLibrary":
        """The library of a material-file document already read as TOML (``format``, ``sources``,
        ``materials`` tables); errors name ``where``."""
        return _parse_document(document, where)

    @classmethod
    def from_toml_text(cls, text: str, where: str = "<text>") -> "MaterialLibrary":
        import tomllib

        try:
            document = tomllib.loads(text)
        except tomllib.TOMLDecodeError as exc:
            raise DesignFileError(where, "(file contents)", "valid TOML", str(exc)) from None
        return _parse_document(document, where)


# --- writing ---------------------------------------------------------------------------------------
def material_to_table(material: Material) -> dict:
    """The file-format table of a material (SI numbers, temperatures in kelvin); inverse of reading."""
    table: dict = {"name": material.name}
    for key in ("category", "composition", "strength_kind", "notes"):
        if getattr(material, key):
            table[key] = getattr(material, key)
    table["youngs_modulus"] = material.youngs_modulus
    table["poisson_ratio"] = material.poisson_ratio
    for key in ("density", "strength", "glass_transition", "solidus"):
        if getattr(material, key) is not None:
            table[key] = getattr(material, key)
    if material.temperature_range is not None:
        table["temperature_range"] = list(material.temperature_range)
    cte = material.cte
    cte_table: dict = {"kind": cte.kind}
    if isinstance(cte, ConstantCTE):
        cte_table["value"] = cte.value
        if cte.reference_range is not None:
            cte_table["measured"] = list(cte.reference_range)
    elif isinstance(cte, MeanCTETable):
        cte_table["reference"] = cte.reference_temperature
    if isinstance(cte, (MeanCTETable, InstantaneousCTETable)):
        cte_table["temperatures"] = list(cte.temperatures)
        cte_table["values"] = list(cte.values)
    if not isinstance(cte, SiliconCTE) and cte.valid_range is not None:
        cte_table["valid_range"] = list(cte.valid_range)
    table["cte"] = cte_table
    if material.sources:
        table["sources"] = dict(material.sources)
    return table


def write_material_file(path: str | os.PathLike, materials: Iterable[Material],
                        citations: Mapping[str, str] | None = None) -> Path:
    """Write materials to a TOML material file atomically (temporary file, then rename)."""
    document: dict = {"sources": dict(citations)} if citations else {}
    tables = {}
    for material in materials:
        key = material.key or _key_from_name(material.name)
        if not re.fullmatch(r"[A-Za-z0-9_\-]+", key):
            raise InputError("key", key, "letters, digits, '_' and '-' only")
        tables[key] = material_to_table(material)
    document["materials"] = tables
    header = "# bilayer material file: SI units (Pa, 1/K, kg/m^3), temperatures in kelvin\n\n"
    return write_text_atomic(path, header + dumps(document))


# --- module-level helpers ----------------------------------------------------------------------------
@lru_cache(maxsize=1)
def default_library() -> MaterialLibrary:
    """The built-in library (parsed on first use, then cached)."""
    return MaterialLibrary.from_toml(LIBRARY_FILE)


def load_material_file(path: str | os.PathLike) -> MaterialLibrary:
    """The materials of a user file, as a library of their own (merge with ``default_library().with_file``)."""
    return MaterialLibrary.from_toml(path)


DEGF_PER_K = 1.8  # a CTE per degF is 1/1.8 of the same CTE per K


def warn_if_unit_slip(material: Material, library: "MaterialLibrary | None" = None) -> None:
    """Warn when a user material's CTE looks like a per-degF number typed as per-K (or the reverse).

    Judged against the library entry with the same key or name: the slip is likely when the value
    differs from that entry by more than 5 % but equals it divided (or multiplied) by 1.8 within 3 %.
    (materials.md sec. 9 lists this slip among the common ones.)
    """
    from ..errors import warn_suspicious

    library = library if library is not None else default_library()
    known = None
    for name in (material.key, material.name):
        key = library._index.get(normalize_name(name)) if name else None
        if key is not None:
            known = library._materials[key]
            break
    if known is None or known.alpha == 0 or material.alpha == 0:
        return
    ratio = material.alpha / known.alpha
    if abs(ratio - 1) <= 0.05:
        return
    for factor, slip in ((1 / DEGF_PER_K, "a per-degF value typed as per-K"),
                         (DEGF_PER_K, "a per-K value typed as per-degF")):
        if abs(ratio / factor - 1) <= 0.03:
            warn_suspicious("cte", material.alpha,
                            f"material {material.name!r}: {ratio:.3f} x the library's {known.name} "
                            f"({known.alpha:.3g} /K); {slip}?", stacklevel=4)
            return


def get_material(name_or_key: "str | Material", library: MaterialLibrary | None = None) -> Material:
    """Look a material up by key or name in ``library`` (default: the built-in library)."""
    if isinstance(name_or_key, Material):
        return name_or_key
    if not isinstance(name_or_key, str):
        raise InputError("material", name_or_key, "a material key or name (text) or a Material")
    return (library if library is not None else default_library())[name_or_key]
