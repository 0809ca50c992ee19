"""Solving the Newton-Euler system fast: block-triangular order, then small reduced blocks.

The system's sparsity pattern is fixed by the layout. A perfect matching of equations to
unknowns, then the strongly connected components of the dependence graph (Tarjan), order it
into diagonal blocks solved one after another (for a chain of dyads: each dyad, then the
driver, as done by hand). Inside a block the force balances have constant coefficients (±1)
on the joint force pairs: they are solved once for all, p = C⁺(f − D·o) + Z·q (C⁺ the
pseudo-inverse, Z a null-space basis), leaving the moment balances as a small system in the
remaining unknowns o (slide normals, the drive torque) and q (at most a few): 1×1 and 2×2 in
closed form for dyads, a batched solve otherwise.
"""

from __future__ import annotations

import sys
from dataclasses import dataclass

import numpy as np

from ..errors import ForcesUndetermined


@dataclass(frozen=True, eq=False)
class Block:
    """One diagonal block, ready to solve.

    ``rows`` and ``columns`` (its unknowns); ``solved``: the earlier unknowns its rows use, through
    the constant ``coupled`` (solved, rows) and the varying entries ``coupling_entries`` (at
    earlier unknowns ``coupling_columns``, spread to rows by ``coupling_spread``). With
    ``pseudo`` (C⁺ᵀ) set, the force rows ``fixed`` are solved apart: ``ec_z`` and ``ec_z0`` give
    [E·C⁺ | E·Z] from the varying entries, ``d``/``d0`` and ``g``/``g0`` give D and G, ``null`` is
    Zᵀ, and ``pairs``/``others`` are the block's joint-force and other unknowns. A block with
    no varying entry has its ``inverse`` (transposed) worked out once; otherwise the whole
    block is solved from ``full``/``full0``."""

    rows: np.ndarray
    columns: np.ndarray
    solved: np.ndarray
    coupled: np.ndarray
    coupling_entries: np.ndarray
    coupling_columns: np.ndarray
    coupling_spread: np.ndarray
    fixed: np.ndarray
    turning: np.ndarray
    pairs: np.ndarray
    others: np.ndarray
    pseudo: np.ndarray | None
    null: np.ndarray | None
    ec_z: np.ndarray | None
    ec_z0: np.ndarray | None
    d: np.ndarray | None
    d0: np.ndarray | None
    g: np.ndarray | None
    g0: np.ndarray | None
    full: np.ndarray | None
    full0: np.ndarray | None
    inverse: np.ndarray | None
    used: np.ndarray


def _matching(pattern: np.ndarray) -> np.ndarray:
    """Row matched to each column (augmenting paths); raises ForcesUndetermined if there is none."""
    size = len(pattern)
    row_of = -np.ones(size, int)
    col_of = -np.ones(size, int)
    neighbours = [np.flatnonzero(pattern[r]) for r in range(size)]

    def augment(r, seen):
        for c in neighbours[r]:
            if not seen[c]:
                seen[c] = True
                if row_of[c] < 0 or augment(row_of[c], seen):
                    row_of[c], col_of[r] = r, c
                    return True
        return False

    limit = sys.getrecursionlimit()
    sys.setrecursionlimit(max(limit, 4 * size + 100))
    try:
        for r in range(size):
            if not augment(r, np.zeros(size, bool)):
                raise ForcesUndetermined("the joint forces are not determined by statics: the balance equations "
                                         "cannot all be met by the joint forces (a redundant constraint)", "joints")
    finally:
        sys.setrecursionlimit(limit)
    return row_of


def _components(pattern: np.ndarray, row_of: np.ndarray) -> list:
    """Strongly connected components of "unknown j needs unknown k", in the order to solve them."""
    size = len(pattern)
    needs = [[k for k in np.flatnonzero(pattern[row_of[j]]) if k != j] for j in range(size)]
    index, low, on_stack, stack, found, counter = {}, {}, set(), [], [], [0]

    def visit(v):
        index[v] = low[v] = counter[0]
        counter[0] += 1
        stack.append(v)
        on_stack.add(v)
        for w in needs[v]:
            if w not in index:
                visit(w)
                low[v] = min(low[v], low[w])
            elif w in on_stack:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            component = []
            while True:
                w = stack.pop()
                on_stack.discard(w)
                component.append(w)
                if w == v:
                    break
            found.append(sorted(component))

    limit = sys.getrecursionlimit()
    sys.setrecursionlimit(max(limit, 4 * size + 100))
    try:
        for v in range(size):
            if v not in index:
                visit(v)
    finally:
        sys.setrecursionlimit(limit)
    return found


