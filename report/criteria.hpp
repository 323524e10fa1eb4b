// criteria.hpp — the one table of the criteria the report compares with: the sections of the
// certification basis the user chooses (with document and amendment), the military
// flying-qualities specification as labelled guidance, and the report's own options and input
// data (which are not criteria, and say so). Each rule's text is quoted verbatim where a public
// copy could be retrieved, with that copy named; where it could not, the row says so and carries
// no text: the report never paraphrases a rule from memory.
//
// Every finding of the report names the rows it compares with (Finding::criteria); a test checks
// that each name is a row of this table and that the page shows the table.
#pragma once

#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace fp {

enum class CriterionKind {
  rule,      // a section of a certification basis
  guidance,  // a military specification's levels: labelled guidance, not a civil rule
  option,    // an option of this tool: a design value, not a criterion
  input,     // the airplane's own stated data (e.g. its CG envelope)
};

enum class TextStatus {
  verbatim,          // the whole section (or paragraph named) quoted from the copy named
  verbatim_partial,  // part of it quoted verbatim; `text_note` says what is missing
  not_available,     // no public copy could be retrieved: no text is shown
  not_applicable,    // an option or input: there is no published text
};

struct Criterion {
  const char* id;          // "14 CFR 23.155", "MIL-F-8785C short period", "option --min-margin"
  const char* basis;       // the basis key it belongs to ("part23-pre64", ...), or "" for all
  CriterionKind kind;
  const char* title;       // the section's own title
  const char* document;    // the document and the edition or amendment of the copy quoted
  const char* text;        // the verbatim text ("" when not available)
  TextStatus status;
  const char* text_note;   // what is missing, or why there is no text
  const char* source;      // where the copy quoted was found: address without its scheme (the page
                           // fetches nothing and names no URL) and title
  const char* compared;    // what the report compares with it, in its own words
};

// The whole table, in the order the report prints it.
std::span<const Criterion> criteria_table();
// A row by its id, or nullptr.
const Criterion* find_criterion(std::string_view id);

// The certification bases the user may choose (ReportOptions::basis, `--basis`).
struct Basis {
  const char* key;         // "part23-pre64"
  const char* name;        // "14 CFR Part 23 before amendment 23-64"
};
std::span<const Basis> bases();
const Basis* find_basis(std::string_view key);
inline constexpr const char* kDefaultBasis = "part23-pre64";

// The rows the report shows for a basis: its own rules, then the guidance, options and inputs.
std::vector<const Criterion*> criteria_for(std::string_view basis);

// What a finding compares with, by topic; the ids of the basis's rows (and of guidance, options
// and inputs) for that topic. Every id returned is a row of criteria_table().
enum class Topic {
  static_stability,   // pull below trim, push above
  force_slope,        // stable stick-force slope over a speed range
  free_return,        // return towards trim speed on slow release, with friction
  maneuver_force,     // stick force at the limit maneuvering load factor
  short_period,       // short-period damping, controls free and fixed
  release,            // sudden release 15 % off trim; phugoid
  divergence,         // aperiodic or phugoid divergence
  cg_limits,          // the CG limits computed with the report's options
  boundary,           // the hands-off divergence boundary against the stated envelope
  uncertainty,        // the stick-free neutral point over the hinge-moment band
};
std::vector<std::string> criteria_ids(std::string_view basis, Topic t);

// The minimum stick force at the positive limit maneuvering load factor of 14 CFR 23.155(a)(2)
// (stick controls) as the text quoted in the table states it: W/140 or 15 pounds, whichever is
// greater, need not be greater than 35 pounds; W the maximum weight. In pounds-force, from the
// maximum weight in pounds.
double stick_force_minimum_23_155_lbf(double max_weight_lb);

}  // namespace fp
