// analysis_text.cpp — margins and modes as text (see analysis_text.hpp).
#include "output/analysis_text.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "output/outputs.hpp"

namespace fp {

using nlohmann::json;

namespace {

json num(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }
json pair_json(const Pair& p) {
  return json{{"closed_form", num(p.closed_form)}, {"model", num(p.model)},
              {"difference", num(p.model - p.closed_form)}};
}
std::string pct(double v) { return std::isfinite(v) ? fixed(100.0 * v, 1) : std::string("n/a"); }

}  // namespace

json margins_json(const Margins& m) {
  auto lim = [](const CgLimit& l) {
    json j{{"cg", num(l.cg)}, {"reason", l.reason}};
    if (!l.basis.empty()) j["basis"] = l.basis;  // e.g. "tool default, not a criterion"
    return j;
  };
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
    o << "  " << name << " " << pct(l.cg) << "  " << l.reason;
    if (!l.basis.empty()) o << " [" << l.basis << "]";
    o << "\n";
  };
  lim("forward ", m.limits.forward);
  lim("aft     ", m.limits.aft);
  lim("  (free NP)       ", m.limits.aft_free_np);
  lim("  (margin)        ", m.limits.aft_margin);
  lim("  (force per g)   ", m.limits.aft_force_per_g);
  o << "  stated envelope " << pct(m.envelope_forward) << " .. " << pct(m.envelope_aft) << "\n";
  return o.str();
}

std::string per_g_stop_text(const PerGCurve& c) {
  char line[512];
  if (c.complete) {
    std::snprintf(line, sizeof line, "per-g curve: every load factor up to %.2f g trims", c.n_max);
    return line;
  }
  const double last = c.points.empty() ? std::nan("") : c.points.back().load_factor;
  if (c.numerical)
    std::snprintf(line, sizeof line,
                  "per-g curve stops at %.2f g: the trim at %.2f g failed numerically (not a limit of the airplane): %s",
                  last, c.stop_load_factor, c.stop_reason.c_str());
  else {
    const char* why = c.stop == TrimLimit::stall           ? "the wing stalls"
                      : c.stop == TrimLimit::elevator_stop ? "the elevator reaches its stop"
                      : c.stop == TrimLimit::tab_stop      ? "the tab is outside its range"
                                                           : "a limit of the airplane";
    std::snprintf(line, sizeof line, "per-g curve stops at %.2f g, the last load factor that trims; at %.2f g %s (%s)",
                  last, c.stop_load_factor, why, c.stop_reason.c_str());
  }
  return line;
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
      if (m.neutral) j["neutral_by_construction"] = m.neutral_reason;
      a.push_back(j);
    }
    return a;
  };
  // the root that decides stability (model/linear.hpp deciding_root) and the roots set aside
  auto dec = [](const std::vector<Mode>& ms) {
    const StabilityRoot d = deciding_root(ms);
    json aside = json::array();
    for (const auto& x : d.set_aside)
      aside.push_back({{"mode", x.mode}, {"real", x.root.real()}, {"imag", x.root.imag()}, {"reason", x.reason}});
    return json{{"mode", d.found ? json(d.mode) : json(nullptr)}, {"real", d.found ? json(d.root.real()) : json(nullptr)},
                {"imag", d.found ? json(d.root.imag()) : json(nullptr)}, {"stable", d.found && d.root.real() < 0},
                {"set_aside", aside}};
  };
  json fr = nullptr;
  if (r.friction.applies)
    fr = json{{"free_model", "slipping (no friction slope)"},
              {"stuck_model", "held (the elevator moves with the airframe)"},
              {"breakout_force_n", r.friction.breakout_force},
              {"breakout_moment_n_m", r.friction.breakout_moment},
              {"stuck_below_tail_alpha_change_deg",
               std::isfinite(r.friction.stuck_alpha_t) ? json(units::to_deg(r.friction.stuck_alpha_t)) : json(nullptr)}};
  auto about = [](const Trim& t) {
    return json{{"airspeed_m_s", t.airspeed}, {"alpha_deg", units::to_deg(t.alpha)},
                {"elevator_deg", units::to_deg(t.de)}, {"tab_deg", units::to_deg(t.tab)}};
  };
  return json{{"held", arr(r.held)}, {"free", r.has_free ? arr(r.free) : json(nullptr)},
              {"deciding_root", {{"held", dec(r.held)}, {"free", r.has_free ? dec(r.free) : json(nullptr)}}},
              {"linearised_about", {{"held", about(r.held_trim)}, {"free", r.has_free ? about(r.free_trim) : json(nullptr)}}},
              {"friction_models", fr}};
}

