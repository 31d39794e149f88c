"""The clinical-context vocabulary: short flags a fellow sets from the history and drug chart.

Flags change how indices are read (a urine anion gap in ketoacidosis, a TTKG on amiloride) and
which causes are plausible. Each flag has a one-line meaning shown in the app and in the docs.
"""

from __future__ import annotations

from enum import StrEnum


class Flag(StrEnum):
    """One item of clinical context; the value is what the case file writes."""

    diarrhea = "diarrhea"
    laxatives = "laxatives"
    bowel_fistula_or_ostomy = "bowel_fistula_or_ostomy"
    urinary_diversion = "urinary_diversion"
    vomiting_or_gastric_drainage = "vomiting_or_gastric_drainage"
    saline_load = "saline_load"
    ketoacidosis = "ketoacidosis"
    toluene = "toluene"
    carbonic_anhydrase_inhibitor = "carbonic_anhydrase_inhibitor"
    proximal_tubule_toxin = "proximal_tubule_toxin"
    paraprotein = "paraprotein"
    known_ckd = "known_ckd"
    diabetes = "diabetes"
    urinary_obstruction = "urinary_obstruction"
    sickle_cell = "sickle_cell"
    autoimmune_disease = "autoimmune_disease"
    raas_blocker = "raas_blocker"
    potassium_sparing_diuretic = "potassium_sparing_diuretic"
    trimethoprim = "trimethoprim"
    calcineurin_inhibitor = "calcineurin_inhibitor"
    heparin = "heparin"
    nsaid = "nsaid"
    loop_or_thiazide_diuretic = "loop_or_thiazide_diuretic"
    lithium = "lithium"
    urease_infection = "urease_infection"
    unmeasured_urine_osmoles = "unmeasured_urine_osmoles"
    liver_disease = "liver_disease"
    acute_kidney_injury = "acute_kidney_injury"
    kidney_stones = "kidney_stones"
    nephrocalcinosis = "nephrocalcinosis"
    solvent_inhalation = "solvent_inhalation"
    ketosis = "ketosis"


MEANING: dict[Flag, str] = {
    Flag.diarrhea: "ongoing diarrhea or high stool output",
    Flag.laxatives: "laxative use or suspected laxative abuse",
    Flag.bowel_fistula_or_ostomy: "small-bowel, biliary or pancreatic fistula, drain or ileostomy",
    Flag.urinary_diversion: "urine drains into bowel (ureterosigmoidostomy, ileal conduit)",
    Flag.vomiting_or_gastric_drainage: "vomiting or nasogastric suction",
    Flag.saline_load: "large volumes of chloride-rich fluid (dilutional acidosis)",
    Flag.ketoacidosis: "known or suspected ketoacidosis (ketoanions in urine)",
    Flag.toluene: "toluene (glue, paint) inhalation: hippurate in urine",
    Flag.carbonic_anhydrase_inhibitor: "acetazolamide, topiramate or another carbonic-anhydrase inhibitor",
    Flag.proximal_tubule_toxin: "tenofovir, ifosfamide, aminoglycoside or another proximal-tubule toxin",
    Flag.paraprotein: "known paraprotein (myeloma, light-chain disease)",
    Flag.known_ckd: "known chronic kidney disease",
    Flag.diabetes: "diabetes mellitus",
    Flag.urinary_obstruction: "known or suspected urinary tract obstruction",
    Flag.sickle_cell: "sickle-cell disease or trait",
    Flag.autoimmune_disease: "Sjögren's syndrome, lupus or another autoimmune disease",
    Flag.raas_blocker: "ACE inhibitor, angiotensin-receptor blocker or renin inhibitor",
    Flag.potassium_sparing_diuretic: "amiloride, triamterene, spironolactone or eplerenone",
    Flag.trimethoprim: "trimethoprim or pentamidine",
    Flag.calcineurin_inhibitor: "tacrolimus or ciclosporin",
    Flag.heparin: "heparin",
    Flag.nsaid: "non-steroidal anti-inflammatory drug",
    Flag.loop_or_thiazide_diuretic: "loop or thiazide diuretic given recently",
    Flag.lithium: "lithium therapy",
    Flag.urease_infection: "urinary infection with a urease-producing organism",
    Flag.unmeasured_urine_osmoles: "mannitol, contrast, glycols or other unmeasured urine osmoles",
    Flag.liver_disease: "advanced liver disease",
    Flag.acute_kidney_injury: "acute kidney injury: creatinine not in a steady state",
    Flag.kidney_stones: "kidney stones, recurrent or calcium-phosphate",
    Flag.nephrocalcinosis: "nephrocalcinosis on imaging",
    Flag.solvent_inhalation: "glue, paint or thinner sniffing (toluene): hippurate in urine",
    Flag.ketosis: "fasting, alcohol or low-carbohydrate ketosis: ketoanions in urine",
}

HYPERKALEMIA_DRUGS = frozenset(
    {
        Flag.raas_blocker,
        Flag.potassium_sparing_diuretic,
        Flag.trimethoprim,
        Flag.calcineurin_inhibitor,
        Flag.heparin,
        Flag.nsaid,
    }
)
SAME_AS: dict[Flag, Flag] = {Flag.toluene: Flag.solvent_inhalation}
"""Older flag → the flag it is read as. ``toluene`` (kept so existing case files still load and
mean the same) is read as ``solvent_inhalation``: a case with both counts the history once."""
SOLVENT = frozenset({Flag.toluene, Flag.solvent_inhalation})
"""Solvent inhalation, under either flag: hippurate, an anion the urine anion gap does not count."""
KETOANIONS = frozenset({Flag.ketoacidosis, Flag.ketosis})
"""Ketoacidosis or ketosis: ketoanions, which the urine anion gap does not count."""
UNMEASURED_URINE_ANIONS = SOLVENT | KETOANIONS
"""History that explains a urine anion gap too high for the ammonium the kidney excretes."""
GI_LOSS = frozenset(
    {Flag.diarrhea, Flag.laxatives, Flag.bowel_fistula_or_ostomy, Flag.urinary_diversion}
)
