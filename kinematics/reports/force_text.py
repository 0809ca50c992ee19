"""The force polygon in words, for ``kinepoly construct FILE --forces``."""

from __future__ import annotations

from ..forcepolygon import ForcePolygon
from ..groups.steps import figure


def force_polygon_text(made: ForcePolygon) -> str:
    """The centre images, the force steps in order, the joint forces, the drive torque and the
    cross-check against the numeric forces, one line each."""
    polygon = made.polygon
    lines = ["centres of mass on the acceleration polygon"]
    lines += [f"  {step.id:>4}  {step.text}" for step in made.centre_images]
    lines += ["", f"force polygon (scale {polygon.scale_per_mm:g} N per mm, pole {polygon.pole_label}); "
              "F(a→b) is the force of a on b"]
    for step in polygon.steps:
        marks = ("  [FLAGGED]" if step.flagged else "") + ("  [numeric]" if step.numeric else "")
        lines.append(f"  {step.id:>4}  {step.text}{marks}")
    lines += ["", f"{'joint force':<34}{'|F| [N]':>12}{'Fx [N]':>12}{'Fy [N]':>12}"]
    for point, by_link in made.joints_n.items():
        for link, (x, y) in by_link.items():
            lines.append(f"  on {link} at {point:<{max(1, 27 - len(link))}}{abs(complex(x, y)):>12.4f}{x:>12.4f}"
                         f"{y:>12.4f}")
    for name, normal in made.normals_n.items():
        lines.append(f"guide force of slide {name}: {figure(normal)} N along the guide's left normal")
    if made.drive_force_n is not None:
        lines.append(f"cylinder force: {figure(made.drive_force_n)} N along its axis (push positive)")
    else:
        lines.append(f"drive torque: {figure(made.drive_torque_n_m)} N·m (counter-clockwise positive)")
    lines.append(f"cross-check against the numeric forces: largest relative difference "
                 f"{made.max_relative_difference:.2e} at {made.where}")
    lines += [f"warning: {w}" for w in made.warnings]
    return "\n".join(lines)
