"""Mutation run: does the test suite catch a realistic bug in the checks, the run's
composition, the soil curves and the engine kernels?

A small driver of our own (no mutation-testing library: the ones in the registries mutate
every operator of every line, far more mutants than two shared cores can run, and none
knows which test files cover which module). Each mutant below is one textual change of
one source line, the kind of slip a person makes (a constant from the wrong table row, a
dropped factor, a sign, the wrong temperature or slip state); the driver applies one at
a time to a copy of the source tree in a temporary folder, runs the test files mapped to
the mutated module (``pytest -x -q -p no:cacheprovider``) and counts the mutant killed
(some test fails or errors, or the run times out) or survived. Not part of CI; it prints
figures and asserts nothing.

The stored-values regression test (tests/models/test_results_unchanged.py) is left out
on purpose: it fails on any change of an example's numbers, right or wrong, so it would
kill every mutant without saying which answer is right. The mutants must be caught by
tests against independent references.

    python benchmarks/mutation_run.py                 # every mutant (about 20-30 min)
    python benchmarks/mutation_run.py --only posts    # mutants whose module or label matches
    python benchmarks/mutation_run.py --list          # the mutants, no run
    python benchmarks/mutation_run.py --tests-from REV  # the test files as at git REV
                                                        # (the "before" figures)
"""
from __future__ import annotations

import argparse
import json
import os
import shutil
import subprocess
import sys
import tempfile
import time
from collections import defaultdict
from dataclasses import dataclass
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
PYTHON = os.environ.get("SPANSTAY_PYTHON", sys.executable)
TIMEOUT = 240.0  # s per mutant; a mutant that hangs the tests counts as killed


@dataclass(frozen=True)
class Mutant:
    path: str       # source file, relative to the repository root
    old: str        # text replaced (must occur exactly once in the file)
    new: str
    label: str      # what the bug is


def M(path: str, old: str, new: str, label: str) -> Mutant:
    return Mutant(path, old, new, label)


LC = "models/analysis/load_cases.py"
RC = "models/analysis/run_case.py"
RUN = "models/analysis/run.py"
LINE = "models/checks/line.py"
POSTS = "models/checks/posts.py"
LAM = "models/checks/laminated.py"
SOIL = "models/checks/soil.py"
DEFL = "models/checks/deflection.py"
ANCH = "models/checks/anchors.py"
RIDE = "models/checks/ride.py"
COLL = "models/checks/collect.py"
VERD = "models/checks/verdict.py"
CHECK = "models/checks/check.py"
NDS = "models/catalogs/nds.py"
FAST = "models/catalogs/fasteners.py"
SOILCAT = "models/catalogs/soil.py"
PY = "models/parts/py_curves.py"
CABLE = "fem/cable.py"
BEAM = "fem/beam.py"
ROT = "fem/rotation.py"
SPRING = "fem/spring.py"
LINK = "fem/link.py"
CONC = "models/checks/concrete.py"
VERT = "models/checks/vertical.py"
SLIDE = "models/checks/sliding.py"
LATCAP = "models/checks/lateral_capacity.py"

