"""Small invented mechanisms for the drawing tests (mm, rpm)."""

import kinematics

GATE_LIFTER = {
    "kinepoly": 1, "title": "Gate lifter linkage", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [24, 32], "B": [150, 95], "O4": [180, 0], "P": [85, 130]},
    "ground": ["O2", "O4"],
    "links": {"crank": ["O2", "A"], "coupler": ["A", "B", "P"], "rocker": ["O4", "B"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 90, "unit": "rpm"},
               "angular_acceleration": {"value": 3, "unit": "rad/s^2"}},
}

# Offset slider-crank: 35 mm crank, the block's line 15 mm below the crank pivot.
BOTTLE_PUSHER = {
    "kinepoly": 1, "title": "Bottle pusher", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [0, 35], "D": [150, -15], "E": [-60, -15], "F": [260, -15]},
    "ground": ["O2", "E", "F"],
    "links": {"crank": ["O2", "A"], "rod": ["A", "D"]},
    "slides": {"block": {"point": "D", "guide": "ground", "line": ["E", "F"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 200, "unit": "rpm"}},
}

# Crank pin A slides along the lever C-T, which turns about C.
SWING_LEVER = {
    "kinepoly": 1, "title": "Swing lever feeder", "length_unit": "mm",
    "points": {"C": [0, 0], "O2": [0, 90], "A": [40, 90], "T": [80, 180]},
    "ground": ["C", "O2"],
    "links": {"crank": ["O2", "A"], "lever": ["C", "T"]},
    "slides": {"slot": {"point": "A", "guide": "lever", "line": ["C", "T"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}},
}

# Not a Grashof crank: crank 60, coupler 80, rocker 50, frame 100 (s + l = 150 > p + q = 140), so the
# crank cannot turn through 180°.
LIMITED_ROCKER = {
    "kinepoly": 1, "title": "Limited rocker", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [0, 60], "B": [78.61866174379956, 45.19776957299928], "O4": [100, 0]},
    "ground": ["O2", "O4"],
    "links": {"crank": ["O2", "A"], "coupler": ["A", "B"], "rocker": ["O4", "B"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}},
}

# The crank drives a three-link group (link1, plate, link2, link3 round the plate): no dyad, so its
# polygon points come from the numeric solver.
TRIAD_PRESS = {
    "kinepoly": 1, "title": "Triad press", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [30, 20], "B": [80, 60], "C": [130, 70], "D": [110, 110], "O4": [170, 0],
               "O6": [40, 160]},
    "ground": ["O2", "O4", "O6"],
    "links": {"crank": ["O2", "A"], "link1": ["A", "B"], "plate": ["B", "C", "D"], "link2": ["O4", "C"],
              "link3": ["O6", "D"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 50, "unit": "rpm"}},
}

DESIGNS = {"gate lifter": GATE_LIFTER, "bottle pusher": BOTTLE_PUSHER, "swing lever": SWING_LEVER,
           "triad press": TRIAD_PRESS}


def construction(design, angle_deg=None):
    return kinematics.construct(kinematics.solve(kinematics.load_mechanism(design), angle_deg))
