// panel_edit.cpp — the App's Edit tab (see app.hpp): every numeric key of the scenario in its
// table, in the unit the key table shows, with a tooltip (key, meaning, unit, range, where it
// was set); the choices that are not plain numbers (tab for zero stick force, reversible
// circuit). Edits go through the session, which checks them as the command line does.
#include <imgui.h>
#include <imgui_stdlib.h>  // needs imgui.h before it

#include "model/units.hpp"
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

using fp::units::to_deg;

namespace {

// The tooltip of a key: its name, meaning, unit, allowed range, and where it was set.
std::string key_tip(const fp::KeyInfo& k, const fp::Scenario& s) {
  std::string tip = k.name + "\n" + k.meaning + "\nunit: " + (k.unit.empty() ? "none" : k.unit) +
                    "\nallowed: " + k.range;
  const auto o = s.origins.find(k.name);
  if (o != s.origins.end() && !o->second.file.empty()) {
    tip += "\nset in " + o->second.file;
    if (o->second.line > 0) tip += ':' + std::to_string(o->second.line);
  } else if (o != s.origins.end() && !o->second.via.empty()) {
    tip += "\nset by " + o->second.via;
  } else {
    tip += "\nnot set in the files (default)";
  }
  return tip;
}

}  // namespace

void App::tab_edit() {
  if (!ses_.loaded()) {
    ImGui::TextDisabled("Open a scenario first.");
    return;
  }
  if (!edit_error_.empty()) {
    ImGui::PushStyleColor(ImGuiCol_ChildBg, IM_COL32(250, 232, 228, 255));
    ImGui::BeginChild("##err", ImVec2(0, ImGui::GetTextLineHeight() * 4.2f), true);
    colored_wrapped(kWarnRed, "Refused, nothing changed:\n" + edit_error_);
    ImGui::EndChild();
    ImGui::PopStyleColor();
  } else if (!edit_ok_.empty()) {
    colored_wrapped(kOkGreen, edit_ok_);
  } else {
    ImGui::TextDisabled("Edits apply on Enter; the airplanes re-trim and restart.");
  }
  ImGui::SetNextItemWidth(-1);
  ImGui::InputTextWithHint("##filter", "filter keys (e.g. ch_ or cg)", &filter_);
  ImGui::BeginChild("##keys", ImVec2(0, 0), false);
  edit_choices();
  key_tables();
  ImGui::EndChild();
}

// The choices that are not plain numbers: the trim tab (auto or fixed) and the circuit.
void App::edit_choices() {
  const fp::Scenario& s = ses_.scenario();
  if (!ImGui::CollapsingHeader("trim and circuit", ImGuiTreeNodeFlags_DefaultOpen)) return;
  bool auto_tab = s.trim.tab_auto;
  if (ImGui::Checkbox("tab for zero stick force (auto)", &auto_tab)) {
    const std::string err = ses_.edit([&](fp::Scenario& c) {
      c.trim.tab_auto = auto_tab;
      if (!auto_tab) c.trim.tab = ses_.trim().tab;
    });
    edit_error_ = err;
    if (err.empty()) edit_ok_ = std::string("trim.tab = ") + (auto_tab ? "auto" : fmt("%.2f deg", to_deg(s.trim.tab)));
  }
  tooltip("trim.tab: \"auto\" sets the tab for zero stick force at the trim condition; a fixed angle holds it.");
  if (!s.trim.tab_auto) {
    double deg = to_deg(s.trim.tab);
    ImGui::SetNextItemWidth(120);
    if (ImGui::InputDouble("fixed tab [deg]", &deg, 0, 0, "%.3f", ImGuiInputTextFlags_EnterReturnsTrue)) {
      const std::string err = ses_.edit([&](fp::Scenario& c) { c.trim.tab = deg * fp::units::deg; });
      edit_error_ = err;
      if (err.empty()) edit_ok_ = fmt("trim.tab = %.3f deg", deg);
    }
  }
  bool rev = s.airplane.circuit.reversible;
  if (ImGui::Checkbox("reversible circuit (elevator can float)", &rev)) {
    const std::string err = ses_.edit([&](fp::Scenario& c) { c.airplane.circuit.reversible = rev; });
    edit_error_ = err;
    if (err.empty()) edit_ok_ = std::string("circuit.reversible = ") + (rev ? "true" : "false");
  }
  tooltip("circuit.reversible: false for a powered (irreversible) circuit: the elevator cannot float: held case only.");
}

