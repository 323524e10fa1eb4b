#!/usr/bin/python3
r"""Independent small-perturbation model of airframe plus free elevator, checked against floatpitch.

floatpitch's own linear model is a central-difference Jacobian of its nonlinear equations; the
SciPy check in scipy_check.py only re-solves that matrix. This script builds a second linear model
from the textbook small-perturbation equations, reading nothing from floatpitch but the scenario's
parameters (the TOML files, parsed here with tomllib, units converted here) and the trim point
(`floatpitch trim --json`, hands-off case: trim is the input of a linearisation, not what is
tested). It then compares, stick free:

  1. its eigenvalues with the free roots of `floatpitch modes --json`;
  2. its response to a small pilot force pulse on the free stick (scipy.signal.lsim) with
     floatpitch's nonlinear run (`floatpitch run --controls free`): angle of attack, pitch rate
     and elevator angle;
  3. the same for an elevator with a large static mass moment (tests/data/
     free_linear_unbalanced.toml, and free_linear_lag.toml with a first-order downwash lag), and
     shows that the same model with the mass-balance coupling of the hinge equation dropped or
     of the wrong sign, or without the elevator's reaction on the airframe, fails both
     comparisons (so a wrong sign or a missing term of that coupling in floatpitch is caught).

Usage: scipy_free_model.py FLOATPITCH SCENARIO.toml... WORKDIR [--coupling=K] [--no-reaction]
  --coupling=0 (drop) or --coupling=-1 (flip the sign of) the mass-balance terms of the
  reference's hinge equation everywhere: self-tests that the checks can fail (the script must
  then exit 1); --no-reaction drops the elevator's reaction on the airframe from the reference
  (measures that neglect). Exit 77 (CTest: skipped) when SciPy is missing.

Equations (stability axes x_s along the trim velocity, z_s down, level trim, gamma_0 = 0;
perturbations u, w, q, theta, h, delta_e, delta_e_dot; angles in rad)
----------------------------------------------------------------------------------------------
Airframe, small-perturbation longitudinal equations (Etkin and Reid, Dynamics of Flight:
Stability and Control, 3rd ed., ch. 4, eqs. 4.9,18 from memory; Nelson, Flight Stability and
Automatic Control, 2nd ed., sec. 3.4), with the elevator's inertial reaction added:

    m u'                                  = dX - m g theta
    m (w' - V q)          + S_e delta''   = dZ
    I_y q'  + (I_h + S_e l_h) delta''     = dM
    theta' = q,      h' = V theta - w

Elevator (one degree of freedom about the hinge, relative to the airframe: its inertial angle
is theta + delta_e, delta_e positive trailing edge down). Moments about the moving hinge point
(Meriam and Kraige, Engineering Mechanics: Dynamics, plane kinetics of rigid bodies, moment about
an accelerating point, from memory); the free-control equations with this inertial coupling are
derived in Etkin, Dynamics of Atmospheric Flight (Wiley, 1972), sec. 11.3 (the section Etkin and
Reid point to for them; its eqs. 11.3,14-15 on the elevator's mass balance):

    (I_h + I_c) delta'' + I_h q' + S_e a_zH = dH_aero + dH_circuit + dH_gravity - F/G
    a_zH = (w' - V q) + l_h q'      (normal acceleration of the hinge, down positive)

The S_e a_zH term is the mass-balance ("weight moment") coupling of Jones and Cohen, An analysis
of the stability of an airplane with free controls, NACA Report 709 (1941; number from memory):
an elevator whose centre of mass lies aft of the hinge (S_e > 0) is left behind, trailing edge
up, when the hinge is accelerated downward. The same S_e and I_h + S_e l_h products appear in
the airframe's Z and M rows (the two bodies' mass matrix is symmetric: the cross terms of their
kinetic energy). The reference keeps this reaction; --no-reaction drops it, to measure its size.
I_h = elevator inertia about the hinge, S_e = its static mass moment (aft positive), I_c =
m_stick / G^2 the circuit referred to the hinge, l_h = hinge aft of the CG, G = gearing.

Aerodynamics (component build-up: Etkin and Reid ch. 2-3 and 5, Nelson ch. 2-3; every surface
sees the local flow at its aerodynamic centre, including the pitch-rate term):
    dalpha_w  = w/V - q x_w/V            (wing-body a.c. x_w ahead of the CG)
    dalpha_tl = w/V + q l_t/V            (local flow angle at the tail a.c., l_t aft of the CG)
    dalpha_t  = dalpha_tl - d eps,   d eps = (d eps/d alpha) dalpha_w  (quasi-steady downwash), or
              with a first-order lag:  tau_eps d eps' = (d eps/d alpha) dalpha_w - d eps,
              tau_eps = l_wt / V, l_wt the wing-to-tail a.c. distance: the time the downwash
              takes to reach the tail (Etkin and Reid sec. 5.5 on the alpha-dot derivatives,
              section number from memory); one first-order stage is the model chosen here
    dCL_w = a dalpha_w,  dCL_t = a_t (dalpha_t + tau delta_e),  dCD = 2 k CL_w0 dCL_w
    dqbar = rho V u + (V^2/2) (d rho/dh) h          (ISA troposphere density gradient)
    dL_w = dqbar S CL_w0 + qbar S dCL_w,   dD = dqbar S CD_0 + qbar S dCD
    dL_t = eta (dqbar S_t CL_t0 + qbar S_t dCL_t)
    dX = L_w0 dalpha_w - dD + L_t0 dalpha_tl        (lift perpendicular to the local flow)
    dZ = -dL_w - D_0 dalpha_w - dL_t
    dM = x_w (dL_w + D_0 dalpha_w) - l_t dL_t + dqbar S c Cm_wb0
         + qbar S c (Cm_alpha,fus dalpha_w + Cm_q q c/(2V)) - S_e g sin(theta_0 + delta_0) delta_e
Hinge moment (Etkin and Reid sec. 2.5, section number from memory; Jones and Cohen):
    Ch = Ch_0 + Ch_alpha alpha_t + Ch_delta delta_e + Ch_tab delta_tab + Ch_ddot delta_e' c_e/(2V)
    dH_aero = eta (dqbar S_e c_e Ch_trim + qbar S_e c_e dCh)
    dH_circuit = -(c_stick delta_e' + k_centering delta_e) / G^2
    dH_gravity = -S_e g sin(theta_0 + delta_0) (theta + delta_e)
Thrust is constant (speed and density exponents 0, line through the CG): no perturbation.

Terms neglected, with their size (all relative to the terms kept; evaluated and printed at run):
  * rotation of the geometry by the trim angle alpha_0 between body and stability axes (the arms
    x_w, l_t, l_h taken along x_s): relative 1 - cos(alpha_0) ~ alpha_0^2/2, and vertical arms
    l sin(alpha_0) acting on the drag and on tail-lift changes with speed (L_t0 small);
  * the elevator's trim deflection in the mass terms (its centre of mass at x_e cos(delta_0)
    behind and x_e sin(delta_0) below the hinge): relative delta_0^2/2, and S_e sin(delta_0) u';
  * geopotential against geometric altitude in the density gradient: relative 2 h / R_earth;
  * second-order terms (centripetal q^2 r, Coriolis of the elevator's own motion).

Comparisons and their tolerances (reasons printed beside the figures when run):
  * roots: relative error <= 10 x the neglected-term bound above, at least 1e-4 (trim
    convergence and floatpitch's central-difference Jacobian); the slow height root is measured
    against the phugoid's magnitude;
  * response: floatpitch flies the pulse and the reversed pulse; their half difference (the odd
    part: no second-order term) is compared with lsim of the reference, within 10 eps^2 (third-
    order terms, eps the perturbation size) plus the root tolerance carried into a time response
    (tol / (e zeta) for the worst mode, at most tol |lambda| T over the run T).
"""
import csv
import json
import math
import os
import subprocess
import sys

