"""The acid-base reading of one draw, one step per module, in the order the analysis runs.

gas_check (is the gas believable) → primary (which process explains the pH) → compensation (did
the other value move as expected) → gap_reading (anion gap and delta ratio) → mixed_disorders
(assembling the primary and added disorders). :func:`workup.disorders.analyse` is the entry point.
"""
