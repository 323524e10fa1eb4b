// panel_modes.cpp — the App's modes panel (see app.hpp): the CG slider, the line that warns
// when the CG is aft of a neutral point, and the complex plane of the roots held and free at
// this CG with their locus over a CG range around the envelope.
#include <algorithm>
#include <cmath>

#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

namespace {

// A root as a point of the plane (its conjugate too when it oscillates), with a tag (the CG).
void add_root(std::vector<double>& x, std::vector<double>& y, std::vector<double>* t, const fp::Mode& m, double tag) {
  x.push_back(m.root.real());
  y.push_back(m.root.imag());
  if (t) t->push_back(tag);
  if (m.oscillatory) {
    x.push_back(m.root.real());
    y.push_back(-m.root.imag());
    if (t) t->push_back(tag);
  }
}

// A set of points as markers only.
Series scatter(const char* label, const std::vector<double>& x, const std::vector<double>& y,
               const std::vector<double>* t, ImU32 col, Marker mk, float size, bool filled) {
  Series sr;
  sr.label = label;
  sr.x = x.data();
  sr.y = y.data();
  sr.n = x.size();
  sr.color = col;
  sr.line = false;
  sr.marker = mk;
  sr.marker_size = size;
  sr.marker_filled = filled;
  sr.sorted_x = false;
  if (t) {
    sr.tag = t->data();
    sr.tag_name = "CG";
  }
  return sr;
}

}  // namespace

void App::modes_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##modes", pos, size,
              ImGuiWindowFlags_NoScrollbar | ImGuiWindowFlags_NoScrollWithMouse | ImGuiWindowFlags_NoBackground);
  caption(f_, "MODES AND CG");
  if (!ses_.loaded()) {
    ImGui::TextDisabled("no scenario");
    ImGui::End();
    return;
  }
  cg_slider(size.x);
  stability_lines();
  const RootsExtent extent = collect_roots();
  roots_plane(extent);
  ImGui::End();
}

// CG slider: re-trims and moves the roots while dragged; margins follow when let go.
void App::cg_slider(float panel_width) {
  const fp::Scenario& s = ses_.scenario();
  ImGui::SameLine(120);
  ImGui::SetCursorPosY(ImGui::GetCursorPosY() - 3);
  ImGui::SetNextItemWidth(std::max(120.0f, panel_width - 250.0f));
  const float lo = static_cast<float>(std::min(ses_.locus_from(), s.airplane.mass.h_cg));
  const float hi = static_cast<float>(std::max(ses_.locus_to(), s.airplane.mass.h_cg));
  if (ImGui::SliderFloat("CG [MAC]", &cg_slider_, lo, hi, "%.3f")) {
    ses_.set_defer_margins(true);
    const std::string err = ses_.set_key("mass.cg", cg_slider_);
    if (!err.empty()) {
      edit_error_ = err;
      cg_slider_ = static_cast<float>(s.airplane.mass.h_cg);
    }
  }
  if (ImGui::IsItemDeactivated()) {
    ses_.set_defer_margins(false);
    if (ses_.margins_stale()) ses_.refresh_margins();
  }
  tooltip("mass.cg: moving it re-trims the airplane and restarts both runs; the roots move along the "
          "locus drawn for the CG range (dots).");
}

