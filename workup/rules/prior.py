"""The tie-break: with no evidence between two causes, the one more common at the patient's age
comes first.

This is a prior, not evidence: it never changes a score or a verdict, only the order of causes
whose scores are equal, and the ranking says so in a note. The orders are common practice (from
memory), not a published table.
"""

from __future__ import annotations

CHILD_BELOW = 18
"""Age (years) below which the children's order applies (as for the bedside Schwartz eGFR)."""

ADULT_ORDER: tuple[str, ...] = (
    "gi_bicarbonate_loss",
    "chloride_load",
    "ckd_acidosis",
    "hypoaldosteronism",
    "distal_rta",
    "proximal_rta",
    "hyperkalemic_distal_rta",
)
"""How common each cause of a normal-gap acidosis is in adults, most common first (common
practice, from memory): gut loss and saline on the wards, then CKD and type 4 (the commonest
renal tubular acidosis of adults, with diabetes and RAAS blockade), then classic distal,
proximal and voltage distal RTA."""
CHILD_ORDER: tuple[str, ...] = (
    "gi_bicarbonate_loss",
    "chloride_load",
    "distal_rta",
    "hypoaldosteronism",
    "proximal_rta",
    "ckd_acidosis",
    "hyperkalemic_distal_rta",
)
"""How common each cause is in children, most common first (common practice, from memory):
gastroenteritis and fluids first; among the tubular causes a primary distal RTA, then type 4
(often with obstructive uropathy or infection in infants), proximal RTA (mostly Fanconi) and
CKD."""


def age_group(age: int | None) -> str:
    """``children`` under :data:`CHILD_BELOW`, else ``adults`` (also when age is not recorded)."""
    return "children" if age is not None and age < CHILD_BELOW else "adults"


_PLACES = {
    "adults": {pid: i for i, pid in enumerate(ADULT_ORDER)},
    "children": {pid: i for i, pid in enumerate(CHILD_ORDER)},
}


def prior_order(age: int | None) -> dict[str, int]:
    """Cause id → its place in the order for ``age`` (0 = most common); shared, do not change."""
    return _PLACES[age_group(age)]


def tie_note(names: list[str], age: int | None) -> str:
    """The ranking note for causes whose scores are equal, listed by the prior."""
    group = age_group(age)
    if age is None:
        group += " (age not recorded)"
    return (
        f"Tie: {', '.join(names[:-1])} and {names[-1]} score the same on the evidence; they are "
        f"listed by how common each is in {group} (common practice). That order is a prior, "
        "not evidence."
    )
