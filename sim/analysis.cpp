// analysis.cpp — static and linear analyses of a scenario (see analysis.hpp).
#include "analysis.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "sim/outputs.hpp"
#include "sim/run.hpp"

namespace fp {

using nlohmann::json;

namespace {

constexpr double nan_ = std::numeric_limits<double>::quiet_NaN();

json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }
json pair_json(const Pair& p) {
  return json{{"closed_form", num(p.closed_form)}, {"model", num(p.model)},
              {"difference", num(p.model - p.closed_form)}};
}

// Speed at which the fixed-tab stick force equals `target`, between a and b (bisection).
double speed_for_force(const Plant& p, const Condition& c, double tab, double target, double a, double b) {
  auto f = [&](double V) {
    Condition ci = c;
    ci.airspeed = V;
    TrimRequest r;
    r.condition = ci;
    r.tab = tab;
    r.check_limits = false;
    return trim(p, r).stick_force - target;
  };
  double fa, fb;
  try {
    fa = f(a);
    fb = f(b);
  } catch (const TrimError&) {
    return nan_;
  }
  if (fa * fb > 0) return nan_;
  for (int i = 0; i < 60 && b - a > 1e-4; ++i) {
    const double m = 0.5 * (a + b);
    double fm;
    try {
      fm = f(m);
    } catch (const TrimError&) {
      return nan_;
    }
    if (fa * fm <= 0) { b = m; fb = fm; } else { a = m; fa = fm; }
  }
  return 0.5 * (a + b);
}

std::string pct(double v) { return std::isfinite(v) ? fixed(100.0 * v, 1) : std::string("n/a"); }

}  // namespace

Margins compute_margins(const Scenario& s, const MarginsOptions& o) {
  Margins m;
  const auto plant = scenario_plant(s);
  const Plant& p = *plant;
  const Condition& c = s.condition;
  m.cg = s.airplane.mass.h_cg;
  m.trim_speed = c.airspeed;
  m.envelope_forward = s.envelope.cg_forward;
  m.envelope_aft = s.envelope.cg_aft;
  m.cf = closed_form(s.airplane, c);
  const Trim tf = trim_free(p, c);  // the hands-off trim at the scenario condition
  m.trim_tab = tf.tab;
  const ModelNeutralPoints mn = model_neutral_points(p, tf);
  m.np_fixed = {m.cf.np_fixed, mn.fixed};
  m.np_free = {m.cf.np_free, mn.free};
  // apparent: the CG where the fixed-tab stick-force gradient vanishes, tab re-trimmed at each CG
  const double app = cg_zero(
      s.airplane,
      [&](const Plant& pp) {
        const Trim t = trim_free(pp, c);
        return stick_force_gradient(pp, c, t.tab);
      },
      m.cg);
  m.np_apparent = {m.cf.np_apparent, app};
  // maneuver points: where d(delta_e)/dn vanishes (fixed), where dF/dn vanishes with the
  // constant hinge moments removed (free, aerodynamic)
  const double mpf = cg_zero(
      s.airplane, [&](const Plant& pp) { return per_g(pp, c, trim_free(pp, c).tab).elevator_per_g; }, m.cg);
  const double mpfree = cg_zero(
      without_constant_hinge_moments(s.airplane),
      [&](const Plant& pp) { return per_g(pp, c, trim_free(pp, c).tab).force_per_g; }, m.cg);
  m.mp_fixed = {m.cf.mp_fixed, mpf};
  m.mp_free = {m.cf.mp_free, mpfree};
  m.margin_fixed = mn.fixed - m.cg;
  m.margin_free = mn.free - m.cg;
  m.margin_apparent = app - m.cg;
  const PerG pg = per_g(p, c, tf.tab);
  m.elevator_per_g = pg.elevator_per_g;
  m.force_per_g = pg.force_per_g;
  {
    const Plant pa = make_plant(without_constant_hinge_moments(s.airplane));
    m.force_per_g_aero = per_g(pa, c, trim_free(pa, c).tab).force_per_g;
  }
  m.force_gradient = stick_force_gradient(p, c, tf.tab);
  // the speed range of the curve: the stated envelope, else 1.2 Vs to 1.6 V_trim
  const double rho = isa_at(geopotential_altitude(c.altitude)).density;
  const double Vs = std::sqrt(2.0 * p.m * units::g0 / (rho * s.airplane.wing.area * wing_stall(s.airplane.wing.lift).CLmax));
  m.speed_lo = s.envelope.min_speed > 0 ? s.envelope.min_speed : 1.2 * Vs;
  m.speed_hi = s.envelope.max_speed > 0 ? s.envelope.max_speed : 1.6 * c.airspeed;
  m.curve = stick_force_curve(p, c, tf.tab, m.speed_lo, m.speed_hi, o.curve_points);
  // a second zero of the force in the range (force reversal)
  m.reversal_speed = nan_;
  for (std::size_t i = 1; i < m.curve.size(); ++i) {
    const auto& a = m.curve[i - 1];
    const auto& b = m.curve[i];
    if (a.stick_force * b.stick_force < 0) {
      const double Vz = a.airspeed - a.stick_force * (b.airspeed - a.airspeed) / (b.stick_force - a.stick_force);
      if (std::abs(Vz - c.airspeed) > 0.02 * c.airspeed) {
        m.reversal_speed = Vz;
        break;
      }
    }
  }
  // free-return band: speeds around trim where the force is below the friction breakout
  const double Ff = s.airplane.circuit.friction;
  m.free_return_low = m.free_return_high = nan_;
  if (Ff > 0 && m.force_gradient < 0) {
    m.free_return_low = speed_for_force(p, c, tf.tab, Ff, std::max(m.speed_lo, 0.5 * c.airspeed), c.airspeed);
    m.free_return_high = speed_for_force(p, c, tf.tab, -Ff, c.airspeed, std::min(m.speed_hi, 2.0 * c.airspeed));
  }
  CgLimitOptions lo;
  // forward limit: flared near the stall, 1.1 Vs at sea level (no ground effect in the model,
  // which would ask for still more up elevator)
  const double Vs0 = std::sqrt(2.0 * p.m * units::g0 / (isa::rho0 * s.airplane.wing.area * wing_stall(s.airplane.wing.lift).CLmax));
  lo.min_speed = 1.1 * Vs0;
  lo.min_static_margin = o.min_static_margin;
  lo.min_force_per_g = o.min_force_per_g;
  m.limits = cg_limits(s.airplane, c, lo);
  return m;
}

