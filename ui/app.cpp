// app.cpp — see app.hpp. Sections: set-up and files; time and actions; keys; toolbar; left
// panel (scenario, edit, inputs, analysis); side view; modes; time plots; status line; layout.
#include "ui/app.hpp"

#include <algorithm>
#include <cfloat>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <limits>
#include <sstream>

#include <SFML/Window/Keyboard.hpp>
#include <imgui_stdlib.h>

#include "model/units.hpp"
#include "output/atomic_file.hpp"

namespace fpui {

namespace fs = std::filesystem;
using fp::units::to_deg;

namespace {

constexpr ImGuiWindowFlags kPanel = ImGuiWindowFlags_NoTitleBar | ImGuiWindowFlags_NoResize |
                                    ImGuiWindowFlags_NoMove | ImGuiWindowFlags_NoCollapse |
                                    ImGuiWindowFlags_NoSavedSettings | ImGuiWindowFlags_NoBringToFrontOnFocus;

std::string fmt(const char* f, double v) {
  char b[96];
  std::snprintf(b, sizeof b, f, v);
  return b;
}

void begin_panel(const char* name, const ImVec2& pos, const ImVec2& size, ImGuiWindowFlags extra = 0) {
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

// One choice of a segmented control: a small button, filled in the accent colour when chosen.
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

// A two-column row of a read-only table.
void row(const char* name, const std::string& value) {
  ImGui::TableNextRow();
  ImGui::TableSetColumnIndex(0);
  ImGui::TextDisabled("%s", name);
  ImGui::TableSetColumnIndex(1);
  ImGui::TextUnformatted(value.c_str());
}

const char* kGustShapes[] = {"1-cosine", "sharp edge", "ramp"};
const char* kGustComponents[] = {"vertical (up +)", "horizontal (tail +)"};

fp::GustShape shape_of(int i) {
  return i == 1 ? fp::GustShape::sharp_edge : i == 2 ? fp::GustShape::ramp : fp::GustShape::one_minus_cosine;
}

std::string recent_file() {
  const char* xdg = std::getenv("XDG_CONFIG_HOME");
  const char* home = std::getenv("HOME");
  if (xdg && *xdg) return std::string(xdg) + "/floatpitch/recent";
  if (home && *home) return std::string(home) + "/.config/floatpitch/recent";
  return {};
}

// Pose of one airplane from the last sample of its trace.
Pose pose_of(const fp::Simulation& sim, bool free_case, const std::string& failure, double let_go_time) {
  Pose p;
  const fp::Trace& tr = sim.trace();
  if (tr.size() > 0) {
    const std::size_t i = tr.size() - 1;
    p.theta = tr.ch[fp::ch_theta][i];
    p.alpha = tr.ch[fp::ch_alpha][i];
    p.de = tr.ch[fp::ch_elevator][i];
    p.tab = tr.ch[fp::ch_tab][i];
    p.gust_w_wing = tr.ch[fp::ch_gust_w_wing][i];
    p.gust_w_tail = tr.ch[fp::ch_gust_w_tail][i];
    p.gust_u_wing = tr.ch[fp::ch_gust_u_wing][i];
    p.gust_u_tail = tr.ch[fp::ch_gust_u_tail][i];
  }
  if (!failure.empty()) p.state = "stopped: numerical failure";
  else if (sim.departure().departed) p.state = fmt("departed at %.2f s", sim.departure().time);
  else if (!free_case) p.state = "stick held";
  else if (sim.controls().stick == fp::Stick::free) p.state = "hands off";
  else if (sim.time() < let_go_time) p.state = fmt("stick held, lets go at %.1f s", let_go_time);
  else p.state = "stick held again";
  return p;
}

}  // namespace

// =============================================================================================
// Set-up and files

App::App(Options o, std::vector<Action> script, Fonts fonts)
    : opt_(std::move(o)), script_(std::move(script)), f_(fonts) {
#ifdef FLOATPITCH_SCENARIOS_DIR
  scenarios_dir_ = FLOATPITCH_SCENARIOS_DIR;
#endif
  if (fs::is_directory("scenarios")) scenarios_dir_ = "scenarios";
  if (!opt_.fixed_step()) {
    std::ifstream in(recent_file());
    for (std::string line; std::getline(in, line) && recent_.size() < 8;)
      if (!line.empty()) recent_.push_back(line);
  }
  if (!opt_.scenario.empty()) open(opt_.scenario);
  path_field_ = opt_.scenario;
}

void App::open(const std::string& path) {
  const std::string err = ses_.load(path);
  if (!err.empty()) {
    message_ = "not opened: " + err;
    if (opt_.fixed_step() && !ses_.loaded()) fatal_ = err;
    return;
  }
  message_ = "opened " + path;
  edit_error_.clear();
  edit_ok_.clear();
  editing_.clear();
  cg_slider_ = static_cast<float>(ses_.scenario().airplane.mass.h_cg);
  const fs::path p(path);
  if (p.has_parent_path()) {
    fs::path dir = p.parent_path();
    if (dir.filename() == "aircraft") dir = dir.parent_path();
    scenarios_dir_ = dir.string();
  }
  fs::path save = p.parent_path() / (p.stem().string() + "_edited.toml");
  save_field_ = save.string();
  path_field_ = path;
  remember_recent(path);
}

void App::remember_recent(const std::string& path) {
  std::error_code ec;
  const std::string abs = fs::absolute(path, ec).lexically_normal().string();
  recent_.erase(std::remove(recent_.begin(), recent_.end(), abs), recent_.end());
  recent_.insert(recent_.begin(), abs);
  if (recent_.size() > 8) recent_.resize(8);
  if (opt_.fixed_step()) return;  // scripted runs leave no trace in the user's settings
  const std::string f = recent_file();
  if (f.empty()) return;
  fs::create_directories(fs::path(f).parent_path(), ec);
  std::ofstream out(f);
  for (const auto& r : recent_) out << r << "\n";
}

std::string App::export_run(const std::string& dir) {
  if (!ses_.loaded()) return "no scenario is open";
  try {
    fp::OutputSet set(dir);
    for (auto& [name, content] : ses_.export_files()) set.add(name, content);
    set.commit();
  } catch (const std::exception& e) {
    return e.what();
  }
  return {};
}

std::string App::take_screenshot_request() {
  std::string r;
  r.swap(screenshot_request_);
  return r;
}

std::string App::layout_text() const {
  std::ostringstream o;
  const ImVec2 d = ImGui::GetIO().DisplaySize;
  o << "size " << d.x << " " << d.y << "\n";
  o << "colour held " << int(kHeldRGB[0]) << " " << int(kHeldRGB[1]) << " " << int(kHeldRGB[2]) << "\n";
  o << "colour free " << int(kFreeRGB[0]) << " " << int(kFreeRGB[1]) << " " << int(kFreeRGB[2]) << "\n";
  o.precision(10);
  for (const auto& [name, g] : geometry_)
    o << "plot " << name << " " << g.p0.x << " " << g.p0.y << " " << g.p1.x << " " << g.p1.y << " " << g.x0 << " "
      << g.x1 << " " << g.y0 << " " << g.y1 << " " << g.legend0.x << " " << g.legend0.y << " " << g.legend1.x << " "
      << g.legend1.y << "\n";
  return o.str();
}

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

// =============================================================================================
// Keys

void App::handle_keys() {
  const ImGuiIO& io = ImGui::GetIO();
  if (io.WantTextInput) return;
  using K = sf::Keyboard;
  auto pressed = [](K::Key k) { return ImGui::IsKeyPressed(k, false); };
  if (io.KeyCtrl) {
    if (pressed(K::E)) {
      const std::string err = export_run(export_dir_);
      message_ = err.empty() ? "run exported to " + export_dir_ : "export failed: " + err;
    }
    if (pressed(K::S) && ses_.loaded()) {
      try {
        fp::write_file_atomic(save_field_, fp::to_toml(ses_.scenario()));
        message_ = "saved " + save_field_;
      } catch (const std::exception& e) {
        message_ = std::string("not saved: ") + e.what();
      }
    }
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
  if (pressed(K::F)) {
    time_x_.automatic = true;
    for (auto& y : plot_y_) y.automatic = true;
  }
  if (pressed(K::Equal) || pressed(K::Add)) speed_ = std::min(16.0, speed_ * 2.0);
  if (pressed(K::Hyphen) || pressed(K::Subtract)) speed_ = std::max(0.0625, speed_ * 0.5);
  if (pressed(K::F12)) {
    std::error_code ec;
    fs::create_directories(export_dir_, ec);
    screenshot_request_ = (fs::path(export_dir_) / ("window-" + std::to_string(++screenshot_count_) + ".png")).string();
  }
}

// =============================================================================================
// Frame

void App::frame(float wall_dt) {
  time_cursor_.new_frame();
  handle_keys();
  advance(wall_dt);
  if (ses_.loaded()) {
    const double lgt = ses_.scenario().run.let_go_time;
    held_pose_ = pose_of(*ses_.held(), false, ses_.held_failure(), lgt);
    if (ses_.has_free()) free_pose_ = pose_of(*ses_.free(), true, ses_.free_failure(), lgt);
    marks_ = MacMarks{};
    marks_.cg = ses_.scenario().airplane.mass.h_cg;
    marks_.envelope_forward = ses_.scenario().envelope.cg_forward;
    marks_.envelope_aft = ses_.scenario().envelope.cg_aft;
    if (const fp::Margins* m = ses_.margins()) {
      marks_.have_points = true;
      marks_.np_fixed = m->np_fixed.model;
      marks_.np_free = m->np_free.model;
      marks_.np_apparent = m->np_apparent.model;
      marks_.mp_fixed = m->mp_fixed.model;
      marks_.mp_free = m->mp_free.model;
      if (!ses_.scenario().airplane.circuit.reversible) {
        // an irreversible circuit: the elevator cannot float (held case only): no stick-free points either
        marks_.np_free = marks_.np_apparent = marks_.mp_free = std::numeric_limits<double>::quiet_NaN();
        marks_.note = "irreversible: no stick-free points";
      }
    } else {
      marks_.missing = "not available: " + ses_.margins_error();
    }
  }

  const ImVec2 d = ImGui::GetIO().DisplaySize;
  // the status line is as tall as the cautions need at this width: they are always shown whole
  const float msg_w = message_width();
  const std::string caution = std::string("CAUTION  ") + kCautions;
  const float caution_h =
      f_.small->CalcTextSizeA(f_.small->FontSize, FLT_MAX, std::max(200.0f, d.x - msg_w - 30.0f), caution.c_str()).y;
  const float bar_h = 42.0f, status_h = std::max(40.0f, caution_h + 12.0f);
  const float left_w = std::clamp(std::floor(d.x * 0.265f), 250.0f, 360.0f);
  const float body_h = std::max(200.0f, d.y - bar_h - status_h);
  const float right_w = std::max(300.0f, d.x - left_w);
  const float band_h = std::max(230.0f, std::floor(body_h * 0.40f));
  toolbar(ImVec2(0, 0), ImVec2(d.x, bar_h));
  left_panel(ImVec2(0, bar_h), ImVec2(left_w, body_h));
  side_panel(ImVec2(left_w, bar_h), ImVec2(std::floor(right_w * 0.5f), band_h));
  modes_panel(ImVec2(left_w + std::floor(right_w * 0.5f), bar_h), ImVec2(right_w - std::floor(right_w * 0.5f), band_h));
  plots_panel(ImVec2(left_w, bar_h + band_h), ImVec2(right_w, body_h - band_h));
  status_line(ImVec2(0, d.y - status_h), ImVec2(d.x, status_h));
}

// =============================================================================================
// Toolbar

void App::toolbar(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##toolbar", pos, size, ImGuiWindowFlags_NoBackground);
  ImGui::GetWindowDrawList()->AddLine(ImVec2(pos.x, pos.y + size.y - 1), ImVec2(pos.x + size.x, pos.y + size.y - 1),
                                      IM_COL32(200, 196, 186, 255));
  ImGui::SetCursorPosY(8.0f);
  const bool ok = ses_.loaded();
  if (!ok) ImGui::BeginDisabled();
  if (ImGui::Button(running_ ? "Pause" : "Run live", ImVec2(78, 0))) running_ = !running_;
  tooltip("Run the two airplanes in real time times the speed factor, or pause them.  [Space]");
  ImGui::SameLine();
  if (ImGui::Button("Step")) {
    running_ = false;
    step_request_ = true;
  }
  tooltip("Pause and advance by one output step of the scenario.  [.]");
  ImGui::SameLine();
  if (ImGui::Button("All at once")) {
    ses_.run_all_at_once();
    running_ = false;
  }
  tooltip("From the trim, run both airplanes to the scenario's run.duration at once, then pause.  [A]");
  ImGui::SameLine();
  if (ImGui::Button("Reset")) ses_.reset();
  tooltip("Both airplanes back to the trim, time 0.  [R]");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(74);
  const double speeds[] = {0.0625, 0.125, 0.25, 0.5, 1, 2, 4, 8, 16};
  if (ImGui::BeginCombo("##speed", fmt("%g×", speed_).c_str())) {
    for (double s : speeds)
      if (ImGui::Selectable(fmt("%g×", s).c_str(), s == speed_)) speed_ = s;
    ImGui::EndCombo();
  }
  tooltip("Speed factor: simulated seconds per real second.  [+] [−]");
  ImGui::SameLine();
  ImGui::Text("t %7.2f s", ses_.time());
  ImGui::SameLine(0, 18);
  if (ImGui::Button("Gust")) gust_now();
  tooltip("A gust now, as set in Inputs (" + std::string(kGustShapes[gust_shape_]) + ", " +
          fmt("%.1f m/s", gust_amplitude_) + ", " + fmt("%.0f m", gust_length_) + "), for both airplanes.  [G]");
  ImGui::SameLine();
  const bool has_free = ses_.has_free();
  if (!has_free) ImGui::BeginDisabled();
  if (ImGui::Button(ses_.free_is_held() ? "Let go" : "Take hold", ImVec2(80, 0))) toggle_hold();
  tooltip("The free airplane's pilot lets go of the stick, or takes hold of it where it is.  [L]");
  ImGui::SameLine();
  if (ImGui::Button("Pulse")) ses_.pulse(pulse_force_, pulse_duration_);
  tooltip(fmt("A pilot force on the free stick: %.0f N (pull +)", pulse_force_) +
          fmt(" for %.2f s, as set in Inputs.  [P]", pulse_duration_));
  if (!has_free) ImGui::EndDisabled();
  ImGui::SameLine();
  if (ImGui::Button("Tab −")) ses_.set_tab(ses_.tab() - tab_step_deg_ * fp::units::deg);
  tooltip(fmt("Trim tab %.1f deg trailing edge up, both airplanes.  [ [ ]", tab_step_deg_));
  ImGui::SameLine(0, 2);
  if (ImGui::Button("Tab +")) ses_.set_tab(ses_.tab() + tab_step_deg_ * fp::units::deg);
  tooltip(fmt("Trim tab %.1f deg trailing edge down, both airplanes.  [ ] ]", tab_step_deg_));
  ImGui::SameLine();
  ImGui::TextDisabled("tab %+.1f°", to_deg(ses_.tab()));
  const float last_x = ImGui::GetItemRectMax().x - ImGui::GetWindowPos().x;
  if (!ok) ImGui::EndDisabled();

  // right: what the two airplanes are doing (when there is room; the side view says it too)
  const std::string h = ok ? "held: " + held_pose_.state : std::string();
  const std::string fr = !ok ? std::string() : has_free ? "free: " + free_pose_.state : "free: none (irreversible circuit)";
  const float w = ImGui::CalcTextSize(h.c_str()).x + ImGui::CalcTextSize(fr.c_str()).x + 26.0f;
  if (ok && last_x + 24.0f + w < size.x) {
    ImGui::SameLine(size.x - w - 10.0f);
    ImGui::SetCursorPosY(8.0f);
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(kHeld));
    ImGui::TextUnformatted(h.c_str());
    ImGui::PopStyleColor();
    ImGui::SameLine(0, 16);
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(IM_COL32(176, 92, 4, 255)));
    ImGui::TextUnformatted(fr.c_str());
    ImGui::PopStyleColor();
  }
  ImGui::End();
}

// =============================================================================================
// Left panel

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

void App::tab_scenario() {
  caption(f_, "OPEN");
  ImGui::SetNextItemWidth(-62);
  const bool enter = ImGui::InputTextWithHint("##path", "scenario file (.toml)", &path_field_,
                                              ImGuiInputTextFlags_EnterReturnsTrue);
  ImGui::SameLine();
  if (ImGui::Button("Open", ImVec2(-1, 0)) || enter) open(path_field_);
  if (!scenarios_dir_.empty()) {
    std::error_code rec;
    const std::string rel = fs::relative(scenarios_dir_, fs::current_path(rec), rec).string();
    ImGui::TextDisabled("in %s", !rec && !rel.empty() && rel.rfind("..", 0) != 0 ? rel.c_str() : scenarios_dir_.c_str());
    // the folder is read again when it changes and about every two seconds
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
  ImGui::Spacing();
  caption(f_, "SAVE THE EDITED SCENARIO AS");
  ImGui::SetNextItemWidth(-62);
  ImGui::InputText("##save", &save_field_);
  ImGui::SameLine();
  if (ImGui::Button("Save", ImVec2(-1, 0))) {
    try {
      fp::write_file_atomic(save_field_, fp::to_toml(ses_.scenario()));
      message_ = "saved " + save_field_;
    } catch (const std::exception& e) {
      message_ = std::string("not saved: ") + e.what();
    }
  }
  tooltip("Writes every key of the scenario as it is now (with the edits) to a new TOML file.  [Ctrl+S]");
}

void App::key_row(const fp::KeyInfo& k) {
  const fp::Scenario& s = ses_.scenario();
  double si = 0.0;
  try {
    si = fp::get_value(s, k.name);
  } catch (const fp::ScenarioError&) {
    return;  // not a plain number in this build
  }
  ImGui::TableNextRow();
  ImGui::TableSetColumnIndex(0);
  const std::string short_name = k.name.substr(k.table.size() + 1);
  ImGui::AlignTextToFramePadding();
  ImGui::TextUnformatted(short_name.c_str());
  std::string tip = k.name + "\n" + k.meaning + "\nunit: " + (k.unit.empty() ? "none" : k.unit) +
                    "\nallowed: " + k.range;
  const auto o = s.origins.find(k.name);
  if (o != s.origins.end() && !o->second.file.empty())
    tip += "\nset in " + o->second.file + (o->second.line > 0 ? ":" + std::to_string(o->second.line) : "");
  else if (o != s.origins.end() && !o->second.via.empty())
    tip += "\nset by " + o->second.via;
  else
    tip += "\nnot set in the files (default)";
  tooltip(tip);
  ImGui::TableSetColumnIndex(1);
  ImGui::SetNextItemWidth(-1);
  const double shown = si / k.si_per_unit;
  auto it = editing_.find(k.name);
  double v = it != editing_.end() ? it->second : shown;
  ImGui::PushID(k.name.c_str());
  ImGui::InputDouble("##v", &v, 0.0, 0.0, k.integer ? "%.0f" : "%.6g", ImGuiInputTextFlags_CharsScientific);
  tooltip(tip);
  ImGui::PopID();
  if (ImGui::IsItemActive()) editing_[k.name] = v;
  if (ImGui::IsItemDeactivatedAfterEdit()) {
    const double value = editing_.count(k.name) ? editing_[k.name] : v;
    editing_.erase(k.name);
    if (value != shown) {
      const std::string err = ses_.set_key(k.name, value * k.si_per_unit);
      if (err.empty()) {
        edit_error_.clear();
        edit_ok_ = k.name + " = " + fmt("%.6g", value) + (k.unit.empty() ? "" : " " + k.unit) +
                   ": re-trimmed, both airplanes restarted";
        cg_slider_ = static_cast<float>(ses_.scenario().airplane.mass.h_cg);
      } else {
        edit_error_ = err;
        edit_ok_.clear();
      }
    }
  } else if (!ImGui::IsItemActive()) {
    editing_.erase(k.name);
  }
  ImGui::TableSetColumnIndex(2);
  ImGui::TextDisabled("%s", k.unit.c_str());
}

void App::tab_edit() {
  if (!ses_.loaded()) {
    ImGui::TextDisabled("Open a scenario first.");
    return;
  }
  if (!edit_error_.empty()) {
    ImGui::PushStyleColor(ImGuiCol_ChildBg, IM_COL32(250, 232, 228, 255));
    ImGui::BeginChild("##err", ImVec2(0, ImGui::GetTextLineHeight() * 4.2f), true);
    colored_wrapped(kWarnRed, "Refused, nothing changed:\n" + edit_error_);
    ImGui::EndChild();
    ImGui::PopStyleColor();
  } else if (!edit_ok_.empty()) {
    colored_wrapped(kOkGreen, edit_ok_);
  } else {
    ImGui::TextDisabled("Edits apply on Enter; the airplanes re-trim and restart.");
  }
  ImGui::SetNextItemWidth(-1);
  ImGui::InputTextWithHint("##filter", "filter keys (e.g. ch_ or cg)", &filter_);
  const fp::Scenario& s = ses_.scenario();
  ImGui::BeginChild("##keys", ImVec2(0, 0), false);
  // choices that are not plain numbers
  if (ImGui::CollapsingHeader("trim and circuit", ImGuiTreeNodeFlags_DefaultOpen)) {
    bool auto_tab = s.trim.tab_auto;
    if (ImGui::Checkbox("tab for zero stick force (auto)", &auto_tab)) {
      const std::string err = ses_.edit([&](fp::Scenario& c) {
        c.trim.tab_auto = auto_tab;
        if (!auto_tab) c.trim.tab = ses_.trim().tab;
      });
      edit_error_ = err;
      if (err.empty()) edit_ok_ = std::string("trim.tab = ") + (auto_tab ? "auto" : fmt("%.2f deg", to_deg(s.trim.tab)));
    }
    tooltip("trim.tab: \"auto\" sets the tab for zero stick force at the trim condition; a fixed angle holds it.");
    if (!s.trim.tab_auto) {
      double deg = to_deg(s.trim.tab);
      ImGui::SetNextItemWidth(120);
      if (ImGui::InputDouble("fixed tab [deg]", &deg, 0, 0, "%.3f", ImGuiInputTextFlags_EnterReturnsTrue)) {
        const std::string err = ses_.edit([&](fp::Scenario& c) { c.trim.tab = deg * fp::units::deg; });
        edit_error_ = err;
        if (err.empty()) edit_ok_ = fmt("trim.tab = %.3f deg", deg);
      }
    }
    bool rev = s.airplane.circuit.reversible;
    if (ImGui::Checkbox("reversible circuit (elevator can float)", &rev)) {
      const std::string err = ses_.edit([&](fp::Scenario& c) { c.airplane.circuit.reversible = rev; });
      edit_error_ = err;
      if (err.empty()) edit_ok_ = std::string("circuit.reversible = ") + (rev ? "true" : "false");
    }
    tooltip("circuit.reversible: false for a powered (irreversible) circuit: the elevator cannot float: held case only.");
  }
  std::string table;
  bool open = false;
  for (const auto& k : fp::numeric_key_info()) {
    if (!filter_.empty() && k.name.find(filter_) == std::string::npos) continue;
    if (k.table != table) {
      if (open) ImGui::EndTable();
      table = k.table;
      const bool start_open = table == "mass" || table == "condition" || table == "elevator";
      open = ImGui::CollapsingHeader(table.c_str(), start_open || !filter_.empty() ? ImGuiTreeNodeFlags_DefaultOpen : 0);
      if (open) {
        open = ImGui::BeginTable(("##t" + table).c_str(), 3, ImGuiTableFlags_SizingStretchProp);
        if (open) {
          ImGui::TableSetupColumn("key", ImGuiTableColumnFlags_WidthStretch, 1.2f);
          ImGui::TableSetupColumn("value", ImGuiTableColumnFlags_WidthStretch, 1.0f);
          ImGui::TableSetupColumn("unit", ImGuiTableColumnFlags_WidthFixed, 44.0f);
        }
      }
    }
    if (open) key_row(k);
  }
  if (open) ImGui::EndTable();
  ImGui::EndChild();
}

void App::tab_inputs() {
  caption(f_, "GUST  [G]");
  ImGui::SetNextItemWidth(130);
  ImGui::Combo("shape", &gust_shape_, kGustShapes, 3);
  ImGui::SetNextItemWidth(130);
  ImGui::Combo("component", &gust_component_, kGustComponents, 2);
  float amp = static_cast<float>(gust_amplitude_), len = static_cast<float>(gust_length_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("amplitude", &amp, -20.0f, 20.0f, "%.1f m/s")) gust_amplitude_ = amp;
  tooltip("Peak gust velocity; vertical: up positive; horizontal: along the flight direction positive (a tail gust).");
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("length H", &len, 2.0f, 200.0f, "%.0f m", ImGuiSliderFlags_Logarithmic)) gust_length_ = len;
  tooltip("Gradient distance H: 1-cosine, distance from start to peak; ramp, the rise.");
  if (ImGui::Button("Gust now", ImVec2(130, 0))) gust_now();
  ImGui::SameLine();
  ImGui::TextDisabled("starts at the wing now");

  ImGui::Spacing();
  caption(f_, "STICK OF THE FREE AIRPLANE");
  if (!ses_.has_free()) ImGui::BeginDisabled();
  if (ImGui::Button(ses_.free_is_held() ? "Let go  [L]" : "Take hold  [L]", ImVec2(130, 0))) toggle_hold();
  float pf = static_cast<float>(pulse_force_), pd = static_cast<float>(pulse_duration_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("force", &pf, -200.0f, 200.0f, "%.0f N")) pulse_force_ = pf;
  tooltip("Pilot force on the stick, pull positive.");
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("duration", &pd, 0.05f, 5.0f, "%.2f s")) pulse_duration_ = pd;
  if (ImGui::Button("Force pulse  [P]", ImVec2(130, 0))) ses_.pulse(pulse_force_, pulse_duration_);
  tooltip("Applies only while the free airplane's stick is free.");
  if (!ses_.has_free()) ImGui::EndDisabled();