MUTANTS: list[Mutant] = [
    # --- the run's composition -----------------------------------------------------
    M(LC, "t_cold, design_slip, count, keep_states=True))", "t_inst, design_slip, count, keep_states=True))",
      "design pass at the installation temperature, not the coldest"),
    M(LC, "rider.heaviest, rider.dynamic_factor,", "rider.heaviest, 1.0,",
      "design pass without the dynamic factor"),
    M(LC, 'design_slip = "ultimate" if needs_ultimate_slip(scenario) else "service"',
      'design_slip = "service"',
      "design pass with K_ser instead of K_u"),
    M(LC, "rider.lightest, 1.0, t_inst", "rider.heaviest, 1.0, t_inst",
      "light ride pass with the heaviest rider"),
    M(LC, "rider.heaviest, 1.0, t_hot", "rider.heaviest, 1.0, t_inst",
      "hot pass at the installation temperature"),
    M(LC, "return min(temps), max(temps)", "return max(temps), min(temps)",
      "coldest and hottest swapped"),
    M(LC, "if line.name != scenario.rider.line]", "if line.name == scenario.rider.line]",
      "other lines: the rider's own line instead"),
    M(LC, "return self.rider_weight * self.rider_factor", "return self.rider_weight",
      "rider load ignores the factor"),
    M(LC, "HOT_MARGIN = 0.05", "HOT_MARGIN = 50.0", "no hot pass"),
    M(LC, "for name in [rider.line] + other_lines(scenario):", "for name in [rider.line]:",
      "no design pass on the other lines"),
    M(LC, 'a.post.kind == "laminated"', 'a.post.kind == "sawn"',
      "ultimate slip decided on the wrong post kind"),
    M(LC, "rider.heaviest, 1.0, t_inst, \"service\", count,\n                 keep_states=True",
      "rider.heaviest, 1.0, t_inst, \"ultimate\", count,\n                 keep_states=True",
      "heavy ride pass with K_u"),
    M(RC, "d_t = case.temperature - system.scenario.settings.install_temperature",
      "d_t = system.scenario.settings.install_temperature - case.temperature",
      "temperature change of the pass with the wrong sign"),
    M(RC, "start = at_temperature(system, structure.installed, d_t)",
      "start = structure.installed", "pass not brought to its temperature"),
    M(RC, "stations_s, case.rider_load,", "stations_s, case.rider_weight,",
      "pass loads the rider weight without the factor"),
    M(RC, "s1 = float(np.interp(span - stop_offset, along, s_nodes))",
      "s1 = float(np.interp(span, along, s_nodes))", "stop offset ignored"),
    M(RUN, 'install(scenario, lengths=lengths, slip="ultimate")',
      'install(scenario, lengths=lengths, slip="service")',
      "strength structure built with K_ser"),
    M(RUN, "u_system, u_installed, _ = install(scenario, lengths=lengths,",
      "u_system, u_installed, _ = install(scenario, lengths=None,",
      "strength structure cut its own cable"),
    # --- checks: line ----------------------------------------------------------------
    M(LINE, "k = int(np.argmax(t))", "k = int(np.argmin(t))", "line tension: smallest segment"),
    M(LINE, "rope.breaking_strength * eff / fos", "rope.breaking_strength / fos",
      "termination efficiency dropped"),
    M(LINE, "(spec.end, t[-1])", "(spec.end, t[0])", "end termination reads the start tension"),
    M(LINE, "float(t[k]), rope.breaking_strength / fos", "float(t[0]), rope.breaking_strength / fos",
      "line tension: first segment"),
    # --- checks: sawn and round posts -------------------------------------------------
    M(POSTS, "KE_CANTILEVER = 2.1", "KE_CANTILEVER = 2.0", "cantilever Ke 2.0 instead of 2.1"),
    M(POSTS, "le / d_eq, c=0.85)", "le / d_eq, c=0.8)", "round pole column constant c 0.8"),
    M(POSTS, "le / d2, c=0.8)", "le / d2, c=0.85)", "sawn post column constant c 0.85"),
    M(POSTS, "le / d2, c=0.8)", "le / d1, c=0.8)", "sawn CP about the strong axis"),
    M(POSTS, "fv = 1.5 * np.hypot", "fv = 1.0 * np.hypot", "rectangle shear V/A"),
    M(POSTS, "fv = 4.0 / 3.0 * np.hypot", "fv = 1.0 * np.hypot", "circle shear V/A"),
    M(POSTS, "d_eq = math.sqrt(math.pi) / 2.0 * float(np.min(dia))",
      "d_eq = float(np.min(dia))", "round column: diameter as the square's side"),
    M(POSTS, "(math.pi * dia**3 / 32.0)", "(math.pi * dia**3 / 16.0)",
      "round section modulus of a tube formula"),
    M(POSTS, "comp = ((fc / Fc) ** 2", "comp = ((fc / Fc)", "axial term not squared"),
    M(POSTS, "d1 = 1.0 - fc / FcE1", "d1 = 1.0", "no moment amplification"),
    M(POSTS, "FbE = 1.20 * Emin / (le_b * d1 / d2**2)", "FbE = 1.0 * Emin / (le_b * d1 / d2**2)",
      "FbE constant 1.0"),
    M(POSTS, 'edge["Fb_star"] * (cl.value if cl else 1.0)', 'edge["Fb_star"]', "CL dropped"),
    M(POSTS, "wet=True, flatwise=flatwise, **extra)", "wet=False, flatwise=flatwise, **extra)",
      "posts taken as dry service"),
    M(POSTS, "a = (np.where(ft > 0, ft / Ft, 0.0)", "a = (np.where(ft > 0, 0.0 * ft, 0.0)",
      "tension term dropped"),
    M(POSTS, "le_b = bending_effective_length(L, d1, \"cantilever point load\")",
      "le_b = bending_effective_length(L, d1, \"cantilever uniform\")",
      "CL with the uniform-load effective length"),
    # --- checks: laminated posts --------------------------------------------------------
    M(LAM, "KE_CANTILEVER = 2.1", "KE_CANTILEVER = 2.0", "laminated Ke 2.0"),
    M(LAM, "kf = KF_BUILT_UP.get(d.fastener.kind, 0.6)", "kf = 1.0", "built-up Kf dropped"),
    M(LAM, "fv = 1.5 * np.maximum", "fv = 1.0 * np.maximum", "ply shear V/A"),
    M(LAM, "mean = res.N.sum(axis=0) / A.sum()", "mean = res.N.sum(axis=0) / A.min()",
      "post mean stress over one ply"),
    M(LAM, "Z.Z * adj,", "Z.Z,", "fastener lateral value without its factors"),
    M(LAM, "fb_edge = np.abs(res.M_edge) / (t * w**2 / 6)",
      "fb_edge = np.abs(res.M_edge) / (t * w**2 / 4)", "ply section modulus /4"),
    M(LAM, "cp_side = column_stability_factor(e[\"Fc_star\"], Emin, le / w, c=0.8)",
      "cp_side = column_stability_factor(e[\"Fc_star\"], Emin, le / w, c=0.9)",
      "laminated column constant c 0.9"),
    # --- checks: footing in the soil ------------------------------------------------------
    M(SOIL, "TILT_LIMIT = math.radians(1.0)", "TILT_LIMIT = math.radians(2.0)", "tilt limit 2 deg"),
    M(SOIL, "IBC_DOUBLED_MOTION = 0.5 * 0.0254", "IBC_DOUBLED_MOTION = 1.0 * 0.0254",
      "doubled-bearing motion 1 inch"),
    M(SOIL, "V, M / V,", "V, M,", "IBC height: the moment instead of moment / shear"),
    M(SOIL, "constrained=fs.slab_at_grade", "constrained=False", "slab at grade ignored"),
    M(SOIL, "width=min(anchor.spec.post.outline)", "width=max(anchor.spec.post.outline)",
      "IBC square on the larger side"),
    M(SOIL, "if V > 1.0:", "if V > 1e9:", "embedment check never made"),
    M(SOIL, "return float(np.arccos(np.clip(state.rotation[node][2, 2], -1.0, 1.0)))",
      "return float(np.arcsin(np.clip(state.rotation[node][2, 2], -1.0, 1.0)))",
      "tilt by arcsin"),
    # --- checks: deflection ------------------------------------------------------------------
    M(DEFL, "DEFLECTION_RATIO = 40.0", "DEFLECTION_RATIO = 60.0", "deflection limit h/60"),
    M(DEFL, "move = float(np.hypot(*state.translation[node][:2]))",
      "move = float(abs(state.translation[node][0]))", "deflection along x only"),
    M(DEFL, "h = max(heights)", "h = min(heights)", "lowest attachment"),
    # --- checks: guys, braces, trees --------------------------------------------------------
    M(ANCH, "KE_PINNED = 1.0", "KE_PINNED = 0.8", "strut Ke 0.8"),
    M(ANCH, "C_SAWN = 0.8", "C_SAWN = 0.85", "strut column constant c 0.85"),
    M(ANCH, "return breaking_strength * efficiency / factor_of_safety",
      "return breaking_strength / factor_of_safety", "guy termination efficiency dropped"),
    M(ANCH, "fc_star * s * s + fc_perp * c * c", "fc_star * c * c + fc_perp * s * s",
      "Hankinson sin and cos swapped"),
    M(ANCH, "incline = math.asin(min(rise, 1.0))", "incline = math.acos(min(rise, 1.0))",
      "strut angle from the vertical"),
    M(ANCH, "d = min(sec.width, sec.depth)", "d = max(sec.width, sec.depth)",
      "strut buckling about the strong axis"),
    M(ANCH, '"sand": 2000.0,', '"sand": 3000.0,', "IBC sand bearing 3000 psf"),
    M(ANCH, "pulled = gs.tension > spec.anchor_capacity", "pulled = gs.tension < spec.anchor_capacity",
      "pull-out finding inverted"),
    M(ANCH, "stress = moment / (math.pi * d**3 / 32.0)", "stress = moment / (math.pi * d**3 / 16.0)",
      "tree stem section modulus"),
    M(ANCH, "n = float(np.min(member_axial_force(state, member)))",
      "n = float(np.max(member_axial_force(state, member)))", "member: least compressive force"),
    # --- checks: ride, verdict ---------------------------------------------------------------
    M(RIDE, "utilization=min_clearance / c.minimum", "utilization=c.minimum / min_clearance",
      "clearance utilization inverted"),
    M(RIDE, "worst = max(fast, key=lambda r: r.arrival_speed)",
      "worst = min(fast, key=lambda r: r.arrival_speed)", "slowest arrival governs"),
    M(RIDE, "reached = end if light.reaches_end else float(light.stop_distance)",
      "reached = end", "a rider who stops counted as arriving"),
    M(RIDE, "    if not p.complete:\n        return f\"not computed",
      "    if False:\n        return f\"not computed", "ride from an incomplete pass"),
    M(COLL, "if old is None or _util(c) > _util(old):", "if old is None or _util(c) < _util(old):",
      "best station kept instead of the worst"),
    M(COLL, 'if case.purpose != "strength" or not p.states:',
      'if case.purpose != "ride" or not p.states:', "checks from the ride passes"),
    M(COLL, "        if not p.complete:\n            verdict.incomplete",
      "        if False:\n            verdict.incomplete", "incomplete pass not recorded"),
    M(VERD, 'return "fail" if self.failed else "pass"', 'return "pass"', "a failed check passes"),
    M(VERD, '"fail": 3,', '"fail": 0,', "exit status 0 on failure"),
    M(CHECK, "self.passed = bool(self.utilization <= 1.0)",
      "self.passed = bool(self.utilization <= 1.05)", "5 % over capacity passes"),
    M(CHECK, "else (0.0 if self.demand <= 0 else math.inf))", "else 0.0)",
      "zero capacity passes"),
    # --- checks added with the ground work (issue 13) ----------------------------------
    M(CONC, "PHI_PLAIN = 0.60", "PHI_PLAIN = 0.65", "plain concrete phi 0.65"),
    M(CONC, "PHI_SHEAR = 0.75", "PHI_SHEAR = 0.85", "shear phi 0.85"),
    M(CONC, "PLAIN_CAST_AGAINST_SOIL = 2 * IN", "PLAIN_CAST_AGAINST_SOIL = 0 * IN",
      "plain pier cast against soil at full size"),
    M(CONC, "mn = 5.0 * root * sm", "mn = 7.5 * root * sm", "plain flexure 7.5 sqrt(f'c)"),
    M(CONC, "vn = 4.0 / 3.0 * root", "vn = 2.0 * root", "plain shear 2 sqrt(f'c)"),
    M(CONC, "0.85 - 0.05 * (f - 4000.0) / 1000.0", "0.85 - 0.025 * (f - 4000.0) / 1000.0",
      "beta1 slope halved"),
    M(CONC, "return 0.85 * fc * area, ybar, steel, strain", "return 1.0 * fc * area, ybar, steel, strain",
      "stress block 1.0 f'c"),
    M(CONC, "vc = min(8.0 * size", "vc = min(2.0 * size", "reinforced shear 2 lambda_s"),
    M(VERT, "delta = ph if cast else 2.0 / 3.0 * ph", "delta = ph", "interface friction of cast = driven"),
    M(VERT, "f = np.where(use_sand, (1.0 - np.sin(ph)) * sv", "f = np.where(use_sand, (1.0 + np.sin(ph)) * sv",
      "K0 with the wrong sign of sin phi"),
    M(VERT, "np.where(psi <= 1.0, 0.5 * psi**-0.5, 0.5 * psi**-0.25)",
      "np.where(psi <= 1.0, 0.5 * psi**-0.25, 0.5 * psi**-0.5)", "API alpha exponents swapped"),
    M(VERT, "CONCRETE_UNIT_WEIGHT = 23.6e3", "CONCRETE_UNIT_WEIGHT = 20.0e3", "concrete 127 pcf"),
    M(VERT, "float(state.reactions[placed.toe_node, 2])", "float(-state.reactions[placed.toe_node, 2])",
      "toe reaction sign"),
    M(SLIDE, "passive = 0.5 * IBC_LATERAL_BEARING_PSF_PER_FT", "passive = 1.0 * IBC_LATERAL_BEARING_PSF_PER_FT",
      "passive triangle doubled"),
    M(SLIDE, "return max(horizontal, 0.0), (base + passive) / factor_of_safety",
      "return max(horizontal, 0.0), (base + passive)", "sliding without its factor of safety"),
    M(LATCAP, "ultimate / factor_of_safety, \"force\"", "ultimate, \"force\"",
      "lateral capacity without its factor of safety"),
    M(LATCAP, "e = max(moment / shear, 0.0) if shear > 0 else 0.0", "e = 0.0",
      "pushover load at grade"),
    # --- NDS and fastener catalogs -----------------------------------------------------------
    M(NDS, "return 0.822 * Emin_adj / le_over_d**2", "return 0.85 * Emin_adj / le_over_d**2",
      "FcE constant 0.85"),
    M(NDS, "return h - math.sqrt(max(h * h - ratio / c, 0.0))",
      "return h - math.sqrt(max(h * h - ratio * c, 0.0))", "stability curve ratio x c"),
    M(NDS, "_stability(FbE / Fb_star, 0.95)", "_stability(FbE / Fb_star, 0.9)", "CL constant 0.9"),
    M(NDS, "fc = 1.0 if ref.Fc * CF_Fc <= 750 * PSI else 0.8",
      "fc = 1.0 if ref.Fc * CF_Fc <= 750 * PSI else 0.9", "wet service Fc 0.9"),
    M(NDS, "fb = 1.0 if ref.Fb * CF_Fb <= 1150 * PSI else 0.85",
      "fb = 1.0 if ref.Fb * CF_Fb <= 1150 * PSI else 1.0", "wet service Fb dropped"),
    M(NDS, '"permanent": 0.9,', '"permanent": 1.0,', "permanent CD 1.0"),
    M(NDS, '"cantilever point load": ((1.87, 0.0), (1.44, 3.0)),',
      '"cantilever point load": ((1.87, 0.0), (1.87, 0.0)),', "Table 3.3.3 second row lost"),
    M(NDS, "RB = math.sqrt(le * d / b**2)", "RB = math.sqrt(le * d / d**2)", "RB with d^2"),
    M(NDS, 'return Factor("CP", "column stability", Kf * _stability(FcE / Fc_star, c)',
      'return Factor("CP", "column stability", _stability(FcE / Fc_star, c)', "Kf dropped"),
    M(FAST, "k = rho_mean**1.5 * d_mm**0.8 / 30.0", "k = rho_mean**1.5 * d_mm**0.8 / 25.0",
      "EC5 nail slip / 25"),
    M(FAST, "k = rho_mean**1.5 * d_mm / 23.0", "k = rho_mean**1.5 * d_mm / 25.0",
      "EC5 predrilled slip / 25"),
    M(FAST, "return 2.0 / 3.0 * slip_modulus_ser(f, rho_mean)",
      "return 1.0 * slip_modulus_ser(f, rho_mean)", "K_u = K_ser"),
    M(FAST, "k = rho_mean**1.5 * d_mm**0.8 / 30.0", "k = rho_mean**1.25 * d_mm**0.8 / 30.0",
      "EC5 nail slip density exponent"),
    # --- soil curves and the soil catalog ---------------------------------------------------
    M(PY, "else np.maximum(3.0 - 0.8 * self.depth / self.width, 0.9))",
      "else np.maximum(3.0 - 0.9 * self.depth / self.width, 0.9))", "API A slope 0.9"),
    M(PY, "else np.maximum(3.0 - 0.8 * self.depth / self.width, 0.9))",
      "else np.maximum(3.0 - 0.8 * self.depth / self.width, 0.8))", "API A floor 0.8"),
    M(PY, "self.factor_a = (np.full(self.n, 0.9) if cyclic", "self.factor_a = (np.full(self.n, 1.0) if cyclic",
      "API cyclic A 1.0"),
    M(PY, "self.initial_slope = self.k_initial * self.depth", "self.initial_slope = self.k_initial * self.width",
      "API initial slope k D"),
    M(PY, "self.y50 = 2.5 * self.eps50 * self.width", "self.y50 = 2.0 * self.eps50 * self.width",
      "Matlock y50 2.0"),
    M(PY, "9.0 * c * D)", "8.0 * c * D)", "Matlock deep limit 8 c D"),
    M(PY, "p = np.where(r < rt, k_lin * a, np.where(r < 8.0, p_cube, pu))",
      "p = np.where(r < rt, k_lin * a, np.where(r < 4.0, p_cube, pu))", "Matlock plateau at 4 y50"),
    M(PY, "return 3.0 * passive_coefficient(friction_angle_deg)",
      "return 2.0 * passive_coefficient(friction_angle_deg)", "Broms 2 Kp"),
    M(PY, "K0_API = 0.4", "K0_API = 0.5", "API K0 0.5"),
    M(PY, "c2 = kp - ka", "c2 = kp", "API C2 without Ka"),
    M(PY, "return np.minimum((c1 * z + c2 * D) * sv, c3 * D * sv)",
      "return np.maximum((c1 * z + c2 * D) * sv, c3 * D * sv)", "API p_u max instead of min"),
    M(PY, "elastic = es * a < pu", "elastic = es * a < 2.0 * pu", "elastic-plastic cap doubled"),
    M(SOILCAT, "gamma = np.where(mid > self.water_table, gamma - WATER_UNIT_WEIGHT, gamma)",
      "gamma = np.where(mid > self.water_table, gamma, gamma)", "water table ignored"),
    M(SOILCAT, "LB_PER_IN3 = 271_447.1", "LB_PER_IN3 = 27_144.71", "lb/in^3 conversion off by 10"),
    M(SOILCAT, "kind=\"sand\", unit_weight=18.5e3, friction_angle_deg=33.0",
      "kind=\"sand\", unit_weight=18.5e3, friction_angle_deg=30.0", "medium sand preset phi 30"),
    # --- engine kernels ------------------------------------------------------------------------
    M(CABLE, "return self.L0 * (1.0 + self.alpha * self.dT)", "return self.L0 * (1.0 - self.alpha * self.dT)",
      "cable thermal strain sign"),
    M(CABLE, "\n        t = np.maximum(self.EA * (length - lf) / lf, 0.0)",
      "\n        t = np.maximum(self.EA * (length - lf) / length, 0.0)", "cable strain on the stretched length"),
    M(CABLE, "half = 0.5 * self.weight * self.L0", "half = self.weight * self.L0", "cable weight doubled"),
    M(CABLE, "k_tr = np.maximum(t, k_reg * length) / length", "k_tr = np.maximum(t, k_reg * length) / lf",
      "cable geometric stiffness on L0 (tangent only)"),
    M(CABLE, "f = np.concatenate([-t[:, None] * e, t[:, None] * e], axis=1)",
      "f = np.concatenate([t[:, None] * e, t[:, None] * e], axis=1)", "cable end force sign"),
    M(BEAM, "wr[:, 0, :] = (ql1 / ql2)[:, None] * wr[:, 1, :]",
      "wr[:, 0, :] = -(ql1 / ql2)[:, None] * wr[:, 1, :]", "torsional spin term sign"),
    M(BEAM, "c12 = cross3(t12[:, :, :, 1], e3[None]) / (2.0 * ql2[None, :, None])",
      "c12 = cross3(t12[:, :, :, 1], e3[None]) / (ql2[None, :, None])", "torsional spin halving lost"),
    M(BEAM, "phi = np.zeros_like(L) if shear_area is None else 12.0 * ei / (G * shear_area * L**2)",
      "phi = np.zeros_like(L) if shear_area is None else 6.0 * ei / (G * shear_area * L**2)",
      "shear parameter 6 instead of 12"),
    M(BEAM, "d = (2.0 - phi) * ei / (L * (1 + phi))", "d = (2.0 + phi) * ei / (L * (1 + phi))",
      "Timoshenko carry-over sign"),
    M(BEAM, "(1.0 / 3.0 - 0.21 * c / a", "(1.0 / 3.0 - 0.25 * c / a", "rectangle torsion constant"),
    M(BEAM, "return BeamSection(E, G, area, i, i, 2.0 * i,", "return BeamSection(E, G, area, i, i, i,",
      "circle J = I"),
    M(BEAM, "half = 0.5 * self.weight * self.L0", "half = self.weight * self.L0", "beam weight doubled"),
    M(BEAM, "elong = (2.0 * np.einsum(", "elong = (1.0 * np.einsum(", "beam elongation halved"),
    M(BEAM, "f[:, 0:3], f[:, 6:9] = -n_ax[:, None] * e1, n_ax[:, None] * e1",
      "f[:, 0:3], f[:, 6:9] = n_ax[:, None] * e1, -n_ax[:, None] * e1", "beam axial force sign"),
    M(ROT, "return eye - 0.5 * s + eta[..., None, None] * (s @ s)",
      "return eye + 0.5 * s + eta[..., None, None] * (s @ s)", "inverse tangent sign"),
    M(ROT, "b = np.where(small, 0.5 - t2 / 24.0 + t2 * t2 / 720.0, (1.0 - np.cos(ts)) / ts**2)",
      "b = np.where(small, 0.5 - t2 / 24.0 + t2 * t2 / 720.0, (1.0 - np.cos(ts)) / ts)",
      "exponential map second coefficient"),
    M(SPRING, "return (self.side == 0) | (self.side * u > 0)", "return (self.side == 0) | (self.side * u < 0)",
      "one-sided spring resists the wrong way"),
    M(LINK, "out[:, 9:12] = m + cross3(a2, f)", "out[:, 9:12] = m - cross3(a2, f)",
      "link offset moment sign"),
    M(LINK, "f_loc = k[:, :3] * slip", "f_loc = 0.5 * k[:, :3] * slip", "link stiffness halved"),
]

