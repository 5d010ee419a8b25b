#include "daemon/assess/assessment_service.h"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cctype>
#include <condition_variable>
#include <exception>
#include <fstream>
#include <memory>
#include <mutex>
#include <optional>
#include <sstream>
#include <thread>

#include "daemon/assess/site_tables.h"
#include "daemon/pipeline/held_back_record.h"
#include "daemon/reporting/report_writer.h"

namespace ferrum::assess {

analytics::AssessmentOptions options_from_config(const config::SiteConfig& config, const site::SiteRoot* root) {
  // The site's tables first: the options' defaults are read from the tables in force.
  if (root) load_site_tables(*root);
  analytics::AssessmentOptions o;
  o.thermal.method = config.thermal_method == "ieee_c57_91" ? analytics::ThermalMethod::ieee_c57_91
                                                            : analytics::ThermalMethod::iec60076_7;
  o.thermal.inspection.interval_days = config.inspection_interval_days;
  o.thermal.measured_top_oil_above_k = config.measured_top_oil_above_k;
  o.thermal.infrared.resolution_k = config.infrared_resolution_k;
  auto& h = o.health;
  for (const auto& [factor, w] : config.health_weights) {
    if (factor == "dga") h.weight_dga = w;
    else if (factor == "oil_quality") h.weight_oil_quality = w;
    else if (factor == "paper") h.weight_paper = w;
    else if (factor == "thermal") h.weight_thermal = w;
    else if (factor == "infrared") h.weight_infrared = w;
    else if (factor == "inspection") h.weight_inspection = w;
    else if (factor == "age") h.weight_age = w;
    else
      for (auto& e : h.electrical_factors)
        if (e.name == factor) e.weight = w;
  }
  o.electrical.reference_c = config.electrical_reference_c;
  o.electrical.pf_correction = config.pf_correction;
  if (!config.health_weights.empty()) h.source += "; weights overridden in ferrum.ini [health]";
  // The decision's keys of [ranking] (analytics/decision/decision.h).
  for (const auto& [key, v] : config.ranking) {
    if (key == "life_horizon_years") o.life.horizon_years = v;
    else if (key == "expected_life_years") o.life.expected_life_years = v;
    else if (key == "lead_time_months") o.actions.decision.lead_time_months = static_cast<int>(std::lround(v));
    else if (key == "replace_within_years") o.actions.decision.replace_within_years = v;
    else if (key == "planning_window_years") o.actions.decision.planning_window_years = v;
    else if (key == "wet_paper_pct") o.actions.decision.wet_paper_pct = v;
    else if (key == "dry_out_min_dp") o.actions.decision.dry_out_min_dp = v;
  }
  auto cuts4 = [](const std::vector<double>& v) { return analytics::RatingCuts{v[0], v[1], v[2], v[3]}; };
  for (const auto& [key, v] : config.health_bands) {
    if (key == "dga_cuts") h.dga_cuts = cuts4(v);
    else if (key == "oil_cuts") h.oil_cuts = cuts4(v);
    else if (key == "furan_ppm_cuts") h.furan_ppm_cuts = cuts4(v);
    else if (key == "dp_cuts") h.dp_cuts = cuts4(v);
    else if (key == "ageing_factor_cuts") h.ageing_factor_cuts = cuts4(v);
    else if (key == "age_cuts") h.age_cuts = cuts4(v);
    else if (key.rfind("gas_", 0) == 0) {
      std::string gas = key.substr(4);
      for (char& c : gas) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
      for (auto& g : h.gas_bands)
        if (g.gas == gas) std::copy(v.begin(), v.end(), g.upper.begin());
    }
  }
  if (!config.health_bands.empty()) h.source += "; score bands overridden in ferrum.ini [health]";
  return o;
}

analytics::UnitAssessment assess_unit(store::Store& store, const std::string& unit_id, analytics::Day as_of,
                                      const analytics::AssessmentOptions& options) {
  analytics::UnitData data = reporting::data_as_of(store.unit_data(unit_id), as_of);
  data.held_back = ingest::held_back_of(store, unit_id);
  return analytics::assess_unit(data, as_of, options);
}

std::vector<analytics::UnitAssessment> assess_fleet(store::Store& store, analytics::Day as_of,
                                                    const analytics::AssessmentOptions& options) {
  std::vector<analytics::UnitAssessment> out;
  for (const auto& u : store.units()) out.push_back(assess_unit(store, u.unit_id, as_of, options));
  return out;
}

namespace {

// Which items are finished, for a caller that takes them in order: workers
// take the next index, run at most `window` ahead of the caller, and mark
// what they finished; the first exception stops everything.
class InOrder {
 public:
  InOrder(std::size_t n, std::size_t window) : done_(n, false), window_(window) {}

  // A worker's next index, or nothing when all are taken or work stopped.
  std::optional<std::size_t> take() {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return failed_ || next_take_ >= done_.size() || next_take_ < next_emit_ + window_; });
    if (failed_ || next_take_ >= done_.size()) return std::nullopt;
    return next_take_++;
  }
  void finished(std::size_t i) {
    {
      std::lock_guard lock(mutex_);
      done_[i] = true;
    }
    changed_.notify_all();
  }
  void fail(std::exception_ptr e) {
    {
      std::lock_guard lock(mutex_);
      if (!error_) error_ = e;
      failed_ = true;
    }
    changed_.notify_all();
  }
  // Waits for the caller's next index; rethrows a worker's exception.
  std::size_t next() {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return failed_ || done_[next_emit_]; });
    if (failed_) std::rethrow_exception(error_);
    return next_emit_;
  }
  // The caller is done with its index: the workers may go one further.
  void emitted() {
    {
      std::lock_guard lock(mutex_);
      ++next_emit_;
    }
    changed_.notify_all();
  }
  void stop() { fail(nullptr); }

 private:
  std::mutex mutex_;
  std::condition_variable changed_;
  std::vector<bool> done_;
  std::size_t window_;
  std::size_t next_take_ = 0, next_emit_ = 0;
  bool failed_ = false;
  std::exception_ptr error_;
};

}  // namespace

