"""The cycle: a sweep of the driver over its range (vectorised closed forms and the solver), the
peaks, the transmission angles, the mechanical advantage and the checks a design review asks for."""