// Warnings: from the neutral points when available, else from the sign of the largest real root;
// then the largest real roots held and free.
void App::stability_lines() {
  const fp::Scenario& s = ses_.scenario();
  const double cg = s.airplane.mass.h_cg;
  const fp::ModesResult& md = ses_.modes();
  std::string mode_h, mode_f;
  const double rh = fp::largest_real_root(md.held, &mode_h);
  const double rf = md.has_free ? fp::largest_real_root(md.free, &mode_f) : -INFINITY;
  ImGui::PushFont(f_.small);
  // while the slider is dragged the neutral points are those of the last position let go (they
  // hardly move with the CG; the margins take many trims and follow when the slider is let go)
  const bool reversible = s.airplane.circuit.reversible;
  if (const fp::Margins* m = ses_.margins(); m && !reversible) {
    if (cg > m->np_fixed.model)
      colored_wrapped(kWarnRed, fmt("CG %.3f is aft of the stick-fixed neutral point ", cg) +
                                    fmt("%.3f: statically unstable.", m->np_fixed.model));
    else
      colored_wrapped(kOkGreen, fmt("Static margin at CG %.3f: ", cg) + fmt("%+.3f (model); irreversible circuit, ",
                                                                               m->np_fixed.model - cg) +
                                    "the elevator cannot float: held case only.");
  } else if (const fp::Margins* m = ses_.margins()) {
    if (cg > m->np_fixed.model)
      colored_wrapped(kWarnRed, fmt("CG %.3f is aft of the stick-FIXED neutral point ", cg) +
                                    fmt("%.3f: unstable even with the stick held.", m->np_fixed.model));
    else if (cg > m->np_free.model)
      colored_wrapped(kWarnAmber, fmt("CG %.3f is aft of the stick-free neutral point ", cg) +
                                      fmt("%.3f: hands off, the airplane is statically unstable", m->np_free.model) +
                                      (cg < m->np_apparent.model
                                           ? fmt(" (the constant hinge moments move the divergence aft to %.3f).",
                                                 m->np_apparent.model)
                                           : std::string(".")));
    else
      colored_wrapped(kOkGreen, fmt("Static margins at CG %.3f: ", cg) + fmt("stick-fixed %+.3f, ", m->np_fixed.model - cg) +
                                    fmt("stick-free %+.3f (model).", m->np_free.model - cg));
  } else {
    if (rh > fp::kDivergenceThreshold)
      colored_wrapped(kWarnRed, "Held airplane diverges at this CG (" + mode_h + fmt(" %+.3f /s).", rh));
    else if (rf > fp::kDivergenceThreshold)
      colored_wrapped(kWarnAmber, "Hands off, the airplane diverges at this CG (" + mode_f + fmt(" %+.3f /s).", rf));
    else
      colored_wrapped(kOkGreen, "No divergent root held or free at this CG.");
  }
  {
    std::string line = "largest real root: held " + (std::isfinite(rh) ? fmt("%+.4f /s", rh) : std::string("none"));
    if (md.has_free) line += ",  free " + (std::isfinite(rf) ? fmt("%+.4f /s", rf) : std::string("none"));
    ImGui::TextDisabled("%s", line.c_str());
  }
  ImGui::PopFont();
}

// The plane's points: the locus over the CG range (small marks) and the roots at this CG
// (large), into roots_; returns the extent of the roots the chosen fit takes.
App::RootsExtent App::collect_roots() {
  const double cg = ses_.scenario().airplane.mass.h_cg;
  const fp::ModesResult& md = ses_.modes();
  RootSets& r = roots_;
  r.clear();
  // the airframe's own modes, without the fast elevator and downwash-lag roots
  auto airframe = [](const fp::Mode& m) { return m.name != "elevator" && m.name != "downwash lag"; };
  RootsExtent e;
  auto fit = [&](const fp::Mode& m) {
    const bool take = roots_fit_ == 1 || (roots_fit_ == 0 && airframe(m)) || (roots_fit_ == 2 && std::abs(m.root) < 2.0);
    if (!take) return;
    e.xlo = std::min(e.xlo, m.root.real());
    e.xhi = std::max(e.xhi, m.root.real());
    e.ymax = std::max(e.ymax, std::abs(m.root.imag()));
  };
  for (const auto& p : ses_.locus()) {
    if (!p.ok) continue;
    for (const auto& m : p.modes.held) add_root(r.lhx, r.lhy, &r.lht, m, p.cg), fit(m);
    if (p.modes.has_free)
      for (const auto& m : p.modes.free) add_root(r.lfx, r.lfy, &r.lft, m, p.cg), fit(m);
  }
  for (const auto& m : md.held) add_root(r.chx, r.chy, nullptr, m, cg), fit(m);
  if (md.has_free)
    for (const auto& m : md.free) add_root(r.cfx, r.cfy, nullptr, m, cg), fit(m);
  return e;
}