json margins_json(const Margins& m) {
  auto lim = [](const CgLimit& l) { return json{{"cg", num(l.cg)}, {"reason", l.reason}}; };
  json curve = json::array();
  for (const auto& f : m.curve)
    curve.push_back({{"airspeed_mps", f.airspeed}, {"stick_force_N", f.stick_force},
                     {"elevator_deg", units::to_deg(f.elevator)}, {"alpha_deg", units::to_deg(f.alpha)}});
  return json{
      {"cg", m.cg},
      {"trim_airspeed_mps", m.trim_speed},
      {"trim_tab_deg", units::to_deg(m.trim_tab)},
      {"neutral_point_fixed", pair_json(m.np_fixed)},
      {"neutral_point_free", pair_json(m.np_free)},
      {"apparent_neutral_point_free", pair_json(m.np_apparent)},
      {"static_margin_fixed", num(m.margin_fixed)},
      {"static_margin_free", num(m.margin_free)},
      {"static_margin_apparent_free", num(m.margin_apparent)},
      {"maneuver_point_fixed", pair_json(m.mp_fixed)},
      {"maneuver_point_free", pair_json(m.mp_free)},
      {"elevator_per_g_deg", units::to_deg(m.elevator_per_g)},
      {"stick_force_per_g_N", m.force_per_g},
      {"stick_force_per_g_aerodynamic_N", m.force_per_g_aero},
      {"stick_force_gradient_N_per_mps", m.force_gradient},
      {"stick_force_gradient_N_per_kt", m.force_gradient * units::kt},
      {"free_return_band_mps",
       {{"low", num(m.free_return_low)}, {"high", num(m.free_return_high)},
        {"width", num(m.free_return_high - m.free_return_low)}}},
      {"force_reversal_speed_mps", num(m.reversal_speed)},
      {"closed_form",
       {{"tail_volume", m.cf.tail_volume}, {"lift_slope_per_rad", m.cf.lift_slope},
        {"lift_slope_free_per_rad", m.cf.lift_slope_free}, {"free_elevator_factor", m.cf.free_factor},
        {"cm_delta_per_rad", m.cf.cm_delta}, {"hinge_constant_Nm", m.cf.hinge_constant},
        {"relative_density", m.cf.mu}, {"cm_q", m.cf.cm_q}, {"cm_q_free", m.cf.cm_q_free},
        {"force_constant_A_N", m.cf.force_constant_A}, {"stick_force_gradient_N_per_mps", m.cf.force_gradient},
        {"elevator_per_g_deg", units::to_deg(m.cf.elevator_per_g)}, {"stick_force_per_g_N", m.cf.force_per_g},
        {"stick_force_per_g_aerodynamic_N", m.cf.force_per_g_aero},
        {"free_return_fraction", num(m.cf.free_return_fraction)}}},
      {"cg_limits",
       {{"forward", lim(m.limits.forward)},
        {"aft", lim(m.limits.aft)},
        {"aft_candidates",
         {{"stick_free_neutral_point", lim(m.limits.aft_free_np)},
          {"minimum_static_margin", lim(m.limits.aft_margin)},
          {"minimum_stick_force_per_g", lim(m.limits.aft_force_per_g)}}},
        {"envelope", {{"forward", m.envelope_forward}, {"aft", m.envelope_aft}}},
        {"envelope_inside_limits",
         std::isfinite(m.limits.forward.cg) && std::isfinite(m.limits.aft.cg) &&
             m.envelope_forward >= m.limits.forward.cg && m.envelope_aft <= m.limits.aft.cg}}},
      {"stick_force_curve", curve}};
}