  ImGui::Spacing();
  caption(f_, "TRIM TAB (BOTH AIRPLANES)");
  if (ses_.loaded()) {
    const auto& c = ses_.scenario().airplane.circuit;
    float tab = static_cast<float>(to_deg(ses_.tab()));
    ImGui::SetNextItemWidth(130);
    if (ImGui::SliderFloat("tab", &tab, static_cast<float>(to_deg(c.tab_min)), static_cast<float>(to_deg(c.tab_max)),
                           "%+.2f deg"))
      ses_.set_tab(tab * fp::units::deg);
    tooltip("Moves the trim tab now (trailing edge down positive).  [ [ ] and [ ] ] step it.");
    float step = static_cast<float>(tab_step_deg_);
    ImGui::SetNextItemWidth(130);
    if (ImGui::SliderFloat("key step", &step, 0.1f, 5.0f, "%.1f deg")) tab_step_deg_ = step;
  }

  ImGui::Spacing();
  caption(f_, "VIEW");
  float sp = static_cast<float>(span_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("plot span", &sp, 2.0f, 120.0f, "%.0f s", ImGuiSliderFlags_Logarithmic)) span_ = sp;
  tooltip("Seconds of history the time plots follow. Wheel: zoom time (Shift: values); drag: pan; "
          "double click or [F]: follow again.");
  float ex = static_cast<float>(exaggeration_);
  ImGui::SetNextItemWidth(130);
  if (ImGui::SliderFloat("deflections ×", &ex, 1.0f, 10.0f, "%.0f")) exaggeration_ = std::round(ex);
  ImGui::Checkbox("superpose the two airplanes  [V]", &superposed_);

