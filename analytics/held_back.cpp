#include "analytics/held_back.h"

#include <optional>

#include "analytics/calendar.h"

namespace ferrum::analytics {
namespace {

template <class T>
std::optional<Day> newest_date(const std::vector<T>& rows) {
  std::optional<Day> out;
  for (const auto& r : rows)
    if (!out || r.date > *out) out = r.date;
  return out;
}

std::optional<Day> newest_stored(const UnitData& d, const std::string& kind) {
  if (kind == "oil") return newest_date(d.oil_samples);
  if (kind == "infrared") return newest_date(d.infrared);
  if (kind == "inspection") return newest_date(d.inspections);
  if (kind == "electrical") return newest_date(d.electrical);
  if (kind == "load" && !d.load.empty()) return day_of(d.load.back().t);
  return std::nullopt;
}

struct KindWords {
  const char* kind;
  const char* result;  // "a newer oil sample"
  const char* who;     // who corrects the file
};
constexpr KindWords kWords[] = {
    {"oil", "a newer oil sample", "the lab"},
    {"infrared", "a newer infrared survey", "the thermographer"},
    {"inspection", "a newer inspection", "the inspector"},
    {"electrical", "a newer electrical test", "the test crew"},
    {"load", "newer load records", "the party that sent it"},
};

}  // namespace

std::vector<HeldBack> newer_held_back(const UnitData& data) {
  std::vector<HeldBack> out;
  for (const auto& h : data.held_back) {
    const auto stored = newest_stored(data, h.kind);
    if (!stored || h.newest > *stored) out.push_back(h);
  }
  return out;
}

std::string held_back_text(const HeldBack& h) {
  const char* result = "newer results";
  const char* who = "the party that sent it";
  for (const auto& w : kWords)
    if (h.kind == w.kind) {
      result = w.result;
      who = w.who;
    }
  return "a file rejected on " + h.rejected_on + (h.file.empty() ? "" : " (" + h.file + ")") + " holds " + result +
         " (" + format_day(h.newest) + "): ask " + who + " to correct it and drop it again";
}

}  // namespace ferrum::analytics
