"""The cylinder driver in a file (format 2): ``{"kind": "actuator", "slide", "speed", "acceleration",
"stroke": {"min", "max"}}``, read into a :class:`~kinematics.model.mechanism.Driver` and written back."""

from __future__ import annotations

from ..errors import FileFormatError
from ..model.mechanism import Driver


def cylinder_from_document(spec, slides):
    """A cylinder driver: its barrel is the slide's guide, pivoted at the slide line's first point
    (whether that makes a cylinder is the decomposition's finding, so an unfinished one loads)."""
    name = spec["slide"]
    if name not in slides:
        raise FileFormatError(f'unknown slide "{name}" (the cylinder driver names the slide of its rod in its barrel)',
                              "driver.slide", "reference")
    slide = slides[name]
    stroke = spec.get("stroke", {})
    low, high = stroke.get("min"), stroke.get("max")  # their order is the Driver's own check
    speed, accel = spec["speed"], spec.get("acceleration", {})
    return Driver(link=slide.guide, pivot=slide.line[0], speed_value=0, kind="actuator", slide=name,
                  linear_speed_value=speed["value"], linear_speed_unit=speed.get("unit", "m/s"),
                  linear_acceleration_value=accel.get("value", 0),
                  linear_acceleration_unit=accel.get("unit", "m/s^2"), stroke_min=low, stroke_max=high)


def cylinder_document(d: Driver) -> dict:
    """The driver's document: the keys it was read from, the stroke's only where the file gave them."""
    doc = {"kind": "actuator", "slide": d.slide,
           "speed": {"value": d.linear_speed_value, "unit": d.linear_speed_unit},
           "acceleration": {"value": d.linear_acceleration_value, "unit": d.linear_acceleration_unit}}
    stroke = {k: v for k, v in (("min", d.stroke_min), ("max", d.stroke_max)) if v is not None}
    if stroke:
        doc["stroke"] = stroke
    return doc
