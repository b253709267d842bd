"""Reference values from general-purpose libraries on PyPI, for
tests/reference.rs. scripts/test runs this inside .venv with the pinned
versions of tests/reference/requirements.txt and writes
target/reference/*.json; nothing here is committed output.

- fluids (Caleb Bell): Colebrook, pipe schedules, Darby 3-K constants.
- CoolProp: water (IAPWS-95) and INCOMP::MEG / INCOMP::MPG glycols.
- iapws (J. Romera): IAPWS-IF97 regions 1 and 2, IAPWS 2008 viscosity.
- fluids.compressible: the isothermal gas-flow equation and its choking
  pressure; CoolProp for gases (air, N2, CO2, methane, a natural-gas mix)
  and steam.
"""
import json
import math
import os
import sys

import CoolProp
import CoolProp.CoolProp as CP
import fluids
import iapws
from fluids.friction import Colebrook
from fluids.fittings import Darby
from fluids.piping import nearest_pipe
from iapws import IAPWS97
from iapws._iapws import _Viscosity

out = sys.argv[1] if len(sys.argv) > 1 else "target/reference"
os.makedirs(out, exist_ok=True)


def dump(name, data):
    with open(os.path.join(out, name), "w") as f:
        json.dump(data, f, indent=1)


versions = {"fluids": fluids.__version__, "CoolProp": CoolProp.__version__, "iapws": iapws.__version__}

# Colebrook over Re 1e3..1e8 and eps/D 0..0.05.
grid = []
for i in range(0, 51):
    re = 10 ** (3 + 5 * i / 50)
    for rr in [0.0, 1e-6, 1e-5, 1e-4, 3e-4, 1e-3, 3e-3, 1e-2, 2e-2, 5e-2]:
        grid.append([re, rr, Colebrook(re, rr)])
dump("colebrook.json", {"versions": versions, "points": grid})

# Pipe schedules: our series id -> fluids schedule name. fluids works in m.
schedules = {
    "steel-sch40": "40", "steel-sch80": "80", "steel-std": "STD", "steel-xs": "XS",
    "steel-sch10": "10", "steel-sch20": "20",
    "stainless-5s": "5S", "stainless-10s": "10S", "stainless-40s": "40S", "stainless-80s": "80S",
    "pvc-sch40": "40D1785", "pvc-sch80": "80D1785", "pvc-c900-dr18": "DR18C900",
}
nps_values = {"1/8": 0.125, "1/4": 0.25, "3/8": 0.375, "1/2": 0.5, "3/4": 0.75, "1": 1, "1-1/4": 1.25,
              "1-1/2": 1.5, "2": 2, "2-1/2": 2.5, "3": 3, "3-1/2": 3.5, "4": 4, "5": 5, "6": 6, "8": 8,
              "10": 10, "12": 12, "14": 14, "16": 16, "18": 18, "20": 20, "22": 22, "24": 24,
              "26": 26, "28": 28, "30": 30, "32": 32, "34": 34, "36": 36, "38": 38, "40": 40, "42": 42,
              "44": 44, "46": 46, "48": 48}
pipes = {}
for sid, sch in schedules.items():
    rows = {}
    for name, nps in nps_values.items():
        try:
            got_nps, di, do, t = nearest_pipe(NPS=nps, schedule=sch)
        except Exception:
            continue
        if abs(got_nps - nps) < 1e-9:
            rows[name] = {"od_mm": do * 1e3, "wall_mm": t * 1e3, "id_mm": di * 1e3}
    pipes[sid] = rows
# EN 10255 medium carries the dimensions of BS 1387 medium, which fluids has by DN.
dn = {}
for name, d in [("DN8", 8), ("DN10", 10), ("DN15", 15), ("DN20", 20), ("DN25", 25), ("DN32", 32), ("DN40", 40),
                ("DN50", 50), ("DN65", 65), ("DN80", 80), ("DN100", 100), ("DN125", 125), ("DN150", 150)]:
    for i, v in enumerate(fluids.piping.DN_MEDIUM_BS1387):
        if abs(v - d) < 1e-9:
            dn[name] = {"od_mm": fluids.piping.MEDIUMo_BS1387[i], "wall_mm": fluids.piping.MEDIUMt_BS1387[i],
                        "id_mm": fluids.piping.MEDIUMi_BS1387[i]}
