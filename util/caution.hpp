// caution.hpp — the cautions every output of floatpitch carries, in one place: the console
// (one line at the end of every command), every JSON file (a "caution" key), the report and
// the window.
#pragma once

namespace fp {

// The full text: reports, the window's status line, JSON files.
inline constexpr const char* kCaution =
    "Engineering analysis aid, not approved data. Results are only as good as the aerodynamic and "
    "hinge-moment data put in, which carry large uncertainty. No flutter and no structural flexibility "
    "are modelled. Flight-test and compliance findings belong to qualified, authorized people under the "
    "applicable airworthiness authority's rules.";

// The one line that ends every console output.
inline constexpr const char* kCautionLine =
    "caution: analysis aid, not approved data; as good as its aerodynamic and hinge-moment inputs; no flutter "
    "or flexibility; compliance belongs to qualified, authorized engineers under the applicable airworthiness rules.";

}  // namespace fp
