"""Mechanism files: the shipped JSON Schemas (formats 1 and 2), the schema-driven loader, the
mass-data keys, and atomic saving."""