  ImGui::Spacing();
  caption(f_, "EXPORT");
  ImGui::SetNextItemWidth(-1);
  ImGui::InputText("##exp", &export_dir_);
  if (ImGui::Button("CSV of this run  [Ctrl+E]")) {
    const std::string err = export_run(export_dir_);
    message_ = err.empty() ? "run exported to " + export_dir_ : "export failed: " + err;
  }
  tooltip("held.csv and free.csv (the time histories), scenario.toml and actions.fps (the live inputs "
          "as a script), written whole or not at all.");
  ImGui::SameLine();
  if (ImGui::Button("Screenshot  [F12]")) {
    std::error_code ec;
    fs::create_directories(export_dir_, ec);
    screenshot_request_ = (fs::path(export_dir_) / ("window-" + std::to_string(++screenshot_count_) + ".png")).string();
  }

  ImGui::Spacing();
  caption(f_, "KEYS");
  ImGui::TextDisabled(
      "Space run/pause   .  step   A  all at once\n"
      "R  reset   G  gust   L  let go / take hold\n"
      "P  force pulse   [ ]  tab −/+   V  superpose\n"
      "+ −  speed   F  follow plots   F12  screenshot\n"
      "Ctrl+E  export CSV   Ctrl+S  save scenario");
}

void App::tab_analysis() {
  if (!ses_.loaded()) {
    ImGui::TextDisabled("Open a scenario first.");
    return;
  }
  caption(f_, "NEUTRAL AND MANEUVER POINTS");
  if (const fp::Margins* m = ses_.margins()) {
    if (ses_.margins_stale()) ImGui::TextDisabled("(for the CG before the slider moved)");
    if (ImGui::BeginTable("##np", 3, ImGuiTableFlags_SizingStretchProp | ImGuiTableFlags_RowBg)) {
      ImGui::TableSetupColumn("fraction of MAC");
      ImGui::TableSetupColumn("closed form");
      ImGui::TableSetupColumn("model");
      ImGui::TableHeadersRow();
      auto r = [](const char* n, const fp::Pair& p) {
        ImGui::TableNextRow();
        ImGui::TableSetColumnIndex(0);
        ImGui::TextUnformatted(n);
        ImGui::TableSetColumnIndex(1);
        ImGui::Text("%.4f", p.closed_form);
        ImGui::TableSetColumnIndex(2);
        ImGui::Text("%.4f", p.model);
      };
      const bool rev = ses_.scenario().airplane.circuit.reversible;
      r("neutral point, fixed", m->np_fixed);
      if (rev) r("neutral point, free", m->np_free);
      if (rev) r("apparent free (hinge consts)", m->np_apparent);
      r("maneuver point, fixed", m->mp_fixed);
      if (rev) r("maneuver point, free", m->mp_free);
      ImGui::EndTable();
    }
    if (ImGui::BeginTable("##mg", 2, ImGuiTableFlags_SizingStretchProp)) {
      row("CG", fmt("%.4f", m->cg));
      row("static margin, fixed", fmt("%+.4f", m->margin_fixed));
      if (ses_.scenario().airplane.circuit.reversible) row("static margin, free", fmt("%+.4f", m->margin_free));
      else row("stick-free case", "none (irreversible circuit)");
      row("stick force per g", fmt("%.1f N/g", m->force_per_g));
      row("elevator per g", fmt("%.2f deg/g", to_deg(m->elevator_per_g)));
      row("force gradient at trim", fmt("%+.3f N/(m/s)", m->force_gradient));
      ImGui::EndTable();
    }
  } else {
    colored_wrapped(kWarnAmber, "not available: " + ses_.margins_error());
  }
  auto modes_table = [&](const char* id, const std::vector<fp::Mode>& ms) {
    ImGui::PushFont(f_.small);
    if (ImGui::BeginTable(id, 4, ImGuiTableFlags_SizingStretchProp | ImGuiTableFlags_RowBg)) {
      ImGui::TableSetupColumn("mode", ImGuiTableColumnFlags_WidthStretch, 1.1f);
      ImGui::TableSetupColumn("root [1/s]", ImGuiTableColumnFlags_WidthStretch, 1.3f);
      ImGui::TableSetupColumn("ζ", ImGuiTableColumnFlags_WidthStretch, 0.45f);
      ImGui::TableSetupColumn("T or t½", ImGuiTableColumnFlags_WidthStretch, 0.8f);
      ImGui::TableHeadersRow();
      for (const auto& m : ms) {
        ImGui::TableNextRow();
        ImGui::TableSetColumnIndex(0);
        ImGui::TextUnformatted(m.name.c_str());
        ImGui::TableSetColumnIndex(1);
        if (m.oscillatory) ImGui::Text("%.3g ± %.3gi", m.root.real(), m.root.imag());
        else ImGui::Text("%.3g", m.root.real());
        ImGui::TableSetColumnIndex(2);
        if (m.oscillatory) ImGui::Text("%.3f", m.damping);
        else ImGui::TextDisabled("-");
        ImGui::TableSetColumnIndex(3);
        if (m.oscillatory) ImGui::Text("T %.3g s", m.period);
        else if (m.root.real() > 0) ImGui::Text("t×2 %.3g s", m.time_to_double);
        else if (m.root.real() < 0) ImGui::Text("t½ %.3g s", m.time_to_half);
      }
      ImGui::EndTable();
    }
    ImGui::PopFont();
  };
  ImGui::Spacing();
  caption(f_, "MODES, STICK HELD");
  modes_table("##mh", ses_.modes().held);
  ImGui::Spacing();
  caption(f_, "MODES, STICK FREE");
  if (ses_.modes().has_free) modes_table("##mf", ses_.modes().free);
  else ImGui::TextDisabled("irreversible circuit: the elevator cannot float: held case only");
}

