"""The rules that rank the causes of a normal-gap acidosis, one job per module, in running order:

readings (one reading per question, from the right draw) → ammonium (one call from NH4 and the
urine gaps) → questions (each reading as an answer word; what to enter when none) → causes/ (one
``cause.Cause`` table per cause: answer or history → weight and why) → judge (into a ``tally``).
"""
