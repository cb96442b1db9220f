"""Widgets shared by the editors and the panels alike."""