ENGINE_TESTS = ["tests/reference/test_engine_beams.py", "tests/reference/test_engine_cables.py",
                "tests/reference/test_engine_links.py", "tests/reference/test_engine_balance.py",
                "tests/reference/test_engine_foundation.py", "tests/reference/test_line_statics.py",
                "tests/fem/test_fem_tangents.py", "tests/reference/test_engine_beam_torsion.py",
                "tests/reference/test_engine_self_weight.py",
                "tests/reference/test_run_composition.py"]
COMPOSITION_TESTS = ["tests/reference/test_run_composition.py", "tests/models/test_run_laminated_slip.py",
                     "tests/models/test_run_two_lines.py", "tests/models/test_run_end_to_end.py"]
POST_TESTS = ["tests/reference/test_post_column.py", "tests/reference/test_checks_post.py",
              "tests/models/test_checks.py", "tests/reference/test_timber_nds.py",
              "tests/reference/test_deflection_check.py"]
SOIL_TESTS = ["tests/reference/test_soil_api_sand.py", "tests/reference/test_soil_api_factor.py",
              "tests/reference/test_soil_matlock_curve.py",
              "tests/reference/test_soil_matlock.py",
              "tests/models/test_soil_curves.py", "tests/models/test_soil_profile.py",
              "tests/reference/test_footing_broms.py", "tests/reference/test_footing_winkler.py",
              "tests/reference/test_footing_statics.py", "tests/reference/test_footing_pushover.py",
              "tests/reference/test_footing_pier.py"]
