// app.cpp — see app.hpp. The frame (its layout of the panels), the shared state's set-up, and
// the files: open, recent files, export, the layout text for the tests. Time, actions and keys
// are in app_actions.cpp; each panel is in its panel_*.cpp.
#include "ui/app.hpp"

#include <algorithm>
#include <cfloat>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "output/atomic_file.hpp"

namespace fpui {

namespace fs = std::filesystem;

namespace {

std::string recent_file() {
  const char* xdg = std::getenv("XDG_CONFIG_HOME");
  const char* home = std::getenv("HOME");
  if (xdg && *xdg) return std::string(xdg) + "/floatpitch/recent";
  if (home && *home) return std::string(home) + "/.config/floatpitch/recent";
  return {};
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
// Frame

void App::frame(float wall_dt) {
  time_cursor_.new_frame();
  handle_keys();
  advance(wall_dt);
  if (ses_.loaded()) update_side_view_state();

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

}  // namespace fpui
