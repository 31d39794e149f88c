"""Where the user's own files live, without importing the settings model (and pydantic).

An unchanged repeat listing must start fast, so it asks here whether a settings file exists
before paying for the model that validates one.
"""

from __future__ import annotations

from pathlib import Path


def settings_file() -> Path:
    """Where the user's settings file lives (the per-user config folder; honours XDG_CONFIG_HOME)."""
    from platformdirs import user_config_path

    return user_config_path("workup", appauthor=False) / "settings.yaml"