def _gather(constant, entry_rows, entry_columns, rows, columns):
    """(S, S0): the flattened sub-matrix [rows × columns] = values @ S + S0, for the varying
    entries' values (N, entries) and the constant part."""
    at_row = {r: i for i, r in enumerate(rows)}
    at_column = {c: i for i, c in enumerate(columns)}
    spread = np.zeros((len(entry_rows), len(rows) * len(columns)))
    for k, (r, c) in enumerate(zip(entry_rows, entry_columns, strict=True)):
        if r in at_row and c in at_column:
            spread[k, at_row[r] * len(columns) + at_column[c]] = 1.0
    return spread, constant[np.ix_(rows, columns)].reshape(-1)


def _varies(rows, columns, varying: set) -> bool:
    return any((r, c) in varying for r in rows for c in columns)


def _block(constant, entry_rows, entry_columns, rows, columns, solved, fixed_row, pair_column) -> Block:
    at_row = {r: i for i, r in enumerate(rows)}
    coupling = [(k, c, at_row[r]) for k, (r, c) in enumerate(zip(entry_rows, entry_columns, strict=True))
                if r in at_row and c in set(solved)]
    spread = np.zeros((len(coupling), len(rows)))
    for i, (_, _, row) in enumerate(coupling):
        spread[i, row] = 1.0
    fixed, turning = np.flatnonzero(fixed_row[rows]), np.flatnonzero(~fixed_row[rows])
    pairs, others = columns[pair_column[columns]], columns[~pair_column[columns]]
    c = constant[np.ix_(rows[fixed], pairs)]
    varying = set(zip(entry_rows, entry_columns, strict=True))
    if not len(turning) or not len(fixed):
        reducible = len(turning) > 0
    else:
        reducible = not _varies(rows[fixed], pairs, varying) and np.linalg.matrix_rank(c) == len(fixed)
    parts = dict(pseudo=None, null=None, ec_z=None, ec_z0=None, d=None, d0=None, g=None, g0=None, full=None,
                 full0=None, inverse=None)
    if not _varies(rows, columns, varying):
        square = constant[np.ix_(rows, columns)]
        if np.linalg.matrix_rank(square) < len(rows):
            raise ForcesUndetermined("the joint forces are not determined by statics: some balance equations "
                                     "repeat others (a redundant constraint)", "joints")
        parts["inverse"] = np.linalg.inv(square).T.copy()
    elif reducible:
        pseudo = np.linalg.pinv(c) if len(fixed) else np.zeros((len(pairs), 0))
        null = np.linalg.svd(c)[2][len(fixed):].T if len(fixed) else np.eye(len(pairs))
        e, e0 = _gather(constant, entry_rows, entry_columns, rows[turning], pairs)
        both = np.kron(np.eye(len(turning)), np.hstack([pseudo, null]))
        d, d0 = _gather(constant, entry_rows, entry_columns, rows[fixed], others)
        g, g0 = _gather(constant, entry_rows, entry_columns, rows[turning], others)
        parts.update(pseudo=pseudo.T.copy(), null=null.T.copy(), ec_z=e @ both, ec_z0=e0 @ both, d=d, d0=d0, g=g,
                     g0=g0)
    else:
        parts["full"], parts["full0"] = _gather(constant, entry_rows, entry_columns, rows, columns)
    maps = [k for k in ("ec_z", "d", "g", "full") if parts[k] is not None]
    used = np.flatnonzero(np.any([parts[k].any(axis=1) for k in maps], axis=0)) if maps else np.zeros(0, int)
    for k in maps:
        parts[k] = parts[k][used]
    return Block(rows=rows, columns=columns, solved=solved, coupled=constant[np.ix_(rows, solved)].T.copy(),
                 used=used,
                 coupling_entries=np.array([k for k, _, _ in coupling], int),
                 coupling_columns=np.array([col for _, col, _ in coupling], int), coupling_spread=spread,
                 fixed=fixed, turning=turning, pairs=pairs, others=others, **parts)


def plan(constant: np.ndarray, entry_rows, entry_columns, fixed_row: np.ndarray, pair_column: np.ndarray) -> tuple:
    """The blocks of a system whose entries are ``constant`` (m, m) plus those that vary with the
    pose at (``entry_rows``, ``entry_columns``); ``fixed_row`` marks the force balances (constant
    coefficients on the joint forces), ``pair_column`` the joint-force unknowns."""
    pattern = constant != 0.0
    pattern[entry_rows, entry_columns] = True
    row_of = _matching(pattern)
    varying = set(zip(entry_rows, entry_columns, strict=True))
    merged = []
    for component in _components(pattern, row_of):
        columns = np.array(component, int)
        if merged and not _varies(row_of[columns], columns, varying) \
                and not _varies(row_of[merged[-1]], merged[-1], varying) \
                and not pattern[np.ix_(row_of[columns], merged[-1])].any():
            # Two constant blocks, the later not needing the earlier: one solve with one inverse.
            merged[-1] = np.concatenate([merged[-1], columns])
        else:
            merged.append(columns)
    blocks, solved = [], np.zeros(len(constant), bool)
    for columns in merged:
        columns = np.sort(columns)
        rows = np.sort(row_of[columns])
        before = np.flatnonzero(solved & pattern[rows].any(axis=0))
        solved[columns] = True
        blocks.append(_block(constant, entry_rows, entry_columns, rows, columns, before, fixed_row, pair_column))
    return tuple(blocks)


