// test_window_core.cpp — the parts of the window that need no display: the action-script
// format, the session (two airplanes from one trim, refused edits, live inputs, exports) and
// the plot widget's tick and reduction arithmetic.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "model/units.hpp"
#include "scenario/scenario.hpp"
#include "ui/plot.hpp"
#include "ui/script.hpp"
#include "ui/session.hpp"

using namespace fpui;
namespace u = fp::units;

namespace {
const std::string kGustCase = std::string(FP_SOURCE_DIR) + "/scenarios/orvane_gust.toml";

std::string error_of(const std::string& text) {
  try {
    parse_script(text, "s.fps");
  } catch (const ScriptError& e) {
    return e.message;
  }
  return "";
}
}  // namespace

TEST_CASE("script: every action reads into SI values") {
  const auto a = parse_script(
      "# demo\n"
      "at 0 cg 0.31\n"
      "\n"
      "at 0.5 gust 1-cosine 20 ft/s 82 ft\n"
      "at 1 gust ramp -3 kt 40 m horizontal\n"
      "at 1.5 tab -2.5 deg   # nose up\n"
      "at 2 pulse 9 lbf 0.5 s\n"
      "at 2 let_go\n"
      "at 3 take_hold\n"
      "at 3 set elevator.ch_alpha -0.2\n"
      "at 4 speed 2\n"
      "at 4 jump 10\n"
      "at 4 span 30\n"
      "at 4 view superposed\n"
      "at 4 exaggeration 5\n"
      "at 5 reset\n"
      "at 9 pause\n",
      "demo.fps");
  REQUIRE(a.size() == 15);
  CHECK(a[0].kind == ActionKind::cg);
  CHECK(a[0].value == doctest::Approx(0.31));
  CHECK(a[0].line == 2);
  CHECK(a[1].kind == ActionKind::gust);
  CHECK(a[1].gust.shape == fp::GustShape::one_minus_cosine);
  CHECK(a[1].gust.component == fp::GustComponent::vertical);
  CHECK(a[1].gust.amplitude == doctest::Approx(20 * u::ft));
  CHECK(a[1].gust.length == doctest::Approx(82 * u::ft));
  CHECK(a[1].line == 4);
  CHECK(a[2].gust.shape == fp::GustShape::ramp);
  CHECK(a[2].gust.component == fp::GustComponent::horizontal);
  CHECK(a[2].gust.amplitude == doctest::Approx(-3 * u::kt));
  CHECK(a[3].kind == ActionKind::tab);
  CHECK(a[3].value == doctest::Approx(-2.5 * u::deg));
  CHECK(a[4].kind == ActionKind::pulse);
  CHECK(a[4].value == doctest::Approx(9 * u::lbf));
  CHECK(a[4].duration == doctest::Approx(0.5));
  CHECK(a[5].kind == ActionKind::let_go);
  CHECK(a[6].kind == ActionKind::take_hold);
  CHECK(a[7].kind == ActionKind::set);
  CHECK(a[7].key == "elevator.ch_alpha");
  CHECK(a[7].value == doctest::Approx(-0.2));
  CHECK(a[8].value == doctest::Approx(2.0));
  CHECK(a[9].kind == ActionKind::jump);
  CHECK(a[11].superposed);
  CHECK(a[13].kind == ActionKind::reset);
  CHECK(a[14].kind == ActionKind::pause);
  CHECK(a[14].time == doctest::Approx(9.0));
}

