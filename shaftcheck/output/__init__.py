"""Presentation at the edge: console tables, atomic file writing, cautions."""
