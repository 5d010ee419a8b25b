// "Electrical tests" section of the unit report: the cautions of the tests,
// then one table per test with every test on record, oldest first, so that
// a column reads as the trend against previous tests.
#include <string>

#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/unit_report_sections.h"

namespace ferrum::report {

namespace {

using analytics::UnitAssessment;

std::string verdict(const std::optional<bool>& within) {
  if (!within) return "not judged";
  return *within ? "within limit" : "OUTSIDE LIMIT";
}

std::string tap_text(const std::optional<int>& tap) { return tap ? std::to_string(*tap) : std::string(kNoValue); }
std::string or_dash(const std::string& s) { return s.empty() ? std::string(kNoValue) : s; }

Table make_table(std::vector<TableColumn> columns) {
  Table t;
  t.font_size = 7.4;
  t.columns = std::move(columns);
  return t;
}

void cautions(PageFlow& flow) {
  flow.paragraph("SAFETY of electrical testing", type::small + 0.6, FontFace::bold);
  std::vector<std::string> lines;
  for (const auto& c : electrical_test_cautions()) lines.push_back(c.lead + " " + c.text);
  flow.bullets(lines, type::small + 0.3);
}

void turns_ratio(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.turns_ratio.empty()) return;
  flow.subsection("Turns ratio (limit ±0.5 % of the nameplate ratio)");
  Table t = make_table({{"Date", 1.0}, {"Tap", 0.5, Align::right}, {"Phase", 0.5}, {"Measured", 0.9, Align::right},
                        {"Nameplate", 0.9, Align::right}, {"Deviation", 0.8, Align::right}, {"Result", 2.4}});
  for (const auto& r : e.turns_ratio) {
    t.rows.push_back({analytics::format_day(r.date), tap_text(r.tap), or_dash(r.phase), fmt_number(r.measured, 4),
                      fmt_number(r.nameplate, 4), fmt_number(r.deviation_pct, 2, "%"),
                      r.note.empty() ? verdict(r.within_limit) : r.note});
    t.emphasis.push_back(r.within_limit && !*r.within_limit);
  }
  flow.table(t);
  flow.paragraph("Tap position 1 is taken as the highest HV voltage. A deviation points to shorted turns or a "
                 "tap-changer contact.", type::small, FontFace::regular, palette::muted);
}

void winding_resistance(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.winding_resistance.empty()) return;
  flow.subsection("Winding resistance (corrected to " + fmt_number(e.winding_resistance.front().reference_c, 0, "°C") +
                  "; spread 2 %, change 5 %)");
  Table t = make_table({{"Date", 1.0}, {"Winding", 0.6}, {"Tap", 0.4, Align::right}, {"Phase", 0.5},
                        {"Measured", 0.8, Align::right}, {"At", 0.5, Align::right}, {"Corrected", 0.8, Align::right},
                        {"Spread", 0.6, Align::right}, {"Change", 0.6, Align::right}, {"Result", 1.1}});
  for (const auto& r : e.winding_resistance) {
    t.rows.push_back({analytics::format_day(r.date), or_dash(r.winding), tap_text(r.tap), or_dash(r.phase),
                      fmt_number(r.measured_ohm, 4, "Ω"), fmt_number(r.temp_c, 0, "°C"), fmt_number(r.corrected_ohm, 4, "Ω"),
                      fmt_number(r.phase_spread_pct, 1, "%"), fmt_number(r.change_pct, 1, "%"), verdict(r.within_limit)});
    t.emphasis.push_back(r.within_limit && !*r.within_limit);
  }
  flow.table(t);
}

void insulation_pf(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.insulation_power_factor.empty()) return;
  flow.subsection("Insulation power factor (at 20 °C; in-service limit 1.0 %)");
  Table t = make_table({{"Date", 1.0}, {"Insulation", 0.7}, {"Measured", 0.8, Align::right}, {"At", 0.5, Align::right},
                        {"K", 0.5, Align::right}, {"At 20 °C", 0.8, Align::right}, {"Capacitance", 1.0, Align::right},
                        {"Change", 0.6, Align::right}, {"Result", 1.1}});
  for (const auto& r : e.insulation_power_factor) {
    t.rows.push_back({analytics::format_day(r.date), or_dash(r.insulation), fmt_number(r.power_factor_pct, 2, "%"),
                      fmt_number(r.temp_c, 0, "°C"), fmt_number(r.correction_factor, 2), fmt_number(r.pf20_pct, 2, "%"),
                      fmt_number(r.capacitance_pf, 0, "pF"), fmt_number(r.capacitance_change_pct, 1, "%"),
                      verdict(r.within_limit)});
    t.emphasis.push_back(r.within_limit && !*r.within_limit);
  }
  flow.table(t);
}

