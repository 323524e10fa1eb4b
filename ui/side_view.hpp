// side_view.hpp — the side view of the airplane, drawn with SFML: fuselage, wing, fin,
// stabiliser, elevator and tab deflected (the deflections exaggerated by a stated factor),
// pitch attitude against the horizon, the flight-path direction, gust arrows at the wing and
// the tail, and a bar of the mean aerodynamic chord with the CG, the CG envelope, and the
// neutral and maneuver points. The held and the free airplane are drawn side by side or
// superposed.
//
// Only the positions that the scenario gives are to scale (wing MAC and its aerodynamic centre,
// tail aerodynamic centre, hinge line, elevator chord, their heights relative to the CG); the
// fuselage outline, the fin and the stabiliser's fixed chord are a generic schematic sized from
// those positions.
#pragma once

#include <string>

#include <SFML/Graphics/Font.hpp>
#include <SFML/Graphics/Rect.hpp>
#include <SFML/Graphics/RenderTarget.hpp>

#include "model/airplane.hpp"

namespace fpui {

// What one airplane is doing at the moment shown (SI, radians).
struct Pose {
  double theta = 0, alpha = 0;       // attitude and angle of attack
  double de = 0, tab = 0;            // elevator, total tab (TE down +)
  double gust_w_wing = 0, gust_w_tail = 0;  // up + [m/s]
  double gust_u_wing = 0, gust_u_tail = 0;  // along the flight direction + [m/s]
  std::string state;                 // e.g. "hands off", "held", "departed at 12.3 s"
};

// Marks of the MAC bar (fractions of the MAC aft of its leading edge).
struct MacMarks {
  double cg = 0.25;
  double envelope_forward = 0.15, envelope_aft = 0.35;
  bool have_points = false;          // neutral and maneuver points available
  double np_fixed = 0, np_free = 0, np_apparent = 0, mp_fixed = 0, mp_free = 0;  // NaN: not marked
  std::string missing;               // why they are not available
  std::string note;                  // a remark shown with the marks (e.g. "the elevator cannot float: held case only")
};

class SideView {
 public:
  SideView();
  bool has_font() const { return font_ok_; }

  // Draw inside `area` (window pixels). `free` may be null (irreversible circuit).
  void draw(sf::RenderTarget& target, const sf::FloatRect& area, const fp::Airplane& ap, const Pose* held,
            const Pose* free, bool superposed, double exaggeration, const MacMarks& marks);

 private:
  sf::Font font_;
  bool font_ok_ = false;
};

// The TrueType font the window uses (DejaVu Sans), or "" when none of the usual places has it.
std::string find_font_file(bool bold = false);

}  // namespace fpui
