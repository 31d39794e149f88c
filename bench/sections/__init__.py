"""The sections of ``make bench``, one module each; each turns a Plan into table rows."""