// Which roots the view fits: the airframe's (the fast elevator mode would squeeze the rest into
// a corner), all of them, or the slow ones near the origin.
void App::roots_fit_choice() {
  const ImVec2 keep = ImGui::GetCursorPos();
  ImGui::SetCursorPos(ImVec2(ImGui::GetWindowWidth() - 180.0f, keep.y));
  ImGui::PushFont(f_.small);
  ImGui::TextDisabled("fit");
  const char* fits[] = {"airframe", "all", "slow"};
  const char* fit_tips[] = {"the airframe's modes: short period, phugoid, divergences (not the elevator mode)",
                            "every root", "the roots within 2 /s of the origin"};
  for (int i = 0; i < 3; ++i) {
    ImGui::SameLine(0, i == 0 ? 6.0f : 2.0f);
    if (segment(fits[i], roots_fit_ == i)) {
      roots_fit_ = i;
      roots_refit_ = true;
    }
    tooltip(std::string("Fit the view to ") + fit_tips[i] + ". Wheel: zoom; drag: pan; double click: fit again.");
  }
  ImGui::PopFont();
  ImGui::SetCursorPos(keep);
}

// The complex plane: fitted to `extent` when asked (or when the scenario changed and the user
// has not zoomed); a zoom or a pan keeps the user's view until a fit is asked for.
void App::roots_plane(const RootsExtent& extent) {
  const bool has_free = ses_.modes().has_free;
  const RootSets& r = roots_;
  std::vector<Series> ser;
  ser.push_back(scatter("held, CG range", r.lhx, r.lhy, &r.lht, IM_COL32(27, 42, 65, 110), Marker::square, 1.5f, true));
  if (has_free)
    ser.push_back(
        scatter("free, CG range", r.lfx, r.lfy, &r.lft, IM_COL32(224, 128, 20, 140), Marker::square, 1.5f, true));
  ser.push_back(scatter("held, this CG", r.chx, r.chy, nullptr, kHeld, Marker::square, 4.5f, true));
  if (has_free) ser.push_back(scatter("free, this CG", r.cfx, r.cfy, nullptr, kFree, Marker::diamond, 5.0f, false));
  std::vector<RefLine> refs{RefLine{true, 0.0, IM_COL32(150, 60, 40, 170), "unstable →", false}};
  roots_fit_choice();
  if (ses_.generation() != roots_generation_) {
    roots_generation_ = ses_.generation();
    if (!roots_user_zoomed_) roots_refit_ = true;
  }
  if (roots_refit_ || (modes_x_.automatic && modes_y_.automatic)) {
    roots_refit_ = false;
    const double pad = 0.08 * (extent.xhi - extent.xlo);
    modes_x_ = AxisRange{extent.xlo - pad, extent.xhi + pad, false};
    modes_y_ = AxisRange{-1.12 * extent.ymax, 1.12 * extent.ymax, false};
    roots_user_zoomed_ = false;
  }
  const AxisRange before_x = modes_x_, before_y = modes_y_;
  PlotSpec ps;
  ps.id = "##roots";
  ps.title = "roots  [1/s]";
  ps.x_unit = "1/s";
  ps.y_unit = "rad/s";
  ps.x = &modes_x_;
  ps.y = &modes_y_;
  ps.x_include_zero = true;
  ps.y_include_zero = true;
  ps.nearest_readout = true;
  ps.y_min_span = 1.0;
  plot(ps, ser, refs);
  if (modes_x_.lo != before_x.lo || modes_x_.hi != before_x.hi || modes_y_.lo != before_y.lo || modes_y_.hi != before_y.hi)
    roots_user_zoomed_ = true;  // zoomed or panned: keep the user's view until asked to fit
}

}  // namespace fpui
