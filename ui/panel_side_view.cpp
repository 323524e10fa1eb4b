// panel_side_view.cpp — the App's side view host (see app.hpp): the poses of the two airplanes
// and the marks of the MAC bar taken from the session each frame, the panel with its view
// choice and the MAC bar's tooltip, and the SFML drawing (side_view.cpp) in its rectangle.
#include <limits>

#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

namespace {

// Pose of one airplane from the last sample of its trace.
Pose pose_of(const fp::Simulation& sim, bool free_case, const std::string& failure, double let_go_time) {
  Pose p;
  const fp::Trace& tr = sim.trace();
  if (tr.size() > 0) {
    const std::size_t i = tr.size() - 1;
    p.theta = tr.ch[fp::ch_theta][i];
    p.alpha = tr.ch[fp::ch_alpha][i];
    p.de = tr.ch[fp::ch_elevator][i];
    p.tab = tr.ch[fp::ch_tab][i];
    p.gust_w_wing = tr.ch[fp::ch_gust_w_wing][i];
    p.gust_w_tail = tr.ch[fp::ch_gust_w_tail][i];
    p.gust_u_wing = tr.ch[fp::ch_gust_u_wing][i];
    p.gust_u_tail = tr.ch[fp::ch_gust_u_tail][i];
  }
  if (!failure.empty()) p.state = "stopped: numerical failure";
  else if (sim.departure().departed) p.state = fmt("departed at %.2f s", sim.departure().time);
  else if (!free_case) p.state = "stick held";
  else if (sim.controls().stick == fp::Stick::free) p.state = "hands off";
  else if (sim.time() < let_go_time) p.state = fmt("stick held, lets go at %.1f s", let_go_time);
  else p.state = "stick held again";
  return p;
}

}  // namespace

void App::update_side_view_state() {
  const double lgt = ses_.scenario().run.let_go_time;
  held_pose_ = pose_of(*ses_.held(), false, ses_.held_failure(), lgt);
  if (ses_.has_free()) free_pose_ = pose_of(*ses_.free(), true, ses_.free_failure(), lgt);
  marks_ = MacMarks{};
  marks_.cg = ses_.scenario().airplane.mass.h_cg;
  marks_.envelope_forward = ses_.scenario().envelope.cg_forward;
  marks_.envelope_aft = ses_.scenario().envelope.cg_aft;
  if (const fp::Margins* m = ses_.margins()) {
    marks_.have_points = true;
    marks_.np_fixed = m->np_fixed.model;
    marks_.np_free = m->np_free.model;
    marks_.np_apparent = m->np_apparent.model;
    marks_.mp_fixed = m->mp_fixed.model;
    marks_.mp_free = m->mp_free.model;
    if (!ses_.scenario().airplane.circuit.reversible) {
      // an irreversible circuit: the elevator cannot float (held case only): no stick-free points either
      marks_.np_free = marks_.np_apparent = marks_.mp_free = std::numeric_limits<double>::quiet_NaN();
      marks_.note = "irreversible: no stick-free points";
    }
  } else {
    marks_.missing = "not available: " + ses_.margins_error();
  }
}

void App::side_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##side", pos, size, ImGuiWindowFlags_NoBackground | ImGuiWindowFlags_NoScrollbar);
  caption(f_, "SIDE VIEW");
  ImGui::SameLine(110);
  ImGui::SetCursorPosY(ImGui::GetCursorPosY() - 1);
  if (segment("side by side", !superposed_)) superposed_ = false;
  ImGui::SameLine(0, 2);
  if (segment("superposed", superposed_)) superposed_ = true;
  tooltip("Held and free airplanes next to each other, or drawn on top of each other (free dashed).  [V]");
  const float top = 28.0f;
  side_rect_ = sf::FloatRect(pos.x + 4.0f, pos.y + top, size.x - 8.0f, size.y - top - 4.0f);
  mac_tooltip();
  if (!ses_.loaded()) {
    ImGui::SetCursorPosY(top + 20);
    ImGui::TextDisabled("no scenario");
  } else if (!side_view_.has_font()) {
    ImGui::SetCursorPosY(size.y - 24);
    ImGui::TextDisabled("(no TrueType font found: labels left out)");
  }
  ImGui::End();
}

// The MAC bar at the foot of the side view explains itself when hovered.
void App::mac_tooltip() {
  const ImVec2 mp = ImGui::GetIO().MousePos;
  if (!(ses_.loaded() && ImGui::IsWindowHovered() && mp.x >= side_rect_.left &&
        mp.x <= side_rect_.left + side_rect_.width && mp.y >= side_rect_.top + side_rect_.height - 76.0f &&
        mp.y <= side_rect_.top + side_rect_.height))
    return;
  std::string t = fmt("Mean aerodynamic chord, leading edge 0 to trailing edge 1.\nCG %.4f", marks_.cg) +
                  fmt("   envelope %.3f", marks_.envelope_forward) + fmt("..%.3f", marks_.envelope_aft);
  if (marks_.have_points)
    t += fmt("\nN fixed  %.4f  stick-fixed neutral point (model)", marks_.np_fixed) +
         fmt("\nN free   %.4f  stick-free neutral point (model)", marks_.np_free) +
         fmt("\nN free app. %.4f  where the hands-off airplane diverges with the constant hinge moments",
             marks_.np_apparent) +
         fmt("\nM fixed  %.4f  stick-fixed maneuver point", marks_.mp_fixed) +
         fmt("\nM free   %.4f  stick-free maneuver point (aerodynamic)", marks_.mp_free);
  else
    t += "\nneutral points: " + marks_.missing;
  ImGui::BeginTooltip();
  ImGui::TextUnformatted(t.c_str());
  ImGui::EndTooltip();
}

void App::draw_sfml(sf::RenderTarget& target) {
  if (!ses_.loaded() || side_rect_.width < 50 || side_rect_.height < 80) return;
  side_view_.draw(target, side_rect_, ses_.scenario().airplane, &held_pose_, ses_.has_free() ? &free_pose_ : nullptr,
                  superposed_, exaggeration_, marks_);
}

}  // namespace fpui
