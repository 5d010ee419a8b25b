#include "analytics/action_plan.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <map>
#include <optional>
#include <tuple>

#include "analytics/calendar.h"
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
  // After a full sentence the next reason is a sentence of its own (no ".;").
  if (reasons.empty()) {
    reasons = r;
  } else if (reasons.back() == '.') {
    std::string sentence = r;
    sentence[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(sentence[0])));
    if (sentence.back() != '.') sentence += '.';
    if (reasons.find(" " + sentence) != std::string::npos) return;  // already said
    reasons += " " + sentence;
  } else {
    reasons += "; " + r;
  }
}

void add_data_actions(const ActionPlanOptions& o, UnitAssessment& a) {
  const int stale_days = static_cast<int>(std::lround(o.stale_after_years * 365.25));
  for (const auto& f : data_freshness(a)) {
    const char* text = nullptr;
    int priority = 4;
    const char* crew = kCrewMaintenance;
    std::string need;
    if (f.kind == "oil") {
      text = "Take an oil sample for DGA, oil quality and furans";
      priority = 3;
      crew = kCrewOilSampling;
      need = "oil-resample";
    } else if (f.kind == "infrared") {
      text = "Carry out an infrared survey";
      crew = kCrewThermography;
      need = "ir-survey";
    } else if (f.kind == "inspection") {
      text = "Carry out a visual inspection";
      need = "inspection-visit";
    }
    if (!text) continue;  // the load record is the daemon's, not a field task
    // None on record: due data_due_days after the unit's first full year in
    // service ended without any (from the register's year built), so that the
    // date holds from week to week and falls overdue as the cover says; a
    // unit built this year (or of unknown year) counts from the assessment.
    // Stale: due data_due_days after the latest data went stale.
    if (!f.latest) {
      const int built = a.unit.year_built;
      const bool dated = built > 0 && built < civil_from_days(a.as_of).year;
      a.actions.push_back(dated_action(priority, dated ? days_from_civil(built + 1, 1, 1) : a.as_of, o.data_due_days,
                                       text,
                                       "no " + f.kind + " data on record" +
                                           (dated ? " (in service since " + std::to_string(built) + ")" : ""),
                                       kSourceDataAge, need, crew));
    } else if (f.age_years && *f.age_years > o.stale_after_years) {
      a.actions.push_back(dated_action(priority, *f.latest, stale_days + o.data_due_days, text,
                                       "latest " + f.kind + " data " + fmt(*f.age_years, 1) + " years old (" +
                                           format_day(*f.latest) + ")",
                                       kSourceDataAge, need, crew));
    }
  }
}

bool has_need(const std::vector<Action>& v, const std::string& need) {
  return std::any_of(v.begin(), v.end(), [&](const Action& x) { return x.need == need; });
}

// The oil sample that gave the paper's water content: the latest with water.
Day water_sample_date(const UnitAssessment& a) {
  for (const auto& act : a.actions)
    if (act.need == "oil-recondition" && act.found) return act.found;
  return a.oil.sample_date.value_or(a.as_of);
}

// Coordination rules (see the header). Runs on the merged list.
void coordinate(const ActionPlanOptions& o, UnitAssessment& a, const Decision& d) {
  auto& v = a.actions;
  // No oil reclamation for a unit that is replaced: reclamation treats the
  // oil, not the paper that ends the unit's life (common practice, no
  // published source).
  if (d.action == "replace" && has_need(v, "oil-reclaim")) {
    v.erase(std::remove_if(v.begin(), v.end(), [](const Action& x) { return x.need == "oil-reclaim"; }), v.end());
    for (auto& x : v)
      if (x.need == "replace") add_reason(x.reason, "oil reclamation not proposed: it does not restore the paper");
  }
  // Wet paper: dry out the active part rather than recondition the oil.
  const auto& pm = a.oil.paper_moisture_pct;
  if (pm && *pm >= o.decision.wet_paper_pct) {
    const auto& dp = a.paper.dp_estimate;
    const std::string wet = "paper water content " + fmt(*pm, 1) + " % (Fessler equilibrium from the oil), at or above " +
                            fmt(o.decision.wet_paper_pct, 1) + " %";
    if (dp && *dp < o.decision.dry_out_min_dp) {
      for (auto& x : v)
        if (x.need == "oil-recondition")
          add_reason(x.reason, wet + ", but drying out the active part is not advised: paper DP about " + fmt(*dp, 0) +
                                   " is below " + fmt(o.decision.dry_out_min_dp, 0) + ", too brittle to dry out");
    } else if (!has_need(v, "dry-out")) {
      v.push_back(dated_action(3, water_sample_date(a), o.dry_out_due_days,
                               "Dry out the active part (and the oil) during an outage",
                               wet + ": oil reconditioning alone would not dry the paper", kSourceOilSample, "dry-out",
                               kCrewMaintenance, true));
    }
  }
  // Drying out the active part dries the oil too: it replaces reconditioning.
  auto dry = std::find_if(v.begin(), v.end(), [](const Action& x) { return x.need == "dry-out"; });
  auto rec = std::find_if(v.begin(), v.end(), [](const Action& x) { return x.need == "oil-recondition"; });
  if (dry != v.end() && rec != v.end()) {
    dry->priority = std::min(dry->priority, rec->priority);
    if (rec->due < dry->due) dry->due = rec->due, dry->found = rec->found;
    add_reason(dry->reason, "instead of oil reconditioning (" + rec->reason + ")");
    v.erase(rec);
  }
}

