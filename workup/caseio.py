"""Reading and writing case files: safe YAML only, and errors that name the file, line and field.

Loading never executes anything and never shows a traceback for a bad file: every failure becomes
a :class:`CaseFileError` holding one :class:`Problem` per field, each with its line where known.
"""

from __future__ import annotations

import difflib
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import yaml
from pydantic import ValidationError

from workup.analytes import CATALOGUE, Panel, UnitSystem, analyte
from workup.model import SCHEMA_VERSION, Case, Draw, Patient

try:  # libyaml is ~8x faster; fall back to the pure-Python safe loader where it is missing.
    from yaml import CSafeDumper as _Dumper
    from yaml import CSafeLoader as _Loader
except ImportError:  # pragma: no cover - depends on how PyYAML was built
    from yaml import SafeDumper as _Dumper  # type: ignore[assignment]
    from yaml import SafeLoader as _Loader  # type: ignore[assignment]

MAX_FILE_BYTES = 1_000_000
"""A case file is a few kilobytes; anything this large is not one."""


@dataclass(frozen=True, slots=True)
class Problem:
    """One thing wrong with a case file."""

    field: str
    """Dotted path of the field, e.g. ``draws[0].serum.sodium``; "" for the whole file."""
    message: str
    """What is wrong and how to fix it."""
    line: int | None = None
    """1-based line in the file, where known."""

    def format(self, source: str) -> str:
        """``file:line: field: message`` on one line."""
        where = f"{source}:{self.line}" if self.line else source
        return (
            f"{where}: {self.field}: {self.message}" if self.field else f"{where}: {self.message}"
        )


class CaseFileError(ValueError):
    """A case file that cannot be read; ``problems`` lists every field at fault."""

    def __init__(self, source: str, problems: list[Problem]):
        self.source = source
        self.problems = problems
        super().__init__("\n".join(p.format(source) for p in problems))


def load_case(path: str | Path) -> Case:
    """Read the case file at ``path``; raises CaseFileError (also for unreadable files)."""
    path = Path(path)
    source = str(path)
    try:
        size = path.stat().st_size
        if size > MAX_FILE_BYTES:
            raise CaseFileError(source, [Problem("", f"file is {size} bytes; not a case file")])
        raw = path.read_bytes()
    except OSError as exc:
        raise CaseFileError(
            source, [Problem("", f"cannot read the file: {exc.strerror}")]
        ) from None
    return case_from_bytes(raw, source)


def case_from_bytes(raw: bytes, source: str = "<text>", registry: dict | None = None) -> Case:
    """Decode and read case-file bytes."""
    if len(raw) > MAX_FILE_BYTES:
        raise CaseFileError(source, [Problem("", f"{len(raw)} bytes is too large for a case file")])
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise CaseFileError(
            source, [Problem("", f"not UTF-8 text (byte {exc.start}); is this a case file?")]
        ) from None
    return case_from_text(text, source, registry)


def parse_yaml(text: str, source: str = "<text>") -> tuple[Any, yaml.Node | None]:
    """Parse YAML safely: no tags, no aliases, no duplicate keys. Returns (data, node tree)."""
    if "\x00" in text:
        raise CaseFileError(source, [Problem("", "the file contains NUL bytes; not a case file")])
    try:
        for event in yaml.parse(text, Loader=_Loader):
            if isinstance(event, yaml.AliasEvent) or getattr(event, "anchor", None):
                line = event.start_mark.line + 1
                raise CaseFileError(
                    source, [Problem("", "anchors and aliases (&, *) are not allowed", line)]
                )
            # The parser reports a tag only where the file wrote one explicitly (!!python/...).
            tag = getattr(event, "tag", None)
            if tag is not None:
                line = event.start_mark.line + 1
                raise CaseFileError(
                    source, [Problem("", f"YAML tags such as {tag} are not allowed", line)]
                )
        node = yaml.compose(text, Loader=_Loader)
        if node is not None:
            _check_duplicates(node, source)
        data = yaml.load(text, Loader=_Loader)
    except CaseFileError:
        raise
    except yaml.YAMLError as exc:
        mark = getattr(exc, "problem_mark", None)
        line = mark.line + 1 if mark is not None else None
        what = getattr(exc, "problem", None) or str(exc).splitlines()[0]
        raise CaseFileError(source, [Problem("", f"not valid YAML: {what}", line)]) from None
    except (ValueError, TypeError, RecursionError) as exc:
        raise CaseFileError(source, [Problem("", f"not valid YAML: {exc}")]) from None
    return data, node