std::string margins_table(const Margins& m) {
  std::ostringstream o;
  char line[256];
  o << "CG " << pct(m.cg) << " % MAC; trim " << fixed(m.trim_speed, 2) << " m/s ("
    << fixed(units::to_kt(m.trim_speed), 1) << " kt TAS), hands-off tab " << fixed(units::to_deg(m.trim_tab), 2)
    << " deg\n\n";
  std::snprintf(line, sizeof line, "%-40s %12s %12s %10s\n", "(% MAC)", "closed form", "model", "diff");
  o << line;
  auto row = [&](const char* name, const Pair& p) {
    std::snprintf(line, sizeof line, "%-40s %12s %12s %10s\n", name, pct(p.closed_form).c_str(), pct(p.model).c_str(),
                  pct(p.model - p.closed_form).c_str());
    o << line;
  };
  row("neutral point, stick fixed", m.np_fixed);
  row("neutral point, stick free (aerodynamic)", m.np_free);
  row("apparent stick-free neutral point", m.np_apparent);
  row("maneuver point, stick fixed", m.mp_fixed);
  row("maneuver point, stick free", m.mp_free);
  o << "\nstatic margin  fixed " << pct(m.margin_fixed) << " %   free " << pct(m.margin_free)
    << " %   apparent free " << pct(m.margin_apparent) << " %  (positive = stable)\n";
  o << "apparent point aft of the aerodynamic free point by " << pct(m.np_apparent.model - m.np_free.model)
    << " % MAC (constant hinge moment " << fixed(m.cf.hinge_constant, 3) << " N m at 1 g)\n";
  o << "elevator per g " << fixed(units::to_deg(m.elevator_per_g), 2) << " deg/g; stick force per g "
    << fixed(m.force_per_g, 1) << " N/g (" << fixed(m.force_per_g / units::lbf, 1) << " lbf/g), aerodynamic only "
    << fixed(m.force_per_g_aero, 1) << " N/g\n";
  o << "stick-force gradient at trim " << fixed(m.force_gradient, 3) << " N per m/s ("
    << fixed(m.force_gradient * units::kt, 3) << " N/kt; negative = pull needed below trim = stable)\n";
  if (std::isfinite(m.free_return_low))
    o << "free-return band (friction) " << fixed(m.free_return_low, 1) << " .. " << fixed(m.free_return_high, 1)
      << " m/s (" << fixed(units::to_kt(m.free_return_low), 1) << " .. " << fixed(units::to_kt(m.free_return_high), 1)
      << " kt)\n";
  else
    o << "free-return band: none (no friction, or no stable gradient)\n";
  if (std::isfinite(m.reversal_speed)) o << "stick force reverses at " << fixed(m.reversal_speed, 1) << " m/s\n";
  o << "\nCG limits (% MAC):\n";
  auto lim = [&](const char* name, const CgLimit& l) {
    o << "  " << name << " " << pct(l.cg) << "  " << l.reason << "\n";
  };
  lim("forward ", m.limits.forward);
  lim("aft     ", m.limits.aft);
  lim("  (free NP)       ", m.limits.aft_free_np);
  lim("  (margin)        ", m.limits.aft_margin);
  lim("  (force per g)   ", m.limits.aft_force_per_g);
  o << "  stated envelope " << pct(m.envelope_forward) << " .. " << pct(m.envelope_aft) << "\n";
  return o.str();
}