try:
    import numpy as np
    from scipy import linalg, signal
except ImportError:
    print("SKIPPED: python3-scipy is not installed (apt-get install python3-scipy)")
    sys.exit(77)
try:
    import tomllib
except ImportError:  # Python < 3.11
    print("SKIPPED: this Python has no tomllib (Python 3.11 or later needed)")
    sys.exit(77)

G0 = 9.80665  # standard gravity [m/s^2]

# ---------------------------------------------------------------------------------------------
# Scenario files: include chain and units (written here from the published unit definitions:
# 1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lb = 0.45359237 kg, 1 lbf = 4.4482216152605 N,
# 1 kt = 1852/3600 m/s; NIST SP 811).
# ---------------------------------------------------------------------------------------------
FT, IN, LB, LBF, KT = 0.3048, 0.0254, 0.45359237, 4.4482216152605, 1852.0 / 3600.0
DEG = math.pi / 180.0
UNITS = {
    "": 1.0, "%": 0.01, "m": 1.0, "cm": 0.01, "mm": 1e-3, "km": 1e3, "ft": FT, "in": IN,
    "nmi": 1852.0, "m2": 1.0, "cm2": 1e-4, "ft2": FT * FT, "in2": IN * IN, "kg": 1.0, "g": 1e-3,
    "lb": LB, "slug": LBF / FT, "N": 1.0, "kN": 1e3, "daN": 10.0, "kgf": G0, "lbf": LBF,
    "m/s": 1.0, "kt": KT, "km/h": 1 / 3.6, "mph": 1609.344 / 3600, "ft/s": FT, "fpm": FT / 60,
    "rad": 1.0, "deg": DEG, "/rad": 1.0, "/deg": 1 / DEG, "rad/s": 1.0, "deg/s": DEG, "s": 1.0,
    "ms": 1e-3, "min": 60.0, "kg m2": 1.0, "slug ft2": LBF / FT * FT * FT, "lb ft2": LB * FT * FT,
    "lb in2": LB * IN * IN, "kg m": 1.0, "lb in": LB * IN, "lb ft": LB * FT, "g cm": 1e-5,
    "N/m": 1.0, "N/mm": 1e3, "lbf/in": LBF / IN, "N s/m": 1.0, "lbf s/in": LBF / IN,
    "N m/rad": 1.0, "N m/deg": 1 / DEG, "N m s/rad": 1.0, "rad/m": 1.0, "deg/m": DEG,
    "deg/cm": DEG / 0.01, "deg/in": DEG / IN,
}


