"""Common ground of the trade layer: input errors, units (pint at the edges), the cautions,
JSON-safe values. Imports nothing else from models/."""
