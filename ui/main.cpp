// main.cpp — floatpitch-view: the desktop window. Parses the command line (by hand: a few
// options), opens an SFML window with an OpenGL context, and runs the frame loop: events to
// ImGui, the interface, the side view drawn with SFML under ImGui's draw data, screenshots and
// the frame-time log. With --frames N it runs N frames without a person and exits.
//
//   floatpitch-view [SCENARIO] [--frames N] [--screenshot FILE.png] [--script FILE]
//                   [--frame-log FILE] [--csv-dir DIR] [--layout FILE] [--size WxH]
//
// Exit status: 0 success, 1 a failure of the program or the display (no window, a file not
// written), 2 bad usage or input (options, script, scenario in a scripted run).
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstring>
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
#include "ui/theme.hpp"

namespace {

const char* kUsage =
    "usage: floatpitch-view [SCENARIO] [options]\n"
    "  SCENARIO             a scenario file (.toml) to open\n"
    "  --frames N           run N frames without a person, then exit (0..1000000)\n"
    "  --screenshot FILE    write the last frame as a PNG\n"
    "  --script FILE        actions at simulated times (see ui/README.md)\n"
    "  --frame-log FILE     write each frame's time [ms]; prints the median at exit\n"
    "  --csv-dir DIR        write the run (held.csv, free.csv, scenario, actions) at exit\n"
    "  --layout FILE        write where the time plots were drawn (for tests)\n"
    "  --size WxH           window size in pixels (default 1280x800)\n"
    "  --help               this text\n";

int usage_error(const std::string& what) {
  std::cerr << "floatpitch-view: " << what << "\n" << kUsage;
  return 2;
}

bool parse_int(const std::string& s, long lo, long hi, long& out) {
  char* end = nullptr;
  const long v = std::strtol(s.c_str(), &end, 10);
  if (s.empty() || *end != '\0' || v < lo || v > hi) return false;
  out = v;
  return true;
}

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

}  // namespace

int main(int argc, char** argv) {
  fpui::Options opt;
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    auto value = [&](std::string& out) {
      if (i + 1 >= argc) return false;
      out = argv[++i];
      return true;
    };
    std::string v;
    if (a == "--help" || a == "-h") {
      std::cout << kUsage;
      return 0;
    } else if (a == "--frames") {
      long n = 0;
      if (!value(v) || !parse_int(v, 0, 1000000, n)) return usage_error("--frames takes a whole number 0..1000000");
      opt.frames = static_cast<int>(n);
    } else if (a == "--screenshot") {
      if (!value(opt.screenshot)) return usage_error("--screenshot takes a file name");
    } else if (a == "--script") {
      if (!value(opt.script)) return usage_error("--script takes a file name");
    } else if (a == "--frame-log") {
      if (!value(opt.frame_log)) return usage_error("--frame-log takes a file name");
    } else if (a == "--csv-dir") {
      if (!value(opt.csv_dir)) return usage_error("--csv-dir takes a directory");
    } else if (a == "--layout") {
      if (!value(opt.layout)) return usage_error("--layout takes a file name");
    } else if (a == "--size") {
      long w = 0, h = 0;
      if (!value(v)) return usage_error("--size takes WxH");
      const auto p = v.find('x');
      if (p == std::string::npos || !parse_int(v.substr(0, p), 640, 8192, w) ||
          !parse_int(v.substr(p + 1), 480, 8192, h))
        return usage_error("--size takes WxH, from 640x480 to 8192x8192");
      opt.width = static_cast<unsigned>(w);
      opt.height = static_cast<unsigned>(h);
    } else if (!a.empty() && a[0] == '-') {
      return usage_error("unknown option " + a);
    } else if (opt.scenario.empty()) {
      opt.scenario = a;
    } else {
      return usage_error("one scenario at a time (" + opt.scenario + ", then " + a + ")");
    }
  }
  if (!opt.screenshot.empty() && opt.screenshot.size() < 5) return usage_error("--screenshot needs a .png file name");

  // the script is read before any window opens: a bad line stops here
  std::vector<fpui::Action> script;
  if (!opt.script.empty()) {
    try {
      script = fpui::load_script(opt.script);
    } catch (const fpui::ScriptError& e) {
      std::cerr << "error: " << e.message << "\n";
      return 2;
    }
  }

  sf::ContextSettings cs;
  cs.depthBits = 0;
  cs.stencilBits = 0;
  cs.antialiasingLevel = 0;
  sf::RenderWindow window(sf::VideoMode(opt.width, opt.height), "floatpitch-view", sf::Style::Default, cs);
  if (!window.isOpen()) {
    std::cerr << "error: no window could be opened (is there a display?)\n";
    return 1;
  }
  window.setPosition({0, 0});
  const bool headless = opt.frames >= 0;
  if (!headless) window.setFramerateLimit(60);
  window.setActive(true);

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

  int status = 0;
  {
    fpui::App app(opt, std::move(script), fonts);
    if (!app.fatal().empty()) {
      std::cerr << "error: " << app.fatal() << "\n";
      status = 2;
    }
    std::vector<double> frame_ms;
    sf::Clock clock;
    using steady = std::chrono::steady_clock;
    int frame = 0;
    while (status == 0 && window.isOpen()) {
      const auto t0 = steady::now();
      sf::Event e;
      while (window.pollEvent(e)) {
        if (e.type == sf::Event::Closed) window.close();
        else if (e.type == sf::Event::Resized)
          window.setView(sf::View(sf::FloatRect(0, 0, static_cast<float>(e.size.width), static_cast<float>(e.size.height))));
        bridge.process_event(e);
      }
      if (!window.isOpen()) break;
      const float dt = clock.restart().asSeconds();
      bridge.new_frame(window.getSize(), dt);
      if (float mx, my; app.scripted_mouse(mx, my)) io.MousePos = ImVec2(mx, my);
      ImGui_ImplOpenGL3_NewFrame();
      ImGui::NewFrame();
      app.frame(dt);
      ImGui::Render();
      if (!app.fatal().empty()) {
        std::cerr << "error: " << app.fatal() << "\n";
        status = 2;
        break;
      }

      window.clear(sf::Color(fpui::kPaperRGB[0], fpui::kPaperRGB[1], fpui::kPaperRGB[2]));
      window.resetGLStates();
      app.draw_sfml(window);
      window.resetGLStates();
      ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
      bridge.end_frame();

      const bool last = headless && frame + 1 >= opt.frames;
      const std::string asked = app.take_screenshot_request();
      if (!asked.empty()) app.report(save_png(window, asked) ? "screenshot " + asked : "screenshot not written: " + asked);
      if (last && !opt.screenshot.empty() && !save_png(window, opt.screenshot)) {
        std::cerr << "error: the screenshot could not be written to " << opt.screenshot << "\n";
        status = 1;
      }
      if (!opt.frame_log.empty()) glFinish();  // count the rendering, not just its submission
      window.display();
      frame_ms.push_back(std::chrono::duration<double, std::milli>(steady::now() - t0).count());
      ++frame;
      if (last) break;
    }

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
    if (!opt.frame_log.empty()) {
      std::ofstream out(opt.frame_log);
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
  }
  ImGui_ImplOpenGL3_Shutdown();
  ImGui::DestroyContext();
  if (window.isOpen()) window.close();
  return status;
}