def si(v):
    """A scenario value in SI: a number, or a string "<number> <unit>"."""
    if isinstance(v, bool):
        raise ValueError(f"expected a number, got {v!r}")
    if isinstance(v, (int, float)):
        return float(v)
    num, _, unit = v.strip().partition(" ")
    return float(num) * UNITS[unit.strip()]


def merge(base, over):
    out = dict(base)
    for k, v in over.items():
        out[k] = merge(out[k], v) if isinstance(v, dict) and isinstance(out.get(k), dict) else v
    return out


def load(path):
    with open(path, "rb") as f:
        d = tomllib.load(f)
    inc = d.pop("include", None)
    if inc is not None:
        d = merge(load(os.path.join(os.path.dirname(path), inc)), d)
    return d


# defaults of the keys this model uses that a scenario may leave out (README's scenario reference)
DEFAULTS = {
    "wing": {"cd0": 0.03, "k_induced": 0.05, "h_ac": 0.25, "z_ac": 0.0, "cm_ac": -0.05,
             "cm_alpha_fus": 0.0, "cm_q": -3.0, "lift_slope": 5.0, "alpha_zero": 0.0},
    "tail": {"eta": 0.9, "deps_dalpha": 0.4, "eps0": 0.0, "tau_elevator": 0.5, "tau_tab": 0.1,
             "lift_slope": 5.0, "incidence": -0.02, "downwash_lag": "chain"},
    "elevator": {"ch0": 0.0, "ch_alpha": -0.2, "ch_delta": -0.45, "ch_tab": -0.3, "ch_rate": -0.5},
    "circuit": {"gearing": 1.2, "stick_mass": 1.0, "damping": 0.0, "friction": 0.0, "centering": 0.0,
                "downspring": 0.0, "bobweight": 0.0, "geared_tab_ratio": 0.0, "held_stiffness": 0.0},
    "propulsion": {"density_exponent": 1.0, "speed_exponent": 0.0, "z_thrust": 0.0, "angle": 0.0},
    "condition": {"flight_path": 0.0},
}


class Params:
    def __init__(self, d):
        self.d = merge(DEFAULTS, d)

    def __call__(self, table, key):
        v = self.d[table][key]
        return v if isinstance(v, str) and key in ("downwash_lag",) else si(v)


