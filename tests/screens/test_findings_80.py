"""The findings pane at 80 x 24: whole words, several rows in view, the compensation rules that do
not apply folded into one row (invented demo cases)."""

from __future__ import annotations

import os
import shutil
from pathlib import Path

from screens.case.keys import HELP_KEYS
from screens.case_screen import CaseScreen
from screens.findings_view import COMPENSATION_RULES, GROUP_KEY, FindingsView, IndexTable
from tests.screens.support import SIZE, screen_rows
from tests.screens.support import make_app as _app
from workup.findings import STATUS_MARK, STATUS_WORD, Status
from workup.short_names import short_name


def _private(tmp_path: Path, cases_dir: Path, name: str) -> Path:
    folder = tmp_path / "cases"
    folder.mkdir(mode=0o700, exist_ok=True)
    os.chmod(folder, 0o700)
    target = folder / name
    shutil.copy(cases_dir / name, target)
    os.chmod(target, 0o600)
    return target


def _table_lines(app, table: IndexTable) -> list[str]:
    region = table.scrollable_content_region  # the text, not the scrollbar beside it
    rows = screen_rows(app)
    return [rows[y][region.x : region.right] for y in range(region.y, region.bottom)]


async def test_table_keeps_the_room_at_80_by_24(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        assert isinstance(screen, CaseScreen)
        table = screen.query_one(IndexTable)
        # Header row + at least 8 index rows in view; the detail box takes two lines.
        assert table.region.height >= 9, table.region
        assert screen.query_one("#index-detail").region.height <= 2
        text = "\n".join(screen_rows(app))
        # The pane's header says which draw: no second "Draw:" line, no legend line repeating
        # what every status cell spells out.
        assert "draw 'baseline' (the acidosis)" in text
        assert "Draw: baseline" not in text
        assert "legend:" not in text


async def test_reading_column_shows_whole_words(tmp_path: Path, cases_dir: Path) -> None:
    # Demo F (invented): urine pH 5.4 reads "acidified (borderline)", longer than a fixed column.
    path = _private(tmp_path, cases_dir, "ckd-acidosis.yaml")
    app = _app(path.parent, path)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        table = app.screen.query_one(IndexTable)
        view = app.screen.query_one(FindingsView)
        assert view.assessment is not None
        lines = _table_lines(app, table)
        shown = " ".join(" ".join(lines).split())
        seen = 0
        for f in view.assessment.indices.values():
            name = short_name(f.id, f.name)
            if f.id in COMPENSATION_RULES or f"{name} " not in shown:
                continue  # folded, or scrolled out of view
            seen += 1
            words = " ".join(str(table.get_row(f.id)[3]).split())
            assert words in shown, (f.id, words)
        assert seen >= 6
        assert "acidified (borderline)" in shown


async def test_rules_that_do_not_apply_fold_into_one_row_and_c_lists_them(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        view = screen.query_one(FindingsView)
        table = screen.query_one(IndexTable)
        a = view.assessment
        assert a is not None
        keys = [k.value for k in table.rows]
        # Baseline draw: a normal-gap metabolic acidosis, so of the compensation rules only
        # Winters' formula applies (Albert, Dell & Winters, Ann Intern Med 1967, from memory);
        # the rules for metabolic alkalosis and the respiratory disorders are for other primary
        # disorders (common practice). The core says so in each rule's reasons.
        folded = [fid for fid in COMPENSATION_RULES if fid not in keys]
        assert "expected_pco2" in keys
        assert len(folded) == 5
        for fid in folded:
            f = a.indices[fid]
            assert f.status is Status.not_valid
            assert any("applies only to" in r or "more likely compensation" in r for r in f.reasons)
        row = [str(c) for c in table.get_row(GROUP_KEY)]
        assert row[0] == "Other compensation rules"
        assert row[1] == "not applicable"
        assert row[2] == f"{STATUS_MARK[Status.not_valid]} {STATUS_WORD[Status.not_valid]}"
        assert "c: show" in row[3]
        await pilot.press("c")
        await pilot.pause()
        keys = [k.value for k in table.rows]
        assert all(fid in keys for fid in COMPENSATION_RULES)
        for fid in folded:
            status = str(table.get_row(fid)[2])
            assert status == f"{STATUS_MARK[Status.not_valid]} {STATUS_WORD[Status.not_valid]}"
        await pilot.press("c")
        await pilot.pause()
        assert sum(1 for k in table.rows if k.value in folded) == 0
        # F1 lists the key.
        assert any(key == "c" and "compensation rules" in what for key, what in HELP_KEYS)


async def test_enter_shows_the_reasons_in_full_and_again_folds_them(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        screen = app.screen
        view = screen.query_one(FindingsView)
        f = view.selected()
        assert f is not None and f.reasons
        reason = " ".join(f.reasons[0].split()[:6])

        def shown() -> str:
            return " ".join(" ".join(screen_rows(app)).split())

        assert reason not in shown()
        await pilot.press("enter")
        await pilot.pause()
        assert reason in shown()
        await pilot.press("enter")
        await pilot.pause()
        assert reason not in shown()


async def test_e_shows_the_disorders_evidence_at_80_by_24(demo: Path) -> None:
    app = _app(demo.parent, demo)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.pause()
        view = app.screen.query_one(FindingsView)
        assert view.assessment is not None
        evidence = [e.text for d in view.assessment.disorders for e in d.evidence]
        assert evidence

        def shown() -> str:
            return " ".join(" ".join(screen_rows(app)).split())

        # Folded at 24 rows, so the table keeps the room; the heading names the key.
        assert "Acid-base disorders (e: evidence):" in shown()
        assert not any(text in shown() for text in evidence)
        await pilot.press("e")
        await pilot.pause()
        assert all(text in shown() for text in evidence), evidence
        assert any(key == "e" and "evidence" in what for key, what in HELP_KEYS)


def test_folded_rules_are_those_that_do_not_apply_in_every_demo_draw(cases_dir: Path) -> None:
    # The folded row says "not applicable": it may only hold rules the core marked NOT VALID
    # because the draw is not the disorder the rule is for. Each compensation rule is defined for
    # one primary disorder (common practice; Berend, de Vries & Gans, N Engl J Med 2014,
    # from memory), and the core puts that reason first among a NOT VALID finding's reasons.
    from screens.findings_view import not_applicable
    from workup.assess import assess
    from workup.caseio import load_case

    seen = 0
    for path in sorted(cases_dir.glob("*.yaml")):
        case = load_case(path)
        for draw in case.draws:
            for f in not_applicable(assess(case, draw.label)):
                seen += 1
                first = f.reasons[0]
                assert "applies only to" in first or "more likely compensation" in first, (
                    path.name,
                    draw.label,
                    f.id,
                    first,
                )
    assert seen >= 20


def test_row_heights_match_how_the_reading_wraps() -> None:
    # The table's row height is counted, not measured: it must agree with Rich's own wrapping,
    # or a reading would be cut (too few lines) or leave gaps (too many).
    from rich.console import Console
    from rich.text import Text

    from screens.findings_view import wrapped_lines

    console = Console(width=200)
    samples = [
        "",
        "low",
        "acidified (borderline)",
        "respiratory alkalosis added",
        "metabolic acidosis added",
        "mixed high and normal gap",
        "indeterminate",
        "inappropriately high: renal K loss",
    ]
    for text in samples:
        for width in range(8, 30):
            expected = len(Text(text).wrap(console, width)) or 1
            assert wrapped_lines(text, width) == expected, (text, width)