// =============================================================================================
// Side view

void App::side_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##side", pos, size, ImGuiWindowFlags_NoBackground | ImGuiWindowFlags_NoScrollbar);
  caption(f_, "SIDE VIEW");
  ImGui::SameLine(110);
  ImGui::SetCursorPosY(ImGui::GetCursorPosY() - 1);
  if (segment("side by side", !superposed_)) superposed_ = false;
  ImGui::SameLine(0, 2);
  if (segment("superposed", superposed_)) superposed_ = true;
  tooltip("Held and free airplanes next to each other, or drawn on top of each other (free dashed).  [V]");
  const float top = 28.0f;
  side_rect_ = sf::FloatRect(pos.x + 4.0f, pos.y + top, size.x - 8.0f, size.y - top - 4.0f);
  // the MAC bar explains itself when hovered
  const ImVec2 mp = ImGui::GetIO().MousePos;
  if (ses_.loaded() && ImGui::IsWindowHovered() && mp.x >= side_rect_.left && mp.x <= side_rect_.left + side_rect_.width &&
      mp.y >= side_rect_.top + side_rect_.height - 76.0f && mp.y <= side_rect_.top + side_rect_.height) {
    std::string t = fmt("Mean aerodynamic chord, leading edge 0 to trailing edge 1.\nCG %.4f", marks_.cg) +
                    fmt("   envelope %.3f", marks_.envelope_forward) + fmt("..%.3f", marks_.envelope_aft);
    if (marks_.have_points)
      t += fmt("\nN fixed  %.4f  stick-fixed neutral point (model)", marks_.np_fixed) +
           fmt("\nN free   %.4f  stick-free neutral point (model)", marks_.np_free) +
           fmt("\nN free app. %.4f  where the hands-off airplane diverges with the constant hinge moments",
               marks_.np_apparent) +
           fmt("\nM fixed  %.4f  stick-fixed maneuver point", marks_.mp_fixed) +
           fmt("\nM free   %.4f  stick-free maneuver point (aerodynamic)", marks_.mp_free);
    else
      t += "\nneutral points: " + marks_.missing;
    ImGui::BeginTooltip();
    ImGui::TextUnformatted(t.c_str());
    ImGui::EndTooltip();
  }
  if (!ses_.loaded()) {
    ImGui::SetCursorPosY(top + 20);
    ImGui::TextDisabled("no scenario");
  } else if (!side_view_.has_font()) {
    ImGui::SetCursorPosY(size.y - 24);
    ImGui::TextDisabled("(no TrueType font found: labels left out)");
  }
  ImGui::End();
}

