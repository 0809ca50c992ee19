"""The force polygon: joint forces and the drive torque by graphical construction, from the mass
data and the kinematic Construction alone, cross-checked against the numeric forces."""

from .build import ForcePolygon, crosscheck, force_polygon

__all__ = ["ForcePolygon", "crosscheck", "force_polygon"]
