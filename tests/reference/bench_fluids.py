"""The work of benches/sizing.rs done with the fluids package, for the
README's side-by-side numbers. Run: .venv/bin/python tests/reference/bench_fluids.py
"""
import math
import timeit

from fluids.fittings import Darby3K
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe
import CoolProp.CoolProp as CP

NPS = [0.125, 0.25, 0.375, 0.5, 0.75, 1, 1.25, 1.5, 2, 2.5, 3, 3.5, 4, 5, 6, 8, 10, 12, 14, 16, 18, 20, 24]
BORES = [nearest_pipe(NPS=n, schedule="40")[1] for n in NPS]
RHO = CP.PropsSI("D", "T", 279.15, "P", 350e3, "Water")
MU = CP.PropsSI("V", "T", 279.15, "P", 350e3, "Water")
FITTINGS = [("Elbow, 90°, (r/D = 2)", 6), ("Valve, Ball valve, standard, β = 1", 2), ("Valve, Swing check", 1)]


def size_line(q, rho=RHO, mu=MU, length=42.0, eps=0.045e-3, max_dpl=400.0, max_v=2.4):
    proposed = None
    rows = []
    for i, d in enumerate(BORES):
        v = q / (math.pi / 4 * d * d)
        re = rho * v * d / mu
        f = friction_factor(Re=re, eD=eps / d)  # Clamond's exact Colebrook solve
        dpl = f * rho * v * v / (2 * d)
        k = sum(n * Darby3K(NPS=d / 0.0254, Re=re, name=name) for name, n in FITTINGS)
        total = dpl * length + k * rho * v * v / 2
        ok = dpl <= max_dpl and v <= max_v
        rows.append((d, v, re, f, dpl, total, ok))
        if ok and proposed is None:
            proposed = i
    return proposed, rows


def sheet():
    # Properties looked up per line, as the Rust sheet does.
    for i in range(1000):
        rho = CP.PropsSI("D", "T", 279.15, "P", 350e3, "Water")
        mu = CP.PropsSI("V", "T", 279.15, "P", 350e3, "Water")
        size_line((0.5 + (i % 97) * 0.4) * 1e-3, rho, mu)


n = 2000
t1 = min(timeit.repeat(lambda: size_line(18.5e-3), number=n, repeat=5)) / n
t2 = min(timeit.repeat(sheet, number=1, repeat=5))
print("fluids: one line, 23 sizes: %.1f µs; 1,000-line sheet: %.1f ms" % (t1 * 1e6, t2 * 1e3))
