// panel_time_plots.cpp — the App's time histories (see app.hpp): nine plots on one shared time
// axis, held dark and solid, free light and dashed, with the scenario's events and the live
// inputs marked; one legend for all plots above them.
#include <cmath>

#include "model/units.hpp"
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

using fp::units::to_deg;

namespace {

// One time plot: its channels and how they are named.
struct PlotDef {
  const char* id;
  std::string title;
  std::size_t ch;       // main channel
  std::size_t ch2;      // second channel (ch_count: none)
  const char* l1;       // label of the main channel in the legend
  const char* l2;
  double min_span;
  bool second_free_only = false;  // the second channel only for the free airplane
};

std::vector<PlotDef> plot_defs() {
  auto title_of = [](std::size_t ch) {
    const auto& ci = fp::channel_info(ch);
    return std::string(ci.label) + "  [" + ci.unit + "]";
  };
  return {
      {"alpha", title_of(fp::ch_alpha), fp::ch_alpha, fp::ch_count, "", "", 0.5},
      {"load_factor", "load factor n  [-]", fp::ch_load_factor, fp::ch_count, "", "", 0.05},
      {"q", title_of(fp::ch_q), fp::ch_q, fp::ch_count, "", "", 1.0},
      {"theta", title_of(fp::ch_theta), fp::ch_theta, fp::ch_count, "", "", 0.5},
      {"elevator", "elevator and tab (TE down +)  [deg]", fp::ch_elevator, fp::ch_tab, "elevator", "tab", 0.5},
      {"stick_force", title_of(fp::ch_stick_force), fp::ch_stick_force, fp::ch_hold_force, "", "(force to hold)", 2.0, true},
      {"airspeed", title_of(fp::ch_airspeed), fp::ch_airspeed, fp::ch_count, "", "", 0.5},
      {"altitude", title_of(fp::ch_altitude), fp::ch_altitude, fp::ch_count, "", "", 2.0},
      {"gust", "vertical gust (up +)  [m/s]", fp::ch_gust_w_wing, fp::ch_gust_w_tail, "wing", "tail", 1.0},
  };
}

// The lines of one plot: held (and free when there is one), and their second channel.
std::vector<Series> plot_series(const PlotDef& d, const fp::Trace& th, const fp::Trace* tf) {
  std::vector<Series> ser;
  auto add = [&](const fp::Trace& tr, std::size_t ch, const std::string& label, ImU32 col, float th_, bool dashed) {
    Series s;
    s.label = label;
    s.x = tr.ch[fp::ch_time].data();
    s.y = tr.ch[ch].data();
    s.n = tr.size();
    s.y_factor = fp::channel_info(ch).display;
    s.color = col;
    s.thickness = th_;
    s.dashed = dashed;
    ser.push_back(s);
  };
  const bool two = d.ch2 != fp::ch_count;
  const bool two_named = two && !d.second_free_only;
  const std::string sh = two_named ? std::string("held ") + d.l1 : "held";
  const std::string sf = two_named ? std::string("free ") + d.l1 : "free";
  add(th, d.ch, sh, kHeld, 2.0f, false);
  if (tf) add(*tf, d.ch, sf, kFree, 2.0f, true);
  if (two && !d.second_free_only) add(th, d.ch2, std::string("held ") + d.l2, kHeld2, 1.0f, false);
  if (two && tf) add(*tf, d.ch2, std::string("free ") + d.l2, kFree2, 1.0f, true);
  return ser;
}

}  // namespace

void App::plots_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##plots", pos, size,
              ImGuiWindowFlags_NoScrollbar | ImGuiWindowFlags_NoScrollWithMouse | ImGuiWindowFlags_NoBackground);
  caption(f_, "TIME HISTORIES");
  time_plots_legend();
  geometry_.clear();
  if (!ses_.loaded()) {
    ImGui::TextDisabled("no scenario");
    ImGui::End();
    return;
  }
  const fp::Trace& th = ses_.held()->trace();
  const fp::Trace* tf = ses_.has_free() ? &ses_.free()->trace() : nullptr;
  const std::vector<RefLine> marks = event_marks();
  std::vector<RefLine> marks_plain = marks;  // the labels only in the first plot
  for (auto& m : marks_plain) m.label.clear();

  const std::vector<PlotDef> defs = plot_defs();
  const int cols = 3;
  const int rows = static_cast<int>((defs.size() + cols - 1) / cols);
  const ImVec2 origin = ImGui::GetCursorScreenPos();
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const float gap = 8.0f;
  const float w = std::floor((avail.x - gap * (cols - 1)) / cols);
  const float h = std::floor((avail.y - gap * (rows - 1)) / rows);
  for (std::size_t k = 0; k < defs.size(); ++k) {
    const PlotDef& d = defs[k];
    const std::vector<Series> ser = plot_series(d, th, tf);
    std::vector<RefLine> refs = k == 0 ? marks : marks_plain;
    if (d.ch == fp::ch_elevator) {
      const auto& el = ses_.scenario().airplane.elevator;
      refs.push_back(RefLine{false, to_deg(el.delta_max), IM_COL32(170, 32, 32, 120), "stop", true});
      refs.push_back(RefLine{false, to_deg(el.delta_min), IM_COL32(170, 32, 32, 120), "stop", true});
    }
    PlotGeometry g;
    const PlotSpec ps{.id = d.id,
                      .title = d.title,
                      .x_unit = "s",
                      .y_unit = fp::channel_info(d.ch).unit,
                      .size = ImVec2(w, h),
                      .x = &time_x_,
                      .y = &plot_y_[k],
                      .cursor = &time_cursor_,
                      .x_follow_span = span_,
                      .y_min_span = d.min_span,
                      .geometry = &g};
    const int r = static_cast<int>(k) / cols, c = static_cast<int>(k) % cols;
    ImGui::SetCursorScreenPos(ImVec2(origin.x + c * (w + gap), origin.y + r * (h + gap)));
    plot(ps, ser, refs);
    geometry_.emplace_back(d.id, g);
  }
  ImGui::End();
}

