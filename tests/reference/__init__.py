"""Independent reference code used only by the tests (never imported by frostline)."""
