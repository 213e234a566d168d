"""Engine benchmark: a multi-span cable line on beam posts in p-y-like soil springs.

A script, not a test (run ``python benchmarks/engine_benchmark.py``). It builds
engine models of about 1e3, 1e4 and 1e5 DOFs, solves each under self-weight and
one point load per span, and prints for each size: the number of equations,
Newton iterations (all, per solve, failed), factorisations, wall time of the solve, the time spent in sparse
factorisation and solve (``fem.solver.TIMINGS``), the ratio of the two, and the
peak resident memory of the process. Each size runs in its own process so the
peak memory belongs to that size alone. Finally it prints the growth exponent
of the solve time from the smallest to the largest model.

Targets (issue 2): total / linear-algebra time at most 3 at 1e4 DOFs and above;
growth exponent at most 1.3.

Then it builds the two-post model of the speed issue (two 4 m posts of 190 x 190
mm, E 11 GPa, embedded 1.5 m on linear springs, a level 30 m cable between their
tips, EA 4 MN, 5 N/m, 1 kN of pretension in its unstressed length) at about 1e4
and 1e5 DOFs, solves self-weight and then a 1.1 kN point load at mid-span, and
prints Newton iterations (all of them, failed tries included), factorisations
and times. Targets (never asserted): at most 25 Newton iterations and a quarter
of the time measured on the engine before the issue, at both sizes.

Options: ``--sizes 1e3 1e4 1e5`` (target DOF counts), ``--repeat N`` (solves per
size, the fastest is reported: the machine may be shared), ``--profile SIZE`` (run
one size under cProfile and print the top functions), ``--two-post 1e4 1e5``
(sizes of the two-post model; none to skip).
"""
from __future__ import annotations

import argparse
import json
import resource
import subprocess
import sys
import time

from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))  # this checkout's engine first
import spanstay.fem as fem  # noqa: E402
from spanstay.fem.assembly import Assembler  # noqa: E402
from spanstay.fem.solver import TIMINGS  # noqa: E402

SPAN = 30.0          # m between posts
POST_HEIGHT = 4.0    # m above ground
EMBED = 2.0          # m below ground
POST_ELEMENTS = (8, 8)  # above, below ground
EA = 3.5e6           # N, cable axial stiffness
W_CABLE = 2.0        # N/m, cable weight
PRETENSION = 4e3     # N
RIDER = 1.2e3        # N, one point load per span


class SoilLaw:
    """p = p_u tanh(k y / p_u), the shape of a sand p-y curve, per spring."""

    def __init__(self, k, p_u) -> None:
        self.k, self.p_u = np.asarray(k, float), np.asarray(p_u, float)

    def force(self, u):
        return self.p_u * np.tanh(self.k * u / self.p_u)

    def stiffness(self, u):
        return self.k * (1.0 - np.tanh(self.k * u / self.p_u) ** 2)


