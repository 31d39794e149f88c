"""Case-file schema migrations: a file of any older schema opens in every later version of workup.

Each registered step turns the plain data of schema ``n`` into the data of schema ``n + 1``;
:func:`migrate` chains them up to :data:`workup.model.SCHEMA_VERSION`. The product is at schema 1,
so the registry is empty and migration is the identity; the mechanism is proved in the tests with
a test-only step. A step must never need the file's text: it works on plain data only.
"""

from __future__ import annotations

import copy
from collections.abc import Callable
from typing import Any

from workup import model

Migration = Callable[[dict[str, Any]], dict[str, Any]]
"""One step: the data of schema n (a private copy, free to change) to the data of schema n + 1."""

MIGRATIONS: dict[int, Migration] = {}
"""The product's steps by the schema they start from. Empty: every file so far is schema 1."""


class MigrationError(ValueError):
    """Data that cannot be brought to the wanted schema."""


def register(from_version: int, registry: dict[int, Migration] | None = None):
    """Decorator adding a step from ``from_version`` to ``from_version + 1`` to ``registry``."""
    target = MIGRATIONS if registry is None else registry

    def deco(fn: Migration) -> Migration:
        """Register ``fn`` and return it unchanged."""
        if from_version in target:
            raise ValueError(f"a migration from schema {from_version} is already registered")
        target[from_version] = fn
        return fn

    return deco


def schema_of(data: dict[str, Any]) -> int:
    """The schema a case's data declares (1 when ``schema:`` is absent)."""
    v = data.get("schema", data.get("schema_version", 1))
    if isinstance(v, bool) or not isinstance(v, int) or v < 1:
        raise MigrationError(f"schema must be a whole number, 1 or later; got {v!r}")
    return v


def migrate(
    data: dict[str, Any],
    *,
    target: int | None = None,
    registry: dict[int, Migration] | None = None,
) -> dict[str, Any]:
    """``data`` brought up to schema ``target`` (default: the current one); input is not changed.

    Raises MigrationError when the data is newer than ``target``, when a step is missing, or when
    a step does not produce the next schema.
    """
    target = model.SCHEMA_VERSION if target is None else target
    steps = MIGRATIONS if registry is None else registry
    version = schema_of(data)
    if version > target:
        raise MigrationError(
            f"this file uses schema {version}, newer than this version of workup reads "
            f"({target}); upgrade workup to open it"
        )
    out = data
    while version < target:
        step = steps.get(version)
        if step is None:
            raise MigrationError(f"no migration from schema {version} to {version + 1}")
        out = step(copy.deepcopy(out))
        got = schema_of(out)
        if got != version + 1:
            raise MigrationError(
                f"the migration from schema {version} produced schema {got}, not {version + 1}"
            )
        version = got
    return out