pipes["en10255-medium"] = dn
# EN 10255 heavy carries BS 1387 heavy.
dn = {}
for name, d in [("DN8", 8), ("DN10", 10), ("DN15", 15), ("DN20", 20), ("DN25", 25), ("DN32", 32), ("DN40", 40),
                ("DN50", 50), ("DN65", 65), ("DN80", 80), ("DN100", 100), ("DN125", 125), ("DN150", 150)]:
    for i, v in enumerate(fluids.piping.DN_HEAVY_BS1387):
        if abs(v - d) < 1e-9:
            dn[name] = {"od_mm": fluids.piping.HEAVYo_BS1387[i], "wall_mm": fluids.piping.HEAVYt_BS1387[i],
                        "id_mm": fluids.piping.HEAVYi_BS1387[i]}
pipes["en10255-heavy"] = dn
dump("pipes.json", {"versions": versions, "series": pipes})

# Large steel mains, held back for review: drop per length of water at every
# size of the series, from fluids' pipe tables and Colebrook, with CoolProp
# water; our sizing of the same line must agree to 2 %.
mains = []
for sid, flow_m3s, t_c in [("steel-std", 0.45, 7.0), ("steel-std", 1.8, 12.0), ("steel-xs", 0.9, 45.0),
                            ("steel-sch40", 0.6, 80.0), ("steel-sch10", 1.2, 15.0), ("steel-sch20", 0.3, 25.0)]:
    T = t_c + 273.15
    rho = CP.PropsSI("D", "T", T, "P", 500e3, "Water")
    mu = CP.PropsSI("V", "T", T, "P", 500e3, "Water")
    sizes = {}
    for name, nps in nps_values.items():
        try:
            got_nps, di, do, t = nearest_pipe(NPS=nps, schedule=schedules[sid])
        except Exception:
            continue
        if abs(got_nps - nps) > 1e-9 or nps < 4:
            continue
        v = flow_m3s / (math.pi / 4 * di * di)
        re = rho * v * di / mu
        f = Colebrook(re, 0.045e-3 / di)
        sizes[name] = f * rho * v * v / (2 * di)
    mains.append({"series": sid, "flow_m3_s": flow_m3s, "t_c": t_c, "drop_pa_m": sizes})
dump("mains.json", {"versions": versions, "cases": mains})

# Crane TP-410 forms in fluids: butterfly valves (centric) and fT at Sch 40
# bores, conical and sudden contractions and enlargements, Kv/Cv.
from fluids.fittings import K_butterfly_valve_Crane, contraction_conical_Crane, diffuser_conical, Kv_to_Cv, ft_Crane
crane = {"butterfly": {}, "ft": {}, "reducers": [], "cv_per_kv": Kv_to_Cv(1.0)}
for name, nps in nps_values.items():
    if nps < 2 or nps > 24:
        continue
    got_nps, di, do, t = nearest_pipe(NPS=nps, schedule="40" if nps not in (22,) else "STD")
    crane["butterfly"][name] = K_butterfly_valve_Crane(di, style=0)
    crane["ft"][name] = ft_Crane(di)
for beta in [0.3, 0.5, 0.7, 0.9]:
    for angle in [10.0, 30.0, 44.0, 60.0, 90.0, 180.0]:
        crane["reducers"].append({
            "beta": beta, "angle": angle,
            "contraction": contraction_conical_Crane(0.1, 0.1 * beta, angle=angle),
            "enlargement": diffuser_conical(0.1 * beta, 0.1, angle=angle, method="Crane"),
        })
dump("crane.json", {"versions": versions, **crane})

# Darby 3-K constants, by fluids' name for each row.
dump("darby.json", {"versions": versions, "rows": {k: list(v) for k, v in Darby.items()}})

