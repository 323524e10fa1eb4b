// panel_left.cpp — the App's left panel (see app.hpp): its four tabs, each in its own file
// (panel_scenario, panel_edit, panel_inputs, panel_analysis). A script may choose the tab.
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

void App::left_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##left", pos, size, ImGuiWindowFlags_NoBackground);
  if (ImGui::BeginTabBar("##lefttabs")) {
    auto flag = [&](int i) { return left_tab_request_ == i ? ImGuiTabItemFlags_SetSelected : 0; };
    if (ImGui::BeginTabItem("Scenario", nullptr, flag(0))) {
      ImGui::BeginChild("##scn", ImVec2(0, 0), false);
      tab_scenario();
      ImGui::EndChild();
      ImGui::EndTabItem();
    }
    if (ImGui::BeginTabItem("Edit", nullptr, flag(1))) {
      tab_edit();
      ImGui::EndTabItem();
    }
    if (ImGui::BeginTabItem("Inputs", nullptr, flag(2))) {
      ImGui::BeginChild("##inp", ImVec2(0, 0), false);
      tab_inputs();
      ImGui::EndChild();
      ImGui::EndTabItem();
    }
    if (ImGui::BeginTabItem("Analysis", nullptr, flag(3))) {
      ImGui::BeginChild("##ana", ImVec2(0, 0), false);
      tab_analysis();
      ImGui::EndChild();
      ImGui::EndTabItem();
    }
    ImGui::EndTabBar();
  }
  left_tab_request_ = -1;
  ImGui::End();
}

}  // namespace fpui
