"""Catalogs with their data files and sources: wire rope, lumber, fasteners, NDS design values,
soil presets and the IBC soil table. Imports only models.common."""
