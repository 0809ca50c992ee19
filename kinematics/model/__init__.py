"""The mechanism model: points, links, slides, the driver, mass data and loads, units and the size
limits, as frozen objects every later layer reads."""
