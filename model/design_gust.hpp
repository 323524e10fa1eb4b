// design_gust.hpp — the classical design-gust amplitudes and the load factor they imply.
//
// These are certification design conventions, not a forecast of the air an airplane will meet.
// Velocities in the rules are EQUIVALENT airspeeds (EAS); the simulation flies in true air, so
// a rule's gust is applied as U_true = U_EAS sqrt(rho0 / rho).
//
// 1. Derived gust velocity with the gust alleviation factor (the classic light-airplane rule):
//    14 CFR 23.341(c) as it stood before amendment 23-64, and CS 23.341 (amendment 4):
//        mu_g = 2 (W/S) / (rho c a g),   K_g = 0.88 mu_g / (5.3 + mu_g),
//        n = 1 + K_g rho0 V_e a U_de / (2 W/S)         (SI form, V_e and U_de as EAS),
//    with U_de = 50 ft/s at V_C and 25 ft/s at V_D from sea level to 20000 ft (23.333(c)).
//    K_g comes from Pratt and Walker, NACA Report 1206 (1954) [from memory]: it stands for the
//    plunge of the airplane AND the lag of unsteady lift in a 1-cosine gust 25 chords long
//    (gradient distance 12.5 c, from memory), which is why a rule gust defaults to H = 12.5 c.
// 2. The gradient-distance family of the transport rules (14 CFR 25.341(a)):
//        U_ds = U_ref F_g (H / 350 ft)^(1/6),   H from 30 to 350 ft,
//    U_ref = 56 ft/s EAS at sea level falling linearly to 44 ft/s at 15000 ft (from memory),
//    F_g the flight profile alleviation factor (1 = none). A transport-category convention,
//    offered as a choice for light airplanes, not a light-airplane requirement.
#pragma once

namespace fp {

struct GustLoadEstimate {
  double mu_g = 0;     // airplane mass ratio 2 (W/S) / (rho c a g) [-]
  double K_g = 0;      // gust alleviation factor 0.88 mu_g / (5.3 + mu_g) [-]
  double delta_n = 0;  // load-factor increment K_g rho0 V_e a U_de / (2 W/S) [-]
};

// wing_loading W/S [N/m^2], mac c [m], lift_slope a of the whole airplane [1/rad], rho the
// air density at altitude [kg/m^3], V_e and U_de equivalent airspeeds [m/s].
GustLoadEstimate derived_gust_load(double wing_loading, double mac, double lift_slope, double rho, double V_e,
                                   double U_de);

// U_de of 23.333(c) [m/s EAS] at V_C (at_vd = false) or V_D; NaN above 20000 ft (the values
// above that height are not given here).
double derived_gust_velocity(bool at_vd, double altitude);

// Quasi-steady sharp-edged gust, before the airplane moves: delta n = rho V U a / (2 W/S)
// (true airspeeds; the same as rho0 V_e U_e a / (2 W/S)).
double sharp_edged_gust_load(double wing_loading, double lift_slope, double rho, double V, double U);

// (H / 350 ft)^(1/6).
double gradient_distance_factor(double H);
// U_ref of the gradient-distance family [m/s EAS]; NaN above 15000 ft.
double gradient_reference_velocity(double altitude);

// Equivalent to true airspeed at density rho.
double eas_to_tas(double v_eas, double rho);

}  // namespace fp