std::string friction_models_text(const FrictionModels& f) {
  if (!f.applies) return "";
  std::ostringstream o;
  o << "Friction circuit (breakout " << fixed(f.breakout_force, 2) << " N at the stick, " << fixed(f.breakout_moment, 3)
    << " N m at the hinge): two linear models.\n"
    << "  slipping: the stick-free modes above (no friction slope; a smoothing constant does not enter).\n"
    << "  stuck: the elevator moves with the airframe, i.e. the stick-held modes above; it applies while the\n"
    << "  hinge moment to hold stays within the breakout";
  if (std::isfinite(f.stuck_alpha_t))
    o << ", about a tail angle-of-attack change of " << fixed(units::to_deg(f.stuck_alpha_t), 3) << " deg from trim";
  o << ".\n";
  if (f.smooth_law)
    o << "  The runs use the smoothed friction law (circuit.friction_law = \"smooth\"): its slope is not physical damping.\n";
  return o.str();
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
      // a real part below 5e-5 /s in size would print as +-0.0000: it is shown in full, so that
      // the table agrees with the sweep's figures (a slow root near a crossing is such a root)
      char re[32];
      if (m.root.real() != 0.0 && std::abs(m.root.real()) < 5e-5) std::snprintf(re, sizeof re, "%10.2e", m.root.real());
      else std::snprintf(re, sizeof re, "%10.4f", m.root.real());
      std::snprintf(line, sizeof line, "  %-18s %10s %10.4f %9.4f %8.3f %9s %12s %9s\n", m.name.c_str(),
                    re, m.root.imag(), m.frequency, m.damping,
                    m.oscillatory ? fixed(m.period, 2).c_str() : "-", th.c_str(),
                    m.cycles_to_tenth > 0 ? fixed(m.cycles_to_tenth, 2).c_str() : "-");
      o << line;
    }
    const StabilityRoot d = deciding_root(ms);
    if (d.found)
      o << "  deciding root: " << d.mode << " " << d.root.real() << " /s"
        << (d.root.real() < 0 ? " (stable)" : " (not stable)") << "\n";
    for (const auto& x : d.set_aside)
      o << "  set aside: " << x.mode << " " << fixed(x.root.real(), 4) << " /s, " << x.reason << "\n";
  };
  block("Stick held:", r.held);
  if (r.has_free && std::abs(r.free_trim.airspeed - r.held_trim.airspeed) > 1e-6 * r.held_trim.airspeed)
    o << "Stick free: about the hands-off trim of the fixed tab (" << fixed(units::to_deg(r.free_trim.tab), 2)
      << " deg), " << fixed(r.free_trim.airspeed, 2) << " m/s (" << fixed(units::to_kt(r.free_trim.airspeed), 1)
      << " kt) where the held case is at " << fixed(r.held_trim.airspeed, 2) << " m/s ("
      << fixed(units::to_kt(r.held_trim.airspeed), 1) << " kt): let go, the airplane settles there\n";
  if (r.has_free) block("Stick free:", r.free);
  else o << "Stick free: none (irreversible circuit)\n";
  o << friction_models_text(r.friction);
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
