"""The fast constructors of frozen dataclasses make the very objects the classes make."""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field
from pathlib import Path

import pytest

from workup import findings, library, pattern_rules
from workup.findings import Evidence, Finding, Status
from workup.frozen import builder
from workup.indices import _common
from workup.inputs import DrawInputs, _new_inputs


def _finding_args() -> tuple:
    return ("uag", "Urine anion gap", 12.0, "mmol/L", Status.ok, ("a reason",), (), "f", "s")


@pytest.mark.parametrize(
    ("make", "cls", "args", "kwargs"),
    [
        (findings.new_finding, Finding, _finding_args(), {"interpretation": "positive"}),
        (findings.new_evidence, Evidence, ("text", "uag", "baseline", 2.0), {}),
        (_new_inputs, DrawInputs, (), {"serum": {"sodium": 140.0}}),
        (_common._new_picture, _common.SerumPicture, (True, True, "words"), {}),
        (
            pattern_rules._new_reading,
            pattern_rules.Reading,
            ("urine_ph", "acidified", 5.2, "baseline", "urine_ph", 1.0, "urine pH 5.2"),
            {},
        ),
        (
            library._entry_builder(),
            library.LibraryEntry,
            (),
            {"name": "a.yaml", "folder": Path(), "size": 1, "mtime_ns": 2, "ok": True},
        ),
    ],
)
def test_a_built_object_is_the_frozen_object(make, cls, args, kwargs) -> None:
    made, called = make(*args, **kwargs), cls(*args, **kwargs)
    assert type(made) is cls and made == called and repr(made) == repr(called)
    name = dataclasses.fields(cls)[0].name
    with pytest.raises(dataclasses.FrozenInstanceError):
        setattr(made, name, None)
    with pytest.raises(dataclasses.FrozenInstanceError):
        delattr(made, name)


def test_default_factories_give_each_object_its_own_value() -> None:
    a, b = findings.new_finding(*_finding_args()), findings.new_finding(*_finding_args())
    assert a.extra == {} and a.extra is not b.extra


def test_hashable_objects_hash_alike() -> None:
    args = ("text", None, None, 1.0)
    assert hash(findings.new_evidence(*args)) == hash(Evidence(*args))


def test_only_frozen_slotted_dataclasses_without_post_init_are_accepted() -> None:
    @dataclass(slots=True)
    class Mutable:
        x: int = 0

    @dataclass(frozen=True)
    class NoSlots:
        x: int = 0

    @dataclass(frozen=True, slots=True)
    class Checked:
        x: int = 0

        def __post_init__(self) -> None:
            if self.x < 0:
                raise ValueError("negative")

    @dataclass(frozen=True, slots=True)
    class Fine:
        x: int = 0
        y: list[int] = field(default_factory=list)

    for cls in (Mutable, NoSlots, Checked):
        with pytest.raises(TypeError):
            builder(cls)
    assert builder(Fine)(3) == Fine(3, [])