TEST_CASE("script: a bad line names the file and the line") {
  SUBCASE("no 'at'") { CHECK(error_of("\n  let_go\n").rfind("s.fps:2: a line starts with \"at <time>\"", 0) == 0); }
  SUBCASE("time not a number") { CHECK(error_of("at soon let_go").rfind("s.fps:1: expected the time", 0) == 0); }
  SUBCASE("negative time") { CHECK(error_of("at -1 let_go").rfind("s.fps:1: the time must not be negative", 0) == 0); }
  SUBCASE("decreasing time") { CHECK(error_of("at 2 let_go\nat 1 take_hold").rfind("s.fps:2: times must not decrease", 0) == 0); }
  SUBCASE("unknown action") { CHECK(error_of("at 1 letgo").rfind("s.fps:1: unknown action \"letgo\"", 0) == 0); }
  SUBCASE("unknown shape") { CHECK(error_of("at 1 gust square 5 m/s 30 m").rfind("s.fps:1: unknown gust shape", 0) == 0); }
  SUBCASE("unit of another dimension") {
    CHECK(error_of("at 1 gust 1-cosine 5 m 30 m").rfind("s.fps:1: \"m\" is not a unit of speed", 0) == 0);
  }
  SUBCASE("missing unit") { CHECK(error_of("at 1 tab 3").rfind("s.fps:1: missing the unit of the tab angle", 0) == 0); }
  SUBCASE("words left over") { CHECK(error_of("at 1 let_go now").rfind("s.fps:1: unexpected \"now\"", 0) == 0); }
  SUBCASE("zero gust length") { CHECK(error_of("at 1 gust ramp 5 m/s 0 m").rfind("s.fps:1: the gust length", 0) == 0); }
  SUBCASE("speed out of range") { CHECK(error_of("at 0 speed 100").rfind("s.fps:1: the speed factor", 0) == 0); }
  SUBCASE("a value that overflows in SI units") {  // found by tests/fuzz/fuzz_script.cpp
    CHECK(error_of("at 0 pulse 1e308 lbf 1 s").rfind("s.fps:1: the pilot force is out of range", 0) == 0);
  }
  SUBCASE("a pixel position beyond float's range") {  // found by tests/fuzz/fuzz_script.cpp
    CHECK(error_of("at 0 hover 1e300 40").rfind("s.fps:1: hover takes pixel positions", 0) == 0);
  }
  SUBCASE("missing file") {
    std::string msg;
    try {
      load_script("/nonexistent/x.fps");
    } catch (const ScriptError& e) {
      msg = e.message;
    }
    CHECK(msg == "/nonexistent/x.fps: cannot be read");
  }
}

TEST_CASE("script: the session log reads back to the same actions") {
  Action g;
  g.time = 2.5;
  g.kind = ActionKind::gust;
  g.gust.shape = fp::GustShape::sharp_edge;
  g.gust.amplitude = 4.25;
  g.gust.length = 12.0;
  g.gust.component = fp::GustComponent::horizontal;
  Action p;
  p.time = 3.0;
  p.kind = ActionKind::pulse;
  p.value = -35.0;
  p.duration = 0.75;
  Action t;
  t.time = 3.5;
  t.kind = ActionKind::tab;
  t.value = -0.05;
  const auto back = parse_script(action_line(g) + "\n" + action_line(p) + "\n" + action_line(t) + "\n", "log");
  REQUIRE(back.size() == 3);
  CHECK(back[0].gust.shape == fp::GustShape::sharp_edge);
  CHECK(back[0].gust.component == fp::GustComponent::horizontal);
  CHECK(back[0].gust.amplitude == doctest::Approx(4.25));
  CHECK(back[0].gust.length == doctest::Approx(12.0));
  CHECK(back[1].value == doctest::Approx(-35.0));
  CHECK(back[1].duration == doctest::Approx(0.75));
  CHECK(back[2].value == doctest::Approx(-0.05).epsilon(1e-5));
  // a legal but huge time (found by tests/fuzz/fuzz_script.cpp: "%.3f" of it did not fit the
  // line buffer, and the log could not be read back) comes back as the same time
  Action late;
  late.time = 3.3e75;
  late.kind = ActionKind::let_go;
  const auto far = parse_script(action_line(late) + "\n", "log");
  REQUIRE(far.size() == 1);
  CHECK(far[0].kind == ActionKind::let_go);
  CHECK(far[0].time == doctest::Approx(3.3e75).epsilon(1e-6));
}

TEST_CASE("plot: ticks are round and cover the range") {
  double step = 0;
  auto t = nice_ticks(0.0, 10.0, 5, &step);
  CHECK(step == doctest::Approx(2.0));
  REQUIRE(t.size() == 6);
  CHECK(t.front() == 0.0);
  CHECK(t.back() == doctest::Approx(10.0));
  t = nice_ticks(-0.37, 1.2, 6, &step);
  CHECK(step == doctest::Approx(0.5));
  REQUIRE(t.size() == 3);
  CHECK(t[0] == 0.0);
  CHECK(!std::signbit(t[0]));
  CHECK(t[2] == doctest::Approx(1.0));
  CHECK(nice_ticks(1.0, 1.0, 5).empty());
  CHECK(tick_text(0.25, 0.05) == "0.25");
  CHECK(tick_text(20.0, 5.0) == "20");
  CHECK(tick_text(-1.5, 0.5) == "-1.5");
}

