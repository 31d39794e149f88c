"""Fast construction of frozen dataclasses, for the objects the assessment makes by the thousand.

A frozen dataclass sets each field through ``object.__setattr__`` in its ``__init__``, which
costs about four times an ordinary attribute store: for the findings, readings and calls of a
library of 10,000 cases it was a tenth of the cold build. :func:`builder` returns a constructor
that fills a mutable twin class with the same slots (an ordinary, fast ``__init__``) and then
gives the object the frozen class. The result is an ordinary instance of the frozen class:
equal to, and as immutable as, one made by calling the class.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Callable
from typing import Any, TypeVar

T = TypeVar("T")


def builder(cls: type[T]) -> Callable[..., T]:
    """A constructor for ``cls`` (a frozen dataclass with slots) taking the same arguments."""
    params = cls.__dataclass_params__  # type: ignore[attr-defined]
    if not params.frozen or "__slots__" not in cls.__dict__:
        raise TypeError(f"{cls.__name__} is not a frozen dataclass with slots")
    if "__post_init__" in cls.__dict__:
        raise TypeError(f"{cls.__name__} has a __post_init__ the twin would skip")
    specs = []
    for f in dataclasses.fields(cls):
        if f.default is not dataclasses.MISSING:
            spec = dataclasses.field(default=f.default)
        elif f.default_factory is not dataclasses.MISSING:
            spec = dataclasses.field(default_factory=f.default_factory)
        else:
            spec = dataclasses.field()
        specs.append((f.name, f.type, spec))

    def become_frozen(self: Any) -> None:
        # Runs at the end of the twin's __init__: same slots in the same order, so CPython
        # allows the change of class.
        self.__class__ = cls

    twin: Any = dataclasses.make_dataclass(
        f"_{cls.__name__}Builder",
        specs,
        namespace={"__post_init__": become_frozen},
        slots=True,
        eq=False,
        repr=False,
    )
    twin.__doc__ = f"Make a {cls.__name__} (fast; see workup.frozen)."
    return twin
