// run.hpp — time-domain runs: one integration path for every use.
//
// Boost.Odeint's Dormand-Prince 5(4) with error control and dense output steps the model;
// the output is sampled on a fixed grid from the dense output, so the grid does not depend on
// the solver's own steps. Timeline events split the integration at their times (the stepper
// is re-initialised there), never inside a step. A departure of the airplane (one of the
// departure criteria below) is a *result*: the run stops cleanly and records when and why.
// A NaN or a collapse of the step size is a *numerical failure*: NumericalFailure is thrown
// with the time and the state. The two are never confused.
//
// `Simulation` can be advanced in slices (the window's live loop) or run to the end (the
// command line); both paths are the same code.
#pragma once

#include <array>
#include <memory>
#include <string>
#include <vector>

#include "model/dynamics.hpp"
#include "model/trim.hpp"
#include "scenario/scenario.hpp"

namespace fp {

// Output channels, SI inside; `display` converts for CSV, tables and plots.
enum Channel : std::size_t {
  ch_time, ch_airspeed, ch_alpha, ch_q, ch_theta, ch_altitude, ch_load_factor, ch_elevator,
  ch_elevator_rate, ch_tab, ch_stick_force, ch_hinge_moment, ch_alpha_tail, ch_gust_w_wing,
  ch_gust_w_tail, ch_gust_u_wing, ch_gust_u_tail,
  ch_hold_force,  // stick force that would hold the elevator still where it is (free: what the
                  // pilot feels on taking hold again; held: the holding force itself)
  ch_count
};

struct ChannelInfo {
  const char* name;      // CSV header name
  const char* unit;      // display unit
  double display;        // SI value * display = displayed value
  const char* label;     // for plots and tables
};
const ChannelInfo& channel_info(std::size_t ch);

// Time histories on the output grid, one vector a channel, SI.
struct Trace {
  std::array<std::vector<double>, ch_count> ch;
  std::size_t size() const { return ch[ch_time].size(); }
  void push(const std::array<double, ch_count>& row) {
    for (std::size_t i = 0; i < ch_count; ++i) ch[i].push_back(row[i]);
  }
};

struct SolverStats {
  long steps = 0;             // accepted steps
  long derivative_calls = 0;  // calls of the derivative function
  double min_step = 0;        // smallest accepted step [s]
  double max_step = 0;        // largest accepted step [s]
  long friction_switches = 0; // stiction circuit: stuck <-> slipping switches located as events
};

struct NumericalFailure {
  double time;           // [s]
  State state;
  std::string message;
};

// Departure criteria. The run has departed, and stops, the first time one of these holds
// ([run] keys; DEVELOPERS.md "Run verdicts"). Every quantity is the one the CSV prints: the
// air-relative airspeed and angle of attack at the wing-body a.c. and the load factor of the
// model's evaluation (model/dynamics.hpp Eval), the pitch rate, attitude and altitude states.
//   angle_of_attack  |alpha| > run.alpha_limit
//   pitch_rate       |q| > run.q_limit
//   underspeed       V < run.min_airspeed_ratio * V_trim
//   overspeed        V > envelope.max_speed (the design dive speed V_D or V_NE the aircraft file
//                    states, compared with the true airspeed: conservative, since TAS >= EAS
//                    below the tropopause), else V > run.max_airspeed_ratio * V_trim
//   floor            h < run.floor_altitude (0: the flat-Earth model's ground)
//   pitch_attitude   |theta| > run.theta_limit
//   load_factor      n > run.load_factor_max or n < run.load_factor_min
// The time is the earliest crossing among the criteria that hold, found on the dense output
// between the last instant checked clear and the first found beyond (Boost.Math TOMS 748).
struct Departure {
  bool departed = false;
  double time = 0;       // [s]
  std::string criterion; // one of the names above ("" when not departed)
  std::string reason;    // which bound, e.g. "angle of attack beyond +-20.1 deg (20.3 deg)"
};

// The airplane's departure bounds as a run applies them (SI). `V_trim` is the trim airspeed.
struct DepartureBounds {
  double alpha = 0, q = 0, v_min = 0, v_max = 0, theta = 0, h_floor = 0, n_min = 0, n_max = 0;
  bool v_max_stated = false;   // v_max is the aircraft's envelope.max_speed (not a multiple of trim)
};
DepartureBounds departure_bounds(const RunSettings& rs, double V_trim);

// The air data a departure check reads (the CSV's airspeed, angle of attack and load factor).
struct FlightValues {
  double V = 0, alpha = 0, q = 0, theta = 0, h = 0, n = 0;
};
// Signed excess of criterion k (0..criteria_count-1) beyond its bound, in the criterion's unit:
// positive once departed. The load-factor criterion is the larger of its two sides.
inline constexpr int departure_criteria_count = 7;
double departure_excess(int k, const DepartureBounds& b, const FlightValues& f);
const char* departure_criterion_name(int k);
std::string departure_reason(int k, const DepartureBounds& b, const FlightValues& f);

// The scenario's run settings with what the aircraft file adds (envelope.max_speed as the
// overspeed bound). Every run of a scenario should start from these.
RunSettings run_settings(const Scenario& s);

// The case being run: which stick, the trim it starts from.
struct RunCase {
  Stick stick = Stick::held;    // the case's name: held or free (free lets go at let_go_time)
  double let_go_time = 0.0;     // [s]
};

class Simulation {
 public:
  // Start at the trimmed state `trim` with the scenario's settings. The gust field is the
  // scenario's; `events` are applied at their times (those that concern the case).
  Simulation(std::shared_ptr<const Plant> plant, GustField gust, const Trim& trim,
             const RunSettings& settings, RunCase rc, std::vector<Event> events);