TEST_CASE("plot: the min/max reduction keeps the extremes in order") {
  std::vector<double> x(1000), y(1000);
  for (std::size_t i = 0; i < x.size(); ++i) {
    x[i] = 0.01 * static_cast<double>(i);
    y[i] = std::sin(3.0 * x[i]) + (i == 437 ? 5.0 : 0.0) - (i == 712 ? 4.0 : 0.0);
  }
  const auto idx = reduce_min_max(x.data(), y.data(), 0, x.size(), 0.0, 10.0, 50);
  CHECK(idx.size() <= 2 * 50 + 2);
  CHECK(idx.size() >= 50);
  CHECK(std::is_sorted(idx.begin(), idx.end()));
  CHECK(std::adjacent_find(idx.begin(), idx.end()) == idx.end());
  CHECK(std::find(idx.begin(), idx.end(), 437u) != idx.end());
  CHECK(std::find(idx.begin(), idx.end(), 712u) != idx.end());
  CHECK(idx.front() == 0u);
  CHECK(idx.back() == 999u);
  // with a tolerance, the smooth columns take one point and the spikes still come through
  const auto few = reduce_min_max(x.data(), y.data(), 0, x.size(), 0.0, 10.0, 50, 0.7);
  CHECK(few.size() < idx.size());
  CHECK(std::find(few.begin(), few.end(), 437u) != few.end());
  CHECK(std::find(few.begin(), few.end(), 712u) != few.end());
  CHECK(std::is_sorted(few.begin(), few.end()));
}

TEST_CASE("session: held and free fly the same trim and part after a gust") {
  Session s;
  REQUIRE(s.load(kGustCase) == "");
  REQUIRE(s.has_free());
  s.advance_to(0.5);
  const auto& h = s.held()->trace();
  const auto& f = s.free()->trace();
  REQUIRE(h.size() == f.size());
  // the scenario's own gust starts at 1 s: before it both sit at the same trim
  for (std::size_t i = 0; i < h.size(); ++i) CHECK(h.ch[fp::ch_alpha][i] == doctest::Approx(f.ch[fp::ch_alpha][i]));
  fp::DiscreteGust g;
  g.amplitude = 6.0;
  g.length = 20.0;
  s.gust_now(g);
  s.advance_to(4.0);
  double max_diff = 0;
  for (std::size_t i = 0; i < h.size() && i < f.size(); ++i)
    max_diff = std::max(max_diff, std::abs(h.ch[fp::ch_elevator][i] - f.ch[fp::ch_elevator][i]));
  CHECK(max_diff > 0.2 * u::deg);  // the free elevator floats in the gust, the held one does not move
  REQUIRE(s.live_log().size() == 1);
  CHECK(s.live_log()[0].time == doctest::Approx(0.5));
}

TEST_CASE("session: the output grid does not depend on how the time is sliced") {
  Session a, b;
  REQUIRE(a.load(kGustCase) == "");
  REQUIRE(b.load(kGustCase) == "");
  for (int k = 1; k <= 180; ++k) a.advance_to(k / 60.0);  // frames at 60 Hz
  for (int k = 1; k <= 21; ++k) b.advance_to(std::min(3.0, k / 7.0));  // frames at 7 Hz
  const auto& ta = a.free()->trace();
  const auto& tb = b.free()->trace();
  REQUIRE(ta.size() == tb.size());
  CHECK(ta.size() == 301);
  for (std::size_t i = 0; i < ta.size(); ++i) {
    CHECK(ta.ch[fp::ch_time][i] == tb.ch[fp::ch_time][i]);
    CHECK(ta.ch[fp::ch_alpha][i] == doctest::Approx(tb.ch[fp::ch_alpha][i]).epsilon(1e-9));
  }
}

