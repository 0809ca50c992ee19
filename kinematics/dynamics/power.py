"""Formulation (2): the power balance (virtual power), giving the drive without any joint force.

With velocities per unit driver speed (so that it holds at rest too), frictionless joints do
no work and, T the drive torque (per 1 rad/s) or a cylinder's axial force F (per 1 m/s of
extension, so that F·L̇ is the drive's power),

    T + Σ_links[m·(g − a_G)·v̂_G − I·α·ω̂] + Σ_particles m·(g − a_P)·v̂_P + Σ_loads(F·v̂_P + M·ω̂) = 0.

Independent of :mod:`kinematics.dynamics.newton_euler`: it shares only the motion (the centres of
mass and the loads' intervals), never a force result.
"""

from __future__ import annotations

import numpy as np

from .bodies import Centres, MassModel, Motion, active


def _dot(force, velocity):
    """F·v of complex F, v."""
    return force.real * velocity.real + force.imag * velocity.imag


def power_balance_torque(model: MassModel, motion: Motion, centres: Centres):
    """(drive (N,), scale (N,)): the drive torque (N·m), or a cylinder's axial force (N, push
    positive), and the sum of the magnitudes of its terms (the size against which rounding in it
    is judged)."""
    g = model.gravity
    terms = [_dot(model.mass * (g - centres.acceleration), centres.unit_velocity),
             -model.inertia * motion.alpha * motion.unit_omega]
    if len(model.particle_point):
        pts = model.particle_point
        force = model.particle_mass * (g - np.take(motion.accelerations, pts, axis=1))
        terms.append(_dot(force, np.take(motion.unit_velocities, pts, axis=1)))
    if len(model.force_point):
        acting = active(model.force_load, motion.angle_deg, model.sense)
        terms.append(acting * _dot(model.force_value, np.take(motion.unit_velocities, model.force_point, axis=1)))
    if len(model.torque_link):
        acting = active(model.torque_load, motion.angle_deg, model.sense)
        terms.append(acting * model.torque_value * np.take(motion.unit_omega, model.torque_link, axis=1))
    every = np.concatenate(terms, axis=1)
    return -every.sum(axis=1), np.abs(every).sum(axis=1)
