// The [costs] and [plan] keys of ferrum.ini (issue 22: the budgeted plan).
// Declared here, in their own table, and added to the site configuration's
// key table by site_config.cpp; values are kept as checked text in
// SiteConfig::costs and SiteConfig::plan and turned into the analytics
// options by daemon/assess/plan_service.
#pragma once

#include <string>
#include <vector>

namespace ferrum::config {

struct SiteConfig;

struct PlanKey {
  const char* section;       // "costs" or "plan"
  const char* name;
  const char* default_text;  // "" = not set
  const char* comment;
  enum Kind { number, whole, yes_no, label } kind;
  double lo, hi;             // bounds of number and whole
};

const std::vector<PlanKey>& plan_keys();

// Throws ConfigError naming section.key when the text is not valid.
void check_plan_key(const PlanKey& key, const std::string& value);

// [plan] budget_per_year is set: `ferrum plan` works without --budget and the
// fleet report has the plan section.
bool plan_configured(const SiteConfig& c);

}  // namespace ferrum::config
