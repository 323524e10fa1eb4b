// dynamics.cpp — aerodynamics, circuit and the coupled airframe-elevator equations (see
// dynamics.hpp for the equations and their sources).
#include "dynamics.hpp"

#include <algorithm>
#include <cmath>

#include <Eigen/Dense>

#include "units.hpp"

namespace fp {

namespace {

constexpr double g = units::g0;

struct V2 {
  double x, z;
};
inline V2 operator+(V2 a, V2 b) { return {a.x + b.x, a.z + b.z}; }
inline V2 operator-(V2 a, V2 b) { return {a.x - b.x, a.z - b.z}; }
inline V2 operator*(double s, V2 a) { return {s * a.x, s * a.z}; }
// y component of the planar cross product r x f (x forward, z down): positive nose up.
inline double cross(V2 r, V2 f) { return r.z * f.x - r.x * f.z; }

// Rigid-body acceleration of the body point r, given a_O, pitch acceleration al, rate q.
inline V2 point_accel(V2 aO, double al, double q, V2 r) {
  return {aO.x + al * r.z - q * q * r.x, aO.z - al * r.x - q * q * r.z};
}

// Inertial ("m a") side of the three equations, for unknowns (a_O, al = q', be = de'').
// The bobweight's hinge moment depends on the load factor and thus on a_O: it is moved to
// this side so that the system stays exact.
struct Lhs {
  double fx, fz, m, h;
};

// Elevator geometry at the current deflection, computed once per derivative call.
struct ElevGeom {
  V2 rho{0, 0};   // hinge to elevator CG (body axes) [m]
  V2 drho{0, 0};  // d rho / d de [m/rad]
  V2 re{0, 0};    // elevator CG from O [m]
};

ElevGeom elevator_geometry(const Plant& p, double de) {
  ElevGeom g;
  if (p.m_e > 0.0) {
    const double c = std::cos(de), s = std::sin(de);
    const double xe = p.S_e / p.m_e;  // hinge to elevator CG, aft positive [m]
    g.rho = {-xe * c, xe * s};
    g.drho = {xe * s, xe * c};
    g.re = V2{p.rH_x, p.rH_z} + g.rho;
  }
  return g;
}

Lhs inertial_side(const Plant& p, const ElevGeom& eg, double q, double ded, V2 aO, double al, double be,
                  double bob_per_n, V2 gvec, double I_c) {
  Lhs L{};
  // airframe
  const V2 rB{p.rB_x, p.rB_z};
  const V2 aB = point_accel(aO, al, q, rB);
  L.fx = p.m_B * aB.x;
  L.fz = p.m_B * aB.z;
  L.m = p.I_B * al + p.m_B * cross(rB, aB);
  L.h = (p.I_ecg + I_c) * be + p.I_ecg * al;
  if (p.m_e > 0.0) {
    const V2 rho = eg.rho, drho = eg.drho, re = eg.re;
    // a_e = rigid acceleration of the point re + relative: be drho - ded^2 rho + 2 q x (ded drho)
    V2 ae = point_accel(aO, al, q, re);
    ae = ae + be * drho - (ded * ded) * rho + V2{2.0 * q * ded * drho.z, -2.0 * q * ded * drho.x};
    L.fx += p.m_e * ae.x;
    L.fz += p.m_e * ae.z;
    L.m += p.I_ecg * (al + be) + p.m_e * cross(re, ae);
    L.h += p.m_e * cross(rho, ae);
  }
  // bobweight: hinge moment +B n / G with n = -(a_z - g_z)/g0 at O
  const double n = -(aO.z - gvec.z) / g;
  L.h -= bob_per_n * n;
  return L;
}

// Smooth stall blend (sigmoid at +-alpha_stall) between the linear law and a flat plate.
double blend(double alpha, double as, double M) {
  const double a1 = std::exp(std::clamp(-M * (alpha - as), -60.0, 60.0));
  const double a2 = std::exp(std::clamp(M * (alpha + as), -60.0, 60.0));
  return (1.0 + a1 + a2) / ((1.0 + a1) * (1.0 + a2));
}

double flat_plate(double alpha) {
  const double s = std::sin(alpha);
  return 2.0 * (alpha >= 0 ? 1.0 : -1.0) * s * s * std::cos(alpha);
}

}  // namespace

double lift_coefficient(const LiftCurve& lc, double alpha, bool symmetric) {
  if (!lc.table.empty()) {
    const auto& t = lc.table;
    if (alpha <= t.front().first || alpha >= t.back().first) {
      // beyond the table: flat plate, joined continuously at the end point
      const auto& e = alpha <= t.front().first ? t.front() : t.back();
      return e.second + flat_plate(alpha) - flat_plate(e.first);
    }
    const auto it = std::upper_bound(t.begin(), t.end(), alpha,
                                     [](double a, const auto& pr) { return a < pr.first; });
    const auto& hi = *it;
    const auto& lo = *(it - 1);
    return lo.second + (alpha - lo.first) / (hi.first - lo.first) * (hi.second - lo.second);
  }
  const double a0 = symmetric ? 0.0 : lc.alpha_zero;
  const double s = blend(alpha, lc.alpha_stall, lc.stall_sharpness);
  return (1.0 - s) * lc.slope * (alpha - a0) + s * flat_plate(alpha);
}

Plant make_plant(const Airplane& ap) {
  Plant p;
  p.ap = ap;
  const double c = ap.wing.mac;
  const double xcg = ap.mass.h_cg * c;  // CG aft of LEMAC [m]
  p.m = ap.mass.mass;
  p.m_e = ap.elevator.mass;
  p.S_e = ap.elevator.mass_moment;
  if (p.m_e >= p.m) throw ModelError{"elevator.mass, mass.mass", "the elevator's mass must be less than the airplane's"};
  if (p.m_e == 0.0 && p.S_e != 0.0)
    throw ModelError{"elevator.mass, elevator.mass_moment", "a massless elevator cannot have a static mass moment"};
  p.m_B = p.m - p.m_e;
  p.rH_x = -(ap.elevator.x_hinge - xcg);
  p.rH_z = ap.elevator.z_hinge;
  p.rW_x = -(ap.wing.h_ac * c - xcg);
  p.rW_z = ap.wing.z_ac;
  p.rT_x = -(ap.tail.x_ac - xcg);
  p.rT_z = ap.tail.z_ac;
  p.l_wt = tail_arm(ap, ap.wing.h_ac);
  if (p.l_wt <= 0.0) throw ModelError{"tail.x_ac, wing.h_ac", "the tail's a.c. must lie aft of the wing-body a.c."};
  const double x_e = p.m_e > 0.0 ? p.S_e / p.m_e : 0.0;
  p.I_ecg = ap.elevator.inertia - p.m_e * x_e * x_e;
  if (p.I_ecg < 0.0)
    throw ModelError{"elevator.inertia, elevator.mass_moment, elevator.mass",
                     "the elevator's inertia about the hinge must be at least mass_moment^2 / mass"};
  // elevator CG at de = 0 from O, and the airframe CG that puts the composite CG at O
  const double re0_x = p.rH_x - x_e, re0_z = p.rH_z;
  p.rB_x = -p.m_e * re0_x / p.m_B;
  p.rB_z = -p.m_e * re0_z / p.m_B;
  p.I_B = ap.mass.pitch_inertia - p.I_ecg - p.m_e * (re0_x * re0_x + re0_z * re0_z) -
          p.m_B * (p.rB_x * p.rB_x + p.rB_z * p.rB_z);
  if (p.I_B <= 0.0)
    throw ModelError{"mass.pitch_inertia", "the airplane's pitch inertia is too small to contain its elevator's"};
  const double G = ap.circuit.gearing;
  p.I_c = ap.circuit.stick_mass / (G * G);
  if (ap.circuit_nl.free_play > 0.0 && p.I_c <= 0.0)
    throw ModelError{"circuit.free_play, circuit.stick_mass",
                     "free play makes the stick side a body of its own: it needs a mass (circuit.stick_mass > 0)"};
  return p;
}

double stick_side_moment(const Airplane& ap, double de, double ded) {
  // de, ded: the stick side's angle and rate (the elevator's own without free play)
  const auto& ci = ap.circuit;
  const double G = ci.gearing;
  double Hc = 0.0;
  Hc -= ci.damping * ded / (G * G);
  Hc -= ci.centering * (de - ci.centering_neutral) / (G * G);
  Hc += ci.downspring / G;
  return Hc;
}

double stop_moment(const Airplane& ap, double de, double ded) {
  const auto& el = ap.elevator;
  // stops: stiff spring-damper contact that can push but never pull (circuit.hpp contact_moment)
  return contact_moment(de, ded, el.delta_min, el.delta_max, ap.circuit.stop_stiffness, ap.circuit.stop_damping);
}

double play_contact_moment(const Airplane& ap, double rel, double rel_rate) {
  const double h = 0.5 * ap.circuit_nl.free_play;
  return contact_moment(rel, rel_rate, -h, h, ap.circuit.stop_stiffness, ap.circuit.stop_damping);
}

double circuit_hinge_moment(const Airplane& ap, double de, double ded) {
  return stick_side_moment(ap, de, ded) + stop_moment(ap, de, ded);
}

double friction_hinge_moment(const Airplane& ap, FrictionState fs, double ded) {
  const auto& ci = ap.circuit;
  const double G = ci.gearing;
  switch (fs) {
    case FrictionState::off:
    case FrictionState::stuck: return 0.0;
    case FrictionState::smooth:
      // Coulomb friction smoothed by tanh over friction_speed at the stick: no stiction; a load
      // below the breakout lets the stick creep at about friction_speed * atanh(load/breakout)
      return -(ci.friction / G) * std::tanh(ded / (G * ci.friction_speed));
    case FrictionState::slip_up: return -sliding_force(ci.friction, ap.circuit_nl) / G;
    case FrictionState::slip_down: return sliding_force(ci.friction, ap.circuit_nl) / G;
  }
  return 0.0;
}

bool elevator_locked(const Airplane& ap, const Controls& c) {
  if (c.play) return false;  // with free play the elevator floats; the stick side is what locks
  const bool rigid_hold = c.stick == Stick::held && ap.circuit.held_stiffness == 0.0;
  return rigid_hold || c.friction == FrictionState::stuck;
}

double weight_hinge_moment(const Airplane& ap, double de, double n) {
  return ap.elevator.mass_moment * std::cos(de) * n * g + ap.circuit.bobweight / ap.circuit.gearing * n;
}

double constant_hinge_moment(const Airplane& ap) {
  return weight_hinge_moment(ap, 0.0, 1.0) + ap.circuit.downspring / ap.circuit.gearing;
}

double steady_hinge_moment(const Plant& p, double H_aero, double de, double n) {
  return H_aero + circuit_hinge_moment(p.ap, de, 0.0) + weight_hinge_moment(p.ap, de, n);
}

int lag_states(const Plant& p) {
  switch (p.ap.tail.lag) {
    case DownwashLag::none: return 0;
    case DownwashLag::first_order: return 1;
    case DownwashLag::chain: return p.ap.tail.lag_stages;
  }
  return 0;
}

namespace {

// What the stages of the derivative pass on.
struct Stage {
  double u, w, q, de, ded, cth, sth;  // state and its trigonometry
  double ds = 0, dsd = 0;             // stick side (free play only)
  V2 gvec{0, 0};                      // gravity in body axes [m/s^2]
  V2 rW{0, 0}, rT{0, 0};              // wing-body and tail a.c. from O [m]
  double rho = 0;                     // [kg/m^3]
  double Vsafe = 0;                   // airspeed at the wing, never 0 [m/s]
  double alpha_tl = 0;                // tail flow angle before incidence and downwash [rad]
  double eps_target = 0;              // steady downwash for the wing's alpha [rad]
  int nlag = 0;                       // downwash-lag stages in use
};

// Stage 1: air data at the wing-body and the tail (each at its own point of the gust field),
// their coefficients and the aerodynamic hinge moment.
void air_data(const Plant& p, const GustField& gust, const State& x, const Controls& ctl, double t, Stage& st,
              Eval& e) {
  const Airplane& ap = p.ap;
  const double u = st.u, w = st.w, q = st.q, de = st.de, ded = st.ded, cth = st.cth, sth = st.sth;
  e.atm = isa_at(geopotential_altitude(std::max(x[sx::h], -1000.0)));
  const double rho = e.atm.density;
  st.rho = rho;

  // Air-relative velocity at a body point r: v_O + q x r - gust(at the point's earth X).
  auto local_air = [&](V2 r, GustSample& gs) {
    const double X = x[sx::x] + r.x * cth + r.z * sth;
    gs = gust.empty() ? GustSample{} : gust.at(X, t);
    // earth gust (u along +X, w up) in body axes; earth z is down so the vector is (u, -w)
    const double gx = gs.u * cth - (-gs.w) * sth;
    const double gz = gs.u * sth + (-gs.w) * cth;
    return V2{u + q * r.z - gx, w - q * r.x - gz};
  };

  // wing-body
  const V2 rW{p.rW_x, p.rW_z};
  st.rW = rW;
  const V2 vW = local_air(rW, e.gust_wing);
  e.V = std::hypot(vW.x, vW.z);
  e.alpha = std::atan2(vW.z, vW.x);
  e.qbar = 0.5 * rho * e.V * e.V;
  const double c = ap.wing.mac;
  const double Vsafe = std::max(e.V, 1e-3);
  st.Vsafe = Vsafe;
  e.CL_wb = lift_coefficient(ap.wing.lift, e.alpha, false);
  e.CD = ap.wing.cd0 + ap.wing.k_induced * e.CL_wb * e.CL_wb;
  e.Cm_wb = ap.wing.cm_ac + ap.wing.cm_alpha_fus * e.alpha + ap.wing.cm_q * q * c / (2.0 * Vsafe);

  // tail
  const V2 rT{p.rT_x, p.rT_z};
  st.rT = rT;
  const V2 vT = local_air(rT, e.gust_tail);
  e.V_t = std::hypot(vT.x, vT.z);
  const double alpha_tl = std::atan2(vT.z, vT.x);
  st.alpha_tl = alpha_tl;
  const double eps_target = steady_downwash(ap.tail, e.alpha);
  const int nlag = lag_states(p);
  st.nlag = nlag;
  st.eps_target = eps_target;
  e.eps = nlag == 0 ? eps_target : x[sx::eps0 + static_cast<std::size_t>(nlag) - 1];
  e.alpha_t = alpha_tl + ap.tail.incidence - e.eps;
  e.qbar_t = ap.tail.eta * 0.5 * rho * e.V_t * e.V_t;
  e.tab = total_tab(ap.circuit, ctl.tab, de);
  e.CL_t = lift_coefficient(ap.tail.lift,
                            e.alpha_t + ap.tail.tau_elevator * de + ap.tail.tau_tab * e.tab, true);

  // hinge moment
  const auto& el = ap.elevator;
  const double Vt_safe = std::max(e.V_t, 1e-3);
  e.Ch = el.ch0 + el.ch_alpha * e.alpha_t + el.ch_delta * de + el.ch_tab * e.tab +
         el.ch_rate * ded * el.chord / (2.0 * Vt_safe);
  e.H_aero = p.aerodynamics ? e.Ch * e.qbar_t * el.area * el.chord : 0.0;

}

// Stage 2: aerodynamic forces and moments about O, and the thrust.
void forces_and_moments(const Plant& p, const Controls& ctl, const Stage& st, Eval& e) {
  const Airplane& ap = p.ap;
  const double S = ap.wing.area, c = ap.wing.mac;
  const double rho = st.rho, alpha_tl = st.alpha_tl;
  const V2 rW = st.rW, rT = st.rT;
  e.X = e.Z = e.M = 0.0;
  if (p.aerodynamics) {
    const double Lw = e.qbar * S * e.CL_wb, Dw = e.qbar * S * e.CD;
    const double ca = std::cos(e.alpha), sa = std::sin(e.alpha);
    const V2 Fw{Lw * sa - Dw * ca, -Lw * ca - Dw * sa};
    const double Lt = e.qbar_t * ap.tail.area * e.CL_t;
    const double cat = std::cos(alpha_tl), sat = std::sin(alpha_tl);
    const V2 Ft{Lt * sat, -Lt * cat};
    e.X = Fw.x + Ft.x;
    e.Z = Fw.z + Ft.z;
    e.M = cross(rW, Fw) + cross(rT, Ft) + e.qbar * S * c * e.Cm_wb;
  }
  if (p.thrust) {
    const auto& pr = ap.propulsion;
    const double sigma = rho / isa::rho0;
    const double Vr = std::max(e.V, 0.3 * pr.reference_speed) / pr.reference_speed;
    const double fs = pr.density_exponent == 1.0 ? sigma : std::pow(sigma, pr.density_exponent);
    const double fv = pr.speed_exponent == 0.0 ? 1.0 : std::pow(Vr, pr.speed_exponent);
    e.thrust = ctl.throttle * pr.max_thrust * fs * fv;
    const V2 Ft{e.thrust * std::cos(pr.angle), -e.thrust * std::sin(pr.angle)};
    e.X += Ft.x;
    e.Z += Ft.z;
    e.M += cross(V2{0.0, pr.z_thrust}, Ft);
  }

}

// Stage 3: the accelerations of the two bodies (and, held rigidly, the pilot's hinge moment).
struct Accel {
  double aOx = 0, aOz = 0, al = 0, be = 0;  // [m/s^2], [rad/s^2]
  double H_pilot = 0, Hc = 0, bob = 0, G = 0, H_friction = 0;
  bool locked = false;
  double dds = 0, dsd = 0;                  // free play: stick side's acceleration and rate
};

// The inertial side is affine in (aOx, aOz, al, be): the matrix from unit probes. Solves the
// airframe's three equations with the hinge equation (4x4), or, with the elevator locked to the
// airframe, the three alone (be = 0) and returns the moment the hinge must take to hold it.
struct Solved {
  double aOx = 0, aOz = 0, al = 0, be = 0, H_hold = 0;
};
Solved solve_bodies(const Plant& p, double q, double de, double ded, double bob, V2 gvec, double I_c, double Fx,
                    double Fz, double Mext, double Hext, bool locked) {
  const ElevGeom eg = elevator_geometry(p, de);
  const auto L0 = inertial_side(p, eg, q, ded, {0, 0}, 0, 0, bob, gvec, I_c);
  const auto Lx = inertial_side(p, eg, q, ded, {1, 0}, 0, 0, bob, gvec, I_c);
  const auto Lz = inertial_side(p, eg, q, ded, {0, 1}, 0, 0, bob, gvec, I_c);
  const auto La = inertial_side(p, eg, q, ded, {0, 0}, 1, 0, bob, gvec, I_c);
  Solved r;
  if (locked) {
    Eigen::Matrix3d A;
    A << Lx.fx - L0.fx, Lz.fx - L0.fx, La.fx - L0.fx,
         Lx.fz - L0.fz, Lz.fz - L0.fz, La.fz - L0.fz,
         Lx.m - L0.m, Lz.m - L0.m, La.m - L0.m;
    const Eigen::Vector3d b(Fx - L0.fx, Fz - L0.fz, Mext - L0.m);
    const Eigen::Vector3d s = A.partialPivLu().solve(b);
    r.aOx = s(0);
    r.aOz = s(1);
    r.al = s(2);
    const auto Ls = inertial_side(p, eg, q, ded, {r.aOx, r.aOz}, r.al, 0.0, bob, gvec, I_c);
    r.H_hold = Ls.h - Hext;
  } else {
    const auto Lb = inertial_side(p, eg, q, ded, {0, 0}, 0, 1, bob, gvec, I_c);
    Eigen::Matrix4d A;
    A << Lx.fx - L0.fx, Lz.fx - L0.fx, La.fx - L0.fx, Lb.fx - L0.fx,
         Lx.fz - L0.fz, Lz.fz - L0.fz, La.fz - L0.fz, Lb.fz - L0.fz,
         Lx.m - L0.m, Lz.m - L0.m, La.m - L0.m, Lb.m - L0.m,
         Lx.h - L0.h, Lz.h - L0.h, La.h - L0.h, Lb.h - L0.h;
    const Eigen::Vector4d b(Fx - L0.fx, Fz - L0.fz, Mext - L0.m, Hext - L0.h);
    const Eigen::Vector4d s = A.partialPivLu().solve(b);
    r.aOx = s(0);
    r.aOz = s(1);
    r.al = s(2);
    r.be = s(3);
  }
  return r;
}

Accel accelerations(const Plant& p, const Controls& ctl, const Stage& st, Eval& e) {
  const Airplane& ap = p.ap;
  const double q = st.q, de = st.de, ded = st.ded;
  const V2 gvec = st.gvec;
  // circuit, referred to the hinge (see state.hpp: a stick force F adds -F/G)
  const auto& ci = ap.circuit;
  const double G = ci.gearing;
  const bool rigid_hold = ctl.stick == Stick::held && ci.held_stiffness == 0.0;
  const bool stuck = !rigid_hold && ctl.friction == FrictionState::stuck;
  // a rigid hold takes whatever moment holds the surface: the circuit's friction is not felt
  double H_friction = rigid_hold ? 0.0 : friction_hinge_moment(ap, ctl.friction, ded);
  const double Hc = circuit_hinge_moment(ap, de, ded) + H_friction;
  const double bob = ci.bobweight / G;  // hinge moment per g

  double H_pilot = 0.0;
  if (ctl.stick == Stick::free) {
    H_pilot = -ctl.pilot_force / G;
  } else if (!rigid_hold) {
    // cable stretch: the hand holds the stick where the elevator would be at hold_de
    H_pilot = -ci.held_stiffness * (de - ctl.hold_de) / (G * G);
  }

  // external side
  const double cde = std::cos(de), sde = std::sin(de);
  const V2 D = p.m_e > 0 ? V2{p.S_e * (1.0 - cde), p.S_e * sde} : V2{0, 0};
  const V2 Srho{-p.S_e * cde, p.S_e * sde};
  const double Fx = e.X + p.m * gvec.x;
  const double Fz = e.Z + p.m * gvec.z;
  const double Mext = e.M + cross(D, gvec);
  const double Hext = e.H_aero + Hc + H_pilot + cross(Srho, gvec);

  const bool locked = rigid_hold || stuck;
  const Solved sv = solve_bodies(p, q, de, ded, bob, gvec, p.I_c, Fx, Fz, Mext, Hext, locked);
  // held rigidly, the moment that holds the surface is the pilot's (hence the stick force);
  // stuck, the friction's (the pilot's own force still acts)
  if (rigid_hold) H_pilot = sv.H_hold + H_pilot;
  else if (stuck) H_friction = sv.H_hold;
  Accel a{sv.aOx, sv.aOz, sv.al, sv.be, H_pilot, stuck ? Hc + H_friction : Hc, bob, G, H_friction, locked};
  return a;
}

// Free play (circuit.hpp): the stick side is its own degree of freedom. The elevator (its own
// inertia, weight, aerodynamics, the stops and the contact across the play) is solved with the
// airframe; then the stick side (the circuit's inertia I_c, damping, springs, friction,
// bobweight at the load factor just found, the pilot) feels the contact's reaction. The stick
// side does not act on the airframe except through the contact (its mass is in the airframe's).
Accel accelerations_play(const Plant& p, const Controls& ctl, const Stage& st, Eval& e) {
  const Airplane& ap = p.ap;
  const auto& ci = ap.circuit;
  const double G = ci.gearing;
  const double q = st.q, de = st.de, ded = st.ded;
  const V2 gvec = st.gvec;
  const bool pinned = ctl.stick == Stick::held && ci.held_stiffness == 0.0;  // the hand holds it rigidly
  const bool stuck = !pinned && ctl.friction == FrictionState::stuck;
  const double ds = pinned ? ctl.hold_de : st.ds;
  const double dsd = pinned || stuck ? 0.0 : st.dsd;
  const double C = play_contact_moment(ap, de - ds, ded - dsd);  // on the elevator
  const double Hel = stop_moment(ap, de, ded) + C;
  const double cde = std::cos(de), sde = std::sin(de);
  const V2 D = p.m_e > 0 ? V2{p.S_e * (1.0 - cde), p.S_e * sde} : V2{0, 0};
  const V2 Srho{-p.S_e * cde, p.S_e * sde};
  const double Hext = e.H_aero + Hel + cross(Srho, gvec);
  const Solved sv = solve_bodies(p, q, de, ded, 0.0, gvec, 0.0, e.X + p.m * gvec.x, e.Z + p.m * gvec.z,
                                 e.M + cross(D, gvec), Hext, false);
  const double n = -(sv.aOz - gvec.z) / g;
  const double bob = ci.bobweight / G;
  // the stick side: I_c dds = H_stick + bob n - C + H_pilot + H_friction
  double H_pilot = 0.0;
  if (ctl.stick == Stick::free) H_pilot = -(ctl.pilot_force / G);
  else if (!pinned) H_pilot = -ci.held_stiffness * (ds - ctl.hold_de) / (G * G);
  const double Hs = stick_side_moment(ap, ds, dsd) + bob * n - C;
  double H_friction = 0.0, dds = 0.0;
  if (pinned) {
    H_pilot = -Hs;
  } else if (stuck) {
    H_friction = -(Hs + H_pilot);
  } else {
    H_friction = friction_hinge_moment(ap, ctl.friction, dsd);
    dds = (Hs + H_pilot + H_friction) / p.I_c;
  }
  Accel a{sv.aOx, sv.aOz, sv.al, sv.be, H_pilot, Hel, 0.0, G, H_friction, false};
  a.dds = dds;
  a.dsd = dsd;
  return a;
}

}  // namespace

void derivatives(const Plant& p, const GustField& gust, const State& x, const Controls& ctl,
                 double t, State& dxdt, Eval* out) {
  const Airplane& ap = p.ap;
  Stage st;
  st.u = x[sx::u];
  st.w = x[sx::w];
  st.q = x[sx::q];
  st.de = x[sx::de];
  st.ded = elevator_locked(ap, ctl) ? 0.0 : x[sx::de_dot];
  st.ds = x[sx::ds];
  st.dsd = x[sx::ds_dot];
  st.cth = std::cos(x[sx::theta]);
  st.sth = std::sin(x[sx::theta]);
  st.gvec = V2{-g * st.sth, g * st.cth};
  Eval e;
  air_data(p, gust, x, ctl, t, st, e);
  forces_and_moments(p, ctl, st, e);
  const Accel acc = ctl.play ? accelerations_play(p, ctl, st, e) : accelerations(p, ctl, st, e);
  const double u = st.u, w = st.w, q = st.q, ded = st.ded, cth = st.cth, sth = st.sth;
  const double aOx = acc.aOx, aOz = acc.aOz, al = acc.al, be = acc.be, G = acc.G, H_pilot = acc.H_pilot;
  const double Hc = acc.Hc, bob = acc.bob;
  const bool locked = acc.locked;
  const V2 gvec = st.gvec;
  const int nlag = st.nlag;
  const double Vsafe = st.Vsafe, eps_target = st.eps_target;
  e.stick_force = -G * H_pilot;
  e.load_factor = -e.Z / (p.m * g);
  e.H_circuit = Hc + bob * (-(aOz - gvec.z) / g);
  e.H_friction = acc.H_friction;

  e.u_dot = aOx - q * w;
  e.w_dot = aOz + q * u;
  e.q_dot = al;
  e.de_ddot = be;

  dxdt[sx::u] = e.u_dot;
  dxdt[sx::w] = e.w_dot;
  dxdt[sx::q] = al;
  dxdt[sx::theta] = q;
  dxdt[sx::x] = u * cth + w * sth;
  dxdt[sx::h] = u * sth - w * cth;
  dxdt[sx::de] = ded;
  dxdt[sx::de_dot] = locked ? 0.0 : be;
  dxdt[sx::ds] = acc.dsd;  // the stick side (free play only; 0 otherwise)
  dxdt[sx::ds_dot] = acc.dds;
  // downwash lag: nlag first-order stages of equal time constant, total l_t / V
  for (std::size_t i = 0; i < sx::max_lag_stages; ++i) dxdt[sx::eps0 + i] = 0.0;
  if (nlag > 0) {
    const double tau = p.l_wt / (Vsafe * nlag);
    double in = eps_target;
    for (int i = 0; i < nlag; ++i) {
      const std::size_t k = sx::eps0 + static_cast<std::size_t>(i);
      dxdt[k] = (in - x[k]) / tau;
      in = x[k];
    }
  }
  if (out) *out = e;
}

State steady_state(const Plant& p, double V, double alpha, double theta, double h, double de) {
  State x{};
  x[sx::u] = V * std::cos(alpha);
  x[sx::w] = V * std::sin(alpha);
  x[sx::theta] = theta;
  x[sx::h] = h;
  x[sx::de] = de;
  const double eps = steady_downwash(p.ap.tail, alpha);
  for (int i = 0; i < lag_states(p); ++i) x[sx::eps0 + static_cast<std::size_t>(i)] = eps;
  return x;
}

}  // namespace fp
