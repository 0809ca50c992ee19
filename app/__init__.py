"""Kinepoly's desktop program (PySide6): a thin view over :mod:`kinematics`."""
