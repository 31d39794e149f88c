"""Which test to do next: the ones whose expected result differs most between the leading causes.

Each test carries a *signature*: the result expected under each cause (Berend et al., Kidney Dis
2017, Table 1; Rodríguez Soriano, JASN 2002, Table 5; Batlle et al., NEJM 1988; common practice
for the confirmatory tests).
Two causes are separated by a test when their expected results differ. A test's usefulness is the
sum, over each pair of leading causes it separates, of 1 / (1 + the gap between their scores), so
a test that splits two close candidates ranks above one that splits a clear leader from an
outsider. Tests whose answer is already in the case are not suggested; tests that confirm the
leading cause add :data:`CONFIRM_BONUS`.
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import combinations

from workup.context import UNMEASURED_URINE_ANIONS, Flag
from workup.findings import NextTest, PatternCall, Verdict, new_next_test
from workup.pattern_rules import Readings

LEADING_MAX = 3
"""At most this many candidates (not unlikely, best first) count as leading."""
CONFIRM_BONUS = 0.3
"""Usefulness added when a test confirms the leading cause directly."""

GI, PROX, DIST, HYK, T4, CKD, CL = (
    "gi_bicarbonate_loss", "proximal_rta", "distal_rta", "hyperkalemic_distal_rta",
    "hypoaldosteronism", "ckd_acidosis", "chloride_load",
)  # fmt: skip


@dataclass(frozen=True, slots=True)
class SuggestedTest:
    """A test the ranker may suggest."""

    id: str
    """Stable id."""
    text: str
    """The test in words."""
    why: str
    """What it settles."""
    signature: dict[str, str]
    """Pattern id → expected result; a pattern left out is not separated by this test."""
    done_by: tuple[str, ...] = ()
    """Reading keys that, when present, mean the answer is already in the case."""
    confirms: tuple[str, ...] = ()
    """Patterns this test confirms directly."""


CATALOGUE: tuple[SuggestedTest, ...] = (
    SuggestedTest(
        "bicarbonate_loading_fehco3",
        "Bicarbonate loading to plasma HCO3 ≥ 20, with FEHCO3 (fresh, anaerobic urine)",
        "FEHCO3 above 15% means proximal wasting; below 5% fits distal RTA (Rodríguez Soriano 2002)",
        {PROX: "high", DIST: "low", HYK: "low", T4: "intermediate", GI: "low", CL: "low"},
        ("fe_bicarbonate",),
        (PROX,),
    ),
    SuggestedTest(
        "bicarbonate_loading_ub_pco2",
        "Urine-minus-blood pCO2 once urine pH ≥ 7.6 during bicarbonate loading",
        "below 20 mmHg means a classic distal secretory defect; above 20 a voltage defect or type 4 "
        "(Rodríguez Soriano 2002)",
        {DIST: "low", HYK: "normal", T4: "normal", PROX: "normal", GI: "normal"},
        ("urine_blood_pco2",),
        (DIST,),
    ),
    SuggestedTest(
        "urine_ammonium",
        "Urine ammonium: measured NH4 or the urine osmolal gap (urine osmolality, Na, K, urea, "
        "glucose)",
        "high ammonium means the kidney responds (gut loss); low means a renal cause",
        {GI: "high", PROX: "high", CL: "high", DIST: "low", HYK: "low", T4: "low", CKD: "low"},
        ("measured_ammonium", "urine_osmolal_gap"),
    ),
    SuggestedTest(
        "urine_ph_meter",
        "Urine pH by meter on a fresh sample taken during the acidosis",
        "above 5.5 points to a distal defect; below 5.5 to type 4, proximal RTA or CKD",
        {
            DIST: "above 5.5",
            HYK: "above 5.5",
            T4: "below 5.5",
            PROX: "below 5.5",
            CKD: "below 5.5",
            CL: "below 5.5",
        },
        ("urine_ph",),
    ),
    SuggestedTest(
        "serum_potassium",
        "Serum potassium with the acidosis",
        "high potassium points to type 4 or a voltage defect; low to gut loss or classic RTA",
        {T4: "high", HYK: "high", DIST: "low", GI: "low", PROX: "low"},
        ("potassium",),
    ),
    SuggestedTest(
        "renin_aldosterone",
        "Plasma renin, aldosterone and morning cortisol",
        "low aldosterone for the potassium confirms hypoaldosteronism; a normal or high one "
        "points to resistance (voltage defect)",
        {T4: "low", HYK: "normal or high", DIST: "normal", GI: "high", PROX: "normal"},
        (),
        (T4,),
    ),
    SuggestedTest(
        "urine_potassium_response",
        "Urine potassium with creatinine (K/creatinine) or osmolality (TTKG)",
        "tells renal potassium wasting from conservation, and a blunted response to hyperkalemia",
        {GI: "conserving", DIST: "wasting", PROX: "wasting", T4: "blunted", HYK: "blunted"},
        ("ttkg", "urine_potassium_creatinine_ratio"),
    ),
    SuggestedTest(
        "stool_electrolytes",
        "Stool volume and electrolytes; laxative screen",
        "confirms or excludes ongoing gut bicarbonate loss",
        {GI: "loss", PROX: "none", DIST: "none", HYK: "none", T4: "none", CKD: "none"},
        (),
        (GI,),
    ),
    SuggestedTest(
        "fanconi_panel",
        "Fanconi panel: urine glucose with plasma glucose, FEPO4 or TmP/GFR, FE urate",
        "other proximal defects make proximal RTA (Fanconi syndrome) likely",
        {PROX: "present", DIST: "absent", GI: "absent", HYK: "absent", T4: "absent"},
        ("fe_phosphate", "glucosuria"),
        (PROX,),
    ),
    SuggestedTest(
        "proximal_cause_screen",
        "Cause of a proximal defect: drug review (tenofovir, ifosfamide, carbonic-anhydrase "
        "inhibitors), protein electrophoresis and serum free light chains, urine amino acids and "
        "β2-microglobulin",
        "finds the cause and the extent of a proximal tubulopathy (common practice)",
        {PROX: "cause found"},
        (),
        (PROX,),
    ),
    SuggestedTest(
        "egfr",
        "Serum creatinine for eGFR (with age and sex)",
        "an eGFR below 30 is enough to explain the acidosis",
        {CKD: "below 30", GI: "any", DIST: "any", PROX: "any", CL: "any"},
        ("egfr",),
        (CKD,),
    ),
    SuggestedTest(
        "urine_calcium_citrate_ultrasound",
        "Urine calcium and citrate per creatinine; renal ultrasound for nephrocalcinosis",
        "high calcium, low citrate and nephrocalcinosis fit classic distal RTA",
        {DIST: "high Ca, low citrate", PROX: "normal", T4: "normal", GI: "normal"},
        (),
        (DIST,),
    ),
    SuggestedTest(
        "autoimmune_serology",
        "Anti-Ro/La and other autoimmune serology",
        "Sjögren's syndrome and lupus are common causes of classic distal RTA in adults",
        {DIST: "often positive"},
        (),
        (DIST,),
    ),
    SuggestedTest(
        "urinary_tract_imaging",
        "Renal and bladder ultrasound with post-void residual",
        "obstruction is a common cause of a voltage-type distal defect",
        {HYK: "obstruction", T4: "none", DIST: "none"},
        (),
        (HYK,),
    ),
    SuggestedTest(
        "acidification_test",
        "Furosemide–fludrocortisone test: urine pH hourly for 6 h",
        "a urine pH below 5.3 in any sample excludes a distal acidification defect (Walsh et al. "
        "2007, from memory)",
        {DIST: "fails", HYK: "fails", T4: "acidifies", PROX: "acidifies", GI: "acidifies"},
        ("urine_ph", "acidification_test"),
    ),
)
"""Every test the ranker may suggest, in the order used to break ties."""


CHILD_EGFR_TEXT = (
    "Height (cm) with serum creatinine for the bedside Schwartz eGFR (under 18; Schwartz et "
    "al., JASN 2009)"
)
"""The eGFR test's text when the patient is a child without a recorded height."""


