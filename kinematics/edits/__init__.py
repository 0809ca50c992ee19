"""Edits of a design: functions that return a new Mechanism the file format accepts."""