# Water: CoolProp (IAPWS-95) and iapws (IF97 + IAPWS 2008) at 0.5..95 degC.
water = []
for t_c in [0.5, 4, 10, 15, 20, 25, 30, 40, 50, 60, 70, 80, 90, 95]:
    T = t_c + 273.15
    for p in [101325.0, 500e3]:
        w = IAPWS97(T=T, P=p / 1e6)
        water.append({
            "t_c": t_c, "p_pa": p,
            "coolprop_rho": CP.PropsSI("D", "T", T, "P", p, "Water"),
            "coolprop_mu": CP.PropsSI("V", "T", T, "P", p, "Water"),
            "if97_rho": w.rho,
            "iapws2008_mu": _Viscosity(w.rho, T),
            "if97_cp": w.cp * 1e3,
            "coolprop_cp": CP.PropsSI("C", "T", T, "P", p, "Water"),
        })
dump("water.json", {"versions": versions, "points": water})

# Glycols: CoolProp off the shipped grid (odd strengths, odd temperatures).
glycol = []
for code, name in [("MEG", "ethylene"), ("MPG", "propylene")]:
    for pct in [12.0, 22.5, 33.0, 41.0, 48.0, 57.0]:
        fl = "INCOMP::%s-%g%%" % (code, pct)
        tf = CP.PropsSI("T_freeze", "T", 300, "P", 101325, fl) - 273.15
        for t_c in [-41.3, -27.7, -12.2, -3.1, 1.3, 8.8, 17.4, 33.3, 48.9, 66.6, 81.2, 97.5]:
            if t_c < tf + 0.5:
                continue
            T = t_c + 273.15
            glycol.append({
                "glycol": name, "percent": pct, "t_c": t_c, "freeze_c": tf,
                "rho": CP.PropsSI("D", "T", T, "P", 101325, fl),
                "mu": CP.PropsSI("V", "T", T, "P", 101325, fl),
                "cp": CP.PropsSI("C", "T", T, "P", 101325, fl),
            })
freezing = []
for code, name in [("MEG", "ethylene"), ("MPG", "propylene")]:
    for pct in range(10, 61):
        fl = "INCOMP::%s-%g%%" % (code, pct)
        freezing.append({"glycol": name, "percent": pct,
                         "freeze_c": CP.PropsSI("T_freeze", "T", 300, "P", 101325, fl) - 273.15})
dump("glycol.json", {"versions": versions, "points": glycol, "freezing": freezing})
# Heat loads to flows: Q = P / (rho cp dT) with CoolProp's rho and cp.
loads = []
for kind, pct, t_c, p_pa, power_w, dt in [
    ("water", 0, 7.0, 300e3, 45e3, 6.0), ("water", 0, 80.0, 300e3, 120e3, 20.0),
    ("water", 0, 45.0, 400e3, 8.5e3, 5.0), ("water", 0, 12.0, 250e3, 1.2e6, 5.5),
    ("ethylene", 30, -5.0, 101325, 60e3, 4.0), ("propylene", 40, 10.0, 101325, 25e3, 5.0),
]:
    fl = "Water" if kind == "water" else "INCOMP::%s-%g%%" % ("MEG" if kind == "ethylene" else "MPG", pct)
    T = t_c + 273.15
    rho = CP.PropsSI("D", "T", T, "P", p_pa, fl)
    cp = CP.PropsSI("C", "T", T, "P", p_pa, fl)
    loads.append({"kind": kind, "percent": pct, "t_c": t_c, "p_pa": p_pa, "power_w": power_w, "dt_k": dt,
                  "flow_m3_s": power_w / (rho * cp * dt)})
dump("loads.json", {"versions": versions, "cases": loads})

