// widgets.cpp — see widgets.hpp.
#include "ui/widgets.hpp"

#include <cstdio>

#include "ui/theme.hpp"

namespace fpui {

namespace {

constexpr ImGuiWindowFlags kPanel = ImGuiWindowFlags_NoTitleBar | ImGuiWindowFlags_NoResize |
                                    ImGuiWindowFlags_NoMove | ImGuiWindowFlags_NoCollapse |
                                    ImGuiWindowFlags_NoSavedSettings | ImGuiWindowFlags_NoBringToFrontOnFocus;

}  // namespace

std::string fmt(const char* f, double v) {
  char b[96];
  std::snprintf(b, sizeof b, f, v);
  return b;
}

void begin_panel(const char* name, const ImVec2& pos, const ImVec2& size, ImGuiWindowFlags extra) {
  ImGui::SetNextWindowPos(pos, ImGuiCond_Always);
  ImGui::SetNextWindowSize(size, ImGuiCond_Always);
  ImGui::Begin(name, nullptr, kPanel | extra);
}

void tooltip(const std::string& text) {
  if (ImGui::IsItemHovered(ImGuiHoveredFlags_AllowWhenDisabled)) {
    ImGui::BeginTooltip();
    ImGui::PushTextWrapPos(ImGui::GetFontSize() * 26.0f);
    ImGui::TextUnformatted(text.c_str());
    ImGui::PopTextWrapPos();
    ImGui::EndTooltip();
  }
}

bool segment(const char* label, bool chosen) {
  if (chosen) {
    ImGui::PushStyleColor(ImGuiCol_Button, ImGui::ColorConvertU32ToFloat4(kAccent));
    ImGui::PushStyleColor(ImGuiCol_ButtonHovered, ImGui::ColorConvertU32ToFloat4(kAccent));
    ImGui::PushStyleColor(ImGuiCol_Text, ImVec4(1, 1, 1, 1));
  }
  const bool pressed = ImGui::SmallButton(label);
  if (chosen) ImGui::PopStyleColor(3);
  return pressed;
}

void colored_wrapped(ImU32 col, const std::string& text) {
  ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(col));
  ImGui::TextWrapped("%s", text.c_str());
  ImGui::PopStyleColor();
}

void row(const char* name, const std::string& value) {
  ImGui::TableNextRow();
  ImGui::TableSetColumnIndex(0);
  ImGui::TextDisabled("%s", name);
  ImGui::TableSetColumnIndex(1);
  ImGui::TextUnformatted(value.c_str());
}

}  // namespace fpui
