"""Rhoscope's browser app: a thin Panel shell over the engine."""
