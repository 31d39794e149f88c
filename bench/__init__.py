"""Benchmarks (not part of the test suite); each module has a ``run()`` returning result rows."""