def leading(calls: list[PatternCall]) -> list[PatternCall]:
    """The candidates the next test should separate: not unlikely, best first."""
    return [c for c in calls if c.verdict is not Verdict.unlikely][:LEADING_MAX]


UNMEASURED_ANION_TESTS: tuple[SuggestedTest, ...] = (
    SuggestedTest(
        "unmeasured_anion_history",
        "Ask about solvent sniffing (toluene), fasting, alcohol, short bowel (D-lactate) and "
        "penicillin-type antibiotics; check urine and blood ketones",
        "a positive or near-zero urine anion gap with plenty of ammonium means unmeasured urine "
        "anions: hippurate, ketoanions, D-lactate or drug anions (Kamel et al., AJKD 1997; "
        "Berend et al., Kidney Dis 2017, Table 1)",
        {},
    ),
    SuggestedTest(
        "urine_ammonium_measured",
        "Measured urine ammonium with urine creatinine (fresh urine)",
        "settles the disagreement between the urine anion and osmolal gaps: the anion gap "
        "misses ammonium excreted with unmeasured anions (Kamel et al., AJKD 1997)",
        {},
        ("measured_ammonium",),
    ),
)
"""Tests when the urine anion gap disagrees with ample ammonium (unmeasured urine anions)."""


def _unmeasured_anion_tests(rd: Readings, lead: list[PatternCall]) -> list[NextTest]:
    """The history and the measured ammonium that resolve unmeasured urine anions; [] when the
    gaps agree. The history is left out once a flag that explains the anions is recorded."""
    if rd.unmeasured_anions is None:
        return []
    seps = tuple(c.id for c in lead)
    out = []
    for spec in UNMEASURED_ANION_TESTS:
        if spec.done_by and not rd.by_key.keys().isdisjoint(spec.done_by):
            continue
        if spec.id == "unmeasured_anion_history" and rd.context & UNMEASURED_URINE_ANIONS:
            continue
        out.append(new_next_test(spec.id, spec.text, spec.why, seps))
    return out