void bushings(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.bushings.empty()) return;
  flow.subsection("Bushings (C1 change 5 % investigate, 10 % out of service; power factor twice the reference)");
  Table t = make_table({{"Date", 1.0}, {"Bushing", 0.7}, {"Power factor", 0.8, Align::right},
                        {"Reference", 0.8, Align::right}, {"Capacitance", 1.0, Align::right},
                        {"Change", 0.6, Align::right}, {"Verdict", 1.3}});
  for (const auto& r : e.bushings) {
    t.rows.push_back({analytics::format_day(r.date), r.bushing + " " + r.insulation,
                      fmt_number(r.power_factor_pct, 2, "%"), fmt_number(r.reference_power_factor_pct, 2, "%"),
                      fmt_number(r.capacitance_pf, 0, "pF"), fmt_number(r.capacitance_change_pct, 1, "%"), r.verdict});
    t.emphasis.push_back(!r.within_limit);
  }
  flow.table(t);
  flow.paragraph("A bushing over its limit is a defect of the bushing: repair or replace the bushing, not the unit. "
                 "Without a nameplate value the first test on record is the reference.",
                 type::small, FontFace::regular, palette::muted);
}

void insulation_resistance(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.insulation_resistance.empty()) return;
  flow.subsection("Insulation resistance and polarization index");
  Table t = make_table({{"Date", 1.0}, {"Insulation", 1.0}, {"1 min", 0.9, Align::right}, {"10 min", 0.9, Align::right},
                        {"PI", 0.5, Align::right}, {"Reading", 1.5}});
  for (const auto& r : e.insulation_resistance) {
    t.rows.push_back({analytics::format_day(r.date), or_dash(r.insulation), fmt_number(r.one_minute_megohm, 0, "MΩ"),
                      fmt_number(r.ten_minute_megohm, 0, "MΩ"), fmt_number(r.polarization_index, 2), or_dash(r.reading)});
    t.emphasis.push_back(r.reading == "dangerous" || r.reading == "poor");
  }
  flow.table(t);
}

void excitation(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.excitation_current.empty()) return;
  flow.subsection("Excitation current (outer phases similar and above the middle phase)");
  Table t = make_table({{"Date", 1.0}, {"Tap", 0.4, Align::right}, {"Test kV", 0.6, Align::right},
                        {"A", 0.7, Align::right}, {"B", 0.7, Align::right}, {"C", 0.7, Align::right},
                        {"Change", 0.7, Align::right}, {"Pattern", 1.2}});
  for (const auto& r : e.excitation_current) {
    const std::string pattern = !r.pattern_expected ? "not judged" : *r.pattern_expected ? "as expected" : "UNEXPECTED";
    t.rows.push_back({analytics::format_day(r.date), tap_text(r.tap), fmt_number(r.test_kv, 1),
                      fmt_number(r.a_ma ? r.a_ma : r.single_ma, 1, "mA"), fmt_number(r.b_ma, 1, "mA"),
                      fmt_number(r.c_ma, 1, "mA"), fmt_number(r.change_pct, 1, "%"), pattern});
    t.emphasis.push_back(r.pattern_expected && !*r.pattern_expected);
  }
  flow.table(t);
}

void leakage_reactance(PageFlow& flow, const analytics::ElectricalSummary& e) {
  if (e.leakage_reactance.empty()) return;
  flow.subsection("Leakage reactance (±2 % three-phase, ±3 % per phase of the nameplate impedance)");
  Table t = make_table({{"Date", 1.0}, {"Phase", 0.8}, {"Measured", 0.8, Align::right}, {"Nameplate", 0.8, Align::right},
                        {"Change", 0.7, Align::right}, {"Result", 1.6}});
  for (const auto& r : e.leakage_reactance) {
    t.rows.push_back({analytics::format_day(r.date), r.phase.empty() ? "three-phase" : r.phase,
                      fmt_number(r.measured_pct, 2, "%"), fmt_number(r.nameplate_pct, 2, "%"),
                      fmt_number(r.change_pct, 2, "%"),
                      r.nameplate_pct ? verdict(r.within_limit) : "no nameplate impedance"});
    t.emphasis.push_back(r.within_limit && !*r.within_limit);
  }
  flow.table(t);
}

}  // namespace

void electrical_section(PageFlow& flow, const UnitAssessment& a) {
  flow.section("Electrical tests");
  cautions(flow);
  if (!a.electrical) {
    no_data_note(flow, "No electrical field test on record.");
    return;
  }
  const auto& e = *a.electrical;
  flow.paragraph("Every test on record, oldest first: read down a column for the trend. Limits and their sources "
                 "are listed under Sources; values from memory are marked there.",
                 type::small, FontFace::regular, palette::muted);
  turns_ratio(flow, e);
  winding_resistance(flow, e);
  insulation_pf(flow, e);
  bushings(flow, e);
  insulation_resistance(flow, e);
  excitation(flow, e);
  leakage_reactance(flow, e);
  if (!e.notes.empty()) flow.bullets(e.notes, type::small);
}

}  // namespace ferrum::report
