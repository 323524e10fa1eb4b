// theme.hpp — the window's look: fonts, ImGui colours and spacing, and the colours that tell
// the held airplane from the free one everywhere (plots, side view, legends). Held is dark and
// drawn solid, free is light and drawn dashed, so the two stay apart in grey-scale print.
#pragma once

#include <imgui.h>

namespace fpui {

// The window's background: the frame is cleared to it and the large panels draw no fill of
// their own (with a software renderer every filled pixel costs).
inline constexpr unsigned char kPaperRGB[3] = {248, 247, 243};

// Held and free in the plots (RGB also used by the screenshot test through the layout file).
inline constexpr unsigned char kHeldRGB[3] = {27, 42, 65};
inline constexpr unsigned char kFreeRGB[3] = {224, 128, 20};
inline constexpr ImU32 kHeld = IM_COL32(27, 42, 65, 255);
inline constexpr ImU32 kFree = IM_COL32(224, 128, 20, 255);
inline constexpr ImU32 kHeld2 = IM_COL32(104, 124, 148, 255);   // second quantity of a plot (tab, tail)
inline constexpr ImU32 kFree2 = IM_COL32(238, 186, 110, 255);
inline constexpr ImU32 kAccent = IM_COL32(46, 110, 107, 255);   // captions, active controls
inline constexpr ImU32 kWarnAmber = IM_COL32(170, 96, 0, 255);
inline constexpr ImU32 kWarnRed = IM_COL32(170, 32, 32, 255);
inline constexpr ImU32 kOkGreen = IM_COL32(46, 110, 64, 255);

struct Fonts {
  ImFont* regular = nullptr;   // 14 px
  ImFont* small = nullptr;     // 12 px: ticks, legends, status line
  ImFont* caption = nullptr;   // 13 px bold: panel captions
};

// Loads DejaVu Sans into the ImGui atlas (falls back on ImGui's own font when it is missing).
Fonts load_fonts();
// Colours, rounding and spacing of our own.
void apply_theme();

// A panel caption: small bold capitals in the accent colour with a rule under it.
void caption(const Fonts& f, const char* text);

}  // namespace fpui
