"""The graphical construction of one pose: the velocity and acceleration polygons laid dyad by dyad
from the group classes' steps, with their components and the cross-check against the solver."""