void run_in_order(const store::Store& database, std::size_t n, unsigned workers,
                  const std::function<void(store::Store&, std::size_t)>& work,
                  const std::function<void(std::size_t)>& emit) {
  if (workers == 0) workers = std::max(1u, std::thread::hardware_concurrency());
  workers = static_cast<unsigned>(std::min<std::size_t>(workers, std::max<std::size_t>(n, 1)));
  constexpr std::size_t kWindowPerWorker = 16;
  InOrder order(n, kWindowPerWorker * workers);
  std::vector<std::thread> threads;
  for (unsigned w = 0; w < workers; ++w) {
    threads.emplace_back([&] {
      try {
        auto store = database.open_another();
        while (auto i = order.take()) {
          work(*store, *i);
          order.finished(*i);
        }
      } catch (...) {
        order.fail(std::current_exception());
      }
    });
  }
  try {
    for (std::size_t i = 0; i < n; ++i) {
      emit(order.next());
      order.emitted();
    }
  } catch (...) {
    order.stop();
    for (auto& t : threads) t.join();
    throw;
  }
  for (auto& t : threads) t.join();
}

void assess_units_parallel(const store::Store& database, const std::vector<std::string>& ids, analytics::Day as_of,
                           const analytics::AssessmentOptions& options, unsigned workers,
                           const std::function<void(analytics::UnitAssessment&&)>& emit) {
  // At most a window of finished assessments is held (run_in_order). A slot
  // is a pointer, not the assessment's 3 KB in place: slots of the whole
  // fleet's size, all touched when made, were most of what grew with the
  // fleet in `assess` and `rank` (bench/results.md, "Peak memory").
  std::vector<std::unique_ptr<analytics::UnitAssessment>> slots(ids.size());
  run_in_order(
      database, ids.size(), workers,
      [&](store::Store& store, std::size_t i) {
        slots[i] = std::make_unique<analytics::UnitAssessment>(assess_unit(store, ids[i], as_of, options));
      },
      [&](std::size_t i) {
        const auto a = std::move(slots[i]);
        emit(std::move(*a));
      });
}

std::vector<std::string> register_unit_ids(store::Store& store) {
  std::vector<std::string> ids;
  const auto units = store.unit_sites();
  ids.reserve(units.size());
  for (const auto& u : units) ids.push_back(u.unit_id);
  return ids;
}

void for_each_fleet_assessment(store::Store& store, const std::vector<std::string>& ids, analytics::Day as_of,
                               const analytics::AssessmentOptions& options,
                               const std::function<void(analytics::UnitAssessment&&)>& emit,
                               const FleetProgress& progress) {
  std::size_t done = 0;
  assess_units_parallel(store, ids, as_of, options, 0, [&](analytics::UnitAssessment&& a) {
    emit(std::move(a));
    if (progress) progress("assessing", ++done, ids.size());
  });
}

std::vector<analytics::UnitAssessment> assess_fleet_parallel(store::Store& store,
                                                             analytics::Day as_of,
                                                             const analytics::AssessmentOptions& options,
                                                             const FleetProgress& progress) {
  const auto ids = register_unit_ids(store);
  std::vector<analytics::UnitAssessment> out;
  out.reserve(ids.size());
  for_each_fleet_assessment(store, ids, as_of, options, [&](analytics::UnitAssessment&& a) { out.push_back(std::move(a)); },
                            progress);
  return out;
}

analytics::RankingOptions ranking_options_from_config(const config::SiteConfig& config) {
  analytics::RankingOptions o;
  bool overridden = false;
  for (const auto& [key, v] : config.ranking) {
    if (key == "pof_as_new") o.pof_as_new = v;
    else if (key == "pof_at_zero") o.pof_at_zero = v;
    else if (key == "weight_criticality") o.weight_criticality = v;
    else if (key == "weight_customers") o.weight_customers = v;
    else if (key == "weight_mva") o.weight_mva = v;
    else if (key == "customers_reference") o.customers_reference = v;
    else if (key == "mva_reference") o.mva_reference = v;
    else continue;  // the decision's keys (options_from_config)
    overridden = true;
  }
  if (overridden) o.pof_source += "; overridden in ferrum.ini [ranking]";
  return o;
}

analytics::SiteViewOptions site_view_options_from_config(const config::SiteConfig& config) {
  analytics::SiteViewOptions o;
  o.wet_paper_pct = config.site_wet_paper_pct;
  return o;
}

std::vector<analytics::SiteView> apply_site_view(std::vector<analytics::UnitAssessment>& units,
                                                 const config::SiteConfig& config) {
  auto sites = analytics::site_view(units, site_view_options_from_config(config));
  analytics::apply_site_view(units, sites);
  return sites;
}

std::vector<analytics::SiteView> apply_site_view(std::vector<analytics::RankingInput>& units,
                                                 const config::SiteConfig& config) {
  auto sites = analytics::site_view(units, site_view_options_from_config(config));
  analytics::apply_site_view(units, sites);
  return sites;
}

}  // namespace ferrum::assess