def build(n_spans: int, segments: int) -> tuple[fem.Model, dict]:
    """Posts at x = 0, SPAN, ...; the cable runs over their tops; end posts guyed."""
    m = fem.Model()
    section = fem.BeamSection.circle(11e9, 11e9 / 16, 0.25)
    n_up, n_down = POST_ELEMENTS
    z = np.r_[np.linspace(-EMBED, 0.0, n_down + 1), np.linspace(0.0, POST_HEIGHT, n_up + 1)[1:]]
    tops, soil_nodes, toes = [], [], []
    for i in range(n_spans + 1):
        ids = m.add_nodes(np.c_[np.full(z.size, i * SPAN), np.zeros(z.size), z])
        m.add_beams(ids[:-1], ids[1:], section, orientation=(0.0, 1.0, 0.0), name=f"post{i}")
        tops.append(int(ids[-1]))
        soil_nodes.append(ids[: n_down + 1])
        toes.append(int(ids[0]))
    soil = np.concatenate(soil_nodes)
    depth = -m.coords[soil, 2]
    trib = np.full(soil.size, EMBED / n_down)
    k_soil = 2e7 * np.maximum(depth, 0.05) * trib          # modulus growing with depth
    p_ult = 6e4 * np.maximum(depth, 0.05) * trib
    for dof in ("ux", "uy"):
        m.add_springs(soil, dof, SoilLaw(k_soil, p_ult), name=f"soil_{dof}")
    m.add_springs(toes, "uz", fem.LinearLaw(5e7), name="toe")
    m.add_springs(toes, "rz", fem.LinearLaw(1e6), name="twist")
    # the cable: a parabola of 2% sag in each span, pretensioned by its unstressed length
    sag = 0.02 * SPAN
    t = np.linspace(0.0, 1.0, segments + 1)[1:-1]
    loads = []
    for i in range(n_spans):
        x0 = i * SPAN
        inner = m.add_nodes(np.c_[x0 + t * SPAN, np.zeros(t.size), POST_HEIGHT - 4 * sag * t * (1 - t)])
        chain = np.r_[tops[i], inner, tops[i + 1]]
        lengths = np.linalg.norm(np.diff(m.coords[chain], axis=0), axis=1)
        m.add_cables(chain[:-1], chain[1:], EA, lengths / (1 + PRETENSION / EA), weight=W_CABLE,
                     name=f"span{i}")
        mid = inner[inner.size // 2]
        m.add_load(mid, [0.0, 150.0, -RIDER])
        loads.append(mid)
    # guys from the end posts to fixed anchors
    for top, sign in ((tops[0], -1.0), (tops[-1], 1.0)):
        anchor = m.add_node([m.coords[top, 0] + sign * 6.0, 0.0, 0.0])
        length = np.linalg.norm(m.coords[top] - m.coords[anchor])
        m.add_cables([anchor], [top], 2 * EA, length / (1 + 2 * PRETENSION / EA), name=f"guy{top}")
        m.fix(anchor, "xyz")
    return m, {"tops": tops, "loads": loads}


def shape_for(target: float) -> tuple[int, int]:
    """(spans, segments per span) giving about ``target`` equations."""
    spans = int(np.clip(round(np.sqrt(target) / 16.0), 2, 40))
    post_dofs = (spans + 1) * 6 * (sum(POST_ELEMENTS) + 1)
    segments = max(int((target - post_dofs) / (3 * spans)) + 1, 8)
    return spans, segments


def counts(state: fem.State, factorisations: int) -> dict:
    """Newton iterations made (failed tries included), kept, failed, and factorisations.

    An engine without ``State.newton_iterations`` factorised once per iteration, so
    its factorisation count is its honest iteration count.
    """
    made = int(getattr(state, "newton_iterations", factorisations))
    kept = int(sum(state.iterations))
    return {"iterations": made, "kept_iterations": kept, "failed_iterations": made - kept,
            "factorisations": int(getattr(state, "factorisations", factorisations))}


def run_one(target: float, repeat: int = 1) -> dict:
    """Build one model and solve it ``repeat`` times from rest; keep the fastest solve."""
    spans, segments = shape_for(target)
    t0 = time.perf_counter()
    model, _ = build(spans, segments)
    t_build = time.perf_counter() - t0
    best = None
    for _ in range(max(repeat, 1)):
        TIMINGS.linear_algebra, TIMINGS.factorisations = 0.0, 0
        t0 = time.perf_counter()
        state = fem.solve(model, steps=2)
        t = time.perf_counter() - t0
        if best is None or t < best[0]:
            best = (t, TIMINGS.linear_algebra, TIMINGS.factorisations, state)
    t_solve, t_linalg, n_fact, state = best
    asm = Assembler(model)
    peak_kib = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    return {"target": target, "spans": spans, "segments": segments, "dofs": asm.n_eq,
            "nnz": asm.nnz, **counts(state, n_fact), "solves": 1, "build_s": t_build,
            "solve_s": t_solve, "linalg_s": t_linalg, "peak_mib": peak_kib / 1024.0,
            "max_tension": float(max(state.group(f"span{i}").tension.max() for i in range(spans)))}


def build_two_post(segments: int) -> tuple[fem.Model, int]:
    """Two 4 m posts (190 x 190 mm, E 11 GPa) embedded 1.5 m on linear springs, 30 m apart,
    a level cable (EA 4 MN, 5 N/m, unstressed length for 1 kN) in ``segments`` segments
    between their tips.

    Returns the model and the mid-span node that takes the point load.
    """
    m = fem.Model()
    section = fem.BeamSection.rectangle(11e9, 11e9 / 16, 0.19, 0.19, weight=500 * 9.81 * 0.19**2)
    z = np.r_[np.linspace(-1.5, 0.0, 16), np.linspace(0.0, 4.0, 41)[1:]]  # 0.1 m elements
    tips = []
    for i, x in enumerate((0.0, 30.0)):
        ids = m.add_nodes(np.c_[np.full(z.size, x), np.zeros(z.size), z])
        m.add_beams(ids[:-1], ids[1:], section, orientation=(0.0, 1.0, 0.0), name=f"post{i}")
        embedded = ids[:16]
        trib = np.full(embedded.size, 0.1)
        trib[[0, -1]] = 0.05
        k = 2e7 * np.maximum(-z[:16], 0.05) * trib   # subgrade modulus growing with depth
        for dof in ("ux", "uy"):
            m.add_springs(embedded, dof, fem.LinearLaw(k), name=f"soil{i}_{dof}")
        m.add_springs([ids[0]], "uz", fem.LinearLaw(5e7), name=f"toe{i}")
        m.add_springs([ids[0]], "rz", fem.LinearLaw(1e6), name=f"twist{i}")
        tips.append(int(ids[-1]))
    t = np.linspace(0.0, 1.0, segments + 1)[1:-1]
    inner = m.add_nodes(np.c_[30.0 * t, np.zeros(t.size), np.full(t.size, 4.0)])
    chain = np.r_[tips[0], inner, tips[1]]
    m.add_cables(chain[:-1], chain[1:], 4e6, np.full(segments, 30.0 / segments / (1 + 1e3 / 4e6)),
                 weight=5.0, name="cable")
    return m, int(inner[inner.size // 2])


def run_two_post(target: float, repeat: int = 1) -> dict:
    """Self-weight, then a 1.1 kN point load at mid-span; the fastest of ``repeat`` pairs."""
    segments = int(round((target - 2 * 56 * 6) / 3)) + 1
    best = None
    for _ in range(max(repeat, 1)):
        model, mid = build_two_post(segments)
        TIMINGS.linear_algebra, TIMINGS.factorisations = 0.0, 0
        t0 = time.perf_counter()
        weight = fem.solve(model)
        n_weight = TIMINGS.factorisations
        model.add_load(mid, [0.0, 0.0, -1.1e3])
        loaded = fem.solve(model, state=weight)
        t = time.perf_counter() - t0
        if best is None or t < best[0]:
            a, b = counts(weight, n_weight), counts(loaded, TIMINGS.factorisations - n_weight)
            best = (t, TIMINGS.linear_algebra, {k: a[k] + b[k] for k in a}, loaded, model, mid)
    t_solve, t_linalg, count, loaded, model, mid = best
    return {"target": target, "dofs": Assembler(model).n_eq, "segments": segments, **count,
            "solves": 2, "solve_s": t_solve, "linalg_s": t_linalg,
            "sag_m": float(-loaded.u[mid, 2]), "tension_n": float(loaded.group("cable").tension.max())}


def main(argv: list[str] | None = None) -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", nargs="*", type=float, default=[1e3, 1e4, 1e5])
    parser.add_argument("--repeat", type=int, default=3, help="solves per size; the fastest counts")
    parser.add_argument("--two-post", nargs="*", type=float, default=[1e4, 1e5],
                        help="DOF counts of the two-post model")
    parser.add_argument("--one", type=float, help=argparse.SUPPRESS)
    parser.add_argument("--one-two-post", type=float, help=argparse.SUPPRESS)
    parser.add_argument("--profile", type=float, help="profile one size with cProfile")
    args = parser.parse_args(argv)
    if args.one:
        print(json.dumps(run_one(args.one, args.repeat)))
        return
    if args.one_two_post:
        print(json.dumps(run_two_post(args.one_two_post, args.repeat)))
        return
    if args.profile:
        import cProfile
        import pstats
        prof = cProfile.Profile()
        prof.runcall(run_one, args.profile, 1)
        pstats.Stats(prof).sort_stats("cumulative").print_stats(30)
        return
    rows = []
    print(f"{'DOFs':>8} {'spans':>5} {'segs':>6} {'iters':>5} {'it/slv':>6} {'failed':>6} {'facts':>5} "
          f"{'build s':>8} {'solve s':>8} {'linalg s':>8} {'ratio':>6} {'peak MiB':>9}")
    for size in args.sizes:
        out = subprocess.run([sys.executable, __file__, "--one", str(size), "--repeat", str(args.repeat)],
                             check=True, capture_output=True, text=True).stdout
        r = json.loads(out.strip().splitlines()[-1])
        rows.append(r)
        print(f"{r['dofs']:>8} {r['spans']:>5} {r['segments']:>6} {r['iterations']:>5} "
              f"{r['iterations'] / r['solves']:>6.1f} {r['failed_iterations']:>6} {r['factorisations']:>5} "
              f"{r['build_s']:>8.2f} {r['solve_s']:>8.2f} {r['linalg_s']:>8.2f} "
              f"{r['solve_s'] / max(r['linalg_s'], 1e-12):>6.2f} {r['peak_mib']:>9.0f}", flush=True)
    def exponent(a: dict, b: dict) -> str:
        expo = np.log(b["solve_s"] / a["solve_s"]) / np.log(b["dofs"] / a["dofs"])
        per_it = np.log((b["solve_s"] / b["iterations"]) / (a["solve_s"] / a["iterations"])) / np.log(
            b["dofs"] / a["dofs"])
        return f"{a['dofs']} -> {b['dofs']} DOFs: {expo:.2f} (per Newton iteration {per_it:.2f})"

    if len(rows) >= 2:
        print("growth exponent of solve time, " + exponent(rows[0], rows[-1]))
        for a, b in zip(rows[:-1], rows[1:]):
            if len(rows) > 2:
                print("  step " + exponent(a, b))
    if args.two_post:
        print("two-post model: self-weight, then 1.1 kN at mid-span (2 solves)")
        print(f"{'DOFs':>8} {'segs':>6} {'iters':>5} {'it/slv':>6} {'failed':>6} {'facts':>5} "
              f"{'solve s':>8} {'linalg s':>8} {'sag m':>8} {'T max N':>9}")
    for size in args.two_post:
        out = subprocess.run([sys.executable, __file__, "--one-two-post", str(size), "--repeat",
                              str(args.repeat)], check=True, capture_output=True, text=True).stdout
        r = json.loads(out.strip().splitlines()[-1])
        print(f"{r['dofs']:>8} {r['segments']:>6} {r['iterations']:>5} {r['iterations'] / r['solves']:>6.1f} "
              f"{r['failed_iterations']:>6} {r['factorisations']:>5} {r['solve_s']:>8.2f} "
              f"{r['linalg_s']:>8.2f} {r['sag_m']:>8.4f} {r['tension_n']:>9.1f}", flush=True)


if __name__ == "__main__":
    main()
