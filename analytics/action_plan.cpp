#include "analytics/action_plan.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <map>
#include <tuple>

#include "analytics/health_index.h"
#include "analytics/work_status.h"

namespace ferrum::analytics {

namespace {

std::string fmt(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

// Lower case, single spaces, no surrounding space or final full stop.
std::string merge_key(const std::string& text) {
  std::string k;
  for (char c : text) {
    if (std::isspace(static_cast<unsigned char>(c))) {
      if (!k.empty() && k.back() != ' ') k += ' ';
    } else {
      k += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    }
  }
  while (!k.empty() && (k.back() == ' ' || k.back() == '.')) k.pop_back();
  return k;
}

void add_reason(std::string& reasons, const std::string& r) {
  if (r.empty()) return;
  // Reasons are joined with "; ": compare against each part, not substrings.
  std::size_t start = 0;
  while (start <= reasons.size()) {
    std::size_t end = reasons.find("; ", start);
    if (reasons.compare(start, end == std::string::npos ? std::string::npos : end - start, r) == 0) return;
    if (end == std::string::npos) break;
    start = end + 2;
  }
  reasons += (reasons.empty() ? "" : "; ") + r;
}

void add_data_actions(const ActionPlanOptions& o, UnitAssessment& a) {
  for (const auto& f : data_freshness(a)) {
    const char* text = nullptr;
    int priority = 4;
    if (f.kind == "oil") {
      text = "Take an oil sample for DGA, oil quality and furans";
      priority = 3;
    } else if (f.kind == "infrared") {
      text = "Carry out an infrared survey";
    } else if (f.kind == "inspection") {
      text = "Carry out a visual inspection";
    }
    if (!text) continue;  // the load record is the daemon's, not a field task
    if (!f.latest)
      a.actions.push_back({priority, a.as_of + o.data_due_days, text, "no " + f.kind + " data on record"});
    else if (f.age_years && *f.age_years > o.stale_after_years)
      a.actions.push_back({priority, a.as_of + o.data_due_days, text,
                           "latest " + f.kind + " data " + fmt(*f.age_years, 1) + " years old"});
  }
}

}  // namespace

std::vector<Action> merge_actions(const std::vector<Action>& actions) {
  std::vector<Action> out;
  std::map<std::string, std::size_t> index;
  for (const auto& act : actions) {
    auto [it, fresh] = index.emplace(merge_key(act.text), out.size());
    if (fresh) {
      out.push_back(act);
      continue;
    }
    Action& m = out[it->second];
    if (act.priority < m.priority) m.text = act.text;  // the most urgent wording leads
    m.priority = std::min(m.priority, act.priority);
    m.due = std::min(m.due, act.due);
    add_reason(m.reason, act.reason);
  }
  std::sort(out.begin(), out.end(), [](const Action& x, const Action& y) {
    return std::tie(x.priority, x.due, x.text) < std::tie(y.priority, y.due, y.text);
  });
  return out;
}

Action dated_action(int priority, Day found, int due_days, std::string text, std::string reason,
                    const char* source, std::string need, const char* crew, bool outage) {
  Action act;
  act.priority = priority;
  act.found = found;
  act.due = found + due_days;
  act.text = std::move(text);
  act.reason = std::move(reason);
  act.source = source ? source : "";
  act.need = std::move(need);
  act.crew = crew ? crew : "";
  act.outage = outage;
  return act;
}

void finalize_actions(UnitAssessment& a) { finalize_actions(ActionPlanOptions{}, a); }

void finalize_actions(const ActionPlanOptions& o, UnitAssessment& a) {
  add_data_actions(o, a);
  Decision d = decide(o.decision, a);
  for (auto& act : decision_actions(o.decision, a, d)) a.actions.push_back(std::move(act));
  a.actions = merge_actions(a.actions);
  apply_work_status(a.work_status, a.unit.unit_id, a.actions, a.closed_actions);
  if (!a.actions.empty()) d.first_action = a.actions.front();
  if (!d.year) d.year = civil_from_days(d.first_action ? d.first_action->due : a.as_of + 365).year;
  a.decision = std::move(d);
}

}  // namespace ferrum::analytics
