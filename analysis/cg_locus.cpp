// cg_locus.cpp — see cg_locus.hpp.
#include "analysis/cg_locus.hpp"

#include "model/trim.hpp"

namespace fp {

std::vector<LocusPoint> cg_root_locus(const Scenario& s, double cg_from, double cg_to, int points) {
  std::vector<LocusPoint> out;
  for (int i = 0; i < points; ++i) {
    LocusPoint p;
    p.cg = points == 1 ? cg_from : cg_from + (cg_to - cg_from) * i / (points - 1);
    Scenario c = s;
    try {
      set_value(c, "mass.cg", p.cg, "CG sweep");
      validate(c);
      p.modes = compute_modes(c);
      p.held_root = deciding_root(p.modes.held);
      if (p.modes.has_free) p.free_root = deciding_root(p.modes.free);
      p.ok = true;
    } catch (const ScenarioError& e) {
      p.error = e.what();
    } catch (const TrimError& e) {
      p.error = e.message;
    }
    out.push_back(std::move(p));
  }
  return out;
}

double largest_real_root(const std::vector<Mode>& modes, std::string* mode) {
  const StabilityRoot r = deciding_root(modes);
  if (mode) *mode = r.mode;
  return r.found ? r.root.real() : -std::numeric_limits<double>::infinity();
}

}  // namespace fp