// A legend for all plots: held dark and solid, free light and dashed; then "follow" when the
// user has moved the time axis, else the span followed.
void App::time_plots_legend() {
  ImGui::SameLine(140);
  ImDrawList* dl = ImGui::GetWindowDrawList();
  const ImVec2 p = ImGui::GetCursorScreenPos();
  const float y = p.y + ImGui::GetFontSize() * 0.5f - 1.0f;
  dl->AddLine(ImVec2(p.x, y), ImVec2(p.x + 26, y), kHeld, 2.2f);
  ImGui::SetCursorScreenPos(ImVec2(p.x + 32, p.y));
  ImGui::TextUnformatted("held (stick held)");
  ImGui::SameLine(0, 18);
  const ImVec2 q = ImGui::GetCursorScreenPos();
  dl->AddLine(ImVec2(q.x, y), ImVec2(q.x + 10, y), kFree, 2.2f);
  dl->AddLine(ImVec2(q.x + 15, y), ImVec2(q.x + 26, y), kFree, 2.2f);
  ImGui::SetCursorScreenPos(ImVec2(q.x + 32, q.y));
  ImGui::TextUnformatted(ses_.has_free() || !ses_.loaded() ? "free (hands off after let go)"
                                                            : "free: none (irreversible circuit)");
  ImGui::SameLine(0, 18);
  if (!time_x_.automatic) {
    if (ImGui::SmallButton("follow  [F]")) follow_live_end();
  } else {
    ImGui::TextDisabled("last %.0f s", span_);
  }
}

// Event marks: the scenario's events and gusts, the live inputs, and where an airplane departed.
std::vector<RefLine> App::event_marks() const {
  std::vector<RefLine> marks;
  const ImU32 mark_col = IM_COL32(46, 110, 107, 150);
  const bool has_free = ses_.has_free();
  if (has_free && ses_.scenario().run.let_go_time > 0.0)
    marks.push_back(RefLine{true, ses_.scenario().run.let_go_time, mark_col, "let go", true});
  for (const auto& e : ses_.scenario().events) {
    const char* n = e.kind == fp::EventKind::let_go      ? "let go"
                    : e.kind == fp::EventKind::take_hold ? "hold"
                    : e.kind == fp::EventKind::tab       ? "tab"
                    : e.kind == fp::EventKind::pulse     ? "pulse"
                                                         : "elevator";
    marks.push_back(RefLine{true, e.time, mark_col, n, true});
  }
  for (std::size_t i = 0; i < ses_.scenario().gust_start_times.size(); ++i)
    if (const auto& st = ses_.scenario().gust_start_times[i]) marks.push_back(RefLine{true, *st, mark_col, "gust", true});
  for (const auto& a : ses_.live_log()) {
    const char* n = a.kind == ActionKind::gust        ? "gust"
                    : a.kind == ActionKind::let_go    ? "let go"
                    : a.kind == ActionKind::take_hold ? "hold"
                    : a.kind == ActionKind::tab       ? "tab"
                    : a.kind == ActionKind::pulse     ? "pulse"
                                                      : "";
    marks.push_back(RefLine{true, a.time, mark_col, n, true});
  }
  if (ses_.held()->departure().departed)
    marks.push_back(RefLine{true, ses_.held()->departure().time, kHeld, "held departed", false});
  if (has_free && ses_.free()->departure().departed)
    marks.push_back(RefLine{true, ses_.free()->departure().time, kFree, "free departed", false});
  return marks;
}

}  // namespace fpui
