"""Data package: the shaftcheck material library and standard tube sizes (TOML files).

Installed as ``shaftcheck.datafiles``; read with :mod:`shaftcheck.io.data_files`.
"""
