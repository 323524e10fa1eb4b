// criteria.cpp — the criteria table (see criteria.hpp). The texts below are copied character for
// character from the public copies named beside them (line-end hyphens of the printed page
// joined); a bracketed "[...]" marks where the copy retrieved stops or lost characters. Nothing
// here is written from memory: a section whose text could not be retrieved has no text.
#include "report/criteria.hpp"

#include <algorithm>
#include <cmath>

namespace fp {

namespace {

constexpr const char* kPre64 = "part23-pre64";
constexpr const char* kAmdt64 = "part23-amdt64";
constexpr const char* kCs23 = "cs23-pre5";

constexpr const char* kEcfr2014 = "14 CFR Ch. I (1\u20131\u201314 Edition), Part 23 as in force before amendment 23-64";

const Criterion kTable[] = {
    // ---- 14 CFR Part 23 before amendment 23-64 (prescriptive) ----
    {"14 CFR 23.171", kPre64, CriterionKind::rule, "General (stability)", "14 CFR Part 23 before amendment 23-64",
     "The airplane must be longitudinally, directionally, and laterally stable under \u00a7\u00a723.173 through 23.181. "
     "In addition, the airplane must show suitable stability and control \u201cfeel\u201d (static stability) in any "
     "condition normally encountered in service, if flight tests show it is necessary for safe operation.",
     TextStatus::verbatim, "the amendment line was not part of the copy retrieved",
     "www.risingup.com/fars/info/part23-171-FAR.shtml (Federal Aviation Regulations, Sec. 23.171 \u2014 General)",
     "stability held and free at every corner: static margins and the deciding root"},
    {"14 CFR 23.173", kPre64, CriterionKind::rule, "Static longitudinal stability", "14 CFR Part 23 before amendment 23-64",
     "", TextStatus::not_available,
     "no public copy of the Part 23 text was retrieved (the Part 25 section of the same number was found and is not "
     "substituted); read the section in the basis's own copy",
     "", "the stick-force slope at trim and the free-return band that friction leaves"},
    {"14 CFR 23.175", kPre64, CriterionKind::rule, "Demonstration of static longitudinal stability",
     "14 CFR Part 23 before amendment 23-64 [Doc. No. 27807, 61 FR 5190, Feb. 9, 1996]",
     "Static longitudinal stability must be shown as follows: (a) (1) Flaps retracted; (2) Landing gear retracted; (3) "
     "Maximum continuous power; and (4) The airplane trimmed at the speed used in determining the climb performance "
     "required by \u00a723.69(a). (b) (1) For normal, utility, and acrobatic category airplanes, the stick force curve "
     "must have a stable slope at all speeds within a range that is the greater of 15 percent of the trim speed plus the "
     "resulting free return speed range, or 40 knots plus the resulting free return speed range, above and below the "
     "trim speed, except that the slope need not be stable [...] (c) Landing. The stick force curve must have a stable "
     "slope at speeds between 1.1 VS1 and 1.8 VS1 with\u2014 (1) Flaps in the landing position; (2) "
     "Landing gear extended; and (3) The airplane trimmed at\u2014 (i) VREF, or the minimum trim speed if higher, "
     "with power off; and (ii) VREF with enough power to maintain a 3 degree angle of descent.",
     TextStatus::verbatim_partial,
     "the copy of (a) and (b) lost the lead-in words of (a) and the speed symbols of the exceptions (b)(1)(i)-(iii), "
     "which are left out here ([...]); (b)(2) (commuter category) is left out",
     "(a), (b): www.pilotfriend.com/FARS/6/Sec.%2023.175.htm (Sec. 23.175 - Demonstration of static longitudinal "
     "stability); (c): www.faraim.org.s3-website-us-east-1.amazonaws.com/far/vol1/far-2014-title14-vol1-212.html "
     "(14 CFR Ch. I, 1-1-14 Edition, page 203)",
     "the sign of the stick-force slope at trim at every corner, and over the wider of 15 % of the trim speed and 40 kt "
     "about it at the analysed point (true airspeed, without the free-return extension)"},
    {"14 CFR 23.155", kPre64, CriterionKind::rule, "Elevator control force in maneuvers", kEcfr2014,
     "(a) The elevator control force needed to achieve the positive limit maneuvering load factor may not be less than: "
     "(1) For wheel controls, W/100 (where W is the maximum weight) or 20 pounds, whichever is greater, except that it "
     "need not be greater than 50 pounds; or (2) For stick controls, W/140 (where W is the maximum weight) or 15 pounds, "
     "whichever is greater, except that it need not be greater than 35 pounds. (b) The requirement of paragraph (a) of "
     "this section must be met at 75 percent of maximum continuous power for reciprocating [...]",
     TextStatus::verbatim_partial, "the copy retrieved stops in paragraph (b); the rest of (b) is not shown",
     "www.faraim.org.s3-website-us-east-1.amazonaws.com/far/vol1/far-2014-title14-vol1-209.html (14 CFR Ch. I, "
     "1-1-14 Edition, page 200)",
     "the stick force at envelope.limit_load_factor (per-g slope at trim times n - 1) against (a)(2), stick controls, "
     "W = envelope.mass_max"},
    {"14 CFR 23.181(a)", kPre64, CriterionKind::rule, "Dynamic stability: short-period oscillations",
     "14 CFR Part 23 before amendment 23-64", "", TextStatus::not_available,
     "no public copy of the Part 23 paragraph was retrieved (the Part 25 paragraph of the same number was found and is "
     "not substituted); read it in the basis's own copy",
     "", "short-period damping ratio with the stick held (fixed) and free"},
    {"14 CFR 23.181(d)", kPre64, CriterionKind::rule, "Dynamic stability: sudden release off trim; phugoid",
     "14 CFR Part 23 before amendment 23-64 [Amdt. 23\u201321, 43 FR 2318, Jan. 16, 1978, as amended by Amdt. 23\u201345, 58 "
     "FR 42158, Aug. 6, 1993; Amdt. 23\u201362, 76 FR 75755, Dec. 2, 2011]",
     "[...] least plus and minus 15 percent is suddenly released, the response of the airplane must not exhibit any "
     "dangerous characteristics nor be excessive in relation to the magnitude of the control force released. Any "
     "long-period oscillation of flight path, phugoid oscillation, that results must not be so unstable as to increase "
     "the pilot\u2019s workload or otherwise endanger the airplane.",
     TextStatus::verbatim_partial, "the copy retrieved starts inside paragraph (d); its opening words are not shown",
     "docslib.org/doc/8999706/federal-aviation-administration-dot-%C2%A7-23-203 (Federal Aviation "
     "Administration, DOT \u00a7 23.203, a page of 14 CFR Part 23)",
     "the time response after the stick is let go at 15 % above and below the trim speed; the phugoid root"},

    // ---- 14 CFR Part 23 at amendment 23-64 (performance-based) ----
    {"14 CFR 23.2145", kAmdt64, CriterionKind::rule, "Stability",
     "14 CFR Part 23 [Doc. No. FAA-2015-1621, Amdt. 23-64, 81 FR 96689, Dec. 30, 2016]",
     "(a) Airplanes not certified for aerobatics must\u2014 (1) Have static longitudinal, lateral, and directional stability "
     "in normal operations; (2) Have dynamic short period and Dutch roll stability in normal operations; and (3) Provide "
     "stable control force feedback throughout the operating envelope. (b) No airplane may exhibit any divergent "
     "longitudinal stability characteristic so unstable as to increase the pilot's workload or otherwise endanger the "
     "airplane and its occupants.",
     TextStatus::verbatim, "",
     "lexbuild.dev/ecfr/title-14/chapter-I/part-23/section-23.2145 (14 CFR \u00a7 23.2145 - Stability, an eCFR "
     "copy)",
     "static margins, the stick-force slope, short-period damping and the deciding root at every corner; the consensus "
     "standards accepted as means of compliance are not in this table"},

    // ---- CS-23 before amendment 5 (prescriptive) ----
    {"CS 23.155", kCs23, CriterionKind::rule, "Elevator control force in manoeuvres", "CS-23 before amendment 5", "",
     TextStatus::not_available, "no public copy of the CS-23 text was retrieved; read it in the basis's own copy", "",
     "the stick force at envelope.limit_load_factor"},
    {"CS 23.173", kCs23, CriterionKind::rule, "Static longitudinal stability", "CS-23 before amendment 5", "",
     TextStatus::not_available, "no public copy of the CS-23 text was retrieved; read it in the basis's own copy", "",
     "the stick-force slope at trim and the free-return band"},
    {"CS 23.175", kCs23, CriterionKind::rule, "Demonstration of static longitudinal stability", "CS-23 before amendment 5",
     "", TextStatus::not_available, "no public copy of the CS-23 text was retrieved; read it in the basis's own copy", "",
     "the sign of the stick-force slope about the trim speed"},
    {"CS 23.181", kCs23, CriterionKind::rule, "Dynamic stability", "CS-23 before amendment 5", "",
     TextStatus::not_available, "no public copy of the CS-23 text was retrieved; read it in the basis's own copy", "",
     "short-period damping held and free; the release 15 % off trim"},

    // ---- guidance: military flying-qualities specification ----
    {"MIL-F-8785C short period", "", CriterionKind::guidance, "Short-period damping (class I airplanes)",
     "MIL-F-8785C, Flying Qualities of Piloted Airplanes, 5 November 1980", "", TextStatus::not_available,
     "the public scan found is not legible text; the level-1 damping range for flight-phase categories A and C, 0.35 to "
     "1.30, is from memory: check it in the document. Guidance only, not a civil rule",
     "tr.scribd.com/document/56445702/MIL-F-8785C-028392 (MIL-F-8785C, scan)",
     "the short-period damping ratio held and free against 0.35 (level 1, categories A and C)"},
    {"MIL-F-8785C phugoid", "", CriterionKind::guidance, "Phugoid stability", "MIL-F-8785C, 5 November 1980", "",
     TextStatus::not_available,
     "the public scan found is not legible text; the level-3 figure, time to double at least 55 s, is from memory: check "
     "it in the document. Guidance only, not a civil rule",
     "tr.scribd.com/document/56445702/MIL-F-8785C-028392 (MIL-F-8785C, scan)",
     "the time to double of the deciding root"},

    // ---- the report's options and the airplane's own data: not criteria ----
    {"option --min-margin", "", CriterionKind::option, "Minimum stick-free static margin for the aft CG limit",
     "an option of this tool (5 % MAC unless set)", "", TextStatus::not_applicable,
     "a design value chosen by the user, not a published criterion", "", "the stick-free static margin"},
    {"option --min-force-per-g", "", CriterionKind::option, "Minimum stick force per g for the aft CG limit",
     "an option of this tool (13.3 N/g unless set)", "", TextStatus::not_applicable,
     "a design value chosen by the user, not a published criterion", "", "the stick force per g"},
    {"input [envelope]", "", CriterionKind::input, "The stated envelope",
     "the aircraft file's [envelope] keys (the manufacturer's data)", "", TextStatus::not_applicable,
     "input data, listed with the other inputs in section 1", "",
     "the CG limits, masses, speeds and limit load factor the corners are built from"},
};

const Basis kBases[] = {
    {kPre64, "14 CFR Part 23 before amendment 23-64 (normal, utility and acrobatic categories)"},
    {kAmdt64, "14 CFR Part 23 at amendment 23-64 (performance-based)"},
    {kCs23, "CS-23 before amendment 5"},
};

}  // namespace

std::span<const Criterion> criteria_table() { return kTable; }

const Criterion* find_criterion(std::string_view id) {
  for (const auto& c : kTable)
    if (id == c.id) return &c;
  return nullptr;
}

std::span<const Basis> bases() { return kBases; }

const Basis* find_basis(std::string_view key) {
  for (const auto& b : kBases)
    if (key == b.key) return &b;
  return nullptr;
}

std::vector<const Criterion*> criteria_for(std::string_view basis) {
  std::vector<const Criterion*> out;
  for (const auto& c : kTable)
    if (basis == c.basis) out.push_back(&c);
  for (const auto& c : kTable)
    if (*c.basis == '\0') out.push_back(&c);
  return out;
}

std::vector<std::string> criteria_ids(std::string_view basis, Topic t) {
  const bool pre64 = basis == kPre64, amdt64 = basis == kAmdt64;
  auto rule = [&](const char* p23, const char* a64, const char* cs) -> std::string {
    return pre64 ? p23 : amdt64 ? a64 : cs;
  };
  switch (t) {
    case Topic::static_stability:
      return pre64 ? std::vector<std::string>{"14 CFR 23.171", "14 CFR 23.173", "14 CFR 23.175"}
                   : std::vector<std::string>{rule("", "14 CFR 23.2145", "CS 23.173")};
    case Topic::force_slope: return {rule("14 CFR 23.175", "14 CFR 23.2145", "CS 23.175")};
    case Topic::free_return:
      return pre64 ? std::vector<std::string>{"14 CFR 23.173", "14 CFR 23.175"}
                   : std::vector<std::string>{rule("", "14 CFR 23.2145", "CS 23.173")};
    case Topic::maneuver_force:
      return amdt64 ? std::vector<std::string>{"option --min-force-per-g"}
                    : std::vector<std::string>{rule("14 CFR 23.155", "", "CS 23.155"), "option --min-force-per-g"};
    case Topic::short_period: return {rule("14 CFR 23.181(a)", "14 CFR 23.2145", "CS 23.181"), "MIL-F-8785C short period"};
    case Topic::release: return {rule("14 CFR 23.181(d)", "14 CFR 23.2145", "CS 23.181")};
    case Topic::divergence: return {rule("14 CFR 23.181(d)", "14 CFR 23.2145", "CS 23.181"), "MIL-F-8785C phugoid"};
    case Topic::cg_limits: return {"option --min-margin", "option --min-force-per-g", "input [envelope]"};
    case Topic::boundary: return {"input [envelope]"};
    case Topic::uncertainty: return {"option --min-margin", "input [envelope]"};
  }
  return {};
}

double stick_force_minimum_23_155_lbf(double W_lb) { return std::min(std::max(W_lb / 140.0, 15.0), 35.0); }

}  // namespace fp
