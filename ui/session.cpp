// session.cpp — see session.hpp.
#include "ui/session.hpp"

#include <algorithm>
#include <cmath>

#include "output/outputs.hpp"

namespace fpui {

namespace {

// The messages of the command line (cli/commands.cpp) for the same failures.
std::string trim_message(const fp::Scenario& s, const fp::TrimError& e) { return s.path + ": " + e.message; }

Action action(double t, ActionKind kind, double value = 0.0, double duration = 0.0) {
  Action a;
  a.time = t;
  a.kind = kind;
  a.value = value;
  a.duration = duration;
  return a;
}

std::string failure_message(const fp::NumericalFailure& f) {
  char buf[96];
  std::snprintf(buf, sizeof buf, "numerical failure at t = %.3f s: ", f.time);
  return buf + f.message;
}

}  // namespace

std::string Session::load(const std::string& path) {
  try {
    return install(fp::load_scenario(path));
  } catch (const fp::ScenarioError& e) {
    return e.what();
  }
}

std::string Session::install(const fp::Scenario& s) {
  std::shared_ptr<const fp::Plant> plant;
  fp::Trim trim;
  fp::ModesResult modes;
  try {
    fp::validate(s);
    plant = fp::scenario_plant(s);
    trim = fp::scenario_trim(*plant, s);
    modes = fp::compute_modes(s);
  } catch (const fp::ScenarioError& e) {
    return e.what();
  } catch (const fp::TrimError& e) {
    return trim_message(s, e);
  }
  scenario_ = s;
  plant_ = std::move(plant);
  trim_ = trim;
  gust_ = fp::scenario_gust_field(s);
  modes_ = std::move(modes);
  ++generation_;
  if (defer_margins_) margins_stale_ = true;
  else refresh_margins();
  recompute_locus();
  reset();
  return {};
}

std::string Session::edit(const std::function<void(fp::Scenario&)>& change) {
  if (!loaded()) return "no scenario is open";
  fp::Scenario copy = scenario_;
  try {
    change(copy);
    fp::validate(copy);
  } catch (const fp::ScenarioError& e) {
    return e.what();
  }
  return install(copy);
}

std::string Session::set_key(const std::string& key, double si_value) {
  return edit([&](fp::Scenario& s) { fp::set_value(s, key, si_value, "window"); });
}

void Session::refresh_margins() {
  margins_stale_ = false;
  margins_.reset();
  margins_error_.clear();
  try {
    margins_ = fp::compute_margins(scenario_);
  } catch (const fp::ScenarioError& e) {
    margins_error_ = e.what();
  } catch (const fp::TrimError& e) {
    margins_error_ = trim_message(scenario_, e);
  } catch (const std::exception& e) {
    margins_error_ = e.what();
  }
}

void Session::recompute_locus() {
  const double from = std::max(-0.5, scenario_.envelope.cg_forward - 0.05);
  const double to = std::min(1.5, scenario_.envelope.cg_aft + 0.25);
  fp::Scenario without_cg = scenario_;
  without_cg.airplane.mass.h_cg = 0.0;
  without_cg.path.clear();
  without_cg.origins.clear();
  std::string key = fp::to_toml(without_cg);
  if (key == locus_key_ && from == locus_from_ && to == locus_to_) return;
  locus_key_ = std::move(key);
  locus_from_ = from;
  locus_to_ = to;
  const int points = std::max(2, static_cast<int>(std::round((to - from) / 0.02)) + 1);
  locus_ = fp::cg_root_locus(scenario_, from, to, points);
}

void Session::reset() {
  fp::RunSettings rs = fp::run_settings(scenario_);
  rs.duration = kLiveHorizon;
  held_ = std::make_unique<fp::Simulation>(plant_, gust_, trim_, rs, fp::RunCase{fp::Stick::held, 0.0},
                                           scenario_.events);
  if (scenario_.airplane.circuit.reversible)
    free_ = std::make_unique<fp::Simulation>(plant_, gust_, trim_, rs,
                                             fp::RunCase{fp::Stick::free, scenario_.run.let_go_time},
                                             scenario_.events);
  else
    free_.reset();
  held_failure_.clear();
  free_failure_.clear();
  t_ = 0.0;
  log_.clear();
}

void Session::step_one(std::unique_ptr<fp::Simulation>& sim, std::string& failure, double t) {
  if (!sim || !failure.empty() || sim->finished()) return;
  try {
    sim->advance_to(t);
  } catch (const fp::NumericalFailure& f) {
    failure = failure_message(f);
  }
}

void Session::advance_to(double t) {
  if (!loaded()) return;
  t = std::min(t, kLiveHorizon);
  if (t <= t_) return;
  step_one(held_, held_failure_, t);
  step_one(free_, free_failure_, t);
  t_ = t;
}

void Session::run_all_at_once() {
  if (!loaded()) return;
  reset();
  advance_to(scenario_.run.duration);
}

void Session::log(const Action& a) { log_.push_back(a); }

void Session::gust_now(const fp::DiscreteGust& g) {
  if (!loaded()) return;
  if (!held_->finished() && held_failure_.empty()) held_->add_gust_now(g);
  if (free_ && !free_->finished() && free_failure_.empty()) free_->add_gust_now(g);
  Action a;
  a.time = t_;
  a.kind = ActionKind::gust;
  a.gust = g;
  log_.push_back(a);
}

bool Session::free_is_held() const { return free_ && free_->controls().stick == fp::Stick::held; }

void Session::let_go() {
  if (!free_ || free_->finished() || !free_failure_.empty()) return;
  free_->apply_now(fp::Event{t_, fp::EventKind::let_go, 0.0, 0.0, 0});
  log_.push_back(action(t_, ActionKind::let_go));
}

void Session::take_hold() {
  if (!free_ || free_->finished() || !free_failure_.empty()) return;
  free_->apply_now(fp::Event{t_, fp::EventKind::take_hold, 0.0, 0.0, 0});
  log_.push_back(action(t_, ActionKind::take_hold));
}

double Session::tab() const { return held_ ? held_->controls().tab : 0.0; }

void Session::set_tab(double tab) {
  if (!loaded()) return;
  const auto& c = scenario_.airplane.circuit;
  tab = std::clamp(tab, c.tab_min, c.tab_max);
  const fp::Event e{t_, fp::EventKind::tab, tab, 0.0, 0};
  if (!held_->finished() && held_failure_.empty()) held_->apply_now(e);
  if (free_ && !free_->finished() && free_failure_.empty()) free_->apply_now(e);
  log_.push_back(action(t_, ActionKind::tab, tab));
}

void Session::pulse(double force, double duration) {
  if (!free_ || free_->finished() || !free_failure_.empty()) return;
  free_->apply_now(fp::Event{t_, fp::EventKind::pulse, force, duration, 0});
  log_.push_back(action(t_, ActionKind::pulse, force, duration));
}

std::vector<std::pair<std::string, std::string>> Session::export_files() const {
  std::vector<std::pair<std::string, std::string>> files;
  if (!loaded()) return files;
  files.emplace_back("held.csv", fp::trace_csv(held_->trace()));
  if (free_) files.emplace_back("free.csv", fp::trace_csv(free_->trace()));
  files.emplace_back("scenario.toml", fp::to_toml(scenario_));
  std::string script =
      "# floatpitch-view actions of this run (replay: floatpitch-view scenario.toml --script actions.fps)\n";
  for (const Action& a : log_) script += action_line(a) + "\n";
  files.emplace_back("actions.fps", script);
  return files;
}

}  // namespace fpui