def preconditions(P):
    """The assumptions the linear model is written under; a scenario breaking one is refused."""
    need = [
        (P("tail", "downwash_lag") in ("none", "first_order"),
         "tail.downwash_lag = \"none\" or \"first_order\" (quasi-steady or one first-order stage)"),
        (P("circuit", "friction") == 0.0, "circuit.friction = 0 (no Coulomb friction)"),
        (P("circuit", "bobweight") == 0.0, "circuit.bobweight = 0"),
        (P("circuit", "geared_tab_ratio") == 0.0, "circuit.geared_tab_ratio = 0"),
        (P("propulsion", "speed_exponent") == 0.0, "propulsion.speed_exponent = 0 (thrust independent of speed)"),
        (P("propulsion", "density_exponent") == 0.0, "propulsion.density_exponent = 0 (thrust independent of altitude)"),
        (P("propulsion", "z_thrust") == 0.0 and P("propulsion", "angle") == 0.0, "thrust line through the CG along body x"),
        (P("wing", "z_ac") == 0.0 and P("tail", "z_ac") == 0.0 and P("elevator", "z_hinge") == 0.0, "no vertical offsets"),
        (P("condition", "flight_path") == 0.0, "level trim"),
        (P("circuit", "held_stiffness") == 0.0, "circuit.held_stiffness = 0"),
    ]
    bad = [what for ok, what in need if not ok]
    if bad:
        sys.exit("scenario outside this model's assumptions: needs " + "; ".join(bad))


def isa_density(h):
    """ISA troposphere (ICAO Doc 7488): density and its altitude derivative [kg/m^3, kg/m^4]."""
    T0, L, R, rho0 = 288.15, 0.0065, 287.05287, 1.225
    T = T0 - L * h
    n = G0 / (R * L) - 1.0
    rho = rho0 * (T / T0) ** n
    return rho, -rho * n * L / T


# ---------------------------------------------------------------------------------------------
# The linear model: E x' = A x + B F, x = [u, w, q, theta, h, delta_e, delta_e_dot], F = pilot
# force on the stick (pull positive) [N].
# ---------------------------------------------------------------------------------------------
NAMES = ["u", "w", "q", "theta", "h", "delta_e", "delta_e_dot", "eps"]
U, W, Q, TH, H, DE, DED, EPS = range(8)