ModesResult compute_modes(const Scenario& s) {
  ModesResult r;
  const auto plant = scenario_plant(s);
  const Trim t = scenario_trim(*plant, s);
  Controls c = t.controls;
  c.stick = Stick::held;
  r.held_lm = linearise(*plant, t.x, c);
  r.held = modes(r.held_lm);
  if (plant->ap.circuit.reversible) {
    c.stick = Stick::free;
    c.pilot_force = 0.0;
    r.free_lm = linearise(*plant, t.x, c);
    r.free = modes(r.free_lm);
    r.has_free = true;
  }
  return r;
}

json modes_json(const ModesResult& r) {
  auto arr = [](const std::vector<Mode>& ms) {
    json a = json::array();
    for (const auto& m : ms) {
      json j{{"name", m.name},
             {"real", m.root.real()},
             {"imag", m.root.imag()},
             {"frequency_rad_s", m.frequency},
             {"damping_ratio", m.damping},
             {"period_s", m.oscillatory ? json(m.period) : json(nullptr)},
             {"cycles_to_tenth", m.cycles_to_tenth > 0 ? json(m.cycles_to_tenth) : json(nullptr)}};
      if (m.root.real() < 0) j["time_to_half_s"] = m.time_to_half;
      if (m.root.real() > 0) j["time_to_double_s"] = m.time_to_double;
      a.push_back(j);
    }
    return a;
  };
  return json{{"held", arr(r.held)}, {"free", r.has_free ? arr(r.free) : json(nullptr)}};
}

std::string modes_table(const ModesResult& r) {
  std::ostringstream o;
  char line[256];
  auto block = [&](const char* title, const std::vector<Mode>& ms) {
    o << title << "\n";
    std::snprintf(line, sizeof line, "  %-18s %10s %10s %9s %8s %9s %12s %9s\n", "mode", "real", "imag", "omega_n",
                  "zeta", "period", "t_half/dbl", "N_1/10");
    o << line;
    std::snprintf(line, sizeof line, "  %-18s %10s %10s %9s %8s %9s %12s %9s\n", "", "[1/s]", "[rad/s]", "[rad/s]",
                  "[-]", "[s]", "[s]", "[cycles]");
    o << line;
    for (const auto& m : ms) {
      std::string th = "-";
      if (m.root.real() < 0) th = fixed(m.time_to_half, 2);
      if (m.root.real() > 0) {
        th = fixed(m.time_to_double, 2);
        th.append(" dbl");
      }
      std::snprintf(line, sizeof line, "  %-18s %10.4f %10.4f %9.4f %8.3f %9s %12s %9s\n", m.name.c_str(),
                    m.root.real(), m.root.imag(), m.frequency, m.damping,
                    m.oscillatory ? fixed(m.period, 2).c_str() : "-", th.c_str(),
                    m.cycles_to_tenth > 0 ? fixed(m.cycles_to_tenth, 2).c_str() : "-");
      o << line;
    }
  };
  block("Stick held:", r.held);
  if (r.has_free) block("Stick free:", r.free);
  else o << "Stick free: none (irreversible circuit)\n";
  return o.str();
}

std::string matrix_csv(const LinearModel& lm, bool inputs) {
  std::ostringstream o;
  o.precision(12);
  o << "row";
  if (inputs)
    for (std::size_t k = 0; k < lm.input_names.size(); ++k) o << "," << lm.input_names[k] << " [" << lm.input_units[k] << "]";
  else
    for (std::size_t s : lm.states) o << "," << state_names[s] << " [" << state_units[s] << "]";
  o << "\n";
  const auto& M = inputs ? lm.B : lm.A;
  for (Eigen::Index i = 0; i < M.rows(); ++i) {
    const std::size_t s = lm.states[static_cast<std::size_t>(i)];
    o << "d(" << state_names[s] << ")/dt [" << state_units[s] << "/s]";
    for (Eigen::Index j = 0; j < M.cols(); ++j) o << "," << M(i, j);
    o << "\n";
  }
  return o.str();
}

}  // namespace fp
