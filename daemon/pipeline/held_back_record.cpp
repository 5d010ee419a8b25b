#include "daemon/pipeline/held_back_record.h"

#include <sstream>

namespace ferrum::ingest {
namespace {

constexpr const char* kKinds[][2] = {
    {"oil_lab", "oil"}, {"infrared", "infrared"}, {"inspection", "inspection"}, {"electrical_tests", "electrical"}};

std::string key_of(const std::string& unit_id, const std::string& kind) { return "held_back:" + unit_id + ":" + kind; }

std::optional<analytics::HeldBack> decode(const std::string& kind, const std::string& value) {
  std::istringstream in(value);
  std::string day, received, file;
  if (!std::getline(in, day, '\t') || !std::getline(in, received, '\t')) return std::nullopt;
  std::getline(in, file);
  analytics::HeldBack h;
  h.kind = kind;
  try {
    h.newest = static_cast<analytics::Day>(std::stol(day));
  } catch (const std::exception&) {
    return std::nullopt;
  }
  h.rejected_on = received.substr(0, 10);  // the receipt's UTC date
  h.file = file;
  return h;
}

}  // namespace

std::string held_back_kind(const std::string& file_kind) {
  for (const auto& k : kKinds)
    if (file_kind == k[0]) return k[1];
  return "";
}

void record_held_back(store::Store& store, const std::string& file_kind,
                      const std::map<std::string, analytics::Day>& newest_day, const std::string& received_at,
                      const std::string& file) {
  const std::string kind = held_back_kind(file_kind);
  if (kind.empty()) return;
  for (const auto& [unit, day] : newest_day) {
    const std::string key = key_of(unit, kind);
    if (const auto old = store.state(key))
      if (const auto h = decode(kind, *old); h && h->newest > day) continue;  // an older file held back more
    store.set_state(key, std::to_string(day) + "\t" + received_at + "\t" + file);
  }
}

std::vector<analytics::HeldBack> held_back_of(store::Store& store, const std::string& unit_id) {
  std::vector<analytics::HeldBack> out;
  for (const auto& k : kKinds)
    if (const auto v = store.state(key_of(unit_id, k[1])))
      if (auto h = decode(k[1], *v)) out.push_back(std::move(*h));
  return out;
}

}  // namespace ferrum::ingest