  // Integrate up to time t (clamped to the run's duration), sampling the grid. Returns false
  // once the run is over (end reached or departure). Throws NumericalFailure.
  bool advance_to(double t);
  void run_to_end() { advance_to(settings_.duration); }

  // Live changes (the window): applied at the current time, splitting the integration.
  void apply_now(const Event& e);
  void add_gust_now(DiscreteGust g);  // g.start is taken relative to the wing's position now
  void set_duration(double d) { settings_.duration = d; }

  double time() const { return t_; }
  const State& state() const { return x_; }
  const Controls& controls() const { return ctl_; }
  const Trace& trace() const { return trace_; }
  const Departure& departure() const { return dep_; }
  const SolverStats& stats() const { return stats_; }
  const Plant& plant() const { return *plant_; }
  const GustField& gust_field() const { return gust_; }
  bool finished() const { return done_; }

 private:
  struct Stepper;
  void restart();
  void record(double t, const State& x);
  void apply(const Event& e);
  FlightValues flight_values(double t, const State& x) const;
  // The first criterion beyond its bound at (t, x), or -1.
  int departed_criterion(double t, const State& x) const;
  int first_beyond(const FlightValues& f) const;
  // A departure found at t_hi: its time (the earliest crossing after the last instant checked
  // clear) and reason are stored and the run is over.
  void record_departure(double t_hi, const State& x_hi);
  // Stiction (model/circuit.hpp): the friction state for the present state and controls, set
  // at the start and after every event; the switching function of the present phase (positive
  // while the phase holds); and the phase switch located inside the stepper's last step
  // (false when the phase holds through it).
  void start_play(const Trim& trim);
  std::size_t rate_index() const { return ctl_.play ? sx::ds_dot : sx::de_dot; }  // friction acts on this rate
  void settle_friction();
  void decide_at_rest();
  double friction_switch(double t, const State& x) const;
  bool locate_friction_switch(double upto, double& t_ev, State& x_ev);
  void switch_friction(double t_ev, const State& x_ev);

  std::shared_ptr<const Plant> plant_;
  GustField gust_;
  RunSettings settings_;
  RunCase case_;
  double V_trim_ = 0;
  std::vector<Event> pending_;   // future events (including pulse ends), sorted
  State x_{};
  Controls ctl_{};
  double t_ = 0;
  double next_out_ = 0;          // next grid time
  long out_index_ = 0;
  Trace trace_;
  Departure dep_;
  SolverStats stats_;
  bool done_ = false;
  double end_checked_ = -1.0;    // last step end checked for a departure [s]
  double clear_time_ = 0.0;      // last instant checked and found within every bound [s]
  double last_switch_time_ = -1.0;  // time of the last friction switch [s]
  int switches_at_once_ = 0;     // friction switches in a row at the same instant
  DepartureBounds bounds_;
  std::shared_ptr<Stepper> stepper_;
};

// The stick force that would hold the elevator still at its present angle (pull +) [N]: with
// the stick free, the force the pilot feels on taking hold again.
double hold_force(const Plant& p, const GustField& gust, double t, const State& x, const Controls& c);

// One row of outputs at (t, x) with the given controls (used for the grid and for tables).
std::array<double, ch_count> output_row(const Plant& p, const GustField& gust, double t,
                                        const State& x, const Controls& c);

// The results of `floatpitch run`: trim, then held and/or free runs.
struct CaseResult {
  RunCase rc;
  Trace trace;
  Departure departure;
  SolverStats stats;
};

struct RunOutcome {
  Trim trim;                        // the common starting trim (tab per the scenario)
  std::unique_ptr<CaseResult> held; // null when not run
  std::unique_ptr<CaseResult> free;
};

// Trim per the scenario's [trim] settings (throws TrimError).
Trim scenario_trim(const Plant& p, const Scenario& s);
// The hands-off equilibrium of a scenario, about which every stick-free linearisation and the
// stick-free time-domain boundary are taken: the trim itself when the tab is set for zero stick
// force (trim.tab = "auto"); with a fixed tab, the airspeed at which that tab trims hands-off at
// the condition's altitude and flight path (the airplane let go settles there). Throws
// TrimError when the tab trims hands-off nowhere. An irreversible circuit: scenario_trim.
Trim scenario_hands_off_trim(const Plant& p, const Scenario& s);
// The gust field of a scenario (discrete gusts; turbulence where configured).
GustField scenario_gust_field(const Scenario& s);
// Run the scenario's cases (throws TrimError, NumericalFailure, ScenarioError).
RunOutcome run_scenario(const Scenario& s, ControlsChoice which);
// The plant of a scenario (throws ScenarioError naming the keys on a ModelError).
std::shared_ptr<const Plant> scenario_plant(const Scenario& s);

}  // namespace fp
