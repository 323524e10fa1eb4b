// main.cpp — floatpitch-view: the desktop window. Reads the command line (options.cpp), opens
// an SFML window with an OpenGL context, and runs the frame loop: events to ImGui, the
// interface, the side view drawn with SFML under ImGui's draw data, screenshots and the
// frame-time log. With --frames N it runs N frames without a person and exits.
//
//   floatpitch-view [SCENARIO] [--frames N] [--screenshot FILE.png] [--script FILE]
//                   [--frame-log FILE] [--csv-dir DIR] [--layout FILE] [--size WxH]
//
// Exit status: 0 success, 1 a failure of the program or the display (no window, a file not
// written), 2 bad usage or input (options, script, scenario in a scripted run).
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <string>
#include <vector>

#include <SFML/Graphics.hpp>
#include <SFML/OpenGL.hpp>
#include <backends/imgui_impl_opengl3.h>
#include <imgui.h>

#include "ui/app.hpp"
#include "ui/imgui_sfml_bridge.hpp"
#include "ui/options.hpp"
#include "ui/theme.hpp"

namespace {

bool save_png(const sf::RenderWindow& window, const std::string& path) {
  sf::Texture tex;
  const sf::Vector2u size = window.getSize();
  if (!tex.create(size.x, size.y)) return false;
  tex.update(window);
  sf::Image img = tex.copyToImage();
  for (unsigned y = 0; y < size.y; ++y)
    for (unsigned x = 0; x < size.x; ++x) {
      sf::Color c = img.getPixel(x, y);
      c.a = 255;
      img.setPixel(x, y, c);
    }
  return img.saveToFile(path);
}

// The script is read before any window opens: a bad line stops here (false, message printed).
bool read_script(const std::string& path, std::vector<fpui::Action>& script) {
  if (path.empty()) return true;
  try {
    script = fpui::load_script(path);
  } catch (const fpui::ScriptError& e) {
    std::cerr << "error: " << e.message << "\n";
    return false;
  }
  return true;
}

// The window with its OpenGL context, at the top left of the screen; false when none opened.
bool open_window(sf::RenderWindow& window, const fpui::Options& opt) {
  sf::ContextSettings cs;
  cs.depthBits = 0;
  cs.stencilBits = 0;
  cs.antialiasingLevel = 0;
  window.create(sf::VideoMode(opt.width, opt.height), "floatpitch-view", sf::Style::Default, cs);
  if (!window.isOpen()) return false;
  window.setPosition({0, 0});
  if (opt.frames < 0) window.setFramerateLimit(60);  // headless runs go as fast as they can
  window.setActive(true);
  return true;
}

// The window's events to ImGui; false when the window was closed.
bool poll_events(sf::RenderWindow& window, fpui::ImGuiSfmlBridge& bridge) {
  sf::Event e;
  while (window.pollEvent(e)) {
    if (e.type == sf::Event::Closed) window.close();
    else if (e.type == sf::Event::Resized)
      window.setView(sf::View(sf::FloatRect(0, 0, static_cast<float>(e.size.width), static_cast<float>(e.size.height))));
    bridge.process_event(e);
  }
  return window.isOpen();
}

// The frame drawn: the background, the side view (SFML), then ImGui's draw data over it.
void render(sf::RenderWindow& window, fpui::App& app, fpui::ImGuiSfmlBridge& bridge) {
  window.clear(sf::Color(fpui::kPaperRGB[0], fpui::kPaperRGB[1], fpui::kPaperRGB[2]));
  window.resetGLStates();
  app.draw_sfml(window);
  window.resetGLStates();
  ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
  bridge.end_frame();
}

// Screenshots of the frame just drawn: one asked for in the window (reported in the status
// line), and the one of --screenshot after the last frame. Returns 1 when that one failed.
int take_screenshots(const sf::RenderWindow& window, fpui::App& app, const fpui::Options& opt, bool last) {
  const std::string asked = app.take_screenshot_request();
  if (!asked.empty()) app.report(save_png(window, asked) ? "screenshot " + asked : "screenshot not written: " + asked);
  if (last && !opt.screenshot.empty() && !save_png(window, opt.screenshot)) {
    std::cerr << "error: the screenshot could not be written to " << opt.screenshot << "\n";
    return 1;
  }
  return 0;
}

// Frames until the window closes (or the last of --frames); each frame's time into `frame_ms`.
// Returns the exit status so far: 2 for a refused script action, 1 for a lost screenshot.
int frame_loop(sf::RenderWindow& window, fpui::ImGuiSfmlBridge& bridge, fpui::App& app, const fpui::Options& opt,
               std::vector<double>& frame_ms) {
  using steady = std::chrono::steady_clock;
  ImGuiIO& io = ImGui::GetIO();
  const bool headless = opt.frames >= 0;
  sf::Clock clock;
  int status = 0;
  for (int frame = 0; status == 0 && window.isOpen(); ++frame) {
    const auto t0 = steady::now();
    if (!poll_events(window, bridge)) break;
    const float dt = clock.restart().asSeconds();
    bridge.new_frame(window.getSize(), dt);
    if (float mx, my; app.scripted_mouse(mx, my)) io.MousePos = ImVec2(mx, my);
    ImGui_ImplOpenGL3_NewFrame();
    ImGui::NewFrame();
    app.frame(dt);
    ImGui::Render();
    if (!app.fatal().empty()) {
      std::cerr << "error: " << app.fatal() << "\n";
      return 2;
    }
    render(window, app, bridge);
    const bool last = headless && frame + 1 >= opt.frames;
    status = take_screenshots(window, app, opt, last);
    if (!opt.frame_log.empty()) glFinish();  // count the rendering, not just its submission
    window.display();
    frame_ms.push_back(std::chrono::duration<double, std::milli>(steady::now() - t0).count());
    if (last) break;
  }
  return status;
}

// At exit: the layout and the run's files (not after bad input). Returns the status.
int write_outputs(fpui::App& app, const fpui::Options& opt, int status) {
  if (status != 2 && !opt.layout.empty()) {
    std::ofstream out(opt.layout);
    out << app.layout_text();
    if (!out) {
      std::cerr << "error: the layout could not be written to " << opt.layout << "\n";
      status = 1;
    }
  }
  if (status != 2 && !opt.csv_dir.empty()) {
    const std::string err = app.export_run(opt.csv_dir);
    if (!err.empty()) {
      std::cerr << "error: " << err << "\n";
      status = 1;
    }
  }
  return status;
}

// The frame-time log (frame,ms) and its median on stdout.
void write_frame_log(const std::string& path, const std::vector<double>& frame_ms) {
  if (path.empty()) return;
  std::ofstream out(path);
  out << "frame,ms\n";
  for (std::size_t i = 0; i < frame_ms.size(); ++i) out << i << "," << frame_ms[i] << "\n";
  std::vector<double> sorted = frame_ms;
  std::sort(sorted.begin(), sorted.end());
  if (!sorted.empty()) {
    const double median = sorted.size() % 2 ? sorted[sorted.size() / 2]
                                            : 0.5 * (sorted[sorted.size() / 2 - 1] + sorted[sorted.size() / 2]);
    std::printf("median frame time: %.2f ms over %zu frames\n", median, sorted.size());
  }
}

// The session in the window: the App, its frames, and what is written at exit.
int run_app(sf::RenderWindow& window, fpui::ImGuiSfmlBridge& bridge, const fpui::Options& opt,
            std::vector<fpui::Action> script, const fpui::Fonts& fonts) {
  fpui::App app(opt, std::move(script), fonts);
  int status = 0;
  if (!app.fatal().empty()) {
    std::cerr << "error: " << app.fatal() << "\n";
    status = 2;
  }
  std::vector<double> frame_ms;
  if (status == 0) status = frame_loop(window, bridge, app, opt, frame_ms);
  status = write_outputs(app, opt, status);
  write_frame_log(opt.frame_log, frame_ms);
  return status;
}

}  // namespace

int main(int argc, char** argv) {
  fpui::Options opt;
  if (const int done = fpui::parse_options(argc, argv, opt); done >= 0) return done;
  std::vector<fpui::Action> script;
  if (!read_script(opt.script, script)) return 2;

  sf::RenderWindow window;
  if (!open_window(window, opt)) {
    std::cerr << "error: no window could be opened (is there a display?)\n";
    return 1;
  }
  IMGUI_CHECKVERSION();
  ImGui::CreateContext();
  ImGuiIO& io = ImGui::GetIO();
  io.IniFilename = nullptr;  // the layout is fixed: nothing to keep between sessions
  io.LogFilename = nullptr;
  fpui::ImGuiSfmlBridge bridge;
  const fpui::Fonts fonts = fpui::load_fonts();
  fpui::apply_theme();
  if (!ImGui_ImplOpenGL3_Init("#version 130")) {
    std::cerr << "error: the OpenGL renderer of the interface could not start\n";
    return 1;
  }

  const int status = run_app(window, bridge, opt, std::move(script), fonts);
  ImGui_ImplOpenGL3_Shutdown();
  ImGui::DestroyContext();
  if (window.isOpen()) window.close();
  return status;
}
