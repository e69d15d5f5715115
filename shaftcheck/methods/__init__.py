"""Pure SI formula modules: one engineering topic each, no I/O, no design-file knowledge."""