def _check_duplicates(node: yaml.Node, source: str) -> None:
    stack = [node]
    while stack:
        n = stack.pop()
        if isinstance(n, yaml.MappingNode):
            seen: dict[str, int] = {}
            for k, v in n.value:
                key = str(k.value)
                if key in seen:
                    raise CaseFileError(
                        source,
                        [
                            Problem(
                                key,
                                f"appears twice (lines {seen[key]} and {k.start_mark.line + 1}); "
                                "keep one",
                                k.start_mark.line + 1,
                            )
                        ],
                    )
                seen[key] = k.start_mark.line + 1
                stack.append(v)
        elif isinstance(n, yaml.SequenceNode):
            stack.extend(n.value)


def case_from_text(text: str, source: str = "<text>", registry: dict | None = None) -> Case:
    """Read a case from YAML text."""
    data, node = parse_yaml(text, source)
    if data is None:
        raise CaseFileError(
            source, [Problem("", "the file is empty; a case needs at least a label")]
        )
    if not isinstance(data, dict):
        raise CaseFileError(
            source,
            [
                Problem(
                    "", f"expected a mapping of keys (label:, draws:…), got {type(data).__name__}"
                )
            ],
        )
    return case_from_data(data, source, node, registry)


def case_from_data(
    data: dict[str, Any],
    source: str = "<data>",
    node: yaml.Node | None = None,
    registry: dict | None = None,
) -> Case:
    """Validate a mapping as a case (migrating an older schema first), errors as Problems.

    ``registry`` replaces the product's migration steps (tests prove the mechanism with it).
    """
    from workup import model
    from workup.migrations import MigrationError, migrate, schema_of

    if not isinstance(data, dict):
        raise CaseFileError(source, [Problem("", "expected a mapping of keys")])
    try:
        version = schema_of(data)
    except MigrationError:
        version = None  # the model's validation names the fault with its line
    if version is not None and version < model.SCHEMA_VERSION:
        try:
            data = migrate(data, registry=registry)
        except MigrationError as exc:
            raise CaseFileError(source, [Problem("schema", str(exc))]) from None
        node = None  # line numbers refer to the old layout
    units = data.get("units")
    system = (
        UnitSystem(units) if isinstance(units, str) and units in UnitSystem.__members__ else None
    )
    try:
        return Case.model_validate(data, context={"units": system})
    except ValidationError as exc:
        problems = [_problem(err, node, data) for err in exc.errors(include_url=False)]
        raise CaseFileError(source, problems) from None


def _dotted(loc: tuple[Any, ...]) -> str:
    out = ""
    for part in loc:
        if isinstance(part, int):
            out += f"[{part}]"
        else:
            out += ("." if out else "") + ("schema" if part == "schema_version" else str(part))
    return out


def _problem(err: dict[str, Any], node: yaml.Node | None, data: dict[str, Any]) -> Problem:
    loc = tuple(p for p in err["loc"] if not (isinstance(p, str) and p.startswith("function-")))
    msg = err["msg"]
    for prefix in ("Value error, ", "Assertion failed, "):
        if msg.startswith(prefix):
            msg = msg[len(prefix) :]
    if err["type"] == "extra_forbidden" and loc:
        key = str(loc[-1])
        known = _known_keys(loc[:-1])
        near = difflib.get_close_matches(key, known, n=1, cutoff=0.6)
        msg = f"unknown key {key!r}" + (f"; did you mean {near[0]!r}?" if near else "")
        if not near and known:
            msg += "; known keys: " + ", ".join(known)
    elif err["type"] == "missing":
        msg = "required; add it"
    elif err["type"] == "enum":
        expected = err.get("ctx", {}).get("expected", "")
        msg = f"{err.get('input')!r} is not one of {expected}"
    return Problem(_dotted(loc), msg, _line_of(node, loc))


def _known_keys(loc: tuple[Any, ...]) -> list[str]:
    names = [p for p in loc if isinstance(p, str)]
    if not names:
        return [("schema" if k == "schema_version" else k) for k in Case.model_fields]
    last = names[-1]
    if last == "patient":
        return list(Patient.model_fields)
    if last in Panel.__members__:
        keys = list(CATALOGUE[Panel(last)])
        return [*keys, "sample"] if last == "blood_gas" else keys
    if last == "draws":
        return list(Draw.model_fields)
    return []


