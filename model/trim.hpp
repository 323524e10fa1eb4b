// trim.hpp — steady flight of the full nonlinear model, solved by Newton's method.
//
// Unknowns are chosen among angle of attack, elevator, throttle, tab and airspeed; the
// equations are the steady airframe accelerations (u', w', q' = 0 with theta = alpha + gamma)
// and, for the hands-off cases, zero stick force. A trim that needs the elevator or the tab
// beyond its stop, an angle of attack past the stall, or a throttle outside 0..1 fails with a
// TrimError saying which limit stops it; it never returns a wrong answer. When Newton's method
// does not converge, the last iterate is examined and a nameable cause is named (the condition
// needs more lift than CLmax, the elevator floats to its stop, the tab runs out); only when none
// applies is it TrimLimit::no_convergence, a numerical failure (exit status 3 on the command line).
#pragma once

#include <string>

#include "dynamics.hpp"

namespace fp {

enum class TrimLimit { none, elevator_stop, tab_stop, stall, throttle, no_convergence };

struct TrimError {
  TrimLimit limit;
  std::string message;
};

struct Trim {
  double airspeed = 0;    // true airspeed [m/s]
  double alpha = 0;       // [rad]
  double theta = 0;       // [rad]
  double de = 0;          // elevator [rad]
  double tab = 0;         // tab setting (without the geared part) [rad]
  double throttle = 0;    // [-]
  double stick_force = 0; // force to hold the stick at this trim, pull positive [N]
  double CL = 0;          // airplane lift coefficient (lift / (q S)) [-]
  double altitude = 0;    // [m]
  int iterations = 0;
  State x{};              // the trimmed state (lag states at their steady values)
  Controls controls{};    // held at de with the tab and throttle above
  Eval eval{};            // every quantity at the trimmed point
};

// What is solved for. Airspeed, elevator and tab are either given or unknown.
struct TrimRequest {
  Condition condition;         // altitude, airspeed (initial guess if speed is unknown), gamma
  bool solve_tab = false;      // tab unknown, zero stick force required
  double tab = 0;              // tab when not solved [rad]
  bool solve_speed = false;    // airspeed unknown (hands-off trim speed, or fixed elevator/alpha)
  bool fix_elevator = false;   // elevator given (with solve_speed)
  double elevator = 0;         // [rad]
  bool fix_alpha = false;      // angle of attack given (with solve_speed)
  double alpha = 0;            // [rad]
  bool zero_force = false;     // require zero stick force (hands-off) with the tab given
  double load_factor = 1.0;    // steady pull-up at n g (pitch rate q = (n-1) g / V), 1 = straight
  bool check_limits = true;    // false: return a trim beyond stops/stall (for limit searches)
  bool check_throttle = true;  // false: leave the throttle out of the limits (a steady pull-up
                               // at constant speed may need more thrust than the engine has;
                               // the stick force per g is still defined)
};

// Throws TrimError.
Trim trim(const Plant& p, const TrimRequest& r);

// Convenience: stick-fixed trim at the condition with the tab given.
Trim trim_held(const Plant& p, const Condition& c, double tab);
// Hands-off trim at the condition: the tab for zero stick force.
Trim trim_free(const Plant& p, const Condition& c);

// The angle of attack at which the wing-body lift coefficient peaks, and that peak.
struct StallPoint {
  double alpha = 0;  // [rad]
  double CLmax = 0;  // [-]
};
// Found by a scan of 0..1.2 rad in steps of 0.001 rad and Brent's method around the best point
// (model/roots.hpp); throws SolverFailure if Brent's method does not converge.
StallPoint wing_stall(const LiftCurve& lc);

// The stall speed (true airspeed) at load factor n at an altitude: V_s = sqrt(2 n m g0 /
// (rho S CLmax)) with the wing-body CLmax of wing_stall (the tail's lift left out), m the total
// mass (the lift equation at CLmax; Etkin and Reid sec. 2.2, common practice) [m/s].
double stall_speed(const Airplane& ap, double altitude, double n = 1.0);

}  // namespace fp
