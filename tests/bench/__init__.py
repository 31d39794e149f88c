"""Tests of the benchmark harness (its pure parts; no timing assertions)."""
