"""The cause tables fit together: every module is ranked, and every row can fire.

A row keyed by a misspelt question or answer, a cause module left out of the registry, or a
reason quoting a setting that does not exist would not fail loudly: the evidence would just never
appear. These checks make such slips fail here instead.
"""

from __future__ import annotations

import importlib
import pkgutil
from pathlib import Path

import pytest

from workup.assess import assess
from workup.caseio import load_case
from workup.context import MEANING
from workup.rules import causes
from workup.rules.ammonium import ammonium
from workup.rules.causes import CAUSES, PATTERNS
from workup.rules.judge import quote_settings
from workup.rules.questions import ANSWERS, QUESTION, answers
from workup.rules.readings import gather
from workup.settings import DEFAULTS

CASES = sorted((Path(__file__).resolve().parents[2] / "cases").glob("*.yaml"))


def test_every_cause_module_is_in_the_registry_once() -> None:
    modules = [m.name for m in pkgutil.iter_modules(causes.__path__)]
    assert sorted(modules) == sorted(c.id for c in CAUSES)
    for name in modules:
        module = importlib.import_module(f"{causes.__name__}.{name}")
        assert module.CAUSE in CAUSES, f"{name}.CAUSE is not listed in CAUSES"
    assert len(PATTERNS) == len(CAUSES)


@pytest.mark.parametrize("cause", CAUSES, ids=lambda c: c.id)
def test_every_row_names_an_answer_a_case_can_give(cause) -> None:
    unknown = [key for key in cause.answers if key[1] not in ANSWERS.get(key[0], ())]
    assert unknown == []


@pytest.mark.parametrize("cause", CAUSES, ids=lambda c: c.id)
def test_every_question_of_a_cause_can_be_listed_as_missing(cause) -> None:
    assert [q for q in cause.questions if q not in QUESTION] == []


@pytest.mark.parametrize("cause", CAUSES, ids=lambda c: c.id)
def test_history_rows_name_flags_with_a_meaning(cause) -> None:
    flags = [*cause.history, *(cause.no_history.flags if cause.no_history else ())]
    assert [f for f in flags if f not in MEANING] == []
    # History reasons are used as written: a {setting} there would show its braces.
    assert [why for _w, why in cause.history.values() if "{" in why] == []


@pytest.mark.parametrize("cause", CAUSES, ids=lambda c: c.id)
def test_reasons_quote_only_settings_that_exist(cause) -> None:
    for _weight, why in cause.answers.values():
        quoted = quote_settings(why, DEFAULTS)  # an unknown setting raises AttributeError
        assert "{" not in quoted and "}" not in quoted


def test_a_quoted_setting_follows_the_users_value() -> None:
    s = DEFAULTS.model_copy(update={"egfr_ckd_below": 25.5})
    assert quote_settings("below {egfr_ckd_below}", s) == "below 25.5"


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
def test_demo_cases_answer_only_with_listed_words(path: Path) -> None:
    case = load_case(path)
    a = assess(case)
    rd = gather(a.draws, case.context, a.settings)
    given = [key for key, _reading in answers(rd, ammonium(rd), a.settings)]
    assert [k for k in given if k[1] not in ANSWERS.get(k[0], ())] == []
    assert len({k[0] for k in given}) == len(given), "a question answered twice"
