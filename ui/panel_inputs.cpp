// panel_inputs.cpp — the App's Inputs tab (see app.hpp): the live gust, the free airplane's
// stick, the trim tab, the view settings, export, and the keys.
#include <cmath>

#include <imgui.h>
#include <imgui_stdlib.h>  // needs imgui.h before it

#include "model/units.hpp"
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

using fp::units::to_deg;

void App::tab_inputs() {
  caption(f_, "GUST  [G]");
  ImGui::SetNextItemWidth(130);
  ImGui::Combo("shape", &gust_shape_, kGustShapes, 3);
  ImGui::SetNextItemWidth(130);
  ImGui::Combo("component", &gust_component_, kGustComponents, 2);
  float amp = static_cast<float>(gust_amplitude_), len = static_cast<float>(gust_length_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("amplitude", &amp, -20.0f, 20.0f, "%.1f m/s")) gust_amplitude_ = amp;
  tooltip("Peak gust velocity; vertical: up positive; horizontal: along the flight direction positive (a tail gust).");
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("length H", &len, 2.0f, 200.0f, "%.0f m", ImGuiSliderFlags_Logarithmic)) gust_length_ = len;
  tooltip("Gradient distance H: 1-cosine, distance from start to peak; ramp, the rise.");
  if (ImGui::Button("Gust now", ImVec2(130, 0))) gust_now();
  ImGui::SameLine();
  ImGui::TextDisabled("starts at the wing now");

  ImGui::Spacing();
  caption(f_, "STICK OF THE FREE AIRPLANE");
  if (!ses_.has_free()) ImGui::BeginDisabled();
  if (ImGui::Button(ses_.free_is_held() ? "Let go  [L]" : "Take hold  [L]", ImVec2(130, 0))) toggle_hold();
  float pf = static_cast<float>(pulse_force_), pd = static_cast<float>(pulse_duration_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("force", &pf, -200.0f, 200.0f, "%.0f N")) pulse_force_ = pf;
  tooltip("Pilot force on the stick, pull positive.");
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("duration", &pd, 0.05f, 5.0f, "%.2f s")) pulse_duration_ = pd;
  if (ImGui::Button("Force pulse  [P]", ImVec2(130, 0))) ses_.pulse(pulse_force_, pulse_duration_);
  tooltip("Applies only while the free airplane's stick is free.");
  if (!ses_.has_free()) ImGui::EndDisabled();

  ImGui::Spacing();
  caption(f_, "TRIM TAB (BOTH AIRPLANES)");
  if (ses_.loaded()) {
    const auto& c = ses_.scenario().airplane.circuit;
    float tab = static_cast<float>(to_deg(ses_.tab()));
    ImGui::SetNextItemWidth(130);
    if (ImGui::SliderFloat("tab", &tab, static_cast<float>(to_deg(c.tab_min)), static_cast<float>(to_deg(c.tab_max)),
                           "%+.2f deg"))
      ses_.set_tab(tab * fp::units::deg);
    tooltip("Moves the trim tab now (trailing edge down positive).  [ [ ] and [ ] ] step it.");
    float step = static_cast<float>(tab_step_deg_);
    ImGui::SetNextItemWidth(130);
    if (ImGui::SliderFloat("key step", &step, 0.1f, 5.0f, "%.1f deg")) tab_step_deg_ = step;
  }

  ImGui::Spacing();
  caption(f_, "VIEW");
  float sp = static_cast<float>(span_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("plot span", &sp, 2.0f, 120.0f, "%.0f s", ImGuiSliderFlags_Logarithmic)) span_ = sp;
  tooltip("Seconds of history the time plots follow. Wheel: zoom time (Shift: values); drag: pan; "
          "double click or [F]: follow again.");
  float ex = static_cast<float>(exaggeration_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("deflections ×", &ex, 1.0f, 10.0f, "%.0f")) exaggeration_ = std::round(ex);
  ImGui::Checkbox("superpose the two airplanes  [V]", &superposed_);

  ImGui::Spacing();
  caption(f_, "EXPORT");
  ImGui::SetNextItemWidth(-1);
  ImGui::InputText("##exp", &export_dir_);
  if (ImGui::Button("CSV of this run  [Ctrl+E]")) export_now();
  tooltip("held.csv and free.csv (the time histories), scenario.toml and actions.fps (the live inputs "
          "as a script), written whole or not at all.");
  ImGui::SameLine();
  if (ImGui::Button("Screenshot  [F12]")) request_screenshot();

  ImGui::Spacing();
  caption(f_, "KEYS");
  ImGui::TextDisabled(
      "Space run/pause   .  step   A  all at once\n"
      "R  reset   G  gust   L  let go / take hold\n"
      "P  force pulse   [ ]  tab −/+   V  superpose\n"
      "+ −  speed   F  follow plots   F12  screenshot\n"
      "Ctrl+E  export CSV   Ctrl+S  save scenario");
}

}  // namespace fpui