# Gases: CoolProp (HEOS) density and viscosity over the working range.
# Natural gas is checked as pure methane (relative density 16.043/28.9647)
# and as a 90/7/3 methane-ethane-propane mixture.
gases = []
for name, fl, rel in [("air", "Air", None), ("nitrogen", "Nitrogen", None), ("carbon-dioxide", "CarbonDioxide", None),
                      ("natural-gas", "Methane", None),
                      ("natural-gas", "HEOS::Methane[0.9]&Ethane[0.07]&Propane[0.03]", None)]:
    molar = CP.PropsSI("M", "T", 300, "P", 101325, fl) * 1000
    for t_c in [-20.0, 0.0, 15.0, 25.0, 40.0, 80.0, 150.0]:
        for p_bar in [0.5, 1.01325, 3.0, 8.0, 13.0, 21.0, 31.0]:
            T, P = t_c + 273.15, p_bar * 1e5
            try:
                phase = CP.PhaseSI("T", T, "P", P, fl)
                if "gas" not in phase and "supercritical" not in phase:
                    continue
                rho = CP.PropsSI("D", "T", T, "P", P, fl)
                mu = CP.PropsSI("V", "T", T, "P", P, fl)
            except ValueError:
                continue
            gases.append({"gas": name, "coolprop": fl, "molar_mass": molar, "t_c": t_c, "p_pa": P,
                          "rho": rho, "mu": mu, "z": P * molar / 1000 / (rho * 8.314462618 * T)})
dump("gases.json", {"versions": versions, "points": gases})

# Steam: IF97 (iapws) and IAPWS-95 (CoolProp) at saturation and superheated.
steam = []
for p_bar in [0.2, 1.01325, 2.0, 4.5, 8.0, 11.0, 17.0, 26.0, 41.0, 61.0, 90.0]:
    P = p_bar * 1e5
    tsat = CP.PropsSI("T", "P", P, "Q", 1, "Water")
    for superheat in [None, 10.0, 60.0, 150.0, 300.0]:
        T = tsat if superheat is None else tsat + superheat
        if T - 273.15 > 600:
            continue
        # Saturated: IF97's own saturation state (its T differs from
        # IAPWS-95's by millikelvins, enough to land on the liquid side).
        if97 = IAPWS97(P=P / 1e6, x=1) if superheat is None else IAPWS97(T=T, P=P / 1e6)
        if superheat is None:
            rho_cp = CP.PropsSI("D", "P", P, "Q", 1, "Water")
            mu_cp = CP.PropsSI("V", "P", P, "Q", 1, "Water")
        else:
            rho_cp = CP.PropsSI("D", "T", T, "P", P, "Water")
            mu_cp = CP.PropsSI("V", "T", T, "P", P, "Water")
        steam.append({"p_pa": P, "t_k": T, "saturated": superheat is None, "t_sat_k": tsat,
                      "rho_if97": if97.rho, "rho_coolprop": rho_cp, "mu_coolprop": mu_cp,
                      "mu_iapws2008": _Viscosity(if97.rho, T)})
dump("steam.json", {"versions": versions, "points": steam})

# The isothermal compressible-flow equation: fluids' isothermal_gas for
# the outlet pressure, and P_isothermal_critical_flow for the choking
# outlet pressure, over a spread of inlet pressures, sizes and flows.
from fluids.compressible import isothermal_gas, P_isothermal_critical_flow
iso = []
for P1 in [1.2e5, 4e5, 8e5, 2e6]:
    for D in [0.0266, 0.0525, 0.1023, 0.2027]:
        for L in [10.0, 80.0, 400.0]:
            for fd in [0.015, 0.022, 0.03]:
                rho = P1 * 0.0289647 / (8.314462618 * 293.15)
                A = math.pi * D * D / 4
                for frac in [0.2, 0.5, 0.8, 0.95]:
                    # A flow that is a fraction of the largest the line can pass.
                    p_crit = P_isothermal_critical_flow(P=P1, fd=fd, D=D, L=L)
                    m_max = isothermal_gas(rho=rho, fd=fd, P1=P1, P2=p_crit, L=L, D=D)
                    m = frac * m_max
                    try:
                        p2 = isothermal_gas(rho=rho, fd=fd, P1=P1, L=L, D=D, m=m)
                    except Exception:
                        continue
                    iso.append({"p1": P1, "rho1": rho, "d": D, "l": L, "fd": fd, "m": m, "p2": p2,
                                "m_max": m_max, "p_crit": p_crit})
dump("isothermal.json", {"versions": versions, "cases": iso})
print("reference values written to %s (%s)" % (out, ", ".join("%s %s" % kv for kv in versions.items())))