def linear_model(P, trim, coupling=1.0, reaction=True):
    """coupling: factor on the S_e (mass-balance) terms of the hinge equation (1 as derived; 0
    drops them, -1 flips their sign: both are the self-tests); reaction: the elevator's inertial
    reaction on the airframe (the S_e and I_h + S_e l_h terms of the Z and M rows) kept or not."""
    V = trim["airspeed_mps"]
    alt = trim["altitude_m"]
    a0 = math.radians(trim["alpha_deg"])
    th0 = math.radians(trim["theta_deg"])
    de0 = math.radians(trim["elevator_deg"])
    tab0 = math.radians(trim["tab_deg"])
    rho, drho = isa_density(alt)
    qbar = 0.5 * rho * V * V

    S, c = P("wing", "area"), P("wing", "mac")
    a_w, al0 = P("wing", "lift_slope"), P("wing", "alpha_zero")
    cd0, k = P("wing", "cd0"), P("wing", "k_induced")
    x_cg = P("mass", "cg") * c
    x_w = x_cg - P("wing", "h_ac") * c                 # wing-body a.c. ahead of the CG
    l_t = P("tail", "x_ac") - x_cg                     # tail a.c. aft of the CG
    l_h = P("elevator", "x_hinge") - x_cg              # hinge aft of the CG
    S_t, a_t, eta = P("tail", "area"), P("tail", "lift_slope"), P("tail", "eta")
    i_t, eps0, eps_a = P("tail", "incidence"), P("tail", "eps0"), P("tail", "deps_dalpha")
    tau, tau_tab = P("tail", "tau_elevator"), P("tail", "tau_tab")
    S_e, c_e = P("elevator", "area"), P("elevator", "chord")
    Ch0, Cha, Chd = P("elevator", "ch0"), P("elevator", "ch_alpha"), P("elevator", "ch_delta")
    Cht, Chr = P("elevator", "ch_tab"), P("elevator", "ch_rate")
    Sm, I_h = P("elevator", "mass_moment"), P("elevator", "inertia")
    G = P("circuit", "gearing")
    I_c = P("circuit", "stick_mass") / G**2
    c_h = P("circuit", "damping") / G**2
    k_h = P("circuit", "centering") / G**2
    m, I_y = P("mass", "mass"), P("mass", "pitch_inertia")
    cmac, cmaf, cmq = P("wing", "cm_ac"), P("wing", "cm_alpha_fus"), P("wing", "cm_q")

    # trim values of the coefficients (from the trim angles and this script's own laws)
    CLw0 = a_w * (a0 - al0)
    CD0 = cd0 + k * CLw0**2
    alpha_t0 = a0 + i_t - (eps0 + eps_a * a0)
    CLt0 = a_t * (alpha_t0 + tau * de0 + tau_tab * tab0)
    Ch_trim = Ch0 + Cha * alpha_t0 + Chd * de0 + Cht * tab0
    Cmwb0 = cmac + cmaf * a0
    Lw0, D0, Lt0 = qbar * S * CLw0, qbar * S * CD0, eta * qbar * S_t * CLt0

    def row(**kw):
        r = np.zeros(8)
        for name, v in kw.items():
            r[NAMES.index(name)] = v
        return r

    dqbar = row(u=rho * V, h=0.5 * V * V * drho)
    da_w = row(w=1 / V, q=-x_w / V)
    da_tl = row(w=1 / V, q=l_t / V)
    lag = P("tail", "downwash_lag") == "first_order"
    deps = row(eps=1.0) if lag else eps_a * da_w
    da_t = da_tl - deps
    dCLw = a_w * da_w
    dCLt = a_t * (da_t + tau * row(delta_e=1.0))
    dCD = 2 * k * CLw0 * dCLw
    dLw = S * CLw0 * dqbar + qbar * S * dCLw
    dD = S * CD0 * dqbar + qbar * S * dCD
    dLt = eta * (S_t * CLt0 * dqbar + qbar * S_t * dCLt)
    dX = Lw0 * da_w - dD + Lt0 * da_tl
    dZ = -dLw - D0 * da_w - dLt
    grav_e = Sm * G0 * math.sin(th0 + de0)  # elevator weight's hinge-moment slope
    dM = (x_w * (dLw + D0 * da_w) - l_t * dLt + S * c * Cmwb0 * dqbar
          + qbar * S * c * (cmaf * da_w + cmq * c / (2 * V) * row(q=1.0)) - grav_e * row(delta_e=1.0))
    dCh = Cha * da_t + Chd * row(delta_e=1.0) + Chr * c_e / (2 * V) * row(delta_e_dot=1.0)
    dH = (eta * (S_e * c_e * Ch_trim * dqbar + qbar * S_e * c_e * dCh)
          - c_h * row(delta_e_dot=1.0) - k_h * row(delta_e=1.0) - grav_e * row(theta=1.0, delta_e=1.0))

    E = np.zeros((8, 8))
    A = np.zeros((8, 8))
    B = np.zeros((8, 1))
    s_r = Sm if reaction else 0.0
    s_c = Sm * coupling
    # X: m u' = dX - m g theta
    E[U, U] = m
    A[U] = dX - m * G0 * math.cos(th0 - a0) * row(theta=1.0)
    # Z: m (w' - V q) + S_e delta'' = dZ
    E[W, W] = m
    E[W, DED] = s_r
    A[W] = dZ + m * V * row(q=1.0)
    # M: I_y q' + (I_h + S_e l_h) delta'' = dM
    E[Q, Q] = I_y
    E[Q, DED] = (I_h + s_r * l_h) if reaction else 0.0
    A[Q] = dM
    # kinematics
    E[TH, TH] = 1.0
    A[TH, Q] = 1.0
    E[H, H] = 1.0
    A[H] = row(theta=V, w=-1.0)
    # downwash: a first-order lag of time constant l_wt / V, or (no lag) an unused state
    E[EPS, EPS] = 1.0
    if lag:
        tau_eps = (P("tail", "x_ac") - P("wing", "h_ac") * c) / V
        A[EPS] = (eps_a * da_w - row(eps=1.0)) / tau_eps
    else:
        A[EPS, EPS] = -1.0  # no lag: a decoupled placeholder, removed below
    E[DE, DE] = 1.0
    A[DE, DED] = 1.0
    # hinge: (I_h + I_c) delta'' + I_h q' + S_e ((w' - V q) + l_h q') = dH - F/G
    E[DED, DED] = I_h + I_c
    E[DED, Q] = I_h + s_c * l_h
    E[DED, W] = s_c
    A[DED] = dH + s_c * V * row(q=1.0)
    B[DED, 0] = -1.0 / G
    Ainv = linalg.solve(E, A)
    Binv = linalg.solve(E, B)
    if not lag:
        Ainv, Binv = Ainv[:EPS, :EPS], Binv[:EPS]
    info = dict(V=V, alpha0=a0, theta0=th0, de0=de0, x_w=x_w, l_t=l_t, l_h=l_h, CLw0=CLw0, CLt0=CLt0,
                Ch_trim=Ch_trim, Lt0=Lt0, D0=D0, E=E.copy(), A=A.copy(),  # before E is inverted
                residual=dict(  # trim residuals of this script's own force laws (should be ~0)
                    X=-D0 + P("propulsion", "max_thrust") * trim["throttle"] * math.cos(a0) - m * G0 * math.sin(th0 - a0),
                    Z=-(Lw0 + Lt0) - P("propulsion", "max_thrust") * trim["throttle"] * math.sin(a0)
                    + m * G0 * math.cos(th0 - a0),
                    M=x_w * Lw0 - l_t * Lt0 + qbar * S * c * Cmwb0,
                    H=eta * qbar * S_e * c_e * Ch_trim + Sm * G0 * math.cos(th0 + de0)))
    return Ainv, Binv, info


