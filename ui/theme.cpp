// theme.cpp — see theme.hpp.
#include "ui/theme.hpp"

#include <string>

#include "ui/plot.hpp"
#include "ui/side_view.hpp"

namespace fpui {

namespace {

// Latin, Latin-1, Greek (alpha, theta, delta), dashes and quotes, arrows, minus and
// plus-minus, geometric shapes.
const ImWchar kRanges[] = {0x0020, 0x00FF, 0x0370, 0x03FF, 0x2010, 0x2027, 0x2190, 0x21FF,
                           0x2212, 0x2212, 0x25A0, 0x25FF, 0};

ImVec4 rgb(int r, int g, int b, int a = 255) { return ImVec4(r / 255.f, g / 255.f, b / 255.f, a / 255.f); }

}  // namespace

Fonts load_fonts() {
  ImGuiIO& io = ImGui::GetIO();
  Fonts f;
  const std::string regular = find_font_file(false);
  const std::string bold = find_font_file(true);
  if (!regular.empty()) {
    f.regular = io.Fonts->AddFontFromFileTTF(regular.c_str(), 14.0f, nullptr, kRanges);
    f.small = io.Fonts->AddFontFromFileTTF(regular.c_str(), 12.0f, nullptr, kRanges);
  }
  if (!bold.empty()) f.caption = io.Fonts->AddFontFromFileTTF(bold.c_str(), 12.5f, nullptr, kRanges);
  if (!f.regular) f.regular = io.Fonts->AddFontDefault();
  if (!f.small) f.small = f.regular;
  if (!f.caption) f.caption = f.regular;
  io.FontDefault = f.regular;
  PlotTheme pt = plot_theme();
  pt.small_font = f.small;
  set_plot_theme(pt);
  return f;
}

void apply_theme() {
  ImGuiStyle& s = ImGui::GetStyle();
  // square corners: a rounded corner costs a software renderer a fan of small triangles
  s.WindowRounding = 0.0f;
  s.ChildRounding = 0.0f;
  s.FrameRounding = 0.0f;
  s.PopupRounding = 0.0f;
  s.GrabRounding = 0.0f;
  s.TabRounding = 0.0f;
  s.ScrollbarRounding = 0.0f;
  s.WindowBorderSize = 0.0f;
  s.FrameBorderSize = 1.0f;
  s.WindowPadding = ImVec2(8, 6);
  s.FramePadding = ImVec2(6, 3);
  s.ItemSpacing = ImVec2(7, 5);
  s.ItemInnerSpacing = ImVec2(5, 4);
  s.ScrollbarSize = 11.0f;
  s.GrabMinSize = 9.0f;
  s.IndentSpacing = 14.0f;

  ImVec4* c = s.Colors;
  c[ImGuiCol_Text] = rgb(28, 35, 43);
  c[ImGuiCol_TextDisabled] = rgb(122, 127, 133);
  c[ImGuiCol_WindowBg] = rgb(248, 247, 243);
  c[ImGuiCol_ChildBg] = rgb(0, 0, 0, 0);
  c[ImGuiCol_PopupBg] = rgb(250, 249, 246, 250);
  c[ImGuiCol_Border] = rgb(196, 192, 182);
  c[ImGuiCol_BorderShadow] = rgb(0, 0, 0, 0);
  c[ImGuiCol_FrameBg] = rgb(255, 255, 255);
  c[ImGuiCol_FrameBgHovered] = rgb(236, 243, 242);
  c[ImGuiCol_FrameBgActive] = rgb(222, 236, 234);
  c[ImGuiCol_TitleBg] = rgb(214, 220, 219);
  c[ImGuiCol_TitleBgActive] = rgb(200, 213, 211);
  c[ImGuiCol_TitleBgCollapsed] = rgb(214, 220, 219);
  c[ImGuiCol_MenuBarBg] = rgb(226, 224, 217);
  c[ImGuiCol_ScrollbarBg] = rgb(0, 0, 0, 0);
  c[ImGuiCol_ScrollbarGrab] = rgb(190, 196, 194);
  c[ImGuiCol_ScrollbarGrabHovered] = rgb(160, 178, 176);
  c[ImGuiCol_ScrollbarGrabActive] = rgb(120, 152, 149);
  c[ImGuiCol_CheckMark] = rgb(46, 110, 107);
  c[ImGuiCol_SliderGrab] = rgb(72, 132, 128);
  c[ImGuiCol_SliderGrabActive] = rgb(46, 110, 107);
  c[ImGuiCol_Button] = rgb(218, 223, 221);
  c[ImGuiCol_ButtonHovered] = rgb(196, 215, 212);
  c[ImGuiCol_ButtonActive] = rgb(166, 198, 194);
  c[ImGuiCol_Header] = rgb(214, 224, 222);
  c[ImGuiCol_HeaderHovered] = rgb(200, 217, 214);
  c[ImGuiCol_HeaderActive] = rgb(180, 205, 201);
  c[ImGuiCol_Separator] = rgb(200, 196, 186);
  c[ImGuiCol_SeparatorHovered] = rgb(120, 152, 149);
  c[ImGuiCol_SeparatorActive] = rgb(46, 110, 107);
  c[ImGuiCol_ResizeGrip] = rgb(0, 0, 0, 0);
  c[ImGuiCol_ResizeGripHovered] = rgb(0, 0, 0, 0);
  c[ImGuiCol_ResizeGripActive] = rgb(0, 0, 0, 0);
  c[ImGuiCol_Tab] = rgb(220, 218, 210);
  c[ImGuiCol_TabHovered] = rgb(196, 215, 212);
  c[ImGuiCol_TabActive] = rgb(255, 255, 255);
  c[ImGuiCol_TabUnfocused] = rgb(220, 218, 210);
  c[ImGuiCol_TabUnfocusedActive] = rgb(255, 255, 255);
  c[ImGuiCol_PlotLines] = rgb(27, 42, 65);
  c[ImGuiCol_PlotHistogram] = rgb(46, 110, 107);
  c[ImGuiCol_TableHeaderBg] = rgb(222, 226, 224);
  c[ImGuiCol_TableBorderStrong] = rgb(196, 192, 182);
  c[ImGuiCol_TableBorderLight] = rgb(220, 217, 209);
  c[ImGuiCol_TableRowBg] = rgb(0, 0, 0, 0);
  c[ImGuiCol_TableRowBgAlt] = rgb(0, 0, 0, 10);
  c[ImGuiCol_TextSelectedBg] = rgb(120, 170, 166, 110);
  c[ImGuiCol_NavHighlight] = rgb(46, 110, 107);
  c[ImGuiCol_ModalWindowDimBg] = rgb(30, 30, 30, 80);
}

void caption(const Fonts& f, const char* text) {
  ImGui::PushFont(f.caption);
  ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(kAccent));
  ImGui::TextUnformatted(text);
  ImGui::PopStyleColor();
  ImGui::PopFont();
  const ImVec2 p = ImGui::GetCursorScreenPos();
  const float w = ImGui::GetContentRegionAvail().x;
  ImGui::GetWindowDrawList()->AddLine(ImVec2(p.x, p.y - 2), ImVec2(p.x + w, p.y - 2), IM_COL32(196, 192, 182, 255));
}

}  // namespace fpui
