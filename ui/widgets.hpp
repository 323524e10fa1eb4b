// widgets.hpp — small pieces shared by the window's panels (panel_*.cpp): a fixed panel, a
// tooltip, a segmented choice, coloured wrapped text, a read-only table row, number formatting.
#pragma once

#include <string>

#include <imgui.h>

namespace fpui {

// A panel of the fixed layout: no title, not movable or resizable, at `pos` with `size`.
void begin_panel(const char* name, const ImVec2& pos, const ImVec2& size, ImGuiWindowFlags extra = 0);

// The tooltip of the last item, wrapped to a readable width (also over a disabled item).
void tooltip(const std::string& text);

// One choice of a segmented control: a small button, filled in the accent colour when chosen.
bool segment(const char* label, bool chosen);

// Wrapped text in one colour.
void colored_wrapped(ImU32 col, const std::string& text);

// A two-column row of a read-only table: the name dimmed, then the value.
void row(const char* name, const std::string& value);

// One number through a printf format.
std::string fmt(const char* f, double v);

}  // namespace fpui