void App::draw_sfml(sf::RenderTarget& target) {
  if (!ses_.loaded() || side_rect_.width < 50 || side_rect_.height < 80) return;
  side_view_.draw(target, side_rect_, ses_.scenario().airplane, &held_pose_, ses_.has_free() ? &free_pose_ : nullptr,
                  superposed_, exaggeration_, marks_);
}

// =============================================================================================
// Modes: complex plane, CG slider, warnings

void App::modes_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##modes", pos, size,
              ImGuiWindowFlags_NoScrollbar | ImGuiWindowFlags_NoScrollWithMouse | ImGuiWindowFlags_NoBackground);
  caption(f_, "MODES AND CG");
  if (!ses_.loaded()) {
    ImGui::TextDisabled("no scenario");
    ImGui::End();
    return;
  }
  const fp::Scenario& s = ses_.scenario();
  // CG slider: re-trims and moves the roots while dragged; margins follow when let go
  ImGui::SameLine(120);
  ImGui::SetCursorPosY(ImGui::GetCursorPosY() - 3);
  ImGui::SetNextItemWidth(std::max(120.0f, size.x - 250.0f));
  const float lo = static_cast<float>(std::min(ses_.locus_from(), s.airplane.mass.h_cg));
  const float hi = static_cast<float>(std::max(ses_.locus_to(), s.airplane.mass.h_cg));
  if (ImGui::SliderFloat("CG [MAC]", &cg_slider_, lo, hi, "%.3f")) {
    ses_.set_defer_margins(true);
    const std::string err = ses_.set_key("mass.cg", cg_slider_);
    if (!err.empty()) {
      edit_error_ = err;
      cg_slider_ = static_cast<float>(s.airplane.mass.h_cg);
    }
  }
  if (ImGui::IsItemDeactivated()) {
    ses_.set_defer_margins(false);
    if (ses_.margins_stale()) ses_.refresh_margins();
  }
  tooltip("mass.cg: moving it re-trims the airplane and restarts both runs; the roots move along the "
          "locus drawn for the CG range (dots).");

  // warnings: from the neutral points when available, else from the sign of the largest real root
  const double cg = s.airplane.mass.h_cg;
  const fp::ModesResult& md = ses_.modes();
  std::string mode_h, mode_f;
  const double rh = fp::largest_real_root(md.held, &mode_h);
  const double rf = md.has_free ? fp::largest_real_root(md.free, &mode_f) : -INFINITY;
  ImGui::PushFont(f_.small);
  // while the slider is dragged the neutral points are those of the last position let go (they
  // hardly move with the CG; the margins take many trims and follow when the slider is let go)
  const bool reversible = s.airplane.circuit.reversible;
  if (const fp::Margins* m = ses_.margins(); m && !reversible) {
    if (cg > m->np_fixed.model)
      colored_wrapped(kWarnRed, fmt("CG %.3f is aft of the stick-fixed neutral point ", cg) +
                                    fmt("%.3f: statically unstable.", m->np_fixed.model));
    else
      colored_wrapped(kOkGreen, fmt("Static margin at CG %.3f: ", cg) + fmt("%+.3f (model); irreversible circuit, ",
                                                                               m->np_fixed.model - cg) +
                                    "the elevator cannot float: held case only.");
  } else if (const fp::Margins* m = ses_.margins()) {
    if (cg > m->np_fixed.model)
      colored_wrapped(kWarnRed, fmt("CG %.3f is aft of the stick-FIXED neutral point ", cg) +
                                    fmt("%.3f: unstable even with the stick held.", m->np_fixed.model));
    else if (cg > m->np_free.model)
      colored_wrapped(kWarnAmber, fmt("CG %.3f is aft of the stick-free neutral point ", cg) +
                                      fmt("%.3f: hands off, the airplane is statically unstable", m->np_free.model) +
                                      (cg < m->np_apparent.model
                                           ? fmt(" (the constant hinge moments move the divergence aft to %.3f).",
                                                 m->np_apparent.model)
                                           : std::string(".")));
    else
      colored_wrapped(kOkGreen, fmt("Static margins at CG %.3f: ", cg) + fmt("stick-fixed %+.3f, ", m->np_fixed.model - cg) +
                                    fmt("stick-free %+.3f (model).", m->np_free.model - cg));
  } else {
    if (rh > fp::kDivergenceThreshold)
      colored_wrapped(kWarnRed, "Held airplane diverges at this CG (" + mode_h + fmt(" %+.3f /s).", rh));
    else if (rf > fp::kDivergenceThreshold)
      colored_wrapped(kWarnAmber, "Hands off, the airplane diverges at this CG (" + mode_f + fmt(" %+.3f /s).", rf));
    else
      colored_wrapped(kOkGreen, "No divergent root held or free at this CG.");
  }
  {
    std::string line = "largest real root: held " + (std::isfinite(rh) ? fmt("%+.4f /s", rh) : std::string("none"));
    if (md.has_free) line += ",  free " + (std::isfinite(rf) ? fmt("%+.4f /s", rf) : std::string("none"));
    ImGui::TextDisabled("%s", line.c_str());
  }
  ImGui::PopFont();

  // complex plane: the locus over the CG range (small marks) and the roots at this CG (large)
  RootSets& r = roots_;
  r.clear();
  auto add = [](std::vector<double>& x, std::vector<double>& y, std::vector<double>* t, const fp::Mode& m, double tag) {
    x.push_back(m.root.real());
    y.push_back(m.root.imag());
    if (t) t->push_back(tag);
    if (m.oscillatory) {
      x.push_back(m.root.real());
      y.push_back(-m.root.imag());
      if (t) t->push_back(tag);
    }
  };
  // the airframe's own modes, without the fast elevator and downwash-lag roots
  auto airframe = [](const fp::Mode& m) { return m.name != "elevator" && m.name != "downwash lag"; };
  double fxlo = -0.1, fxhi = 0.1, fymax = 0.1;
  auto fit = [&](const fp::Mode& m) {
    const bool take = roots_fit_ == 1 || (roots_fit_ == 0 && airframe(m)) || (roots_fit_ == 2 && std::abs(m.root) < 2.0);
    if (!take) return;
    fxlo = std::min(fxlo, m.root.real());
    fxhi = std::max(fxhi, m.root.real());
    fymax = std::max(fymax, std::abs(m.root.imag()));
  };
  for (const auto& p : ses_.locus()) {
    if (!p.ok) continue;
    for (const auto& m : p.modes.held) add(r.lhx, r.lhy, &r.lht, m, p.cg), fit(m);
    if (p.modes.has_free)
      for (const auto& m : p.modes.free) add(r.lfx, r.lfy, &r.lft, m, p.cg), fit(m);
  }
  for (const auto& m : md.held) add(r.chx, r.chy, nullptr, m, cg), fit(m);
  if (md.has_free)
    for (const auto& m : md.free) add(r.cfx, r.cfy, nullptr, m, cg), fit(m);
  std::vector<Series> ser;
  auto scatter = [&](const char* label, const std::vector<double>& x, const std::vector<double>& y,
                     const std::vector<double>* t, ImU32 col, Marker mk, float size, bool filled) {
    Series sr;
    sr.label = label;
    sr.x = x.data();
    sr.y = y.data();
    sr.n = x.size();
    sr.color = col;
    sr.line = false;
    sr.marker = mk;
    sr.marker_size = size;
    sr.marker_filled = filled;
    sr.sorted_x = false;
    if (t) {
      sr.tag = t->data();
      sr.tag_name = "CG";
    }
    ser.push_back(sr);
  };
  scatter("held, CG range", r.lhx, r.lhy, &r.lht, IM_COL32(27, 42, 65, 110), Marker::square, 1.5f, true);
  if (md.has_free)
    scatter("free, CG range", r.lfx, r.lfy, &r.lft, IM_COL32(224, 128, 20, 140), Marker::square, 1.5f, true);
  scatter("held, this CG", r.chx, r.chy, nullptr, kHeld, Marker::square, 4.5f, true);
  if (md.has_free) scatter("free, this CG", r.cfx, r.cfy, nullptr, kFree, Marker::diamond, 5.0f, false);
  std::vector<RefLine> refs{RefLine{true, 0.0, IM_COL32(150, 60, 40, 170), "unstable →", false}};
  // which roots the view fits: the airframe's (the fast elevator mode would squeeze the rest
  // into a corner), all of them, or the slow ones near the origin
  const ImVec2 keep = ImGui::GetCursorPos();
  ImGui::SetCursorPos(ImVec2(ImGui::GetWindowWidth() - 180.0f, keep.y));
  ImGui::PushFont(f_.small);
  ImGui::TextDisabled("fit");
  const char* fits[] = {"airframe", "all", "slow"};
  const char* fit_tips[] = {"the airframe's modes: short period, phugoid, divergences (not the elevator mode)",
                            "every root", "the roots within 2 /s of the origin"};
  for (int i = 0; i < 3; ++i) {
    ImGui::SameLine(0, i == 0 ? 6.0f : 2.0f);
    if (segment(fits[i], roots_fit_ == i)) {
      roots_fit_ = i;
      roots_refit_ = true;
    }
    tooltip(std::string("Fit the view to ") + fit_tips[i] + ". Wheel: zoom; drag: pan; double click: fit again.");
  }
  ImGui::PopFont();
  ImGui::SetCursorPos(keep);
  if (ses_.generation() != roots_generation_) {
    roots_generation_ = ses_.generation();
    if (!roots_user_zoomed_) roots_refit_ = true;
  }
  if (roots_refit_ || (modes_x_.automatic && modes_y_.automatic)) {
    roots_refit_ = false;
    const double pad = 0.08 * (fxhi - fxlo);
    modes_x_ = AxisRange{fxlo - pad, fxhi + pad, false};
    modes_y_ = AxisRange{-1.12 * fymax, 1.12 * fymax, false};
    roots_user_zoomed_ = false;
  }
  const AxisRange before_x = modes_x_, before_y = modes_y_;
  PlotSpec ps;
  ps.id = "##roots";
  ps.title = "roots  [1/s]";
  ps.x_unit = "1/s";
  ps.y_unit = "rad/s";
  ps.x = &modes_x_;
  ps.y = &modes_y_;
  ps.x_include_zero = true;
  ps.y_include_zero = true;
  ps.nearest_readout = true;
  ps.y_min_span = 1.0;
  plot(ps, ser, refs);
  if (modes_x_.lo != before_x.lo || modes_x_.hi != before_x.hi || modes_y_.lo != before_y.lo || modes_y_.hi != before_y.hi)
    roots_user_zoomed_ = true;  // zoomed or panned: keep the user's view until asked to fit
  ImGui::End();
}

