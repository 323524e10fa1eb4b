// key_info.cpp — see key_info.hpp; made from the one key table (keys.cpp).
#include "scenario/key_info.hpp"

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

}  // namespace fp
