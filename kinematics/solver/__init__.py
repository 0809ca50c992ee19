"""The numeric solver: the constraint rows, the mobility check, and Newton's method for the pose
with the linear solves for velocity, acceleration and jerk."""
