"""Reading lab-report text copied out of a hospital record: names, headings, dates, value cells.

The pieces here only read text; :mod:`workup.paste` turns what they find into a reviewed proposal.
"""
