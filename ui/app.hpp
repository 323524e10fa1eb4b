// app.hpp — the window's interface, rebuilt every frame from the session and a few view
// settings: toolbar, the scenario/edit/inputs/analysis panel, the side view, the complex plane
// of the modes with the CG slider, the time plots, and the status line with the cautions.
// The class is defined over several files: app.cpp (the frame and the files), app_actions.cpp
// (time, script actions, keys) and one panel_*.cpp a panel; they share this state.
//
// Time: with a person at the window the simulated time follows the wall clock times the speed
// factor; in scripted or headless use (a script or a frame count given) every frame advances
// exactly 1/60 s times the speed factor, so a run is the same whatever the frame rate. The
// simulations sample their outputs on the scenario's fixed output step either way.
#pragma once

#include <array>
#include <filesystem>
#include <map>
#include <string>
#include <vector>

#include <SFML/Graphics/Rect.hpp>
#include <SFML/Graphics/RenderTarget.hpp>

#include "scenario/key_info.hpp"
#include "util/caution.hpp"
#include "ui/options.hpp"
#include "ui/plot.hpp"
#include "ui/script.hpp"
#include "ui/session.hpp"
#include "ui/side_view.hpp"
#include "ui/theme.hpp"

namespace fpui {

inline constexpr const char* kCautions = fp::kCaution;

// The live gust's choices (Inputs panel, toolbar tooltip).
inline constexpr const char* kGustShapes[] = {"1-cosine", "sharp edge", "ramp"};
inline constexpr const char* kGustComponents[] = {"vertical (up +)", "horizontal (tail +)"};

class App {
 public:
  App(Options o, std::vector<Action> script, Fonts fonts);

  // One frame: advance the simulations, then build the ImGui windows (between NewFrame and Render).
  void frame(float wall_dt);
  // The SFML part (the side view), drawn before ImGui's draw data.
  void draw_sfml(sf::RenderTarget& target);

  // A screenshot asked for in the window this frame ("" when none); cleared by the call.
  std::string take_screenshot_request();
  void report(const std::string& message) { message_ = message; }
  // A refused script action: the program stops with status 2 and this message.
  const std::string& fatal() const { return fatal_; }
  // Where each time plot was drawn in the last frame, with its ranges (for the tests).
  std::string layout_text() const;
  // Write the run's files (CSVs, scenario, actions) to `dir`; returns the error or "".
  std::string export_run(const std::string& dir);
  const Session& session() const { return ses_; }
  // A mouse position a script asked for (window pixels), applied before the next frame.
  bool scripted_mouse(float& x, float& y) const {
    x = mouse_x_;
    y = mouse_y_;
    return mouse_scripted_;
  }

 private:
  // app.cpp: files
  void open(const std::string& path);
  void remember_recent(const std::string& path);

  // app_actions.cpp: time, script actions, keys, and the commands that buttons and keys share
  void advance(float wall_dt);
  bool run_action(const Action& a);  // true when the simulations were restarted
  void handle_keys();
  void toggle_hold();
  void gust_now();
  void save_scenario();
  void export_now();
  void request_screenshot();
  void follow_live_end();

  // panel_toolbar.cpp
  void toolbar(const ImVec2& pos, const ImVec2& size);
  void toolbar_states(float last_x, float width);
  // panel_left.cpp: the tabs of the left panel
  void left_panel(const ImVec2& pos, const ImVec2& size);
  // panel_scenario.cpp
  void tab_scenario();
  void scenario_files();
  void scenario_summary();
  // panel_edit.cpp
  void tab_edit();
  void edit_choices();
  void key_tables();
  void key_row(const fp::KeyInfo& k);
  // panel_inputs.cpp
  void tab_inputs();
  // panel_analysis.cpp
  void tab_analysis();
  // panel_side_view.cpp (and draw_sfml above)
  void update_side_view_state();
  void side_panel(const ImVec2& pos, const ImVec2& size);
  void mac_tooltip();
  // panel_modes.cpp: the complex plane of the modes, the CG slider, the warnings
  struct RootsExtent {             // what the view fits
    double xlo = -0.1, xhi = 0.1, ymax = 0.1;
  };
  void modes_panel(const ImVec2& pos, const ImVec2& size);
  void cg_slider(float panel_width);
  void stability_lines();
  RootsExtent collect_roots();
  void roots_fit_choice();
  void roots_plane(const RootsExtent& extent);
  // panel_time_plots.cpp
  void plots_panel(const ImVec2& pos, const ImVec2& size);
  void time_plots_legend();
  std::vector<RefLine> event_marks() const;
  // panel_status.cpp
  void status_line(const ImVec2& pos, const ImVec2& size);
  float message_width() const;  // room the last message takes at the right of the status line

  Options opt_;
  std::vector<Action> script_;
  std::size_t next_action_ = 0;
  Fonts f_;
  Session ses_;
  SideView side_view_;

  // run and view settings
  bool running_ = true;
  bool step_request_ = false;
  double speed_ = 1.0;
  double span_ = 20.0;            // seconds of history in the time plots
  bool superposed_ = false;
  double exaggeration_ = 3.0;
  // live inputs
  int gust_shape_ = 0;            // 1-cosine, sharp edge, ramp
  int gust_component_ = 0;        // vertical, horizontal
  double gust_amplitude_ = 6.0;   // [m/s]
  double gust_length_ = 25.0;     // [m]
  double tab_step_deg_ = 0.5;
  double pulse_force_ = 40.0;     // [N]
  double pulse_duration_ = 0.5;   // [s]
  // files
  std::string path_field_, save_field_, export_dir_ = "floatpitch-view-out";
  std::vector<std::string> recent_;
  std::string scenarios_dir_;
  std::string listed_dir_;                       // the folder listing, refreshed now and then
  std::vector<std::filesystem::path> listed_files_;
  int list_refresh_frame_ = 0;
  // messages
  std::string message_, edit_error_, edit_ok_, fatal_;
  std::string screenshot_request_;
  int screenshot_count_ = 0;
  // plots
  AxisRange time_x_;
  std::array<AxisRange, 9> plot_y_{};
  Cursor time_cursor_;
  AxisRange modes_x_, modes_y_;
  int roots_fit_ = 0;             // complex plane fitted to: 0 airframe modes, 1 all roots, 2 slow roots
  bool roots_refit_ = true;
  bool roots_user_zoomed_ = false;
  int roots_generation_ = -1;
  struct RootSets {               // the complex plane's points, rebuilt each frame
    std::vector<double> lhx, lhy, lht, lfx, lfy, lft, chx, chy, cfx, cfy;
    void clear() {
      for (auto* v : {&lhx, &lhy, &lht, &lfx, &lfy, &lft, &chx, &chy, &cfx, &cfy}) v->clear();
    }
  } roots_;
  int left_tab_request_ = -1;
  bool mouse_scripted_ = false;
  float mouse_x_ = 0, mouse_y_ = 0;
  std::vector<std::pair<std::string, PlotGeometry>> geometry_;
  // CG slider
  float cg_slider_ = 0.25f;
  // the edit panel: values being typed, by key
  std::map<std::string, double> editing_;
  std::string filter_;
  // side view
  sf::FloatRect side_rect_;
  Pose held_pose_, free_pose_;
  MacMarks marks_;
};

}  // namespace fpui