#: test files run for a mutant of each module (a file missing in the tree is skipped)
TESTS: dict[str, list[str]] = {
    LC: COMPOSITION_TESTS, RC: COMPOSITION_TESTS, RUN: COMPOSITION_TESTS,
    LINE: ["tests/reference/test_checks_post.py", "tests/reference/test_run_composition.py",
           "tests/models/test_checks.py"],
    POSTS: POST_TESTS, DEFL: POST_TESTS,
    LAM: ["tests/reference/test_laminated_checks.py", "tests/models/test_checks.py",
          "tests/reference/test_post_column.py"],
    SOIL: ["tests/reference/test_checks_ibc.py", "tests/reference/test_checks_ibc_shapes.py",
           "tests/models/test_verdict.py",
           "tests/reference/test_footing_statics.py", "tests/models/test_checks.py"],
    ANCH: ["tests/reference/test_guy_checks.py", "tests/reference/test_brace_checks.py",
           "tests/reference/test_anchor_parts_checks.py",
           "tests/models/test_checks_hbrace.py", "tests/models/test_tree_anchor.py",
           "tests/reference/test_post_column.py"],
    RIDE: ["tests/models/test_ride_checks.py", "tests/models/test_verdict.py",
           "tests/models/test_ride.py", "tests/models/test_checks.py"],
    COLL: ["tests/models/test_verdict.py", "tests/models/test_checks.py",
           "tests/models/test_run_two_lines.py"],
    VERD: ["tests/models/test_verdict.py", "tests/models/test_checks.py"],
    CHECK: ["tests/models/test_checks.py", "tests/models/test_verdict.py"],
    NDS: ["tests/reference/test_timber_nds.py", "tests/reference/test_checks_post.py",
          "tests/reference/test_post_column.py", "tests/reference/test_laminated_checks.py"],
    FAST: ["tests/reference/test_timber_slip.py", "tests/reference/test_laminated_reference.py",
           "tests/reference/test_run_composition.py", "tests/models/test_run_laminated_slip.py"],
    PY: SOIL_TESTS, SOILCAT: SOIL_TESTS,
    CABLE: ENGINE_TESTS, BEAM: ENGINE_TESTS, ROT: ENGINE_TESTS, SPRING: ENGINE_TESTS,
    LINK: ENGINE_TESTS,
    CONC: ["tests/reference/test_pier_concrete.py"],
    VERT: ["tests/reference/test_vertical_checks.py"],
    SLIDE: ["tests/reference/test_sliding_check.py"],
    LATCAP: ["tests/reference/test_lateral_capacity_check.py"],
}
IGNORE = shutil.ignore_patterns(".git", ".venv", "__pycache__", "*_results", ".*.spanstay-*",
                                "*.egg-info", "build", "dist")