TEST_CASE("session: a refused edit keeps the last valid state and says what the command line says") {
  Session s;
  REQUIRE(s.load(kGustCase) == "");
  s.advance_to(2.0);
  const double cg = s.scenario().airplane.mass.h_cg;
  // the message the loader's own checks give for the same value
  fp::Scenario copy = s.scenario();
  std::string expected;
  try {
    fp::set_value(copy, "mass.cg", 5.0, "window");
  } catch (const fp::ScenarioError& e) {
    expected = e.what();
  }
  REQUIRE(!expected.empty());
  CHECK(s.set_key("mass.cg", 5.0) == expected);
  CHECK(s.scenario().airplane.mass.h_cg == cg);
  CHECK(s.time() == doctest::Approx(2.0));  // not restarted
  CHECK(s.set_key("wing.no_such_key", 1.0) != "");

  const double alpha0 = s.trim().alpha;
  CHECK(s.set_key("mass.cg", cg + 0.03) == "");
  CHECK(s.scenario().airplane.mass.h_cg == doctest::Approx(cg + 0.03));
  CHECK(s.trim().alpha != alpha0);   // re-trimmed
  CHECK(s.time() == 0.0);            // both restarted
  CHECK(s.held()->trace().size() == 1);
}

TEST_CASE("session: let go, take hold, tab and pulse reach the right airplane") {
  Session s;
  REQUIRE(s.load(kGustCase) == "");
  s.advance_to(0.2);
  const bool held_at_start = s.free_is_held();
  if (held_at_start) s.let_go();
  CHECK_FALSE(s.free_is_held());
  s.take_hold();
  CHECK(s.free_is_held());
  s.let_go();
  CHECK_FALSE(s.free_is_held());
  const double tab0 = s.tab();
  s.set_tab(tab0 + 1.0 * u::deg);
  CHECK(s.tab() == doctest::Approx(tab0 + 1.0 * u::deg));
  CHECK(s.free()->controls().tab == doctest::Approx(tab0 + 1.0 * u::deg));
  s.set_tab(10.0);  // far beyond the stop: clamped to the circuit's range
  CHECK(s.tab() == doctest::Approx(s.scenario().airplane.circuit.tab_max));
  s.pulse(30.0, 0.5);
  CHECK(s.free()->controls().pilot_force == doctest::Approx(30.0));
  CHECK(s.held()->controls().pilot_force == 0.0);
  s.advance_to(1.0);
  CHECK(s.free()->controls().pilot_force == doctest::Approx(0.0));  // the pulse ended
}

TEST_CASE("session: the export holds both runs, the scenario and the live inputs") {
  Session s;
  REQUIRE(s.load(kGustCase) == "");
  s.advance_to(0.3);
  s.let_go();
  s.advance_to(0.5);
  const auto files = s.export_files();
  REQUIRE(files.size() == 4);
  CHECK(files[0].first == "held.csv");
  CHECK(files[0].second.rfind("time [s],", 0) == 0);
  CHECK(files[1].first == "free.csv");
  CHECK(files[2].first == "scenario.toml");
  CHECK(files[3].first == "actions.fps");
  const auto actions = parse_script(files[3].second, "actions.fps");
  REQUIRE(actions.size() == 1);
  CHECK(actions[0].kind == ActionKind::let_go);
  CHECK(actions[0].time == doctest::Approx(0.3));
  // the written scenario reads back and flies the same trim
  const fp::Scenario back = fp::parse_scenario(files[2].second, "back.toml", std::string(FP_SOURCE_DIR) + "/scenarios");
  Session t;
  REQUIRE(t.install(back) == "");
  CHECK(t.trim().alpha == doctest::Approx(s.trim().alpha));
}

// ---------------------------------------------------------------------------------------------
// The event bridge: a click or a key tap that begins and ends within one frame still reaches
// ImGui (the release is held over to the next frame).

#include <imgui.h>

#include "ui/imgui_sfml_bridge.hpp"

