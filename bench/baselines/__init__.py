"""Bare Textual programs the app is measured against, started the same way in the same run."""