def copy_tree(dest: Path, tests_from: str | None) -> None:
    """The worktree's sources into ``dest``; with ``tests_from`` the tests/ folder as at
    that git revision (to measure the suite before new tests)."""
    shutil.copytree(ROOT, dest, ignore=IGNORE, dirs_exist_ok=True)
    if tests_from:
        shutil.rmtree(dest / "tests")
        archive = subprocess.run(["git", "-C", str(ROOT), "archive", tests_from, "tests"],
                                 check=True, capture_output=True).stdout
        subprocess.run(["tar", "-x", "-C", str(dest)], input=archive, check=True)


def run_tests(tree: Path, files: list[str]) -> tuple[str, float]:
    """'pass', 'fail' or 'timeout' of the test files in ``tree``, and the time taken."""
    env = dict(os.environ, PYTHONDONTWRITEBYTECODE="1", OPENBLAS_NUM_THREADS="1",
               OMP_NUM_THREADS="1", MPLBACKEND="Agg")
    env.pop("SPANSTAY_TEST_WRITE_DELAY", None)
    t0 = time.perf_counter()
    try:
        done = subprocess.run([PYTHON, "-m", "pytest", "-x", "-q", "-p", "no:cacheprovider", *files],
                              cwd=tree, env=env, capture_output=True, timeout=TIMEOUT)
    except subprocess.TimeoutExpired:
        return "timeout", time.perf_counter() - t0
    return ("pass" if done.returncode == 0 else "fail"), time.perf_counter() - t0


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--only", help="run only mutants whose module path or label holds this text")
    ap.add_argument("--list", action="store_true", help="list the mutants and exit")
    ap.add_argument("--tests-from", help="git revision whose tests/ folder to use")
    ap.add_argument("--json", help="write the outcome of every mutant to this file")
    args = ap.parse_args(argv)
    mutants = [m for m in MUTANTS if not args.only or args.only in m.path or args.only in m.label]
    for m in mutants:
        text = (ROOT / m.path).read_text()
        if text.count(m.old) != 1:
            print(f"mutant text found {text.count(m.old)} times in {m.path}: {m.old!r}")
            return 2
    if args.list:
        for i, m in enumerate(mutants, 1):
            print(f"{i:3d} {m.path}: {m.label}")
        return 0
    outcomes = []
    with tempfile.TemporaryDirectory(prefix="spanstay-mutants-") as tmp:
        tree = Path(tmp) / "tree"
        copy_tree(tree, args.tests_from)
        where = subprocess.run([PYTHON, "-c", "import spanstay.fem as f; print(f.__file__)"],
                               cwd=tree, capture_output=True, text=True).stdout.strip()
        if not where.startswith(str(tree)):
            print(f"the copy imports spanstay from {where!r}, not from the copy: stopped")
            return 2
        baseline = {}
        for path in sorted({m.path for m in mutants}):
            files = [f for f in TESTS[path] if (tree / f).exists()]
            status, secs = run_tests(tree, files)
            baseline[path] = files
            print(f"baseline {path}: {len(files)} test files, {status} in {secs:.0f} s", flush=True)
            if status != "pass":
                print("the unmutated tests do not pass: stopped")
                return 2
        for i, m in enumerate(mutants, 1):
            target = tree / m.path
            original = target.read_text()
            target.write_text(original.replace(m.old, m.new))
            try:
                status, secs = run_tests(tree, baseline[m.path])
            finally:
                target.write_text(original)
            result = "survived" if status == "pass" else ("killed (timeout)" if status == "timeout"
                                                          else "killed")
            outcomes.append({"module": m.path, "label": m.label, "result": result,
                             "seconds": round(secs, 1)})
            print(f"{i:3d}/{len(mutants)} {result:16s} {secs:5.0f} s  {m.path}: {m.label}",
                  flush=True)
    per = defaultdict(lambda: [0, 0])
    for o in outcomes:
        per[o["module"]][0] += 1
        per[o["module"]][1] += o["result"] == "survived"
    print("\nmodule                              mutants  killed  survived")
    for path in sorted(per):
        n, s = per[path]
        print(f"{path:36s} {n:6d} {n - s:7d} {s:9d}")
    total = len(outcomes)
    survived = [o for o in outcomes if o["result"] == "survived"]
    print(f"{'all':36s} {total:6d} {total - len(survived):7d} {len(survived):9d}"
          f"   ({100.0 * len(survived) / max(total, 1):.1f} % survived)")
    for o in survived:
        print(f"  survived: {o['module']}: {o['label']}")
    if args.json:
        Path(args.json).write_text(json.dumps(outcomes, indent=1))
    return 0


if __name__ == "__main__":
    sys.exit(main())
