"""``workup import FILE|- [--units conventional|si] [--label L] [--json] [--into CASE.yaml]``.

Prints the draw proposed from pasted lab-report text for review: each value with its source line,
then the questions and the lines not taken. With ``--into`` the draw is appended to a case file,
but only when nothing is left to answer (else exit 2 with the questions on stderr). The rest of
the case file (comments, order, layout) is kept: the new draw is added with a round-trip editor.
"""

from __future__ import annotations

import argparse
import io
import json
import sys
import textwrap
from pathlib import Path
from typing import Any

from workup.analytes import UnitSystem
from workup.caseio import MAX_FILE_BYTES, CaseFileError, case_from_text, draw_to_data, dump_case
from workup.model import Case, Draw
from workup.paste import PANEL_WORD, Proposal, apply_proposal, propose

EXIT_OK, EXIT_FAILURE, EXIT_BAD_INPUT = 0, 1, 2


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Arguments of ``workup import``."""
    p.add_argument("file", help="text file holding the pasted report, or - for standard input")
    p.add_argument(
        "--units",
        choices=[u.value for u in UnitSystem],
        help="unit system of bare numbers (default: the case's units with --into, else none)",
    )
    p.add_argument("--label", help="label of the new draw (default: 'pasted' and the time)")
    p.add_argument("--json", action="store_true", help="print the proposal as one JSON object")
    p.add_argument("--into", type=Path, help="append the draw to this case file (YAML)")


def _read_input(name: str) -> str | None:
    try:
        if name == "-":
            raw = sys.stdin.buffer.read(MAX_FILE_BYTES + 1)
        else:
            with open(name, "rb") as fh:
                raw = fh.read(MAX_FILE_BYTES + 1)
    except OSError as exc:
        print(f"workup: {name}: cannot read the file: {exc.strerror}", file=sys.stderr)
        return None
    if len(raw) > MAX_FILE_BYTES:
        print(f"workup: {name}: larger than {MAX_FILE_BYTES} bytes; not a report", file=sys.stderr)
        return None
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        print(f"workup: {name}: not UTF-8 text (byte {exc.start})", file=sys.stderr)
        return None


def run(args: argparse.Namespace) -> int:
    """Print the proposal; with --into, append it as a new draw when nothing is ambiguous."""
    text = _read_input(args.file)
    if text is None:
        return EXIT_BAD_INPUT
    case_text = None
    case: Case | None = None
    if args.into is not None:
        try:
            case_text = args.into.read_text(encoding="utf-8")
            case = case_from_text(case_text, str(args.into))
        except OSError as exc:
            print(f"workup: {args.into}: cannot read the file: {exc.strerror}", file=sys.stderr)
            return EXIT_BAD_INPUT
        except (CaseFileError, UnicodeDecodeError) as exc:
            print(str(exc), file=sys.stderr)
            return EXIT_BAD_INPUT
    units = UnitSystem(args.units) if args.units else (case.units if case else None)
    proposal = propose(text, units)
    if args.json:
        json.dump(proposal_to_json(proposal), sys.stdout, indent=2, ensure_ascii=False)
        sys.stdout.write("\n")
    else:
        sys.stdout.write(render_text(proposal, args.file))
    if case is None or case_text is None:
        return EXIT_OK
    return _append(args, case, case_text, proposal)


def _append(args: argparse.Namespace, case: Case, case_text: str, proposal: Proposal) -> int:
    if proposal.questions:
        print(
            f"workup: not added to {args.into}: {len(proposal.questions)} question(s) to answer "
            "first (add a heading such as 'Urine' or 'Serum', write the units, or pass --units):",
            file=sys.stderr,
        )
        for q in proposal.questions:
            print(_wrap(f"{q.id}: {q.text}", "  "), file=sys.stderr)
        return EXIT_BAD_INPUT
    if not proposal.entries:
        print(f"workup: not added to {args.into}: no value was recognised", file=sys.stderr)
        return EXIT_BAD_INPUT
    label = args.label or _default_label(proposal, case)
    if any(d.label == label for d in case.draws):
        print(
            f"workup: {args.into}: a draw is already labelled {label!r}; pass another --label",
            file=sys.stderr,
        )
        return EXIT_BAD_INPUT
    try:
        draw = apply_proposal(Draw(label=label), proposal)
    except ValueError as exc:
        print(f"workup: {exc}", file=sys.stderr)
        return EXIT_BAD_INPUT
    try:
        new_text = append_draw_text(case_text, draw)
        case_from_text(new_text, str(args.into))  # the file must read back before it is written
    except (CaseFileError, ValueError) as exc:
        print(f"workup: {args.into}: the new draw could not be added: {exc}", file=sys.stderr)
        return EXIT_FAILURE
    from workup.storage import atomic_write_text

    try:
        atomic_write_text(args.into, new_text)
    except OSError as exc:
        print(f"workup: {args.into}: cannot write the file: {exc.strerror}", file=sys.stderr)
        return EXIT_FAILURE
    print(f"added draw {label!r} to {args.into}", file=sys.stderr)
    return EXIT_OK


def _default_label(proposal: Proposal, case: Case) -> str:
    base = f"pasted {proposal.taken:%Y-%m-%d %H:%M}" if proposal.taken else "pasted"
    labels = {d.label for d in case.draws}
    label, n = base, 2
    while label in labels:
        label, n = f"{base} ({n})", n + 1
    return label


def append_draw_text(case_text: str, draw: Draw) -> str:
    """The case file text with ``draw`` appended to ``draws:``, the rest of the file unchanged.

    When ``draws:`` is the last key and a block list (the usual layout) the new draw is added as
    text at the end, indented like the others, so that every other byte of the file is kept.
    Otherwise the file is edited with a round-trip YAML editor, which keeps comments and order
    but may re-wrap long lines.
    """
    appended = _append_as_text(case_text, draw)
    return appended if appended is not None else _append_round_trip(case_text, draw)


def _append_as_text(case_text: str, draw: Draw) -> str | None:
    import yaml

    try:
        root = yaml.compose(case_text, Loader=yaml.SafeLoader)
    except yaml.YAMLError:
        return None
    if not isinstance(root, yaml.MappingNode) or not root.value:
        return None
    key, seq = root.value[-1]
    if key.value != "draws" or not isinstance(seq, yaml.SequenceNode) or not seq.value:
        return None
    if seq.flow_style:
        return None
    tail = case_text[seq.end_mark.index :]
    if any(line.strip() and not line.lstrip().startswith("#") for line in tail.splitlines()):
        return None
    first = seq.value[0].start_mark
    dash = case_text.splitlines()[first.line][: first.column].rstrip()
    if not dash.endswith("-"):
        return None
    indent = " " * (len(dash) - 1)
    dumped = dump_case(Case(label="new", draws=[draw]))
    block = dumped.split("\ndraws:\n", 1)[1]
    body = "".join(indent + line if line.strip() else line for line in block.splitlines(True))
    return case_text.rstrip("\n") + "\n" + body


def _append_round_trip(case_text: str, draw: Draw) -> str:
    from ruamel.yaml import YAML
    from ruamel.yaml.comments import CommentedMap, CommentedSeq

    yaml = YAML()  # round-trip: comments, order and flow style of the rest are kept
    yaml.preserve_quotes = True
    yaml.width = 100
    yaml.indent(mapping=2, sequence=4, offset=2)
    data = yaml.load(case_text)
    if not isinstance(data, dict):
        raise ValueError("the case file is not a mapping")
    new = CommentedMap()
    for key, value in draw_to_data(draw).items():
        if isinstance(value, dict):
            panel = CommentedMap(value)
            panel.fa.set_flow_style()
            new[key] = panel
        else:
            new[key] = value
    draws = data.get("draws")
    if draws is None:
        data["draws"] = CommentedSeq([new])
    elif isinstance(draws, list):
        draws.append(new)
    else:
        raise ValueError("draws: is not a list")
    out = io.StringIO()
    yaml.dump(data, out)
    return out.getvalue()


def _wrap(text: str, indent: str = "    ") -> str:
    return textwrap.fill(text, 80, initial_indent=indent, subsequent_indent=indent + "  ")


def _value_text(entry) -> str:
    m = entry.measurement
    if m.word is not None:
        return m.word
    v = int(m.value) if float(m.value).is_integer() else m.value
    return f"{v} {m.unit}".strip()


def render_text(p: Proposal, source: str = "-") -> str:
    """The proposal as plain text, 80 columns wide, for review."""
    when = f"{p.taken:%Y-%m-%d %H:%M}" if p.taken else "not given"
    lines = [f"Proposed draw from {source}", f"  collected: {when}"]
    if p.gas_sample:
        lines.append(f"  blood gas sample: {p.gas_sample}")
    cautions = {id(e): note for e, note in p.cautions()}
    for panel in ("serum", "blood_gas", "urine"):
        rows = [e for e in p.entries if e.panel == panel]
        if not rows:
            continue
        lines += ["", PANEL_WORD[panel]]
        for e in rows:
            status = "unusual" if id(e) in cautions else "read"
            flags = f" [{' '.join(e.flags)}]" if e.flags else ""
            src = " ".join(e.source.text.split())
            lines.append(
                f"  {e.analyte.name[:26]:<26} {_value_text(e):>14}  {status:<7}{flags}"
                f"  line {e.source.number}: {src}"[:200]
            )
            if id(e) in cautions:
                lines.append(_wrap("! " + cautions[id(e)], "      "))
    if not p.entries:
        lines += ["", "  no value was recognised"]
    if p.questions:
        lines += ["", f"Questions ({len(p.questions)}): answer them, or leave the item out"]
        for q in p.questions:
            lines.append(_wrap(f"{q.id}: {q.text}", "  "))
            for i, o in enumerate(q.options, start=1):
                lines.append(_wrap(f"{i}) {o.label}", "      "))
    if p.unrecognised:
        lines += ["", f"Not taken ({len(p.unrecognised)})"]
        for u in p.unrecognised:
            word = "refused" if u.refused else "skipped"
            shown = " ".join(u.source.text.split())
            lines.append(_wrap(f"line {u.source.number} {word}: “{shown}”: {u.reason}", "  "))
    return "\n".join(lines) + "\n"


def proposal_to_json(p: Proposal) -> dict[str, Any]:
    """The proposal as JSON-ready data (every value with its unit, status and source line)."""
    cautions = {id(e): note for e, note in p.cautions()}

    def entry(e) -> dict[str, Any]:
        m = e.measurement
        return {
            "panel": e.panel,
            "key": e.key,
            "value": m.word if m.word is not None else m.value,
            "unit": m.unit,
            "canonical": m.canonical,
            "canonical_unit": e.analyte.canonical,
            "status": "unusual" if id(e) in cautions else "read",
            "caution": cautions.get(id(e)),
            "flags": list(e.flags),
            "when": e.when or None,
            "line": e.source.number,
            "source": e.source.text,
        }

    return {
        "taken": p.taken.isoformat(timespec="minutes") if p.taken else None,
        "gas_sample": p.gas_sample,
        "units": p.units.value if p.units else None,
        "values": [entry(e) for e in p.entries],
        "questions": [
            {
                "id": q.id,
                "kind": q.kind,
                "question": q.text,
                "lines": [s.number for s in q.sources],
                "options": [
                    {
                        "label": o.label,
                        "value": entry(o.entry) if o.entry else None,
                        "taken": o.taken.isoformat(timespec="minutes") if o.taken else None,
                    }
                    for o in q.options
                ],
            }
            for q in p.questions
        ],
        "unrecognised": [
            {
                "line": u.source.number,
                "source": u.source.text,
                "reason": u.reason,
                "refused": u.refused,
            }
            for u in p.unrecognised
        ],
    }