# ---------------------------------------------------------------------------------------------
# floatpitch: trim (input), free roots and the nonlinear run (what is checked)
# ---------------------------------------------------------------------------------------------
def fp_json(exe, *args):
    return json.loads(subprocess.check_output([exe, *args, "--json"]))


def fp_run(exe, scenario, out):
    subprocess.check_call([exe, "run", scenario, "--controls", "free", "--out", out, "--quiet"])
    with open(os.path.join(out, "free.csv")) as f:
        rd = csv.reader(f)
        head = [h.split(" [")[0] for h in next(rd)]
        data = np.array([[float(x) for x in r] for r in rd])
    return {h: data[:, i] for i, h in enumerate(head)}


def pulses(P):
    """The scenario's pilot-force pulses on the free stick: [(start, duration, force)]."""
    out = []
    for ev in P.d.get("event", []):
        if ev["action"] == "pulse":
            out.append((si(ev["time"]), si(ev["duration"]), si(ev["force"])))
        elif ev["action"] not in ("tab",):
            sys.exit(f"event {ev['action']!r} is outside this check")
    return out


def roots_of(A):
    ev = linalg.eigvals(A)
    return ev[np.argsort(-abs(ev))]


def match_roots(fp_modes, ours):
    """Each floatpitch root (upper half-plane) with the nearest of ours: [(name, fp, ours)]."""
    rows = []
    for mo in fp_modes:
        r = complex(mo["real"], mo["imag"])
        mine = ours[np.argmin(abs(ours - r))]
        rows.append((mo["name"], r, complex(mine.real, abs(mine.imag)) if r.imag >= 0 else mine))
    return rows


def linear_response(A, B, info, t, force):
    """lsim of the linear model: deviations of wing-a.c. alpha, q, delta_e [deg, deg/s, deg]."""
    n = A.shape[0]
    sysl = signal.StateSpace(A, B, np.eye(n), np.zeros((n, 1)))
    _, y, _ = signal.lsim(sysl, force, t, interp=False)  # zero-order hold: the pulse edges on the grid
    V = info["V"]
    # floatpitch's alpha column is the angle of attack at the wing-body a.c. (local flow)
    dalpha = y[:, W] / V - y[:, Q] * info["x_w"] / V
    return {"alpha": np.degrees(dalpha), "q": np.degrees(y[:, Q]), "elevator": np.degrees(y[:, DE])}


