#include "report/report_format.h"

#include "analytics/health_index.h"
#include "analytics/words.h"

#include <cmath>
#include <cstdio>
#include <map>

namespace ferrum::report {

std::string fmt_number(std::optional<double> v, int decimals, const std::string& unit) {
  if (!v || !std::isfinite(*v)) return kNoValue;
  char buf[64];
  double x = *v;
  if (std::fabs(x) < 0.5 * std::pow(10.0, -decimals)) x = 0;  // no "-0.0"
  std::snprintf(buf, sizeof buf, "%.*f", decimals, x);
  return unit.empty() ? std::string(buf) : std::string(buf) + " " + unit;
}

std::string fmt_mva(std::optional<double> v, const std::string& unit) {
  if (!v || !std::isfinite(*v) || *v <= 0) return kNoValue;
  std::string s = fmt_number(v, 3);
  while (s.back() == '0') s.pop_back();
  if (s.back() == '.') s.pop_back();
  return unit.empty() ? s : s + " " + unit;
}

std::string fmt_ageing_factor(std::optional<double> v) {
  if (!v || !std::isfinite(*v)) return kNoValue;
  return analytics::significant_figures(*v, 3);
}

// A whole number, except just above a band edge: 85.3 is in the band above
// 85 (edges belong to the worse band, analytics/health_index.h), and "85"
// would read as the band below, so it keeps a decimal.
std::string fmt_health_index(std::optional<double> hi) {
  if (hi && std::isfinite(*hi)) {
    static const auto bands = analytics::HealthIndexOptions{}.bands;
    for (const auto& b : bands)
      if (*hi > b.lower && std::round(*hi) == b.lower) return fmt_number(hi, 1);
  }
  return fmt_number(hi, 0);
}

std::string fmt_years_range(std::optional<double> years, std::optional<double> low,
                            std::optional<double> high) {
  if (!years) return kNoValue;
  std::string s = fmt_number(years, 1) + " years";
  if (low && high) s += " (range " + fmt_number(low, 1) + "–" + fmt_number(high, 1) + ")";
  return s;
}

std::string fmt_measure(std::optional<double> v, const std::string& unit) {
  int decimals = 1;
  if (unit == "mg/kg" || unit == "kV" || unit == "mN/m" || unit == "ppm" || unit == "µg/L") decimals = 0;
  if (unit == "mg KOH/g" || unit == "%") decimals = 2;
  return fmt_number(v, decimals, unit);
}

std::string fmt_ppm(std::optional<double> v) {
  if (!v || !std::isfinite(*v)) return kNoValue;
  const double a = std::fabs(*v);
  int decimals = 0;
  if (a < 10) decimals = 1;
  if (a < 1) decimals = 2;
  // Large values stay whole, as the laboratory reports them: rounding 1308 to
  // 1310 would contradict the method texts that quote the value itself.
  return fmt_number(v, decimals);
}

std::string fmt_day(std::optional<analytics::Day> d) {
  return d ? analytics::format_day(*d) : std::string(kNoValue);
}

std::string fmt_timestamp(analytics::Timestamp t) {
  const analytics::Day d = analytics::day_of(t);
  const long secs = static_cast<long>(t - analytics::start_of(d));
  char buf[32];
  std::snprintf(buf, sizeof buf, " %02ld:%02ld UTC", secs / 3600, (secs % 3600) / 60);
  return analytics::format_day(d) + buf;
}

namespace {
std::string lookup(const std::map<std::string, std::string>& names, const std::string& key) {
  const auto it = names.find(key);
  return it == names.end() ? key : it->second;
}
}  // namespace

std::string factor_title(const std::string& key) {
  static const std::map<std::string, std::string> names = {
      {"dga", "Dissolved gases"}, {"oil_quality", "Oil quality"}, {"paper", "Paper (furans)"},
      {"thermal", "Loading and heat"}, {"infrared", "Infrared"}, {"inspection", "Inspection"},
      {"age", "Age"}, {"insulation_power_factor", "Insulation power factor"},
      {"turns_ratio", "Turns ratio"}, {"leakage_reactance", "Leakage reactance"},
      {"winding_resistance", "Winding resistance"}, {"bushings", "Bushings"},
      {"insulation_resistance", "Insulation resistance"}};
  return lookup(names, key);
}

std::string oil_test_title(const std::string& key) {
  static const std::map<std::string, std::string> names = {
      {"moisture", "Water content"}, {"breakdown", "Dielectric breakdown"},
      {"acidity", "Acidity (neutralisation no.)"}, {"ift", "Interfacial tension"},
      {"pf25", "Power factor at 25 °C"}, {"pf100", "Power factor at 100 °C"},
      {"color", "Colour (ASTM D1500)"}};
  return lookup(names, key);
}

std::string gas_label(const std::string& gas) {
  // Unicode subscripts print with the embedded DejaVu font.
  static const std::map<std::string, std::string> names = {
      {"H2", "H₂"}, {"CH4", "CH₄"}, {"C2H6", "C₂H₆"}, {"C2H4", "C₂H₄"},
      {"C2H2", "C₂H₂"}, {"CO", "CO"}, {"CO2", "CO₂"}, {"O2", "O₂"}, {"N2", "N₂"}};
  return lookup(names, gas);
}

std::string rating_title(analytics::Rating r) {
  switch (r) {
    case analytics::Rating::good: return "good";
    case analytics::Rating::fair: return "fair";
    case analytics::Rating::poor: return "poor";
    case analytics::Rating::very_poor: return "very poor";
    case analytics::Rating::unsafe: return "UNSAFE";
  }
  return "?";
}

std::string priority_title(int priority) {
  switch (priority) {
    case 1: return "P1 urgent";
    case 2: return "P2 soon";
    case 3: return "P3 planned";
    default: return "P" + std::to_string(priority) + " routine";
  }
}

std::string item_title(const std::string& item) {
  std::string out = item;
  for (char& c : out)
    if (c == '_') c = ' ';
  return out;
}

std::string short_reason(const std::string& reason, std::size_t max_chars) {
  std::string s = reason;
  bool more = false;  // a later clause left out: said by "…", the full reason is in the unit report
  for (const char* stop : {"; ", ". "})
    if (auto p = s.find(stop); p != std::string::npos) s.resize(p), more = true;
  while (!s.empty() && (s.back() == '.' || s.back() == ' ')) s.pop_back();
  if (s.size() <= max_chars) return more ? s + "…" : s;
  std::size_t cut = s.rfind(' ', max_chars - 1);
  if (cut == std::string::npos || cut < max_chars / 2) cut = max_chars - 1;
  // Never inside a UTF-8 sequence.
  while (cut > 0 && (static_cast<unsigned char>(s[cut]) & 0xC0) == 0x80) --cut;
  s.resize(cut);
  while (!s.empty() && (s.back() == ',' || s.back() == ' ')) s.pop_back();
  return s + "…";
}

}  // namespace ferrum::report