def _line_of(node: yaml.Node | None, loc: tuple[Any, ...]) -> int | None:
    if node is None:
        return None
    line = node.start_mark.line + 1
    for part in loc:
        part = "schema" if part == "schema_version" else part
        if isinstance(node, yaml.MappingNode):
            for k, v in node.value:
                if str(k.value) == str(part):
                    line, node = k.start_mark.line + 1, v
                    break
            else:
                return line
        elif (
            isinstance(node, yaml.SequenceNode) and isinstance(part, int) and part < len(node.value)
        ):
            node = node.value[part]
            line = node.start_mark.line + 1
        else:
            return line
    return line


def case_to_data(case: Case) -> dict[str, Any]:
    """The case as plain YAML-ready data, in the documented key order, omitting empty fields."""
    out: dict[str, Any] = {"schema": SCHEMA_VERSION, "label": case.label}
    patient = {k: v for k, v in case.patient.model_dump(mode="json").items() if v is not None}
    if patient:
        out["patient"] = patient
    if case.units is not None:
        out["units"] = case.units.value
    if case.context:
        out["context"] = [f.value for f in case.context]
    if case.notes:
        out["notes"] = case.notes
    if case.settings:
        out["settings"] = dict(case.settings)
    out["draws"] = [draw_to_data(d) for d in case.draws]
    return out


def draw_to_data(draw: Draw) -> dict[str, Any]:
    """One draw as YAML-ready data."""
    d: dict[str, Any] = {"label": draw.label}
    if draw.taken is not None:
        d["taken"] = draw.taken.isoformat(timespec="minutes")
    if draw.during is not None:
        d["during"] = draw.during.value
    for panel in Panel:
        values = {
            key: m.written(analyte(panel, key))
            for key, m in draw.panel(panel).measurements().items()
        }
        if panel is Panel.blood_gas and values and draw.blood_gas.sample.value != "arterial":
            values = {"sample": draw.blood_gas.sample.value, **values}
        if values:
            d[panel.value] = values
    if draw.notes:
        d["notes"] = draw.notes
    return d


class _FlowDumper(_Dumper):  # type: ignore[misc, valid-type]
    """Writes panels as one-line flow mappings so a case file stays short and readable."""


def _represent_dict(dumper: yaml.SafeDumper, data: dict[str, Any]) -> yaml.Node:
    flow = all(not isinstance(v, dict | list) for v in data.values()) and "label" not in data
    return dumper.represent_mapping("tag:yaml.org,2002:map", data.items(), flow_style=flow)


def _represent_str(dumper: yaml.SafeDumper, data: str) -> yaml.Node:
    # Notes of several lines read best, and are edited most safely, as a literal block; the
    # emitter itself falls back to a quoted style where a block cannot hold the text exactly.
    style = "|" if "\n" in data else None
    return dumper.represent_scalar("tag:yaml.org,2002:str", data, style=style)


_FlowDumper.add_representer(dict, _represent_dict)
_FlowDumper.add_representer(str, _represent_str)


WRAP_AT = 96
"""Panels longer than this are wrapped, at a comma, under their opening brace."""


def dump_case(case: Case) -> str:
    """The case as YAML text that :func:`case_from_text` reads back to an equal case."""
    # Dump unwrapped, then wrap the one-line panels ourselves: PyYAML's own wrapping may break
    # inside a value ("80\n umol/L"), which reads back the same but is miserable to hand-edit.
    text = yaml.dump(
        case_to_data(case),
        Dumper=_FlowDumper,
        sort_keys=False,
        allow_unicode=True,
        width=1_000_000,
        default_flow_style=False,
    )
    return "".join(_wrap_flow(line) for line in text.splitlines(keepends=True))


def _wrap_flow(line: str) -> str:
    if len(line) <= WRAP_AT + 1 or ": {" not in line or not line.rstrip().endswith("}"):
        return line
    head, _, body = line.partition("{")
    indent = " " * (len(head) + 1)
    out, current = [], head + "{"
    items = body.rstrip().removesuffix("}").split(", ")
    for i, item in enumerate(items):
        piece = item + ("}" if i == len(items) - 1 else ",")
        if len(current) + 1 + len(piece) > WRAP_AT and current.strip() not in (
            "",
            head.strip() + " {",
        ):
            out.append(current.rstrip())
            current = indent + piece
        else:
            current += ("" if current.endswith("{") else " ") + piece
    out.append(current)
    return "\n".join(out) + "\n"


def save_case(case: Case, path: str | Path) -> Path:
    """Write the case to ``path`` atomically (see workup.storage for the full save)."""
    from workup.storage import atomic_write_text

    path = Path(path)
    atomic_write_text(path, dump_case(case))
    return path
