"""Instantaneous centres by Kennedy's theorem: every centre of a pose, the velocities they give
(a third formulation beside the polygon and the solver), and the mechanical advantage.

See :mod:`kinematics.instantaneous.kennedy` for the bodies and the order the centres are found in,
:mod:`kinematics.instantaneous.velocities` for the velocities, :mod:`kinematics.instantaneous.advantage`
for the output against the driver.
"""
