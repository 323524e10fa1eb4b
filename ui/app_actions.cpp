// app_actions.cpp — the App's time, script actions and keys (see app.hpp), and the commands
// that a button and a key share (save, export, screenshot, follow the live end).
#include <algorithm>
#include <filesystem>

#include <SFML/Window/Keyboard.hpp>

#include "model/units.hpp"
#include "output/atomic_file.hpp"
#include "ui/app.hpp"

namespace fpui {

namespace fs = std::filesystem;

namespace {

fp::GustShape shape_of(int i) {
  return i == 1 ? fp::GustShape::sharp_edge : i == 2 ? fp::GustShape::ramp : fp::GustShape::one_minus_cosine;
}

}  // namespace

// =============================================================================================
// Time and actions

void App::advance(float wall_dt) {
  if (!ses_.loaded()) return;
  // actions due now come first, so that a speed or a view set "at 0" holds from the first frame
  auto run_due = [&](double upto) {
    bool restarted = false;
    while (next_action_ < script_.size() && script_[next_action_].time <= upto + 1e-12 && fatal_.empty()) {
      const Action a = script_[next_action_++];
      if (a.time > ses_.time()) ses_.advance_to(a.time);
      restarted = run_action(a) || restarted;
    }
    return restarted;
  };
  run_due(ses_.time());
  double dt = 0.0;
  if (running_) dt = opt_.fixed_step() ? speed_ / 60.0 : std::min(static_cast<double>(wall_dt), 0.1) * speed_;
  if (step_request_) {
    dt = ses_.scenario().run.output_step;
    step_request_ = false;
  }
  const double target = ses_.time() + dt;
  if (run_due(target) || !fatal_.empty()) return;  // restarted: time begins again next frame
  ses_.advance_to(std::max(target, ses_.time()));
}

bool App::run_action(const Action& a) {
  auto refuse = [&](const std::string& err) {
    fatal_ = opt_.script + ":" + std::to_string(a.line) + ": refused: " + err;
  };
  switch (a.kind) {
    case ActionKind::let_go: ses_.let_go(); break;
    case ActionKind::take_hold: ses_.take_hold(); break;
    case ActionKind::gust: ses_.gust_now(a.gust); break;
    case ActionKind::tab: ses_.set_tab(a.value); break;
    case ActionKind::pulse: ses_.pulse(a.value, a.duration); break;
    case ActionKind::cg: {
      const std::string err = ses_.set_key("mass.cg", a.value);
      if (!err.empty()) refuse(err);
      cg_slider_ = static_cast<float>(ses_.scenario().airplane.mass.h_cg);
      return err.empty();
    }
    case ActionKind::set: {
      double si = a.value;
      for (const auto& k : fp::numeric_key_info())
        if (k.name == a.key) si = a.value * k.si_per_unit;
      const std::string err = ses_.set_key(a.key, si);
      if (!err.empty()) refuse(err);
      cg_slider_ = static_cast<float>(ses_.scenario().airplane.mass.h_cg);
      return err.empty();
    }
    case ActionKind::reset: ses_.reset(); return true;
    case ActionKind::speed: speed_ = a.value; break;
    case ActionKind::jump: ses_.advance_to(ses_.time() + a.value); break;
    case ActionKind::span: span_ = a.value; break;
    case ActionKind::view: superposed_ = a.superposed; break;
    case ActionKind::exaggeration: exaggeration_ = a.value; break;
    case ActionKind::pause: running_ = false; break;
    case ActionKind::panel: left_tab_request_ = a.panel; break;
    case ActionKind::hover:
      mouse_scripted_ = true;
      mouse_x_ = a.x;
      mouse_y_ = a.y;
      break;
    case ActionKind::roots:
      roots_fit_ = a.roots;
      roots_refit_ = true;
      break;
  }
  return false;
}

// =============================================================================================
// Commands of a button and a key

void App::toggle_hold() {
  if (!ses_.has_free()) return;
  if (ses_.free_is_held()) ses_.let_go();
  else ses_.take_hold();
}

void App::gust_now() {
  fp::DiscreteGust g;
  g.shape = shape_of(gust_shape_);
  g.component = gust_component_ == 1 ? fp::GustComponent::horizontal : fp::GustComponent::vertical;
  g.amplitude = gust_amplitude_;
  g.length = gust_length_;
  g.start = 0.0;
  ses_.gust_now(g);
}

void App::save_scenario() {
  try {
    fp::write_file_atomic(save_field_, fp::to_toml(ses_.scenario()));
    message_ = "saved " + save_field_;
  } catch (const std::exception& e) {
    message_ = std::string("not saved: ") + e.what();
  }
}

void App::export_now() {
  const std::string err = export_run(export_dir_);
  message_ = err.empty() ? "run exported to " + export_dir_ : "export failed: " + err;
}

void App::request_screenshot() {
  std::error_code ec;
  fs::create_directories(export_dir_, ec);
  screenshot_request_ = (fs::path(export_dir_) / ("window-" + std::to_string(++screenshot_count_) + ".png")).string();
}

void App::follow_live_end() {
  time_x_.automatic = true;
  for (auto& y : plot_y_) y.automatic = true;
}

// =============================================================================================
// Keys

void App::handle_keys() {
  const ImGuiIO& io = ImGui::GetIO();
  if (io.WantTextInput) return;
  using K = sf::Keyboard;
  auto pressed = [](K::Key k) { return ImGui::IsKeyPressed(k, false); };
  if (io.KeyCtrl) {
    if (pressed(K::E)) export_now();
    if (pressed(K::S) && ses_.loaded()) save_scenario();
    return;
  }
  if (pressed(K::Space)) running_ = !running_;
  if (pressed(K::Period)) {
    running_ = false;
    step_request_ = true;
  }
  if (pressed(K::A)) {
    ses_.run_all_at_once();
    running_ = false;
  }
  if (pressed(K::R)) ses_.reset();
  if (pressed(K::G)) gust_now();
  if (pressed(K::L)) toggle_hold();
  if (pressed(K::P)) ses_.pulse(pulse_force_, pulse_duration_);
  if (pressed(K::LBracket)) ses_.set_tab(ses_.tab() - tab_step_deg_ * fp::units::deg);
  if (pressed(K::RBracket)) ses_.set_tab(ses_.tab() + tab_step_deg_ * fp::units::deg);
  if (pressed(K::V)) superposed_ = !superposed_;
  if (pressed(K::F)) follow_live_end();
  if (pressed(K::Equal) || pressed(K::Add)) speed_ = std::min(16.0, speed_ * 2.0);
  if (pressed(K::Hyphen) || pressed(K::Subtract)) speed_ = std::max(0.0625, speed_ * 0.5);
  if (pressed(K::F12)) request_screenshot();
}

}  // namespace fpui