// =============================================================================================
// Time plots

void App::plots_panel(const ImVec2& pos, const ImVec2& size) {
  begin_panel("##plots", pos, size,
              ImGuiWindowFlags_NoScrollbar | ImGuiWindowFlags_NoScrollWithMouse | ImGuiWindowFlags_NoBackground);
  caption(f_, "TIME HISTORIES");
  // a legend for all plots: held dark and solid, free light and dashed
  {
    ImGui::SameLine(140);
    ImDrawList* dl = ImGui::GetWindowDrawList();
    const ImVec2 p = ImGui::GetCursorScreenPos();
    const float y = p.y + ImGui::GetFontSize() * 0.5f - 1.0f;
    dl->AddLine(ImVec2(p.x, y), ImVec2(p.x + 26, y), kHeld, 2.2f);
    ImGui::SetCursorScreenPos(ImVec2(p.x + 32, p.y));
    ImGui::TextUnformatted("held (stick held)");
    ImGui::SameLine(0, 18);
    const ImVec2 q = ImGui::GetCursorScreenPos();
    dl->AddLine(ImVec2(q.x, y), ImVec2(q.x + 10, y), kFree, 2.2f);
    dl->AddLine(ImVec2(q.x + 15, y), ImVec2(q.x + 26, y), kFree, 2.2f);
    ImGui::SetCursorScreenPos(ImVec2(q.x + 32, q.y));
    ImGui::TextUnformatted(ses_.has_free() || !ses_.loaded() ? "free (hands off after let go)"
                                                              : "free: none (irreversible circuit)");
    if (!time_x_.automatic) {
      ImGui::SameLine(0, 18);
      if (ImGui::SmallButton("follow  [F]")) {
        time_x_.automatic = true;
        for (auto& yy : plot_y_) yy.automatic = true;
      }
    } else {
      ImGui::SameLine(0, 18);
      ImGui::TextDisabled("last %.0f s", span_);
    }
  }
  geometry_.clear();
  if (!ses_.loaded()) {
    ImGui::TextDisabled("no scenario");
    ImGui::End();
    return;
  }
  const fp::Trace& th = ses_.held()->trace();
  const fp::Trace* tf = ses_.has_free() ? &ses_.free()->trace() : nullptr;

  // event marks: scenario events and the live inputs
  std::vector<RefLine> marks;
  const ImU32 mark_col = IM_COL32(46, 110, 107, 150);
  if (tf && ses_.scenario().run.let_go_time > 0.0)
    marks.push_back(RefLine{true, ses_.scenario().run.let_go_time, mark_col, "let go", true});
  for (const auto& e : ses_.scenario().events) {
    const char* n = e.kind == fp::EventKind::let_go      ? "let go"
                    : e.kind == fp::EventKind::take_hold ? "hold"
                    : e.kind == fp::EventKind::tab       ? "tab"
                    : e.kind == fp::EventKind::pulse     ? "pulse"
                                                         : "elevator";
    marks.push_back(RefLine{true, e.time, mark_col, n, true});
  }
  for (std::size_t i = 0; i < ses_.scenario().gust_start_times.size(); ++i)
    if (const auto& st = ses_.scenario().gust_start_times[i]) marks.push_back(RefLine{true, *st, mark_col, "gust", true});
  for (const auto& a : ses_.live_log()) {
    const char* n = a.kind == ActionKind::gust        ? "gust"
                    : a.kind == ActionKind::let_go    ? "let go"
                    : a.kind == ActionKind::take_hold ? "hold"
                    : a.kind == ActionKind::tab       ? "tab"
                    : a.kind == ActionKind::pulse     ? "pulse"
                                                      : "";
    marks.push_back(RefLine{true, a.time, mark_col, n, true});
  }
  if (ses_.held()->departure().departed)
    marks.push_back(RefLine{true, ses_.held()->departure().time, kHeld, "held departed", false});
  if (tf && ses_.free()->departure().departed)
    marks.push_back(RefLine{true, ses_.free()->departure().time, kFree, "free departed", false});
  std::vector<RefLine> marks_plain = marks;
  for (auto& m : marks_plain) m.label.clear();

  struct Def {
    const char* id;
    std::string title;
    std::size_t ch;       // main channel
    std::size_t ch2;      // second channel (ch_count: none)
    const char* l1;       // label of the main channel in the legend
    const char* l2;
    double min_span;
    bool second_free_only = false;  // the second channel only for the free airplane
  };
  auto title_of = [](std::size_t ch) {
    const auto& ci = fp::channel_info(ch);
    return std::string(ci.label) + "  [" + ci.unit + "]";
  };
  const std::vector<Def> defs{
      {"alpha", title_of(fp::ch_alpha), fp::ch_alpha, fp::ch_count, "", "", 0.5},
      {"load_factor", "load factor n  [-]", fp::ch_load_factor, fp::ch_count, "", "", 0.05},
      {"q", title_of(fp::ch_q), fp::ch_q, fp::ch_count, "", "", 1.0},
      {"theta", title_of(fp::ch_theta), fp::ch_theta, fp::ch_count, "", "", 0.5},
      {"elevator", "elevator and tab (TE down +)  [deg]", fp::ch_elevator, fp::ch_tab, "elevator", "tab", 0.5},
      {"stick_force", title_of(fp::ch_stick_force), fp::ch_stick_force, fp::ch_hold_force, "", "(force to hold)", 2.0, true},
      {"airspeed", title_of(fp::ch_airspeed), fp::ch_airspeed, fp::ch_count, "", "", 0.5},
      {"altitude", title_of(fp::ch_altitude), fp::ch_altitude, fp::ch_count, "", "", 2.0},
      {"gust", "vertical gust (up +)  [m/s]", fp::ch_gust_w_wing, fp::ch_gust_w_tail, "wing", "tail", 1.0},
  };
  const int cols = 3;
  const int rows = static_cast<int>((defs.size() + cols - 1) / cols);
  const ImVec2 origin = ImGui::GetCursorScreenPos();
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const float gap = 8.0f;
  const float w = std::floor((avail.x - gap * (cols - 1)) / cols);
  const float h = std::floor((avail.y - gap * (rows - 1)) / rows);
  for (std::size_t k = 0; k < defs.size(); ++k) {
    const Def& d = defs[k];
    const auto& ci = fp::channel_info(d.ch);
    std::vector<Series> ser;
    auto add = [&](const fp::Trace& tr, std::size_t ch, const std::string& label, ImU32 col, float th_, bool dashed) {
      Series s;
      s.label = label;
      s.x = tr.ch[fp::ch_time].data();
      s.y = tr.ch[ch].data();
      s.n = tr.size();
      s.y_factor = fp::channel_info(ch).display;
      s.color = col;
      s.thickness = th_;
      s.dashed = dashed;
      ser.push_back(s);
    };
    const bool two = d.ch2 != fp::ch_count;
    const bool two_named = two && !d.second_free_only;
    const std::string sh = two_named ? std::string("held ") + d.l1 : "held";
    const std::string sf = two_named ? std::string("free ") + d.l1 : "free";
    add(th, d.ch, sh, kHeld, 2.0f, false);
    if (tf) add(*tf, d.ch, sf, kFree, 2.0f, true);
    if (two && !d.second_free_only) add(th, d.ch2, std::string("held ") + d.l2, kHeld2, 1.0f, false);
    if (two && tf) add(*tf, d.ch2, std::string("free ") + d.l2, kFree2, 1.0f, true);
    std::vector<RefLine> refs = k == 0 ? marks : marks_plain;
    if (d.ch == fp::ch_elevator) {
      const auto& el = ses_.scenario().airplane.elevator;
      refs.push_back(RefLine{false, to_deg(el.delta_max), IM_COL32(170, 32, 32, 120), "stop", true});
      refs.push_back(RefLine{false, to_deg(el.delta_min), IM_COL32(170, 32, 32, 120), "stop", true});
    }
    PlotSpec ps;
    ps.id = d.id;
    ps.title = d.title;
    ps.x_unit = "s";
    ps.y_unit = ci.unit;
    ps.size = ImVec2(w, h);
    ps.x = &time_x_;
    ps.y = &plot_y_[k];
    ps.cursor = &time_cursor_;
    ps.x_follow_span = span_;
    ps.y_min_span = d.min_span;
    PlotGeometry g;
    ps.geometry = &g;
    const int r = static_cast<int>(k) / cols, c = static_cast<int>(k) % cols;
    ImGui::SetCursorScreenPos(ImVec2(origin.x + c * (w + gap), origin.y + r * (h + gap)));
    plot(ps, ser, refs);
    geometry_.emplace_back(d.id, g);
  }
  ImGui::End();
}

// =============================================================================================
// Status line: the cautions, always

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
