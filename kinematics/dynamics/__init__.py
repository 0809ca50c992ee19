"""Forces of frictionless rigid linkages: inertia loads, joint forces, the drive torque, shaking,
what the frame receives, and the drive and bearing summary of a cycle.

``forces(solution)`` for one pose and ``sweep_forces(sweep)`` for a cycle solve Newton-Euler
(:mod:`.newton_euler`) and, on its own, the power balance (:mod:`.power`), whose agreement each
result reports; ``drive_summary(force_sweep, fluctuation)`` sizes the drive and the bearings.
No friction is modelled.
"""

from .analysis import forces, sweep_forces
from .cylinder_summary import CylinderJoint, CylinderSummary
from .results import FRICTIONLESS, Forces, ForceSweep, FrameLoads, LinkInertia, PowerBalance, SlideForce
from .summary import DEFAULT_FLUCTUATION, DriveSummary, JointSummary, drive_summary

__all__ = [
    "DEFAULT_FLUCTUATION", "FRICTIONLESS", "CylinderJoint", "CylinderSummary",
    "DriveSummary", "ForceSweep", "Forces", "FrameLoads", "JointSummary",
    "LinkInertia", "PowerBalance", "SlideForce", "drive_summary", "forces", "sweep_forces",
]
