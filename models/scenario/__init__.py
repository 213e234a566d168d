"""The scenario: reading and validating a TOML file into SI dataclasses (spec.py is the contract),
and the starter layouts. Imports models.common and models.catalogs."""
