"""The machine a benchmark ran on, recorded beside its figures (they mean little without it)."""

from __future__ import annotations

import os
import platform
import sys
from datetime import UTC, datetime
from importlib import metadata
from pathlib import Path
from typing import Any


def cpu_model(cpuinfo: str) -> str:
    """The first "model name" in the text of /proc/cpuinfo, or "unknown"."""
    for line in cpuinfo.splitlines():
        key, _, value = line.partition(":")
        if key.strip() == "model name" and value.strip():
            return value.strip()
    return "unknown"


def _version(dist: str) -> str:
    try:
        return metadata.version(dist)
    except metadata.PackageNotFoundError:
        return "not installed"


def load_average() -> list[float] | None:
    """1, 5 and 15-minute load averages (how busy the shared machine was), where available."""
    try:
        return [round(x, 2) for x in os.getloadavg()]
    except OSError:
        return None


def source_state(root: Path) -> dict[str, Any]:
    """The commit measured and how many files differed from it (others edit the tree live)."""
    import subprocess

    def git(*args: str) -> str:
        done = subprocess.run(
            ["git", "-C", str(root), *args], capture_output=True, text=True, check=False
        )
        return done.stdout.strip() if done.returncode == 0 else ""

    status = git("status", "--porcelain", "--untracked-files=no")
    return {
        "commit": git("rev-parse", "--short", "HEAD") or "unknown",
        "modified_files": len(status.splitlines()) if status else 0,
    }


def info() -> dict[str, Any]:
    """Processor count and model, Python, Textual and PyYAML versions, date, load."""
    try:
        text = Path("/proc/cpuinfo").read_text(encoding="utf-8", errors="replace")
    except OSError:
        text = ""
    usable = len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else os.cpu_count()
    return {
        "date_utc": datetime.now(UTC).strftime("%Y-%m-%d %H:%M"),
        "nproc": usable,
        "cpu_model": cpu_model(text) if text else platform.processor() or "unknown",
        "platform": platform.platform(),
        "python": sys.version.split()[0],
        "textual": _version("textual"),
        "pyyaml": _version("PyYAML"),
        "pydantic": _version("pydantic"),
        "load_before": load_average(),
        **source_state(Path(__file__).resolve().parent.parent),
    }
