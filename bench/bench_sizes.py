"""Time every command-line verb against the size of the design: the figures behind MAX_POINTS.

Run: ``python bench/bench_sizes.py [--sizes 100,200,400] [--timeout 60]``

Two shapes of invented design grow with the size N (the number of points):

- ``one link``: a crank-rocker whose coupler carries N − 4 further points;
- ``many links``: a crank-rocker followed by (N − 4) / 2 dyads in a chain, each a binary link
  pinned to the last moving point and another to its own ground pivot.

Each verb runs through the command line's own ``main`` in a fresh process that first runs the same
verb on a sample (so Python, Qt, ezdxf and the caches of the imports are warm: start-up is the
same at any size and is printed apart, on the first line); the figure is the verb's own time, the
quickest of ``--rounds`` runs (the machine is shared). A verb past ``--timeout`` seconds prints
``>TIMEOUT``. The size limit of the file format (docs/file-format.md) is chosen so that every verb
answers within 2 s below it.
"""

from __future__ import annotations

import argparse
import json
import math
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from tests.designs import many_links, one_link  # noqa: E402

VERBS = {"check": [], "solve": ["--json"], "construct": ["--json"], "centres": ["--json"],
         "sweep": ["-o", "{out}.csv"], "render": ["-o", "{out}.png"], "print": ["-o", "{out}.pdf"],
         "export": ["-o", "{out}.dxf"]}


SAMPLE = ROOT / "samples" / "label-swing-arm.json"


def _run_in_process(verb: str, path: Path, out: Path) -> tuple:
    """(seconds, exit code) of ``kinepoly VERB PATH`` through the command line's main, stdout discarded."""
    import contextlib
    import io

    from app.main import main as kinepoly

    args = [a.format(out=out) for a in VERBS[verb]]
    start = time.perf_counter()
    with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()):
        code = kinepoly([verb, str(path), *args])
    return time.perf_counter() - start, code


def time_verb(verb: str, path: Path, out: Path, timeout: float) -> tuple:
    """(seconds, exit code) of the verb on ``path`` in a fresh, warmed process; (inf, "timeout") past ``timeout``."""
    try:
        done = subprocess.run([sys.executable, __file__, "--child", verb, str(path), str(out)], cwd=ROOT,
                              capture_output=True, text=True, timeout=timeout,
                              env={"QT_QPA_PLATFORM": "offscreen", "PATH": "/usr/bin:/bin"})
    except subprocess.TimeoutExpired:
        return math.inf, "timeout"
    if done.returncode != 0:
        return math.inf, f"crash {done.stderr.strip().splitlines()[-1:]}"
    seconds, code = done.stdout.split()
    return float(seconds), int(code)


def _child(verb: str, path: str, out: str) -> int:
    _run_in_process(verb, SAMPLE, Path(out))  # warm: imports, fonts, Qt's first paint
    seconds, code = _run_in_process(verb, Path(path), Path(out))
    print(seconds, code)
    return 0


def startup_seconds(verb: str, out: Path) -> float:
    """A fresh ``python -m app.main VERB SAMPLE``, start to end (what any size adds to the verb's own time)."""
    start = time.perf_counter()
    subprocess.run([sys.executable, "-m", "app.main", verb, str(SAMPLE), *[a.format(out=out) for a in VERBS[verb]]],
                   cwd=ROOT, capture_output=True, env={"QT_QPA_PLATFORM": "offscreen", "PATH": "/usr/bin:/bin"})
    return time.perf_counter() - start


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    if argv[:1] == ["--child"]:
        return _child(*argv[1:4])
    parser = argparse.ArgumentParser()
    parser.add_argument("--sizes", default="100,200,400,800")
    parser.add_argument("--rounds", type=int, default=2)
    parser.add_argument("--timeout", type=float, default=60.0)
    parser.add_argument("--verbs", default=",".join(VERBS))
    options = parser.parse_args(argv)
    sizes = [int(s) for s in options.sizes.split(",")]
    verbs = options.verbs.split(",")
    with tempfile.TemporaryDirectory() as folder:
        start_up = [startup_seconds(verb, Path(folder) / "out") for verb in verbs]
        print(f"{'whole run':<11}{'sample':>7}  " + "".join(f"{t:>10.2f}" for t in start_up)
              + "   (s: a fresh process on a sample, start-up included)")
        print(f"{'shape':<11}{'points':>7}  " + "".join(f"{v:>10}" for v in verbs)
              + "   (s: the verb's own time, quickest run; /exit code if not 0)")
        for shape, make in (("one link", one_link), ("many links", many_links)):
            for size in sizes:
                path = Path(folder) / f"{shape.replace(' ', '_')}_{size}.json"
                path.write_text(json.dumps(make(size)))
                cells = []
                for verb in verbs:
                    runs = [time_verb(verb, path, Path(folder) / "out", options.timeout) for _ in range(options.rounds)]
                    best, code = min(runs, key=lambda r: r[0])
                    cells.append(">TIMEOUT" if code == "timeout" else "CRASH" if isinstance(code, str)
                                 else f"{best:.2f}" + ("" if code == 0 else f"/{code}"))
                print(f"{shape:<11}{size:>7}  " + "".join(f"{c:>10}" for c in cells), flush=True)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