// The numeric keys, one collapsing table a key table, filtered by the filter field.
void App::key_tables() {
  std::string table;
  bool open = false;
  for (const auto& k : fp::numeric_key_info()) {
    if (!filter_.empty() && k.name.find(filter_) == std::string::npos) continue;
    if (k.table != table) {
      if (open) ImGui::EndTable();
      table = k.table;
      const bool start_open = table == "mass" || table == "condition" || table == "elevator";
      open = ImGui::CollapsingHeader(table.c_str(), start_open || !filter_.empty() ? ImGuiTreeNodeFlags_DefaultOpen : 0);
      if (open) {
        open = ImGui::BeginTable(("##t" + table).c_str(), 3, ImGuiTableFlags_SizingStretchProp);
        if (open) {
          ImGui::TableSetupColumn("key", ImGuiTableColumnFlags_WidthStretch, 1.2f);
          ImGui::TableSetupColumn("value", ImGuiTableColumnFlags_WidthStretch, 1.0f);
          ImGui::TableSetupColumn("unit", ImGuiTableColumnFlags_WidthFixed, 44.0f);
        }
      }
    }
    if (open) key_row(k);
  }
  if (open) ImGui::EndTable();
}

// One key: its short name, an input in the shown unit, the unit.
void App::key_row(const fp::KeyInfo& k) {
  const fp::Scenario& s = ses_.scenario();
  double si = 0.0;
  try {
    si = fp::get_value(s, k.name);
  } catch (const fp::ScenarioError&) {
    return;  // not a plain number in this build
  }
  ImGui::TableNextRow();
  ImGui::TableSetColumnIndex(0);
  const std::string short_name = k.name.substr(k.table.size() + 1);
  ImGui::AlignTextToFramePadding();
  ImGui::TextUnformatted(short_name.c_str());
  const std::string tip = key_tip(k, s);
  tooltip(tip);
  ImGui::TableSetColumnIndex(1);
  ImGui::SetNextItemWidth(-1);
  const double shown = si / k.si_per_unit;
  auto it = editing_.find(k.name);
  double v = it != editing_.end() ? it->second : shown;
  ImGui::PushID(k.name.c_str());
  ImGui::InputDouble("##v", &v, 0.0, 0.0, k.integer ? "%.0f" : "%.6g", ImGuiInputTextFlags_CharsScientific);
  tooltip(tip);
  ImGui::PopID();
  if (ImGui::IsItemActive()) editing_[k.name] = v;
  if (ImGui::IsItemDeactivatedAfterEdit()) {
    const double value = editing_.count(k.name) ? editing_[k.name] : v;
    editing_.erase(k.name);
    if (value != shown) {
      const std::string err = ses_.set_key(k.name, value * k.si_per_unit);
      if (err.empty()) {
        edit_error_.clear();
        edit_ok_ = k.name + " = " + fmt("%.6g", value) + (k.unit.empty() ? "" : " " + k.unit) +
                   ": re-trimmed, both airplanes restarted";
        cg_slider_ = static_cast<float>(ses_.scenario().airplane.mass.h_cg);
      } else {
        edit_error_ = err;
        edit_ok_.clear();
      }
    }
  } else if (!ImGui::IsItemActive()) {
    editing_.erase(k.name);
  }
  ImGui::TableSetColumnIndex(2);
  ImGui::TextDisabled("%s", k.unit.c_str());
}

}  // namespace fpui