// Most urgent first; at equal priority and due date the jobs come before the
// outage line that gathers them, so that a unit's first action (the ranking's
// "first action") is a job, not "plan one outage for ...".
void sort_actions(std::vector<Action>& v) {
  std::sort(v.begin(), v.end(), [](const Action& x, const Action& y) {
    const bool xo = x.need == "outage", yo = y.need == "outage";
    return std::tie(x.priority, x.due, xo, x.text) < std::tie(y.priority, y.due, yo, y.text);
  });
}

}  // namespace

std::vector<Action> merge_actions(const std::vector<Action>& actions) {
  std::vector<Action> out;
  std::map<std::string, std::size_t> index;
  for (const auto& act : actions) {
    auto [it, fresh] = index.emplace(act.need.empty() ? "text:" + merge_key(act.text) : act.need, out.size());
    if (fresh) {
      out.push_back(act);
      continue;
    }
    Action& m = out[it->second];
    if (act.priority < m.priority) {  // the most urgent wording, evidence and crew lead
      m.text = act.text;
      m.source = act.source;
      m.crew = act.crew;
    }
    m.priority = std::min(m.priority, act.priority);
    if (act.due < m.due) m.due = act.due, m.found = act.found;
    m.outage = m.outage || act.outage;
    add_reason(m.reason, act.reason);
  }
  sort_actions(out);
  return out;
}

std::optional<Action> outage_action(const std::vector<Action>& actions) {
  const Action* lead = nullptr;
  int priority = 5, jobs = 0;
  for (const auto& x : actions) {
    if (!x.outage || x.need == "outage") continue;
    if (!lead || x.due < lead->due) lead = &x;
    priority = std::min(priority, x.priority);
    ++jobs;
  }
  if (!lead) return std::nullopt;
  // The jobs stay on the list as their own actions (each with its reference,
  // crew and work status): this line counts them and never repeats their
  // words, so that no list shows a job twice and no job's own text ("...;
  // plan an outage; ...") ends up inside it.
  const std::string text = jobs == 1 ? "Plan an outage for the job that needs this unit out of service (listed on its own)"
                                     : "Plan one outage for the " + std::to_string(jobs) +
                                           " jobs that need this unit out of service (each listed on its own)";
  return dated_action(priority, lead->found, static_cast<int>(lead->due - lead->found), text,
                      jobs == 1 ? "the job needs the unit out of service, by its due date"
                                : "do them in one outage, by the earliest due date",
                      lead->source.c_str(), "outage", kCrewEngineering, true);
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
  coordinate(o, a, d);
  auto mark = [&](Action& act) {
    act.reference = action_reference(a.unit.unit_id, act.need.empty() ? merge_key(act.text) : act.need);
    act.overdue = act.due < a.as_of;
  };
  for (auto& act : a.actions) mark(act);
  // Planners' work status (booked, done, cancelled: the work-status kind of
  // issue #16) is applied here, once references and overdue flags are set,
  // and before the one outage action is gathered, so that it lists only the
  // jobs still to be done (a booked job stays in it).
  apply_work_status(a.work_status, a.unit.unit_id, a.actions, a.closed_actions);
  if (auto outage = outage_action(a.actions)) {
    mark(*outage);
    std::vector<Action> one{std::move(*outage)};
    apply_work_status(a.work_status, a.unit.unit_id, one, a.closed_actions);
    for (auto& x : one) a.actions.push_back(std::move(x));
  }
  sort_actions(a.actions);
  if (!a.actions.empty()) d.first_action = a.actions.front();
  if (!d.year)
    d.year = std::max(civil_from_days(a.as_of).year,
                      civil_from_days(d.first_action ? d.first_action->due : a.as_of + 365).year);
  a.decision = std::move(d);
}

}  // namespace ferrum::analytics
