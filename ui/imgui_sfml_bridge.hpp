// imgui_sfml_bridge.hpp — feeds SFML window events to Dear ImGui 1.86 (mouse, wheel, keys,
// text, focus, display size, frame time).
//
// ImGui 1.86 reads its input from ImGuiIO fields (MousePos, MouseDown[], MouseWheel,
// KeysDown[] through KeyMap[], KeyCtrl/Shift/Alt, AddInputCharacter). A press and release
// that arrive within one frame would cancel out before ImGui saw the press, so a release that
// follows a press of the same frame is held over to the next frame. Rendering is not done
// here: the OpenGL3 renderer of Dear ImGui draws the frame (see main.cpp).
#pragma once

#include <array>

#include <SFML/Window/Event.hpp>
#include <SFML/System/Vector2.hpp>
#include <SFML/Window/Keyboard.hpp>

namespace fpui {

class ImGuiSfmlBridge {
 public:
  // Fills the key map of the current ImGui context. Call after ImGui::CreateContext().
  ImGuiSfmlBridge();

  // One SFML event; call for every polled event.
  void process_event(const sf::Event& e);

  // Before ImGui::NewFrame(): display size (the window's size in pixels), mouse position,
  // modifier keys, delta time.
  void new_frame(sf::Vector2u window_size, float dt_seconds);

  // After the frame was built: deliver the releases held over from this frame, so that the
  // next frame sees them.
  void end_frame();

 private:
  static constexpr int kButtons = 3;
  static constexpr int kKeys = sf::Keyboard::KeyCount;
  void set_key(int code, bool down);

  std::array<bool, kButtons> pressed_now_{};      // pressed during the current frame
  std::array<bool, kButtons> release_later_{};    // release to deliver next frame
  std::array<bool, kKeys> key_pressed_now_{};
  std::array<bool, kKeys> key_release_later_{};
  bool has_focus_ = true;
  bool mouse_inside_ = true;
};

}  // namespace fpui
