"""``python -m shaftcheck``: the same command line as the ``shaftcheck`` console script."""

from shaftcheck.cli import main

main()
