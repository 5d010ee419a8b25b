#include "report/site_section.h"

#include <cstdio>

#include "report/csv_field.h"
#include "report/page_flow.h"
#include "report/report_format.h"
#include "report/safety_text.h"

namespace ferrum::report {
namespace {

std::string n1_word(const analytics::SiteView& s) {
  if (!s.n1_ok) return "not assessed";
  return *s.n1_ok ? "passes" : "FAILS";
}

std::string number(std::optional<double> v) {
  if (!v) return "";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.6g", *v);
  return buf;
}

}  // namespace

void site_section(PageFlow& flow, const std::vector<analytics::SiteView>& sites) {
  flow.section("Sites and N-1", 60);
  if (sites.empty()) {
    flow.paragraph("No units in the register.", type::body, FontFace::regular, palette::muted);
    return;
  }
  flow.paragraph(
      "Per site: installed capacity against the sum of the units' peak loads over the last year (peaks need not "
      "coincide, so the sum is on the safe side), and N-1: whether the other units can carry that load with any one "
      "unit out (the worst single outage is shown), each within its long-time emergency loading (hot spot at the IEC 60076-7 limit at the "
      "ambient of its peak). A unit that is loading limited, wet or unhealthy takes no transferred load: it counts "
      "with its own peak only. Load is never proposed onto such a unit.",
      type::small, FontFace::regular, palette::muted);
  Table t;
  t.font_size = 7.2;
  t.columns = {{"Site", 1.0},          {"Units", 0.4, Align::right},        {"Installed MVA", 0.7, Align::right},
               {"Peak MVA", 0.6, Align::right}, {"Worst outage", 0.8},      {"Others carry MVA", 0.8, Align::right},
               {"Margin MVA", 0.65, Align::right}, {"N-1", 0.7}};
  std::vector<std::string> limits;
  for (const auto& s : sites) {
    t.rows.push_back({s.site.empty() ? std::string(kNoValue) : s.site, std::to_string(s.units.size()),
                      fmt_mva(s.installed_mva), fmt_number(s.peak_load_mva, 1),
                      s.n1_unit_out.empty() ? std::string(kNoValue) : s.n1_unit_out + " (" + fmt_mva(s.n1_unit_out_mva) + ")",
                      fmt_number(s.n1_capacity_mva, 1), fmt_number(s.n1_margin_mva, 1), n1_word(s)});
    t.emphasis.push_back(s.flagged());
    for (const auto& u : s.units) {
      if (u.limits.empty()) continue;
      std::string why;
      for (const auto& l : u.limits) why += (why.empty() ? "" : "; ") + l;
      limits.push_back(s.site + ", " + u.unit_id + " takes no transferred load: " + why);
    }
  }
  flow.table(t);
  for (const auto& s : sites)
    if (!s.n1_ok || s.flagged()) flow.paragraph(s.site + ": " + s.n1_text + ".", type::small);
  if (!limits.empty()) {
    flow.subsection("Units that take no transferred load");
    flow.bullets(limits, type::small);
  }
}

std::string fleet_sites_csv(const std::vector<analytics::SiteView>& sites) {
  std::string csv =
      "site,installed_mva,site_peak_load_mva,n1_unit_out,n1_capacity_mva,n1_margin_mva,n1,unit_id,rated_mva,"
      "peak_load_mva,emergency_mva,spare_mva,takes_transferred_load,limits\n";
  for (const auto& s : sites)
    for (const auto& u : s.units) {
      std::string why;
      for (const auto& l : u.limits) why += (why.empty() ? "" : "; ") + l;
      csv += quote(s.site) + "," + number(s.installed_mva) + "," + number(s.peak_load_mva) + "," +
             quote(s.n1_unit_out) + "," + number(s.n1_capacity_mva) + "," + number(s.n1_margin_mva) + "," +
             (!s.n1_ok ? "unknown" : *s.n1_ok ? "pass" : "fail") + "," + quote(u.unit_id) + "," +
             number(u.rated_mva) + "," + number(u.peak_load_mva) + "," + number(u.emergency_mva) + "," +
             number(u.spare_mva) + "," + (u.can_take_load() ? "yes" : "no") + "," + quote(why) + "\n";
    }
  return csv + csv_caution_line() + "\n";
}

}  // namespace ferrum::report
