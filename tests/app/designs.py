"""Small invented mechanisms for the window tests (our own numbers, mm)."""

import copy

import kinematics

# A crank-rocker with a coupler point, like a film-advance claw.
FOUR_BAR = {
    "kinepoly": 1, "title": "claw feed four-bar", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [30, 40], "B": [140, 110], "O4": [170, 0], "P": [70, 140]},
    "ground": ["O2", "O4"],
    "links": {"crank": ["O2", "A"], "coupler": ["A", "B", "P"], "rocker": ["O4", "B"]},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 120, "unit": "rpm"},
               "angular_acceleration": {"value": 5, "unit": "rad/s^2"}},
}

# An offset slider-crank pushing a carton along a fixed guide.
SLIDER_CRANK = {
    "kinepoly": 1, "title": "carton pusher", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [0, 40], "D": [150, -15], "E": [-60, -15], "F": [260, -15]},
    "ground": ["O2", "E", "F"],
    "links": {"crank": ["O2", "A"], "rod": ["A", "D"]},
    "slides": {"guide": {"point": "D", "guide": "ground", "line": ["E", "F"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 300, "unit": "rpm"}},
}

# A crank whose pin slides in the slot of a rocking lever.
SLOTTED_LEVER = {
    "kinepoly": 1, "title": "indexing lever", "length_unit": "mm",
    "points": {"C": [0, 0], "O2": [0, 100], "A": [40, 100], "T": [80, 200]},
    "ground": ["C", "O2"],
    "links": {"crank": ["O2", "A"], "lever": ["C", "T"]},
    "slides": {"slot": {"point": "A", "guide": "lever", "line": ["C", "T"]}},
    "driver": {"link": "crank", "pivot": "O2", "speed": {"value": 60, "unit": "rpm"}},
}

# The four-bar without its driver: an unfinished design.
UNFINISHED = {k: v for k, v in FOUR_BAR.items() if k != "driver"}


def load(design: dict):
    return kinematics.load_mechanism(copy.deepcopy(design))

# A triple rocker (Grashof: s + l = 50 + 120 > 100 + 60): the input link cannot turn fully,
# so some driver angles cannot be assembled.
TRIPLE_ROCKER = {
    "kinepoly": 1, "title": "gate rocker", "length_unit": "mm",
    "points": {"O2": [0, 0], "A": [86.60254037844388, 50.0], "B": [135.98543038577725, 57.831358408578566],
               "O4": [120, 0]},
    "ground": ["O2", "O4"],
    "links": {"input": ["O2", "A"], "coupler": ["A", "B"], "output": ["O4", "B"]},
    "driver": {"link": "input", "pivot": "O2", "speed": {"value": 30, "unit": "rpm"}},
}
