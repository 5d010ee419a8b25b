#include "analytics/words.h"

#include <algorithm>
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

}  // namespace ferrum::analytics
