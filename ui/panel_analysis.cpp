// panel_analysis.cpp — the App's Analysis tab (see app.hpp): neutral and maneuver points
// (closed form and from the model), margins, stick force per g, and the modes held and free,
// all as the session's analysis gives them.
#include "model/units.hpp"
#include "ui/app.hpp"
#include "ui/widgets.hpp"

namespace fpui {

using fp::units::to_deg;

namespace {

// The modes of one case: name, root, damping, period or time to double / to half.
void modes_table(const Fonts& fonts, const char* id, const std::vector<fp::Mode>& ms) {
  ImGui::PushFont(fonts.small);
  if (ImGui::BeginTable(id, 4, ImGuiTableFlags_SizingStretchProp | ImGuiTableFlags_RowBg)) {
    ImGui::TableSetupColumn("mode", ImGuiTableColumnFlags_WidthStretch, 1.1f);
    ImGui::TableSetupColumn("root [1/s]", ImGuiTableColumnFlags_WidthStretch, 1.3f);
    ImGui::TableSetupColumn("ζ", ImGuiTableColumnFlags_WidthStretch, 0.45f);
    ImGui::TableSetupColumn("T or t½", ImGuiTableColumnFlags_WidthStretch, 0.8f);
    ImGui::TableHeadersRow();
    for (const auto& m : ms) {
      ImGui::TableNextRow();
      ImGui::TableSetColumnIndex(0);
      ImGui::TextUnformatted(m.name.c_str());
      ImGui::TableSetColumnIndex(1);
      if (m.oscillatory) ImGui::Text("%.3g ± %.3gi", m.root.real(), m.root.imag());
      else ImGui::Text("%.3g", m.root.real());
      ImGui::TableSetColumnIndex(2);
      if (m.oscillatory) ImGui::Text("%.3f", m.damping);
      else ImGui::TextDisabled("-");
      ImGui::TableSetColumnIndex(3);
      if (m.oscillatory) ImGui::Text("T %.3g s", m.period);
      else if (m.root.real() > 0) ImGui::Text("t×2 %.3g s", m.time_to_double);
      else if (m.root.real() < 0) ImGui::Text("t½ %.3g s", m.time_to_half);
    }
    ImGui::EndTable();
  }
  ImGui::PopFont();
}

}  // namespace

void App::tab_analysis() {
  if (!ses_.loaded()) {
    ImGui::TextDisabled("Open a scenario first.");
    return;
  }
  caption(f_, "NEUTRAL AND MANEUVER POINTS");
  if (const fp::Margins* m = ses_.margins()) {
    if (ses_.margins_stale()) ImGui::TextDisabled("(for the CG before the slider moved)");
    if (ImGui::BeginTable("##np", 3, ImGuiTableFlags_SizingStretchProp | ImGuiTableFlags_RowBg)) {
      ImGui::TableSetupColumn("fraction of MAC");
      ImGui::TableSetupColumn("closed form");
      ImGui::TableSetupColumn("model");
      ImGui::TableHeadersRow();
      auto r = [](const char* n, const fp::Pair& p) {
        ImGui::TableNextRow();
        ImGui::TableSetColumnIndex(0);
        ImGui::TextUnformatted(n);
        ImGui::TableSetColumnIndex(1);
        ImGui::Text("%.4f", p.closed_form);
        ImGui::TableSetColumnIndex(2);
        ImGui::Text("%.4f", p.model);
      };
      const bool rev = ses_.scenario().airplane.circuit.reversible;
      r("neutral point, fixed", m->np_fixed);
      if (rev) r("neutral point, free", m->np_free);
      if (rev) r("apparent free (hinge consts)", m->np_apparent);
      r("maneuver point, fixed", m->mp_fixed);
      if (rev) r("maneuver point, free", m->mp_free);
      ImGui::EndTable();
    }
    if (ImGui::BeginTable("##mg", 2, ImGuiTableFlags_SizingStretchProp)) {
      row("CG", fmt("%.4f", m->cg));
      row("static margin, fixed", fmt("%+.4f", m->margin_fixed));
      if (ses_.scenario().airplane.circuit.reversible) row("static margin, free", fmt("%+.4f", m->margin_free));
      else row("stick-free case", "none (irreversible circuit)");
      row("stick force per g", fmt("%.1f N/g", m->force_per_g));
      row("elevator per g", fmt("%.2f deg/g", to_deg(m->elevator_per_g)));
      row("force gradient at trim", fmt("%+.3f N/(m/s)", m->force_gradient));
      ImGui::EndTable();
    }
  } else {
    colored_wrapped(kWarnAmber, "not available: " + ses_.margins_error());
  }
  ImGui::Spacing();
  caption(f_, "MODES, STICK HELD");
  modes_table(f_, "##mh", ses_.modes().held);
  ImGui::Spacing();
  caption(f_, "MODES, STICK FREE");
  if (ses_.modes().has_free) modes_table(f_, "##mf", ses_.modes().free);
  else ImGui::TextDisabled("irreversible circuit: the elevator cannot float: held case only");
}

}  // namespace fpui
