"""Reading input: the design-file loader, strict TOML tables, corner tables, data files and
the starter design."""
