"""Forces of frictionless rigid linkages: inertia loads, joint forces, the drive torque,
shaking, and the drive and bearing summary of a cycle. See :mod:`kinematics.forces.analysis`."""
