"""Framewright's window and command line. Qt lives in the window's modules only: app.cli and app.main
import none of it, so the command line starts fast and runs where no display exists."""
