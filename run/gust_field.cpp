// gust_field.cpp — the turbulence of a scenario (see gust_field.hpp).
#include "run/gust_field.hpp"

#include <cmath>

#include "model/dynamics.hpp"
#include "model/units.hpp"

namespace fp {

ResolvedTurbulence resolve_turbulence(const Scenario& s) {
  ResolvedTurbulence r;
  const TurbulenceSettings& t = s.turbulence;
  if (t.model == TurbulenceKind::none) return r;
  r.active = true;
  const TurbulenceModel m = t.model == TurbulenceKind::dryden ? TurbulenceModel::dryden : TurbulenceModel::von_karman;
  r.probability = t.probability > 0.0 ? t.probability : severity_probability(static_cast<Severity>(t.severity));
  r.height = t.height > 0.0 ? t.height : s.condition.altitude;
  r.tables = turbulence_levels(m, r.height, r.probability);
  r.closing_speed = gust_closing_speed(s);
  TurbulenceSpec& sp = r.spec;
  sp.model = m;
  sp.sigma_u = t.sigma_u > 0.0 ? t.sigma_u : r.tables.sigma_u;
  sp.sigma_w = t.sigma_w > 0.0 ? t.sigma_w : r.tables.sigma_w;
  sp.L_u = t.scale_u > 0.0 ? t.scale_u : r.tables.L_u;
  sp.L_w = t.scale_w > 0.0 ? t.scale_w : r.tables.L_w;
  if (t.components == TurbulenceComponents::vertical) sp.sigma_u = 0.0;
  if (t.components == TurbulenceComponents::horizontal) sp.sigma_w = 0.0;
  // The field is sampled at X + front_speed t by points from the tail (behind the CG) to the
  // wing: cover the tail's position at t = 0 to the wing's at the end, with a margin for the
  // airspeed changes the turbulence itself causes.
  const Airplane& ap = s.airplane;
  const double wing_tail = tail_arm(ap, ap.wing.h_ac);
  const double cg_tail = std::abs(tail_arm(ap, ap.mass.h_cg));
  // default spacing: half the wing-to-tail distance, so that the shortest wavelength the
  // record holds (2 dx) is the distance between the surfaces; at most a tenth of the smaller
  // scale length (low altitude).
  sp.dx = t.spacing > 0.0 ? t.spacing : std::max(0.01, std::min(wing_tail / 2.0, 0.1 * std::min(sp.L_u, sp.L_w)));
  sp.x0 = -(cg_tail + 20.0);
  sp.length = 1.1 * r.closing_speed * s.run.duration + 2.0 * cg_tail + 100.0;
  sp.x_start = r.closing_speed * t.start_time;
  sp.fade = r.closing_speed * t.fade_in;
  sp.seed = static_cast<std::uint64_t>(t.seed);
  sp.interpolation = Interpolation::cubic_spline;
  r.stats_from = t.start_time + t.fade_in;
  return r;
}

std::shared_ptr<const TurbulenceRecord> scenario_turbulence(const Scenario& s) {
  const ResolvedTurbulence r = resolve_turbulence(s);
  if (!r.active || (r.spec.sigma_u <= 0.0 && r.spec.sigma_w <= 0.0)) return nullptr;
  return make_turbulence_record(r.spec);
}

}  // namespace fp