namespace {

struct ImGuiFrames {
  ImGuiSfmlBridge* bridge = nullptr;
  ImGuiFrames() {
    ImGui::CreateContext();
    ImGuiIO& io = ImGui::GetIO();
    io.IniFilename = nullptr;
    unsigned char* px = nullptr;
    int w = 0, h = 0;
    io.Fonts->GetTexDataAsRGBA32(&px, &w, &h);  // builds the atlas; no renderer needed
    bridge = new ImGuiSfmlBridge();
  }
  ~ImGuiFrames() {
    delete bridge;
    ImGui::DestroyContext();
  }
  // One frame with these events; `ui` builds the interface and returns what it saw.
  template <class F>
  auto frame(const std::vector<sf::Event>& events, F ui) {
    for (const auto& e : events) bridge->process_event(e);
    bridge->new_frame(sf::Vector2u(400, 300), 1.0f / 60.0f);
    ImGui::NewFrame();
    ImGui::SetNextWindowPos(ImVec2(0, 0));
    ImGui::SetNextWindowSize(ImVec2(400, 300));
    ImGui::Begin("test", nullptr, ImGuiWindowFlags_NoTitleBar);
    auto r = ui();
    ImGui::End();
    ImGui::Render();
    bridge->end_frame();
    return r;
  }
};

sf::Event mouse(sf::Event::EventType t, int x, int y) {
  sf::Event e;
  e.type = t;
  if (t == sf::Event::MouseMoved) {
    e.mouseMove.x = x;
    e.mouseMove.y = y;
  } else {
    e.mouseButton.button = sf::Mouse::Left;
    e.mouseButton.x = x;
    e.mouseButton.y = y;
  }
  return e;
}

sf::Event key(sf::Event::EventType t, sf::Keyboard::Key k) {
  sf::Event e;
  e.type = t;
  e.key.code = k;
  e.key.alt = e.key.control = e.key.shift = e.key.system = false;
  return e;
}

}  // namespace

TEST_CASE("bridge: a click within one frame presses a button") {
  ImGuiFrames f;
  auto button = [] {
    ImGui::SetCursorPos(ImVec2(20, 20));
    return ImGui::Button("go", ImVec2(100, 40));
  };
  f.frame({mouse(sf::Event::MouseMoved, 60, 40)}, button);
  // press and release arrive together
  const auto first = f.frame({mouse(sf::Event::MouseButtonPressed, 60, 40), mouse(sf::Event::MouseButtonReleased, 60, 40)},
                             [&] {
                               const bool down = ImGui::GetIO().MouseDown[0];
                               const bool clicked = button();
                               return std::pair<bool, bool>(down, clicked);
                             });
  CHECK(first.first);  // ImGui saw the button down in that frame
  CHECK_FALSE(first.second);
  const bool clicked = f.frame({}, button);  // the held-over release completes the click
  CHECK(clicked);
  CHECK_FALSE(ImGui::GetIO().MouseDown[0]);
  // a click outside the button does nothing
  f.frame({mouse(sf::Event::MouseButtonPressed, 300, 250), mouse(sf::Event::MouseButtonReleased, 300, 250)}, button);
  CHECK_FALSE(f.frame({}, button));
}

TEST_CASE("bridge: a key tap within one frame is seen as pressed") {
  ImGuiFrames f;
  auto pressed_g = [] { return ImGui::IsKeyPressed(sf::Keyboard::G, false); };
  CHECK_FALSE(f.frame({}, pressed_g));
  CHECK(f.frame({key(sf::Event::KeyPressed, sf::Keyboard::G), key(sf::Event::KeyReleased, sf::Keyboard::G)}, pressed_g));
  CHECK_FALSE(f.frame({}, pressed_g));
  CHECK_FALSE(ImGui::GetIO().KeysDown[sf::Keyboard::G]);
  // text input skips control characters
  sf::Event t;
  t.type = sf::Event::TextEntered;
  t.text.unicode = 'x';
  sf::Event bs = t;
  bs.text.unicode = 8;  // backspace arrives as a key, not as text
  sf::Event del = t;
  del.text.unicode = 127;  // delete likewise
  sf::Event y = t;
  y.text.unicode = 'y';
  // what the frame's widgets see in the character queue (ImGui empties it at the end of every
  // frame, so it is read inside the frame): the printable characters, in order, nothing else
  auto queue = [] {
    std::vector<unsigned> q;
    for (int i = 0; i < ImGui::GetIO().InputQueueCharacters.Size; ++i) q.push_back(ImGui::GetIO().InputQueueCharacters[i]);
    return q;
  };
  CHECK(f.frame({t, bs, del, y}, queue) == std::vector<unsigned>{'x', 'y'});
  CHECK(f.frame({}, queue).empty());  // and the next frame does not see them again
}
