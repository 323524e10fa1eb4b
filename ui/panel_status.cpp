// panel_status.cpp — the App's status line (see app.hpp): the cautions, always and whole, and
// the last message at the right.
#include <algorithm>
#include <cfloat>

#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

float App::message_width() const {
  if (message_.empty()) return 0.0f;
  return std::min(360.0f, f_.small->CalcTextSizeA(f_.small->FontSize, FLT_MAX, 0.0f, message_.c_str()).x + 16.0f);
}

void App::status_line(const ImVec2& pos, const ImVec2& size) {
  ImGui::PushStyleColor(ImGuiCol_WindowBg, IM_COL32(44, 52, 60, 255));
  ImGui::PushStyleVar(ImGuiStyleVar_WindowPadding, ImVec2(10, 4));
  begin_panel("##status", pos, size, ImGuiWindowFlags_NoScrollbar);
  ImGui::PopStyleVar();
  ImGui::PopStyleColor();
  ImGui::PushFont(f_.small);
  const float msg_w = message_width();
  ImGui::PushStyleColor(ImGuiCol_Text, IM_COL32(240, 226, 190, 255));
  ImGui::PushTextWrapPos(size.x - msg_w - 10.0f);
  ImGui::TextWrapped("%s", (std::string("CAUTION  ") + kCautions).c_str());
  ImGui::PopTextWrapPos();
  ImGui::PopStyleColor();
  if (!message_.empty()) {
    ImGui::SetCursorPos(ImVec2(size.x - msg_w, 4));
    ImGui::PushStyleColor(ImGuiCol_Text, IM_COL32(190, 214, 210, 255));
    ImGui::PushTextWrapPos(size.x - 6.0f);
    ImGui::TextWrapped("%s", message_.c_str());
    ImGui::PopTextWrapPos();
    ImGui::PopStyleColor();
  }
  ImGui::PopFont();
  ImGui::End();
}

}  // namespace fpui
