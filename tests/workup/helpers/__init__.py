"""Helper scripts run as separate processes by the crash tests."""
