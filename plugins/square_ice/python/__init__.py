"""Square ice (six-vertex model)."""
