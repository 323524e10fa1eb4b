// panel_toolbar.cpp — the App's toolbar (see app.hpp): run, step, all at once, reset, speed,
// time; gust, let go / take hold, pulse, tab; at the right what each airplane is doing.
#include "model/units.hpp"
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

using fp::units::to_deg;

void App::toolbar(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##toolbar", pos, size, ImGuiWindowFlags_NoBackground);
  ImGui::GetWindowDrawList()->AddLine(ImVec2(pos.x, pos.y + size.y - 1), ImVec2(pos.x + size.x, pos.y + size.y - 1),
                                      IM_COL32(200, 196, 186, 255));
  ImGui::SetCursorPosY(8.0f);
  const bool ok = ses_.loaded();
  if (!ok) ImGui::BeginDisabled();
  if (ImGui::Button(running_ ? "Pause" : "Run live", ImVec2(78, 0))) running_ = !running_;
  tooltip("Run the two airplanes in real time times the speed factor, or pause them.  [Space]");
  ImGui::SameLine();
  if (ImGui::Button("Step")) {
    running_ = false;
    step_request_ = true;
  }
  tooltip("Pause and advance by one output step of the scenario.  [.]");
  ImGui::SameLine();
  if (ImGui::Button("All at once")) {
    ses_.run_all_at_once();
    running_ = false;
  }
  tooltip("From the trim, run both airplanes to the scenario's run.duration at once, then pause.  [A]");
  ImGui::SameLine();
  if (ImGui::Button("Reset")) ses_.reset();
  tooltip("Both airplanes back to the trim, time 0.  [R]");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(74);
  const double speeds[] = {0.0625, 0.125, 0.25, 0.5, 1, 2, 4, 8, 16};
  if (ImGui::BeginCombo("##speed", fmt("%g×", speed_).c_str())) {
    for (double s : speeds)
      if (ImGui::Selectable(fmt("%g×", s).c_str(), s == speed_)) speed_ = s;
    ImGui::EndCombo();
  }
  tooltip("Speed factor: simulated seconds per real second.  [+] [−]");
  ImGui::SameLine();
  ImGui::Text("t %7.2f s", ses_.time());
  ImGui::SameLine(0, 18);
  if (ImGui::Button("Gust")) gust_now();
  tooltip("A gust now, as set in Inputs (" + std::string(kGustShapes[gust_shape_]) + ", " +
          fmt("%.1f m/s", gust_amplitude_) + ", " + fmt("%.0f m", gust_length_) + "), for both airplanes.  [G]");
  ImGui::SameLine();
  const bool has_free = ses_.has_free();
  if (!has_free) ImGui::BeginDisabled();
  if (ImGui::Button(ses_.free_is_held() ? "Let go" : "Take hold", ImVec2(80, 0))) toggle_hold();
  tooltip("The free airplane's pilot lets go of the stick, or takes hold of it where it is.  [L]");
  ImGui::SameLine();
  if (ImGui::Button("Pulse")) ses_.pulse(pulse_force_, pulse_duration_);
  tooltip(fmt("A pilot force on the free stick: %.0f N (pull +)", pulse_force_) +
          fmt(" for %.2f s, as set in Inputs.  [P]", pulse_duration_));
  if (!has_free) ImGui::EndDisabled();
  ImGui::SameLine();
  if (ImGui::Button("Tab −")) ses_.set_tab(ses_.tab() - tab_step_deg_ * fp::units::deg);
  tooltip(fmt("Trim tab %.1f deg trailing edge up, both airplanes.  [ [ ]", tab_step_deg_));
  ImGui::SameLine(0, 2);
  if (ImGui::Button("Tab +")) ses_.set_tab(ses_.tab() + tab_step_deg_ * fp::units::deg);
  tooltip(fmt("Trim tab %.1f deg trailing edge down, both airplanes.  [ ] ]", tab_step_deg_));
  ImGui::SameLine();
  ImGui::TextDisabled("tab %+.1f°", to_deg(ses_.tab()));
  const float last_x = ImGui::GetItemRectMax().x - ImGui::GetWindowPos().x;
  if (!ok) ImGui::EndDisabled();
  if (ok) toolbar_states(last_x, size.x);
  ImGui::End();
}

// At the right: what the two airplanes are doing (when there is room; the side view says it too).
void App::toolbar_states(float last_x, float width) {
  const std::string h = "held: " + held_pose_.state;
  const std::string fr = ses_.has_free() ? "free: " + free_pose_.state : "free: none (irreversible circuit)";
  const float w = ImGui::CalcTextSize(h.c_str()).x + ImGui::CalcTextSize(fr.c_str()).x + 26.0f;
  if (last_x + 24.0f + w >= width) return;
  ImGui::SameLine(width - w - 10.0f);
  ImGui::SetCursorPosY(8.0f);
  ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(kHeld));
  ImGui::TextUnformatted(h.c_str());
  ImGui::PopStyleColor();
  ImGui::SameLine(0, 16);
  ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(IM_COL32(176, 92, 4, 255)));
  ImGui::TextUnformatted(fr.c_str());
  ImGui::PopStyleColor();
}

}  // namespace fpui
