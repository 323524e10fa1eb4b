// key_info.cpp — see key_info.hpp; made from the one key table (keys.cpp).
#include "scenario/key_info.hpp"

#include <algorithm>

#include "scenario/keys.hpp"

namespace fp {

const std::vector<KeyInfo>& numeric_key_info() {
  static const std::vector<KeyInfo> info = [] {
    std::vector<KeyInfo> v;
    for (const keys::Key& k : keys::table_keys()) {
      if (k.kind != keys::Kind::number && k.kind != keys::Kind::integer) continue;
      KeyInfo i;
      i.name = k.name;
      i.table = std::string(keys::table_of(k));
      i.meaning = k.meaning;
      i.unit = keys::display_unit(k);
      i.si_per_unit = keys::display_factor(k);
      i.range = keys::range_text(k);
      i.integer = k.kind == keys::Kind::integer;
      v.push_back(std::move(i));
    }
    return v;
  }();
  return info;
}

namespace {

std::string value_of(const keys::Key& k, Scenario& s) {
  using keys::Kind;
  switch (k.kind) {
    case Kind::number:
      return k.num ? keys::value_text(k, k.num(s)) : "";
    case Kind::integer:
      return k.integer ? std::to_string(k.integer(s)) : "";
    case Kind::boolean:
      return k.flag ? (k.flag(s) ? "true" : "false") : "";
    case Kind::choice:
      if (k.get_choice) {
        const int i = k.get_choice(s);
        if (i >= 0 && static_cast<std::size_t>(i) < k.choices.size()) return k.choices[static_cast<std::size_t>(i)];
      }
      return "";
    case Kind::text:
      return k.text ? k.text(s) : "";
    case Kind::tab_setting:
      return s.trim.tab_auto ? "auto" : keys::value_text(k, s.trim.tab);
    case Kind::lift_table: {
      const auto& t = std::string_view(k.name).starts_with("tail.") ? s.airplane.tail.lift.table : s.airplane.wing.lift.table;
      return t.empty() ? std::string("none (the lift law)") : std::to_string(t.size()) + " rows";
    }
  }
  return "";
}


}  // namespace

std::vector<KeyValue> key_values(const Scenario& s0, const std::vector<std::string>& tables) {
  Scenario s = s0;  // the accessors take a mutable scenario; read a copy
  std::vector<KeyValue> out;
  for (const keys::Key& k : keys::table_keys()) {
    const std::string table(keys::table_of(k));
    if (!tables.empty() && std::find(tables.begin(), tables.end(), table) == tables.end()) continue;
    out.push_back({k.name, table, k.meaning, value_of(k, s), k.kind == keys::Kind::text ? std::string() : keys::allowed_text(k)});
  }
  return out;
}

}  // namespace fp
