// gust_timing.hpp — when a scenario's gusts and events happen, in one place.
//
// The field is frozen and sampled at X + front_speed t (model/gust.hpp); the CG is at
// X = V cos(gamma) t. A point of the airplane at distance d behind the CG therefore meets the
// field's distance s at t = (s + d) / (V cos(gamma) + front_speed).
#pragma once

#include "scenario/scenario.hpp"

namespace fp {

// The speed at which the airplane moves through the frozen gust field, relative to the field:
// the trim airspeed's horizontal part plus the speed of a gust front moving towards it,
// V cos(gamma) + front_speed [m/s]. The one definition for every consumer (gust start times,
// turbulence record extent, gust timing, plots).
double gust_closing_speed(const Scenario& s);

// The moment the scenario's disturbances are over [s] (0 when it has none):
//  * a 1-cosine gust, when its trailing end (start + 2 H) has passed the tail a.c.;
//  * a train, when the trailing end of its last gust, start + (count - 1) spacing + 2 H, has;
//  * a sharp edge or a ramp never ends: when the tail has passed its rise (0 and H long);
//  * an event, at its time plus its duration (a pulse or an elevator step of some length).
// The let-go of the free case is not counted: it is the start of that case, not a disturbance.
// Used for the window in which damping and growth are read from a response.
double disturbances_over_time(const Scenario& s);

}  // namespace fp
