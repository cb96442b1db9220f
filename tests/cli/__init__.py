"""Command-line tests: run without Qt or a display."""
