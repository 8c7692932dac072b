"""The one TOML writer of bilayer: design files, records and material files.

Tables and arrays of tables are written as ``[table]`` and ``[[array]]`` blocks in the order given,
never inline: design files list their layers as ``[[layer]]`` blocks (docs/design-file.md), and a
record's review log grows by appending a ``[[review]]`` block to the end of the text, which an inline
array could not take. Floats are written with ``repr`` (exact round trip), non-finite floats as
``nan``/``inf``, texts with newlines as literal multi-line strings where that is lossless. Reading
is the standard library's ``tomllib``.
"""
from __future__ import annotations

import json
import math
import re
from typing import Any, Mapping

from .errors import InputError

__all__ = ["dumps", "toml_key", "toml_string", "toml_value", "BARE_KEY"]

BARE_KEY = re.compile(r"[A-Za-z0-9_\-]+")


def toml_key(name: str) -> str:
    return name if BARE_KEY.fullmatch(name) else toml_string(name)


def toml_string(text: str) -> str:
    try:
        text.encode("utf-8")
    except UnicodeEncodeError:
        raise InputError("text", text, "text that can be written as UTF-8") from None
    if ("\n" in text and "'''" not in text and not text.endswith("'")
            and not any((ord(c) < 32 and c not in "\n\t") or ord(c) == 127 for c in text)):
        return "'''\n" + text + "'''"
    return json.dumps(text, ensure_ascii=False).replace("\x7f", "\\u007f")


def toml_value(value: Any) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        if math.isnan(value):
            return "nan"
        if math.isinf(value):
            return "inf" if value > 0 else "-inf"
        return repr(value)
    if isinstance(value, str):
        return toml_string(value)
    if isinstance(value, (list, tuple)):
        return "[" + ", ".join(toml_value(item) for item in value) + "]"
    if isinstance(value, Mapping):
        return "{ " + ", ".join(f"{toml_key(k)} = {toml_value(v)}" for k, v in value.items()) + " }"
    raise InputError("value", value, "a number, text, boolean, list or table")


def _is_table_array(value: Any) -> bool:
    return isinstance(value, (list, tuple)) and bool(value) and all(isinstance(v, Mapping) for v in value)


def dumps(document: Mapping, path: tuple[str, ...] = ()) -> str:
    """The TOML text of ``document``: keys in their order, scalars first, then tables and arrays of tables
    as ``[table]`` and ``[[array]]`` blocks (never inline, so a block can be appended to the text)."""
    lines: list[str] = []
    blocks: list[str] = []
    for name, value in document.items():
        if isinstance(value, Mapping):
            inner = dumps(value, (*path, name))
            header = "[" + ".".join(toml_key(p) for p in (*path, name)) + "]"
            only_tables = value and all(isinstance(v, Mapping) or _is_table_array(v) for v in value.values())
            blocks.append(inner if only_tables else header + "\n" + inner)
        elif _is_table_array(value):
            header = "[[" + ".".join(toml_key(p) for p in (*path, name)) + "]]"
            for entry in value:
                blocks.append(header + "\n" + dumps(entry, (*path, name)))
        else:
            lines.append(f"{toml_key(name)} = {toml_value(value)}")
    text = "\n".join(lines) + ("\n" if lines else "")
    for block in blocks:
        text += ("\n" if text else "") + block
    return text
