// panel_scenario.cpp — the App's Scenario tab (see app.hpp): the path field, the scenario
// folder listed, recent files; the airplane and the flight condition, the common trim, and
// "save the edited scenario as".
#include <algorithm>
#include <filesystem>

#include <imgui.h>
#include <imgui_stdlib.h>  // needs imgui.h before it

#include "model/units.hpp"
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

namespace fs = std::filesystem;
using fp::units::to_deg;

void App::tab_scenario() {
  caption(f_, "OPEN");
  ImGui::SetNextItemWidth(-62);
  const bool enter = ImGui::InputTextWithHint("##path", "scenario file (.toml)", &path_field_,
                                              ImGuiInputTextFlags_EnterReturnsTrue);
  ImGui::SameLine();
  if (ImGui::Button("Open", ImVec2(-1, 0)) || enter) open(path_field_);
  if (!scenarios_dir_.empty()) scenario_files();
  if (!recent_.empty()) {
    ImGui::TextDisabled("recent");
    for (std::size_t i = 0; i < recent_.size() && i < 5; ++i) {
      const std::string r = recent_[i];
      ImGui::PushID(static_cast<int>(i));
      if (ImGui::Selectable(fs::path(r).filename().string().c_str())) open(r);
      tooltip(r);
      ImGui::PopID();
    }
  }
  if (!ses_.loaded()) {
    ImGui::Spacing();
    colored_wrapped(kWarnAmber, "No scenario is open. Choose one above, or give its path.");
    return;
  }
  scenario_summary();
  ImGui::Spacing();
  caption(f_, "SAVE THE EDITED SCENARIO AS");
  ImGui::SetNextItemWidth(-62);
  ImGui::InputText("##save", &save_field_);
  ImGui::SameLine();
  if (ImGui::Button("Save", ImVec2(-1, 0))) save_scenario();
  tooltip("Writes every key of the scenario as it is now (with the edits) to a new TOML file.  [Ctrl+S]");
}

// The scenario folder (case files and aircraft/ files), read again when it changes and about
// every two seconds.
void App::scenario_files() {
  std::error_code rec;
  const std::string rel = fs::relative(scenarios_dir_, fs::current_path(rec), rec).string();
  ImGui::TextDisabled("in %s", !rec && !rel.empty() && rel.rfind("..", 0) != 0 ? rel.c_str() : scenarios_dir_.c_str());
  std::error_code ec;
  if (listed_dir_ != scenarios_dir_ || ImGui::GetFrameCount() >= list_refresh_frame_) {
    listed_dir_ = scenarios_dir_;
    list_refresh_frame_ = ImGui::GetFrameCount() + 120;
    listed_files_.clear();
    for (const auto& dir : {fs::path(scenarios_dir_), fs::path(scenarios_dir_) / "aircraft"})
      for (auto it = fs::directory_iterator(dir, ec); !ec && it != fs::directory_iterator(); it.increment(ec))
        if (it->path().extension() == ".toml") listed_files_.push_back(it->path());
    std::sort(listed_files_.begin(), listed_files_.end());
    ec.clear();
  }
  const std::vector<fs::path>& files = listed_files_;
  ImGui::BeginChild("##files", ImVec2(0, std::min(6.0f, static_cast<float>(files.size()) + 0.4f) *
                                             ImGui::GetTextLineHeightWithSpacing()),
                    true);
  for (const auto& p : files) {
    const std::string label = p.parent_path().filename() == "aircraft" ? "aircraft/" + p.filename().string()
                                                                       : p.filename().string();
    const bool current = ses_.loaded() && fs::equivalent(p, ses_.scenario().path, ec);
    if (ImGui::Selectable(label.c_str(), current)) open(p.string());
  }
  ImGui::EndChild();
}

// The airplane, the flight condition and the common trim of the open scenario.
void App::scenario_summary() {
  const fp::Scenario& s = ses_.scenario();
  ImGui::Spacing();
  caption(f_, "AIRPLANE AND CONDITION");
  ImGui::TextWrapped("%s", s.name.empty() ? s.path.c_str() : s.name.c_str());
  if (!s.aircraft_name.empty()) ImGui::TextDisabled("%s", s.aircraft_name.c_str());
  if (!s.description.empty()) {
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::GetStyleColorVec4(ImGuiCol_TextDisabled));
    ImGui::TextWrapped("%s", s.description.c_str());
    ImGui::PopStyleColor();
  }
  if (ImGui::BeginTable("##cond", 2, ImGuiTableFlags_SizingStretchProp)) {
    row("mass", fmt("%.0f kg", s.airplane.mass.mass));
    row("CG", fmt("%.3f MAC", s.airplane.mass.h_cg) +
                  fmt("  (envelope %.2f", s.envelope.cg_forward) + fmt("..%.2f)", s.envelope.cg_aft));
    row("altitude", fmt("%.0f ft", fp::units::to_ft(s.condition.altitude)) + fmt("  (%.0f m)", s.condition.altitude));
    row("airspeed", fmt("%.1f kt", fp::units::to_kt(s.condition.airspeed)) + fmt("  (%.2f m/s)", s.condition.airspeed));
    row("flight path", fmt("%+.2f°", to_deg(s.condition.flight_path)));
    row("circuit", s.airplane.circuit.reversible ? "reversible (elevator can float)" : "irreversible: held only");
    ImGui::EndTable();
  }
  ImGui::Spacing();
  caption(f_, "TRIM (COMMON START)");
  const fp::Trim& t = ses_.trim();
  if (ImGui::BeginTable("##trim", 2, ImGuiTableFlags_SizingStretchProp)) {
    row("angle of attack", fmt("%+.2f°", to_deg(t.alpha)));
    row("pitch attitude", fmt("%+.2f°", to_deg(t.theta)));
    row("elevator", fmt("%+.2f° (TE down +)", to_deg(t.de)));
    row("tab", fmt("%+.2f°", to_deg(t.tab)) + (s.trim.tab_auto ? "  (zero stick force)" : "  (fixed)"));
    row("throttle", fmt("%.3f", t.throttle));
    row("stick force", fmt("%+.1f N (pull +)", t.stick_force));
    row("CL", fmt("%.3f", t.CL));
    ImGui::EndTable();
  }
}

}  // namespace fpui
