// run.cpp — the one integration path (see run.hpp).
#include "run/run.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include <boost/math/tools/toms748_solve.hpp>
#include <boost/numeric/odeint.hpp>

#include "model/units.hpp"
#include "run/gust_field.hpp"

namespace fp {

namespace odeint = boost::numeric::odeint;

namespace {

const std::array<ChannelInfo, ch_count> kChannels{{
    {"time", "s", 1.0, "time"},
    {"airspeed", "m/s", 1.0, "airspeed"},
    {"alpha", "deg", 1.0 / units::deg, "angle of attack"},
    {"q", "deg/s", 1.0 / units::deg, "pitch rate"},
    {"theta", "deg", 1.0 / units::deg, "pitch attitude"},
    {"altitude", "m", 1.0, "altitude"},
    {"load_factor", "-", 1.0, "load factor"},
    {"elevator", "deg", 1.0 / units::deg, "elevator (TE down +)"},
    {"elevator_rate", "deg/s", 1.0 / units::deg, "elevator rate"},
    {"tab", "deg", 1.0 / units::deg, "tab (TE down +)"},
    {"stick_force", "N", 1.0, "stick force (pull +)"},
    {"hinge_moment", "N m", 1.0, "aerodynamic hinge moment (TE down +)"},
    {"alpha_tail", "deg", 1.0 / units::deg, "tail angle of attack"},
    {"gust_w_wing", "m/s", 1.0, "vertical gust at wing (up +)"},
    {"gust_w_tail", "m/s", 1.0, "vertical gust at tail (up +)"},
    {"gust_u_wing", "m/s", 1.0, "horizontal gust at wing"},
    {"gust_u_tail", "m/s", 1.0, "horizontal gust at tail"},
    {"hold_force", "N", 1.0, "force to hold the stick where it is (pull +)"},
}};

std::string fmt(const char* f, double a, double b = 0) {
  char buf[200];
  std::snprintf(buf, sizeof buf, f, a, b);
  return buf;
}

}  // namespace

const ChannelInfo& channel_info(std::size_t ch) { return kChannels.at(ch); }

// The stick force that holds the elevator still at its present angle and zero rate: the
// model's own rigid-hold evaluation (dynamics.cpp solves the hinge equation for the pilot's
// hinge moment when the stick is held rigidly), at the same state and time.
double hold_force(const Plant& p, const GustField& gust, double t, const State& x, const Controls& c) {
  Controls h = c;
  h.stick = Stick::held;
  h.hold_de = c.play ? x[sx::ds] : x[sx::de];  // with free play: the stick where it is
  h.pilot_force = 0.0;
  h.friction = FrictionState::off;
  State xs = x;
  if (c.play) xs[sx::ds_dot] = 0.0;
  else xs[sx::de_dot] = 0.0;
  State d{};
  Eval e;
  if (p.ap.circuit.held_stiffness == 0.0) {
    derivatives(p, gust, xs, h, t, d, &e);
  } else {
    Plant rigid = p;  // a compliant hold would read zero force at its own angle: hold rigidly
    rigid.ap.circuit.held_stiffness = 0.0;
    derivatives(rigid, gust, xs, h, t, d, &e);
  }
  return e.stick_force;
}

std::array<double, ch_count> output_row(const Plant& p, const GustField& gust, double t,
                                        const State& x, const Controls& c) {
  State d{};
  Eval e;
  derivatives(p, gust, x, c, t, d, &e);
  std::array<double, ch_count> r{};
  r[ch_time] = t;
  r[ch_airspeed] = e.V;
  r[ch_alpha] = e.alpha;
  r[ch_q] = x[sx::q];
  r[ch_theta] = x[sx::theta];
  r[ch_altitude] = x[sx::h];
  r[ch_load_factor] = e.load_factor;
  r[ch_elevator] = x[sx::de];
  r[ch_elevator_rate] = d[sx::de];
  r[ch_tab] = e.tab;
  r[ch_stick_force] = e.stick_force;
  r[ch_hinge_moment] = e.H_aero;
  r[ch_alpha_tail] = e.alpha_t;
  r[ch_gust_w_wing] = e.gust_wing.w;
  r[ch_gust_w_tail] = e.gust_tail.w;
  r[ch_gust_u_wing] = e.gust_wing.u;
  r[ch_gust_u_tail] = e.gust_tail.u;
  r[ch_hold_force] = c.stick == Stick::held ? e.stick_force : hold_force(p, gust, t, x, c);
  return r;
}

// ---------------------------------------------------------------------------------------------
// Stepper: dense-output Dormand-Prince with a counting system functor.

struct Simulation::Stepper {
  using base = odeint::runge_kutta_dopri5<State>;
  using dense_t = odeint::result_of::make_dense_output<base>::type;
  dense_t dense;
  bool initialised = false;
  Stepper(double atol, double rtol) : dense(odeint::make_dense_output(atol, rtol, base())) {}
};

Simulation::Simulation(std::shared_ptr<const Plant> plant, GustField gust, const Trim& trim,
                       const RunSettings& settings, RunCase rc, std::vector<Event> events)
    : plant_(std::move(plant)), gust_(std::move(gust)), settings_(settings), case_(rc) {
  x_ = trim.x;
  ctl_ = trim.controls;
  V_trim_ = trim.airspeed;
  if (plant_->ap.circuit_nl.free_play > 0.0) start_play(trim);
  bounds_ = departure_bounds(settings_, V_trim_);
  // the free case starts held and lets go at its time (at once when it is 0)
  if (rc.stick == Stick::free) {
    if (rc.let_go_time <= 0.0) {
      ctl_.stick = Stick::free;
      ctl_.pilot_force = 0.0;
    } else {
      pending_.push_back(Event{rc.let_go_time, EventKind::let_go, 0, 0, 0});
    }
  }
  for (const auto& e : events) pending_.push_back(e);
  std::stable_sort(pending_.begin(), pending_.end(),
                   [](const Event& a, const Event& b) { return a.time < b.time; });
  stepper_ = std::make_shared<Stepper>(settings_.abs_tol, settings_.rel_tol);
  // apply events at t = 0 before the first sample
  while (!pending_.empty() && pending_.front().time <= 0.0) {
    const Event e = pending_.front();
    pending_.erase(pending_.begin());
    apply(e);
  }
  settle_friction();
  record(0.0, x_);
  out_index_ = 1;
  next_out_ = settings_.output_step;
}

void Simulation::restart() { stepper_->initialised = false; }

void Simulation::record(double t, const State& x) { trace_.push(output_row(*plant_, gust_, t, x, ctl_)); }

DepartureBounds departure_bounds(const RunSettings& rs, double V_trim) {
  DepartureBounds b;
  b.alpha = rs.alpha_limit;
  b.q = rs.q_limit;
  b.v_min = rs.min_airspeed_ratio * V_trim;
  b.v_max_stated = rs.dive_speed > 0.0;
  b.v_max = b.v_max_stated ? rs.dive_speed : rs.max_airspeed_ratio * V_trim;
  b.theta = rs.theta_limit;
  b.h_floor = rs.floor_altitude;
  b.n_min = rs.load_factor_min;
  b.n_max = rs.load_factor_max;
  return b;
}

RunSettings run_settings(const Scenario& s) {
  RunSettings rs = s.run;
  rs.dive_speed = s.envelope.max_speed;
  return rs;
}

namespace {
constexpr const char* kCriteria[departure_criteria_count] = {
    "angle_of_attack", "pitch_rate", "underspeed", "overspeed", "floor", "pitch_attitude", "load_factor"};
}  // namespace

const char* departure_criterion_name(int k) { return kCriteria[k]; }

double departure_excess(int k, const DepartureBounds& b, const FlightValues& f) {
  switch (k) {
    case 0: return std::abs(f.alpha) - b.alpha;
    case 1: return std::abs(f.q) - b.q;
    case 2: return b.v_min - f.V;
    case 3: return f.V - b.v_max;
    case 4: return b.h_floor - f.h;
    case 5: return std::abs(f.theta) - b.theta;
    default: return std::max(f.n - b.n_max, b.n_min - f.n);
  }
}

std::string departure_reason(int k, const DepartureBounds& b, const FlightValues& f) {
  switch (k) {
    case 0:
      return fmt("angle of attack beyond +-%.1f deg (%.1f deg)", units::to_deg(b.alpha), units::to_deg(f.alpha));
    case 1:
      return fmt("pitch rate beyond +-%.1f deg/s (%.1f deg/s)", units::to_deg(b.q), units::to_deg(f.q));
    case 2:
      return fmt("airspeed below %.2f m/s, run.min_airspeed_ratio times trim (%.2f m/s)", b.v_min, f.V);
    case 3:
      return fmt(b.v_max_stated ? "overspeed: airspeed above envelope.max_speed %.2f m/s (%.2f m/s)"
                                : "overspeed: airspeed above %.2f m/s, run.max_airspeed_ratio times trim (%.2f m/s)",
                 b.v_max, f.V);
    case 4:
      return fmt("altitude below run.floor_altitude %.1f m (%.1f m)", b.h_floor, f.h);
    case 5:
      return fmt("pitch attitude beyond +-%.1f deg (%.1f deg)", units::to_deg(b.theta), units::to_deg(f.theta));
    default:
      return f.n > b.n_max ? fmt("load factor above %.2f (%.2f)", b.n_max, f.n)
                           : fmt("load factor below %.2f (%.2f)", b.n_min, f.n);
  }
}

// The same evaluation as output_row (model/dynamics.cpp derivatives): what the CSV prints.
FlightValues Simulation::flight_values(double t, const State& x) const {
  State d{};
  Eval e;
  derivatives(*plant_, gust_, x, ctl_, t, d, &e);
  return FlightValues{e.V, e.alpha, x[sx::q], x[sx::theta], x[sx::h], e.load_factor};
}

int Simulation::departed_criterion(double t, const State& x) const { return first_beyond(flight_values(t, x)); }

int Simulation::first_beyond(const FlightValues& f) const {
  for (int k = 0; k < departure_criteria_count; ++k)
    if (departure_excess(k, bounds_, f) > 0.0) return k;
  return -1;
}

// Each criterion beyond its bound at t_hi crosses it once between the last clear instant and
// t_hi (the excess is continuous on the dense output, which is a polynomial in t inside the
// step): its crossing is the root of the excess, bracketed, found by TOMS 748 (Alefeld, Potra
// and Shi, ACM TOMS 21, 1995; Boost.Math toms748_solve) to 40 bits. The earliest crossing names
// the departure.
void Simulation::record_departure(double t_hi, const State& x_hi) {
  auto& st = *stepper_;
  const double t_lo = std::min(t_hi, std::max(clear_time_, st.dense.previous_time()));
  const FlightValues f_hi = flight_values(t_hi, x_hi);
  State xs;
  State x_lo;
  st.dense.calc_state(t_lo, x_lo);
  const FlightValues f_lo = flight_values(t_lo, x_lo);
  double t_dep = t_hi;
  int which = -1;
  for (int k = 0; k < departure_criteria_count; ++k) {
    if (departure_excess(k, bounds_, f_hi) <= 0.0) continue;
    double tk = t_lo;  // already beyond at t_lo (an instant not checked, e.g. a restart)
    if (departure_excess(k, bounds_, f_lo) <= 0.0 && t_hi > t_lo) {
      auto g = [&](double t) {
        st.dense.calc_state(t, xs);
        return departure_excess(k, bounds_, flight_values(t, xs));
      };
      std::uintmax_t iters = 100;
      const auto r = boost::math::tools::toms748_solve(g, t_lo, t_hi, boost::math::tools::eps_tolerance<double>(40), iters);
      if (iters >= 100)
        throw NumericalFailure{t_hi, x_hi, std::string("the time the ") + kCriteria[k] +
                                               " bound was crossed was not found in 100 evaluations (TOMS 748)"};
      tk = r.second;
    }
    if (which < 0 || tk < t_dep) {
      which = k;
      t_dep = tk;
    }
  }
  if (which < 0) which = departed_criterion(t_hi, x_hi);
  dep_ = Departure{true, t_dep, kCriteria[which], departure_reason(which, bounds_, f_hi)};
}

void Simulation::apply(const Event& e) {
  const bool is_free_case = case_.stick == Stick::free;
  switch (e.kind) {
    case EventKind::let_go:
      if (is_free_case) {
        ctl_.stick = Stick::free;
        ctl_.pilot_force = 0.0;
      }
      break;
    case EventKind::take_hold:
      if (is_free_case && ctl_.stick == Stick::free) {
        ctl_.stick = Stick::held;
        ctl_.hold_de = ctl_.play ? x_[sx::ds] : x_[sx::de];
        if (plant_->ap.circuit.held_stiffness == 0.0) x_[ctl_.play ? sx::ds_dot : sx::de_dot] = 0.0;
      }
      break;
    case EventKind::tab:
      ctl_.tab = e.value;
      break;
    case EventKind::pulse:
      if (is_free_case && ctl_.stick == Stick::free) {
        ctl_.pilot_force += e.value;
        if (e.duration > 0.0) {
          Event end = e;
          end.time = e.time + e.duration;
          end.value = -e.value;
          end.duration = 0.0;
          end.line = -1;  // marks an end event: always applied while free
          pending_.push_back(end);
          std::stable_sort(pending_.begin(), pending_.end(),
                           [](const Event& a, const Event& b) { return a.time < b.time; });
        }
      } else if (e.line == -1 && ctl_.stick == Stick::free) {
        ctl_.pilot_force += e.value;
      }
      break;
    case EventKind::elevator:
      if (ctl_.stick == Stick::held) {
        ctl_.hold_de += e.value;
        if (plant_->ap.circuit.held_stiffness == 0.0) x_[ctl_.play ? sx::ds : sx::de] = ctl_.hold_de;
        if (e.duration > 0.0) {
          Event end = e;
          end.time = e.time + e.duration;
          end.value = -e.value;
          end.duration = 0.0;
          pending_.push_back(end);
          std::stable_sort(pending_.begin(), pending_.end(),
                           [](const Event& a, const Event& b) { return a.time < b.time; });
        }
      }
      break;
  }
  settle_friction();
  restart();
}

// ---------------------------------------------------------------------------------------------
// Stiction (model/circuit.hpp): phases and their switches, located on the dense output.

namespace {
bool stiction_phase(FrictionState f) {
  return f == FrictionState::stuck || f == FrictionState::slip_up || f == FrictionState::slip_down;
}
}  // namespace

// Free play: the stick side starts where the contact carries the trim's hinge moment to the
// elevator at rest, C = -(H_aero + stops + S_e cos(delta_e) g0) (steady flight at 1 g: the
// elevator's own balance), so the elevator starts at its trimmed angle; held, the hand holds the
// stick side there.
void Simulation::start_play(const Trim& trim) {
  const Airplane& ap = plant_->ap;
  ctl_.play = true;
  const double de = x_[sx::de];
  const double C = -(trim.eval.H_aero + stop_moment(ap, de, 0.0) + ap.elevator.mass_moment * std::cos(de) * units::g0);
  x_[sx::ds] = de - play_offset(C, ap.circuit_nl.free_play, ap.circuit.stop_stiffness);
  x_[sx::ds_dot] = 0.0;
  ctl_.hold_de = x_[sx::ds];
}

void Simulation::settle_friction() {
  const Airplane& ap = plant_->ap;
  const bool rigid = ctl_.stick == Stick::held && ap.circuit.held_stiffness == 0.0;
  if (rigid || ap.circuit.friction <= 0.0) {
    ctl_.friction = FrictionState::off;
    return;
  }
  if (ap.circuit_nl.friction_law == FrictionLaw::smooth) {
    ctl_.friction = FrictionState::smooth;
    return;
  }
  const double ded = x_[rate_index()];
  const bool slipping_on = (ctl_.friction == FrictionState::slip_up && ded > 0.0) ||
                           (ctl_.friction == FrictionState::slip_down && ded < 0.0);
  if (slipping_on) return;
  if (ded != 0.0 && !stiction_phase(ctl_.friction)) {  // from another law or state: slip as it moves
    ctl_.friction = ded > 0.0 ? FrictionState::slip_up : FrictionState::slip_down;
    return;
  }
  decide_at_rest();
}

// At rest relative to the airframe: stuck when the moment that holds the elevator there is
// within the breakout moment F_b/G, else slipping against that moment.
void Simulation::decide_at_rest() {
  const Airplane& ap = plant_->ap;
  x_[rate_index()] = 0.0;
  Controls c = ctl_;
  c.friction = FrictionState::stuck;
  State d{};
  Eval e;
  derivatives(*plant_, gust_, x_, c, t_, d, &e);
  const double Hb = ap.circuit.friction / ap.circuit.gearing;
  if (std::abs(e.H_friction) <= Hb) ctl_.friction = FrictionState::stuck;
  else ctl_.friction = e.H_friction > 0.0 ? FrictionState::slip_down : FrictionState::slip_up;
}

// Positive while the present phase holds: slipping, the rate in the slip's direction; stuck,
// the breakout moment less the moment needed to hold.
double Simulation::friction_switch(double t, const State& x) const {
  switch (ctl_.friction) {
    case FrictionState::slip_up: return x[rate_index()];
    case FrictionState::slip_down: return -x[rate_index()];
    case FrictionState::stuck: {
      State d{};
      Eval e;
      derivatives(*plant_, gust_, x, ctl_, t, d, &e);
      return plant_->ap.circuit.friction / plant_->ap.circuit.gearing - std::abs(e.H_friction);
    }
    default: return 1.0;
  }
}

// The first instant in the stepper's last step, up to `upto`, where the present phase ends:
// the switching function's sign change bracketed on the dense output (a polynomial in t inside
// the step) and refined with TOMS 748 (Alefeld, Potra and Shi 1995) to 50 bits.
bool Simulation::locate_friction_switch(double upto, double& t_ev, State& x_ev) {
  if (!stiction_phase(ctl_.friction)) return false;
  auto& st = *stepper_;
  const double t1 = std::min(upto, st.dense.current_time());
  double t0 = std::max(st.dense.previous_time(), t_);
  if (!(t1 > t0)) return false;
  State xs;
  auto g = [&](double t) {
    st.dense.calc_state(t, xs);
    return friction_switch(t, xs);
  };
  const double g1 = g(t1);
  if (g1 > 0.0) return false;
  if (!(g(t0) > 0.0)) {
    // the phase began on its boundary at t0 (a slip from rest): the first instant where it holds
    bool found = false;
    for (int k = 1; k < 64 && !found; ++k) {
      const double tk = t0 + (t1 - t0) * k / 64.0;
      if (g(tk) > 0.0) {
        t0 = tk;
        found = true;
      }
    }
    if (!found) {  // it did not hold at all: the switch is at its start
      t_ev = t0;
      st.dense.calc_state(t0, x_ev);
      return true;
    }
  }
  std::uintmax_t iters = 100;
  const auto r = boost::math::tools::toms748_solve(g, t0, t1, boost::math::tools::eps_tolerance<double>(50), iters);
  if (iters >= 100)
    throw NumericalFailure{t1, st.dense.current_state(),
                           "the friction phase switch was not located in 100 evaluations (TOMS 748)"};
  t_ev = r.second;  // the end of the bracket where the phase no longer holds
  st.dense.calc_state(t_ev, x_ev);
  return true;
}

void Simulation::switch_friction(double t_ev, const State& x_ev) {
  if (t_ev <= last_switch_time_ + 1e-12) {
    if (++switches_at_once_ > 20)
      throw NumericalFailure{t_ev, x_ev, "the friction phases switched more than 20 times at one instant"};
  } else {
    switches_at_once_ = 0;
  }
  last_switch_time_ = t_ev;
  ++stats_.friction_switches;
  t_ = t_ev;
  x_ = x_ev;
  if (ctl_.friction == FrictionState::stuck) {
    // breakout: slip against the moment that held it
    State d{};
    Eval e;
    derivatives(*plant_, gust_, x_, ctl_, t_, d, &e);
    ctl_.friction = e.H_friction > 0.0 ? FrictionState::slip_down : FrictionState::slip_up;
    x_[rate_index()] = 0.0;
  } else {
    decide_at_rest();  // the rate reached zero: stuck, or slipping back
  }
  restart();
}

void Simulation::apply_now(const Event& e) {
  Event ev = e;
  ev.time = t_;
  // the stepper may be ahead of t_: bring the state to t_ exactly before changing anything
  if (stepper_->initialised && stepper_->dense.current_time() > t_) stepper_->dense.calc_state(t_, x_);
  apply(ev);
}

void Simulation::add_gust_now(DiscreteGust g) {
  if (stepper_->initialised && stepper_->dense.current_time() > t_) stepper_->dense.calc_state(t_, x_);
  const Plant& p = *plant_;
  const double X_wing = x_[sx::x] + p.rW_x * std::cos(x_[sx::theta]) + p.rW_z * std::sin(x_[sx::theta]);
  g.start += X_wing + gust_.front_speed * t_;
  gust_.gusts.push_back(g);
  restart();
}

bool Simulation::advance_to(double target) {
  if (done_) return false;
  target = std::min(target, settings_.duration);
  auto& st = *stepper_;
  auto sys = [this](const State& x, State& dxdt, double t) {
    ++stats_.derivative_calls;
    derivatives(*plant_, gust_, x, ctl_, t, dxdt, nullptr);
  };
  const double tiny = 1e-12;
  // Sample the output grid inside the stepper's last step, up to `upto`, and check for a
  // departure there and at the step's end (once). Returns false on a departure. The stepper
  // may already be ahead of t_ from an earlier call (a live loop advancing in slices): the grid
  // points of that step up to the new stop are sampled here, so slicing changes nothing.
  auto sample = [&](double upto, double stop) {
    while (true) {
      const double tk = static_cast<double>(out_index_) * settings_.output_step;
      if (tk > upto + tiny || tk > settings_.duration + tiny) break;
      State xk;
      st.dense.calc_state(tk, xk);
      // the row the CSV gets is what the criteria read (one evaluation for both)
      const auto row = output_row(*plant_, gust_, tk, xk, ctl_);
      if (first_beyond(FlightValues{row[ch_airspeed], row[ch_alpha], row[ch_q], row[ch_theta], row[ch_altitude],
                                    row[ch_load_factor]}) >= 0) {
        record_departure(tk, xk);
        trace_.push(row);
        t_ = tk;
        x_ = xk;
        done_ = true;
        return false;
      }
      trace_.push(row);
      clear_time_ = tk;
      ++out_index_;
    }
    // a departure between grid points (a short excursion) counts too
    const double t_after = st.dense.current_time();
    if (t_after <= stop + tiny && t_after > end_checked_) {
      end_checked_ = t_after;
      const State& xs = st.dense.current_state();
      if (departed_criterion(t_after, xs) >= 0) {
        record_departure(t_after, xs);
        t_ = t_after;
        x_ = xs;
        done_ = true;
        return false;
      }
      clear_time_ = t_after;
    }
    return true;
  };
  while (t_ < target - tiny) {
    // the next stop: the target or the next event, whichever comes first
    double stop = target;
    const bool event_next = !pending_.empty() && pending_.front().time <= target + tiny;
    if (event_next) stop = std::max(pending_.front().time, t_);
    if (!st.initialised) {
      const double dt0 = std::min(settings_.output_step, 1e-3);
      st.dense.initialize(x_, t_, dt0);
      st.initialised = true;
      end_checked_ = t_;
    } else if (st.dense.current_time() > t_ + tiny) {
      // the stepper is ahead of t_: first the grid points of its last step up to `stop`
      if (!sample(std::min(st.dense.current_time(), stop), stop)) return false;
    }
    // step until the stepper has passed `stop` (or a friction phase ends)
    bool switched = false;
    while (st.dense.current_time() < stop - tiny) {
      const double t_before = st.dense.current_time();
      try {
        st.dense.do_step(sys);
      } catch (const odeint::step_adjustment_error& ex) {
        throw NumericalFailure{t_before, st.dense.current_state(),
                               std::string("step size could not be adjusted: ") + ex.what()};
      }
      const double t_after = st.dense.current_time();
      const double h = t_after - t_before;
      const State& xs = st.dense.current_state();
      for (double v : xs)
        if (!std::isfinite(v))
          throw NumericalFailure{t_after, xs, "the state became NaN or infinite"};
      if (h < 1e-10)
        throw NumericalFailure{t_after, xs,
                               fmt("the step size collapsed to %.3g s (a very stiff circuit: raise "
                                   "the tolerances or soften the stops)", h)};
      ++stats_.steps;
      stats_.min_step = stats_.steps == 1 ? h : std::min(stats_.min_step, h);
      stats_.max_step = std::max(stats_.max_step, h);
      double t_ev = 0.0;
      State x_ev{};
      if (locate_friction_switch(stop, t_ev, x_ev)) {
        // the grid up to the switch comes from this step; the next phase starts afresh there
        if (!sample(t_ev, t_ev)) return false;
        switch_friction(t_ev, x_ev);
        switched = true;
        break;
      }
      if (!sample(std::min(t_after, stop), stop)) return false;
    }
    if (switched) continue;
    st.dense.calc_state(stop, x_);
    t_ = stop;
    // a stiction phase may end in the part of the last step beyond `stop`, which no later
    // slice would look at: the next slice starts afresh at `stop`
    if (stiction_phase(ctl_.friction) && st.dense.current_time() > stop + tiny) restart();
    if (event_next && std::abs(pending_.front().time - stop) <= tiny + 1e-15 * stop) {
      while (!pending_.empty() && pending_.front().time <= t_ + tiny) {
        const Event e = pending_.front();
        pending_.erase(pending_.begin());
        apply(e);
      }
    }
  }
  if (t_ >= settings_.duration - tiny) done_ = true;
  return !done_;
}

// ---------------------------------------------------------------------------------------------

std::shared_ptr<const Plant> scenario_plant(const Scenario& s) {
  try {
    return std::make_shared<const Plant>(make_plant(s.airplane));
  } catch (const ModelError& e) {
    throw ScenarioError{s.path, 0, 0, e.keys, e.message};
  }
}

Trim scenario_trim(const Plant& p, const Scenario& s) {
  if (s.trim.tab_auto && p.ap.circuit.reversible) return trim_free(p, s.condition);
  return trim_held(p, s.condition, s.trim.tab_auto ? 0.0 : s.trim.tab);
}

Trim scenario_hands_off_trim(const Plant& p, const Scenario& s) {
  if (!p.ap.circuit.reversible || s.trim.tab_auto) return scenario_trim(p, s);
  TrimRequest r;
  r.condition = s.condition;
  r.tab = s.trim.tab;
  r.zero_force = true;
  r.solve_speed = true;
  return trim(p, r);
}

GustField scenario_gust_field(const Scenario& s) {
  GustField g;
  g.gusts = s.gusts;
  g.front_speed = s.gust_front_speed;
  g.turbulence = scenario_turbulence(s);
  return g;
}

namespace {

// The key that sets departure criterion k's bound (for the message when the trim is beyond it).
const char* bound_key(int k, const DepartureBounds& b) {
  constexpr const char* keys[departure_criteria_count] = {"run.alpha_limit", "run.q_limit", "run.min_airspeed_ratio",
                                                          "run.max_airspeed_ratio", "run.floor_altitude",
                                                          "run.theta_limit", "run.load_factor_max"};
  if (k == 3 && b.v_max_stated) return "envelope.max_speed";
  return keys[k];
}

// A run that would depart at its first instant is bad input, not a result: the bound excludes
// the very condition the scenario asks for. Throws ScenarioError naming the key.
void check_trim_within_bounds(const Scenario& s, const Plant& p, const GustField& g, const Trim& t) {
  const RunSettings rs = run_settings(s);
  const DepartureBounds b = departure_bounds(rs, t.airspeed);
  const auto row = output_row(p, g, 0.0, t.x, t.controls);
  const FlightValues f{row[ch_airspeed], row[ch_alpha], row[ch_q], row[ch_theta], row[ch_altitude], row[ch_load_factor]};
  for (int k = 0; k < departure_criteria_count; ++k) {
    if (departure_excess(k, b, f) <= 0.0) continue;
    std::string key = bound_key(k, b);
    if (k == 6 && f.n < b.n_min) key = "run.load_factor_min";
    // where the bound came from: a file's line, an option (--set, --vary), or the default
    ScenarioError e{s.path, 0, 0, key, "the trimmed start is already beyond this departure bound: " +
                                           departure_reason(k, b, f) + "; the bound must leave room for the trim"};
    const auto o = s.origins.find(key);
    if (o == s.origins.end()) {
      e.message += " (the default value)";
    } else {  // as the loader reports a key (scenario.cpp fail)
      e.file = o->second.file;
      e.line = o->second.line;
      e.column = o->second.column;
      if (!o->second.via.empty()) e.message += " (from " + o->second.via + ")";
    }
    throw e;
  }
}

}  // namespace

RunOutcome run_scenario(const Scenario& s, ControlsChoice which) {
  if (!s.airplane.circuit.reversible && which != ControlsChoice::held)
    throw ScenarioError{s.path, 0, 0, "circuit.reversible",
                        "this circuit is irreversible (powered): the elevator cannot float: held case only; "
                        "run with the controls held"};
  auto plant = scenario_plant(s);
  RunOutcome out;
  out.trim = scenario_trim(*plant, s);
  const GustField gust = scenario_gust_field(s);
  check_trim_within_bounds(s, *plant, gust, out.trim);
  const RunSettings rs = run_settings(s);
  auto run_case = [&](Stick stick) {
    auto r = std::make_unique<CaseResult>();
    r->rc = RunCase{stick, s.run.let_go_time};
    Simulation sim(plant, gust, out.trim, rs, r->rc, s.events);
    sim.run_to_end();
    r->trace = sim.trace();
    r->departure = sim.departure();
    r->stats = sim.stats();
    return r;
  };
  if (which != ControlsChoice::free) out.held = run_case(Stick::held);
  if (which != ControlsChoice::held) out.free = run_case(Stick::free);
  return out;
}

}  // namespace fp
