// imgui_sfml_bridge.cpp — see imgui_sfml_bridge.hpp.
#include "ui/imgui_sfml_bridge.hpp"

#include <cfloat>

#include <imgui.h>

namespace fpui {

ImGuiSfmlBridge::ImGuiSfmlBridge() {
  ImGuiIO& io = ImGui::GetIO();
  using K = sf::Keyboard;
  io.KeyMap[ImGuiKey_Tab] = K::Tab;
  io.KeyMap[ImGuiKey_LeftArrow] = K::Left;
  io.KeyMap[ImGuiKey_RightArrow] = K::Right;
  io.KeyMap[ImGuiKey_UpArrow] = K::Up;
  io.KeyMap[ImGuiKey_DownArrow] = K::Down;
  io.KeyMap[ImGuiKey_PageUp] = K::PageUp;
  io.KeyMap[ImGuiKey_PageDown] = K::PageDown;
  io.KeyMap[ImGuiKey_Home] = K::Home;
  io.KeyMap[ImGuiKey_End] = K::End;
  io.KeyMap[ImGuiKey_Insert] = K::Insert;
  io.KeyMap[ImGuiKey_Delete] = K::Delete;
  io.KeyMap[ImGuiKey_Backspace] = K::Backspace;
  io.KeyMap[ImGuiKey_Space] = K::Space;
  io.KeyMap[ImGuiKey_Enter] = K::Enter;
  io.KeyMap[ImGuiKey_Escape] = K::Escape;
  io.KeyMap[ImGuiKey_KeyPadEnter] = K::Enter;  // SFML does not tell the keypad's Enter apart
  io.KeyMap[ImGuiKey_A] = K::A;
  io.KeyMap[ImGuiKey_C] = K::C;
  io.KeyMap[ImGuiKey_V] = K::V;
  io.KeyMap[ImGuiKey_X] = K::X;
  io.KeyMap[ImGuiKey_Y] = K::Y;
  io.KeyMap[ImGuiKey_Z] = K::Z;
  io.BackendPlatformName = "floatpitch-sfml";
}

void ImGuiSfmlBridge::set_key(int code, bool down) {
  if (code < 0 || code >= kKeys) return;
  ImGuiIO& io = ImGui::GetIO();
  if (down) {
    io.KeysDown[code] = true;
    key_pressed_now_[code] = true;
    key_release_later_[code] = false;
  } else if (key_pressed_now_[code]) {
    key_release_later_[code] = true;  // a tap within one frame: release next frame
  } else {
    io.KeysDown[code] = false;
  }
}

void ImGuiSfmlBridge::process_event(const sf::Event& e) {
  ImGuiIO& io = ImGui::GetIO();
  switch (e.type) {
    case sf::Event::MouseMoved:
      mouse_inside_ = true;
      io.MousePos = ImVec2(static_cast<float>(e.mouseMove.x), static_cast<float>(e.mouseMove.y));
      break;
    case sf::Event::MouseButtonPressed: {
      const int b = e.mouseButton.button;
      io.MousePos = ImVec2(static_cast<float>(e.mouseButton.x), static_cast<float>(e.mouseButton.y));
      if (b >= 0 && b < kButtons) {
        io.MouseDown[b] = true;
        pressed_now_[b] = true;
        release_later_[b] = false;
      }
      break;
    }
    case sf::Event::MouseButtonReleased: {
      const int b = e.mouseButton.button;
      if (b >= 0 && b < kButtons) {
        if (pressed_now_[b]) release_later_[b] = true;  // a click within one frame
        else io.MouseDown[b] = false;
      }
      break;
    }
    case sf::Event::MouseWheelScrolled:
      if (e.mouseWheelScroll.wheel == sf::Mouse::VerticalWheel) io.MouseWheel += e.mouseWheelScroll.delta;
      else io.MouseWheelH += e.mouseWheelScroll.delta;
      break;
    case sf::Event::MouseLeft:
      mouse_inside_ = false;
      break;
    case sf::Event::MouseEntered:
      mouse_inside_ = true;
      break;
    case sf::Event::KeyPressed:
      set_key(e.key.code, true);
      break;
    case sf::Event::KeyReleased:
      set_key(e.key.code, false);
      break;
    case sf::Event::TextEntered:
      // control characters (backspace, tab, enter, delete) arrive as keys, not as text
      if (e.text.unicode >= 32 && e.text.unicode != 127) io.AddInputCharacter(e.text.unicode);
      break;
    case sf::Event::LostFocus:
      has_focus_ = false;
      for (bool& k : io.KeysDown) k = false;
      for (bool& b : io.MouseDown) b = false;
      key_release_later_.fill(false);
      release_later_.fill(false);
      break;
    case sf::Event::GainedFocus:
      has_focus_ = true;
      break;
    default:
      break;
  }
}

void ImGuiSfmlBridge::new_frame(sf::Vector2u size, float dt_seconds) {
  ImGuiIO& io = ImGui::GetIO();
  io.DisplaySize = ImVec2(static_cast<float>(size.x), static_cast<float>(size.y));
  io.DisplayFramebufferScale = ImVec2(1.0f, 1.0f);
  io.DeltaTime = dt_seconds > 0.0f ? dt_seconds : 1.0f / 60.0f;
  if (!mouse_inside_ || !has_focus_) io.MousePos = ImVec2(-FLT_MAX, -FLT_MAX);

  using K = sf::Keyboard;
  io.KeyCtrl = io.KeysDown[K::LControl] || io.KeysDown[K::RControl];
  io.KeyShift = io.KeysDown[K::LShift] || io.KeysDown[K::RShift];
  io.KeyAlt = io.KeysDown[K::LAlt] || io.KeysDown[K::RAlt];
  io.KeySuper = io.KeysDown[K::LSystem] || io.KeysDown[K::RSystem];
}

void ImGuiSfmlBridge::end_frame() {
  ImGuiIO& io = ImGui::GetIO();
  for (int b = 0; b < kButtons; ++b) {
    if (release_later_[b]) io.MouseDown[b] = false;
    release_later_[b] = false;
    pressed_now_[b] = false;
  }
  for (int k = 0; k < kKeys; ++k) {
    if (key_release_later_[k]) io.KeysDown[k] = false;
    key_release_later_[k] = false;
    key_pressed_now_[k] = false;
  }
}

}  // namespace fpui