def main():
    args = [a for a in sys.argv[1:] if not a.startswith("--")]
    coupling = 1.0
    reaction = "--no-reaction" not in sys.argv
    for a in sys.argv[1:]:
        if a.startswith("--coupling="):
            coupling = float(a.split("=", 1)[1])
    exe, scenarios, work = args[0], args[1:-1], args[-1]
    os.makedirs(work, exist_ok=True)
    failures, checks = 0, 0

    def check(ok, text):
        nonlocal failures, checks
        checks += 1
        if not ok:
            failures += 1
        print(("  ok    " if ok else "  FAIL  ") + text)

    for scenario in scenarios:
        label = os.path.splitext(os.path.basename(scenario))[0]
        P = Params(load(scenario))
        preconditions(P)
        trim = fp_json(exe, "trim", scenario)["free"]
        A, B, info = linear_model(P, trim, coupling=coupling, reaction=reaction)
        print(f"\n{label}: {scenario}")
        print(f"  trim V {info['V']:.3f} m/s, alpha_0 {math.degrees(info['alpha0']):.3f} deg, "
              f"delta_0 {math.degrees(info['de0']):.3f} deg, S_e {P('elevator', 'mass_moment'):.3f} kg m")
        res = info["residual"]
        print("  trim residuals of this model's force laws at floatpitch's trim: "
              f"X {res['X']:.3g} N, Z {res['Z']:.3g} N, M {res['M']:.3g} N m, H {res['H']:.3g} N m")
        ours = roots_of(A)
        modes = fp_json(exe, "modes", scenario)["free"]
        # -- 1. roots ------------------------------------------------------------------------
        # Neglected terms (docstring): the trim angles' geometric effects, relative alpha_0^2/2 +
        # delta_0^2/2 (+ the first-order vertical arms l sin(alpha_0) acting on forces that are
        # themselves small at trim: tail lift and drag, bounded by |alpha_0| (L_t0 + D_0)/(m g));
        # and the central-difference Jacobian of floatpitch (relative ~1e-6). The tolerance is ten
        # times that bound, with a floor of 1e-4 for the Jacobian and the trim's convergence.
        a0, d0 = info["alpha0"], info["de0"]
        bound = a0**2 / 2 + d0**2 / 2 + abs(a0) * (abs(info["Lt0"]) + info["D0"]) / (P("mass", "mass") * G0)
        tol = max(1e-4, 10 * bound)
        # the slowest (height) root is compared against the phugoid's magnitude: it is a small
        # difference of phugoid-sized terms, so its error scales with them, not with itself
        scale = max(abs(complex(mo["real"], mo["imag"])) for mo in modes if mo["name"] == "phugoid") \
            if any(mo["name"] == "phugoid" for mo in modes) else 1.0
        print(f"  roots (stick free), tolerance {tol:.2g} relative (neglected-term bound {bound:.2g})")
        print(f"    {'mode':18s} {'floatpitch':>24s} {'reference':>24s} {'rel. error':>10s}")
        for name, r_fp, r_ref in match_roots(modes, ours):
            den = abs(r_fp) if abs(r_fp) > 0.1 * scale else scale
            err = abs(r_ref - r_fp) / den
            check(err <= tol, f"{name:18s} {r_fp.real:11.5f}{r_fp.imag:+11.5f}j {r_ref.real:11.5f}{r_ref.imag:+11.5f}j "
                  f"{err:10.2e}")
        # -- 2./3. pulse response ------------------------------------------------------------
        # floatpitch flies the scenario's pulse and the same pulse reversed (a case file that
        # includes the scenario and replaces its events). The odd part of the response,
        # (y(+F) - y(-F))/2, holds every odd-order term and no even-order one: it equals the
        # linear response up to third-order terms, of relative size eps^2 (eps the perturbation
        # size below). The even part, (y(+F) + y(-F))/2, is the second-order response: printed, as
        # the measure of how far the single run is from linear.
        out = fp_run(exe, scenario, os.path.join(work, label))
        rev = os.path.join(work, label + "_reversed.toml")
        with open(rev, "w") as f:
            f.write(f"include = {json.dumps(os.path.abspath(scenario))}\n")
            for t0, dur, F in pulses(P):
                f.write(f"\n[[event]]\ntime = {t0!r}\naction = \"pulse\"\nforce = {-F!r}\nduration = {dur!r}\n")
        out_r = fp_run(exe, rev, os.path.join(work, label + "_reversed"))
        t = np.round(out["time"], 9)
        force = np.zeros_like(t)
        for t0, dur, F in pulses(P):
            force[(t >= t0 - 1e-9) & (t < t0 + dur - 1e-9)] += F
        lin = linear_response(A, B, info, t, force)
        V = info["V"]
        dev = {ch: out[ch] - out[ch][0] for ch in out}
        dev_r = {ch: out_r[ch] - out_r[ch][0] for ch in out_r}
        odd = {ch: (dev[ch] - dev_r[ch]) / 2 for ch in dev}
        even = {ch: (dev[ch] + dev_r[ch]) / 2 for ch in dev}
        # perturbation size eps: the largest of |d alpha|, |d delta_e|, |d theta| (rad), 2|u|/V
        # (the speed enters squared through the dynamic pressure)
        eps = max(np.max(abs(np.radians(dev["alpha"]))), np.max(abs(np.radians(dev["elevator"]))),
                  np.max(abs(np.radians(dev["theta"]))), 2 * np.max(abs(dev["airspeed"])) / V)
        # Tolerance on the odd part, relative to its peak:
        #  * third-order terms: eps^2, times 10 for the several such terms that add;
        #  * the reference's neglected terms, through the roots: a root error d lambda = tol |lambda|
        #    shifts a mode's response by at most t |d lambda| e^(sigma t) <= tol / (e zeta) of its
        #    amplitude (zeta its damping ratio), and by no more than tol |lambda| T over the run T;
        #    the worst mode counts, as if it carried the whole peak;
        #  * the CSV's printed precision: 1e-6 deg (deg/s), two values combined: 2e-6 absolute.
        T = t[-1] - t[0]
        mode_part = max(min(1 / (math.e * max(-z.real / abs(z), 1e-3)), abs(z) * T) for z in ours if abs(z) > 1e-6)
        ttol = 10 * eps**2 + tol * mode_part
        print(f"  force pulse response, stick free, odd part of +F/-F runs: perturbation size eps {eps:.2g}; "
              f"tolerance {100*ttol:.3f} % of each peak (third order {100*10*eps**2:.3f} %, roots {100*tol*mode_part:.3f} %)")
        for ch in ("alpha", "q", "elevator"):
            peak = np.max(abs(odd[ch]))
            err = np.max(abs(lin[ch] - odd[ch]))
            raw = np.max(abs(lin[ch] - dev[ch]))
            check(err <= ttol * peak + 2e-6, f"{ch:8s}: peak {peak:.5f}, max |reference - floatpitch| {err:.2e} "
                  f"({100*err/peak:.4f} %); single +F run: {100*raw/peak:.3f} %, its even part {100*np.max(abs(even[ch]))/peak:.3f} %")
        # 3. variants of the reference: without the elevator's reaction on the airframe (the
        # neglect a textbook treatment may make: its size), and with the mass-balance terms of
        # the hinge equation dropped or of the wrong sign. Each must fail both comparisons: so
        # floatpitch missing any of them, or with a wrong sign, would fail this test.
        def miss(coupling_k, reaction_k):
            A1, B1, _ = linear_model(P, trim, coupling=coupling_k, reaction=reaction_k)
            lin1 = linear_response(A1, B1, info, t, force)
            worst = max(np.max(abs(lin1[ch] - odd[ch])) / np.max(abs(odd[ch])) for ch in ("alpha", "q", "elevator"))
            r1 = roots_of(A1)
            rerr = max(abs(r_ref - r_fp) / max(abs(r_fp), scale)
                       for _, r_fp, r_ref in match_roots(modes, r1))
            return worst, rerr, [z for z in r1 if z.imag > 0]
        for what, ck, rk in (("without the reaction on the airframe", 1.0, False),
                             ("without the mass-balance coupling", 0.0, True),
                             ("with the coupling's sign flipped", -1.0, True)):
            worst, rerr, r1 = miss(ck, rk)
            print(f"  reference {what}: response misses by {100*worst:.2f} % of a peak, roots by {rerr:.2g} "
                  "relative; oscillatory roots " + ", ".join(f"{z.real:.4f}{z.imag:+.4f}j" for z in r1))
            # asserted where the elevator is unbalanced enough for the reaction to show
            if coupling == 1.0 and reaction and abs(P("elevator", "mass_moment")) >= 0.1:
                check(worst > ttol and rerr > tol,
                      f"the check can tell: {what} the reference exceeds both tolerances")

    print(f"\n{checks - failures} passed, {failures} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
