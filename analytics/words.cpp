#include "analytics/words.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <map>

namespace ferrum::analytics {

std::string words(const std::string& id) {
  static const std::map<std::string, std::string> kWords{
      {"dga", "dissolved gases"},
      {"oil_quality", "oil quality"},
      {"pf25", "power factor at 25 °C"},
      {"pf100", "power factor at 100 °C"},
      {"ift", "interfacial tension"},
  };
  if (auto it = kWords.find(id); it != kWords.end()) return it->second;
  std::string s = id;
  std::replace(s.begin(), s.end(), '_', ' ');
  return s;
}

std::string significant_figures(double v, int digits) {
  if (!std::isfinite(v)) return "-";
  if (v == 0) return "0";
  const int magnitude = static_cast<int>(std::floor(std::log10(std::fabs(v))));
  const int decimals = std::max(0, digits - 1 - magnitude);
  // Rounding can carry into the next decade (0.09996 -> 0.100): recount then.
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  const double r = std::atof(buf);
  if (r != 0 && static_cast<int>(std::floor(std::log10(std::fabs(r)))) > magnitude && decimals > 0)
    std::snprintf(buf, sizeof buf, "%.*f", decimals - 1, v);
  return buf;
}

}  // namespace ferrum::analytics