def solve(blocks: tuple, values: np.ndarray, applied: np.ndarray):
    """The unknowns (N, m) of A·u = ``applied`` at every pose, A given by ``values`` of the varying
    entries; (unknowns, index of the first pose found singular, or None)."""
    count = len(values)
    unknowns = np.zeros(applied.shape)
    singular = np.zeros(count, bool)
    for block in blocks:
        rhs = applied[:, block.rows]
        if len(block.solved):
            rhs = rhs - unknowns[:, block.solved] @ block.coupled
        if len(block.coupling_entries):
            through = values[:, block.coupling_entries] * unknowns[:, block.coupling_columns]
            rhs = rhs - through @ block.coupling_spread
        if block.inverse is not None:
            unknowns[:, block.columns] = rhs @ block.inverse
            continue
        if block.pseudo is None:
            size = len(block.columns)
            found, bad = solve_small((values[:, block.used] @ block.full + block.full0).reshape(count, size, size),
                                     rhs)
            unknowns[:, block.columns] = found
        else:
            bad = _reduced(block, values, rhs, unknowns)
        singular |= bad
    return unknowns, (int(np.argmax(singular)) if singular.any() else None)


def _reduced(block: Block, values, rhs, unknowns) -> np.ndarray:
    """Solve a block whose force rows are solved apart (see the module), into ``unknowns``;
    returns where it was singular."""
    count = len(values)
    values = values[:, block.used]
    nt, nf, no = len(block.turning), len(block.fixed), len(block.others)
    f, g = rhs[:, block.fixed], rhs[:, block.turning]
    ec_z = (values @ block.ec_z + block.ec_z0).reshape(count, nt, -1)
    ec, ez = ec_z[:, :, :nf], ec_z[:, :, nf:]
    reduced_rhs = g - np.einsum("nij,nj->ni", ec, f) if nf else g
    if no:
        d = (values @ block.d + block.d0).reshape(count, nf, no)
        g_part = (values @ block.g + block.g0).reshape(count, nt, no)
        matrix = np.concatenate([g_part - np.einsum("nij,njk->nik", ec, d), ez], axis=2) if nf else \
            np.concatenate([g_part, ez], axis=2)
    else:
        matrix = ez
    found, singular = solve_small(matrix, reduced_rhs)
    o, q = found[:, :no], found[:, no:]
    if no and nf:
        f = f - np.einsum("nij,nj->ni", d, o)
    unknowns[:, block.pairs] = f @ block.pseudo + q @ block.null
    unknowns[:, block.others] = o
    return singular


# A reduced block whose rows are this near to dependent (|det| against the product of the
# rows' lengths, or a 1×1 coefficient of order-one rows) leaves the forces undetermined.
DEPENDENT = 1e-13


def solve_small(matrix: np.ndarray, rhs: np.ndarray):
    """Solve (N, n, n)·x = (N, n) for small n; returns (x, the poses found singular)."""
    n = matrix.shape[-1]
    if n == 0:
        return rhs[:, :0], np.zeros(len(rhs), bool)
    if n == 1:
        a = matrix[:, 0, 0]
        bad = np.abs(a) <= DEPENDENT
        return (rhs / np.where(bad, 1.0, a)[:, None]), bad
    if n == 2:
        a, b, c, d = matrix[:, 0, 0], matrix[:, 0, 1], matrix[:, 1, 0], matrix[:, 1, 1]
        det = a * d - b * c
        bad = np.abs(det) <= DEPENDENT * np.hypot(a, b) * np.hypot(c, d)
        det = np.where(bad, 1.0, det)
        found = np.empty(rhs.shape)
        found[:, 0] = (d * rhs[:, 0] - b * rhs[:, 1]) / det
        found[:, 1] = (a * rhs[:, 1] - c * rhs[:, 0]) / det
        return found, bad
    figures = np.linalg.cond(matrix)
    bad = ~(figures < 1.0 / DEPENDENT)
    safe = np.where(bad[:, None, None], np.eye(n), matrix)
    return np.linalg.solve(safe, rhs[..., None])[..., 0], bad