def suggest(calls: list[PatternCall], rd: Readings) -> list[NextTest]:
    """Tests most useful first (see module doc); [] when no candidate is left. Unmeasured urine
    anions (:func:`_unmeasured_anion_tests`) come first: until they are explained the urine
    ammonium, on which most causes turn, is uncertain."""
    lead = leading(calls)
    first = _unmeasured_anion_tests(rd, lead)
    if not lead:
        return first
    top = lead[0].id
    scored: list[tuple[float, int, NextTest]] = []
    pairs = [(a.id, b.id, 1.0 / (1.0 + abs(a.score - b.score))) for a, b in combinations(lead, 2)]
    answered = rd.by_key.keys()
    for order, spec in enumerate(CATALOGUE):
        if spec.done_by and not answered.isdisjoint(spec.done_by):  # already answered
            continue
        use, split = 0.0, set()
        sig = spec.signature
        for a, b, closeness in pairs:
            ea, eb = sig.get(a), sig.get(b)
            if ea is not None and eb is not None and ea != eb:
                use += closeness
                split |= {a, b}
        if top in spec.confirms:
            use += CONFIRM_BONUS
            split.add(top)
        if use <= 0:
            continue
        seps = tuple(c.id for c in lead if c.id in split)
        text = spec.text
        if spec.id == "egfr" and "patient.height" in rd.egfr_needs:
            text = CHILD_EGFR_TEXT  # a child's eGFR waits for a height, not a creatinine
        scored.append((use, order, new_next_test(spec.id, text, spec.why, seps)))
    scored.sort(key=lambda t: (-t[0], t[1]))
    return first + [t for _, _, t in scored]


INCOMPLETE = "incomplete_distal_rta"
STONE_FLAGS = frozenset({Flag.kidney_stones, Flag.nephrocalcinosis})
"""History that makes an acidification test worth doing without a systemic acidosis."""

WITHOUT_ACIDOSIS: tuple[SuggestedTest, ...] = (
    SuggestedTest(
        "acidification_test_confirm",
        "Repeat the acidification test, or do the other one: short ammonium chloride (0.1 g/kg; "
        "not in liver disease; check that plasma HCO3 falls) after furosemide–fludrocortisone",
        "some people without a distal defect never reach 5.3; in stone formers a failed "
        "furosemide–fludrocortisone test had a positive predictive value of about 30% (Dhayat "
        "et al., CJASN 2016)",
        {INCOMPLETE: "fails again"},
        (),
        (INCOMPLETE,),
    ),
    SuggestedTest(
        "urine_citrate_calcium",
        "Urine citrate and calcium (24-hour collection or per creatinine)",
        "low citrate and high calcium fit a distal acidification defect and drive stone risk",
        {INCOMPLETE: "low citrate, high calcium"},
        (),
        (INCOMPLETE,),
    ),
    SuggestedTest(
        "renal_ultrasound_nephrocalcinosis",
        "Renal ultrasound for nephrocalcinosis and stones",
        "nephrocalcinosis makes a distal acidification defect more likely",
        {INCOMPLETE: "nephrocalcinosis"},
        (),
        (INCOMPLETE,),
    ),
    SuggestedTest(
        "autoimmune_screen_distal",
        "Anti-Ro/La and other autoimmune serology",
        "Sjögren's syndrome can cause a distal defect before any systemic acidosis",
        {INCOMPLETE: "often positive"},
        (),
        (INCOMPLETE,),
    ),
)
"""Tests for a case without a normal-gap acidosis (incomplete distal RTA), in order."""


def suggest_without_acidosis(rd: Readings, call: PatternCall | None) -> list[NextTest]:
    """Tests when no draw shows a normal-gap acidosis. Without an acidification test: one, with
    urine citrate and calcium and an ultrasound, when stones or nephrocalcinosis are recorded.
    After a failed test (``call`` is the incomplete distal RTA call): confirmation and the work-up
    of a distal defect. After a passed test, or with no stone history: nothing."""
    flags = rd.context
    test = rd.get("acidification_test")
    if test is None:
        if not flags & STONE_FLAGS:
            return []
        wanted = (
            "acidification_test",
            "urine_citrate_calcium",
            "renal_ultrasound_nephrocalcinosis",
        )
    elif test.word == "not_acidified" and call is not None and call.verdict is not Verdict.unlikely:
        wanted = (
            "acidification_test_confirm", "urine_citrate_calcium",
            "renal_ultrasound_nephrocalcinosis", "autoimmune_screen_distal",
        )  # fmt: skip
    else:
        return []
    if Flag.nephrocalcinosis in flags:  # already imaged
        wanted = tuple(w for w in wanted if w != "renal_ultrasound_nephrocalcinosis")
    seps = (INCOMPLETE,) if call is not None else ()
    specs = {t.id: t for t in (*CATALOGUE, *WITHOUT_ACIDOSIS)}
    return [new_next_test(w, specs[w].text, specs[w].why, seps) for w in wanted]
