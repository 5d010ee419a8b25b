#include "daemon/assess/spilled_ranking.h"

#include <Poco/BinaryReader.h>
#include <Poco/BinaryWriter.h>
#include <Poco/MemoryStream.h>
#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstdlib>
#include <sstream>
#include <stdexcept>
#include <system_error>

namespace ferrum::assess {
namespace {

constexpr std::size_t kPendingBytes = 1 << 20;  // written a MiB at a time

int unnamed_temporary_file() {
  const char* dir = std::getenv("TMPDIR");
  int fd = -1;
  if (dir && *dir) fd = ::open(dir, O_TMPFILE | O_RDWR | O_CLOEXEC, 0600);
  if (fd < 0) fd = ::open("/tmp", O_TMPFILE | O_RDWR | O_CLOEXEC, 0600);
  return fd;  // -1: the rows stay in memory
}

[[noreturn]] void fail(const char* what) {
  throw std::system_error(errno, std::generic_category(),
                          std::string("the ranking's temporary file (in $TMPDIR or /tmp): ") + what);
}

// A unit in the file: Poco's binary form of every field, in the order of
// analytics::RankingInput (a field added there must be added here, as to
// the ranking cache). Written and read by this process only.
template <typename T>
void put(Poco::BinaryWriter& w, const std::optional<T>& v) {
  w << v.has_value();
  if (v) w << *v;
}

template <typename T>
void get(Poco::BinaryReader& r, std::optional<T>& v) {
  bool has = false;
  r >> has;
  v.reset();
  if (!has) return;
  T x{};
  r >> x;
  v = x;
}

}  // namespace

std::string spill_form(const analytics::RankingInput& u) {
  std::ostringstream out;
  Poco::BinaryWriter w(out);
  w << u.unit_id << u.site << u.rated_mva << u.criticality;
  put(w, u.customers_served);
  put(w, u.health_index);
  put(w, u.condition_index);
  w << u.band << u.confidence << u.missing;
  put(w, u.remaining_life_years);
  w << u.limiting_factor << u.beyond_horizon << u.horizon_years << u.action;
  put(w, u.action_year);
  w << u.action_reason << u.treats_paper << u.first_action.has_value();
  if (const auto& f = u.first_action)
    w << f->priority << f->due << f->text << f->reason << f->found << f->source << f->need << f->reference << f->outage
      << f->crew << f->overdue << f->status << f->work_date << f->work_note;
  const auto& in = u.site_inputs;
  put(w, in.peak_load_pu);
  put(w, in.emergency_load_pu);
  put(w, in.hours_above_normal_cyclic);
  w << in.normal_cyclic_limit_c << in.hot_spot_from_measured_top_oil;
  put(w, in.paper_moisture_pct);
  w << in.unsafe_inspection << in.active_arcing;
  put(w, in.c57104_2008_fault_condition);
  w.flush();
  return std::move(out).str();
}

analytics::RankingInput of_spill_form(const std::string& bytes) {
  Poco::MemoryInputStream in(bytes.data(), bytes.size());
  Poco::BinaryReader r(in);
  analytics::RankingInput u;
  r >> u.unit_id >> u.site >> u.rated_mva >> u.criticality;
  get(r, u.customers_served);
  get(r, u.health_index);
  get(r, u.condition_index);
  r >> u.band >> u.confidence >> u.missing;
  get(r, u.remaining_life_years);
  r >> u.limiting_factor >> u.beyond_horizon >> u.horizon_years >> u.action;
  get(r, u.action_year);
  bool has_first = false;
  r >> u.action_reason >> u.treats_paper >> has_first;
  if (has_first) {
    analytics::Action f;
    r >> f.priority >> f.due >> f.text >> f.reason >> f.found >> f.source >> f.need >> f.reference >> f.outage >>
        f.crew >> f.overdue >> f.status >> f.work_date >> f.work_note;
    u.first_action = std::move(f);
  }
  auto& si = u.site_inputs;
  get(r, si.peak_load_pu);
  get(r, si.emergency_load_pu);
  get(r, si.hours_above_normal_cyclic);
  r >> si.normal_cyclic_limit_c >> si.hot_spot_from_measured_top_oil;
  get(r, si.paper_moisture_pct);
  r >> si.unsafe_inspection >> si.active_arcing;
  get(r, si.c57104_2008_fault_condition);
  if (!r.good() || in.peek() != std::char_traits<char>::eof())
    throw std::runtime_error("the ranking's temporary file holds a damaged row");
  return u;
}

SpilledRanking::SpilledRanking(analytics::Day as_of, const analytics::RankingOptions& ranking,
                               const analytics::SiteViewOptions& site_view, bool keep_sites, Storage storage)
    : as_of_(as_of), options_(ranking), site_options_(site_view), keep_sites_(keep_sites),
      fd_(storage == Storage::temporary_file ? unnamed_temporary_file() : -1) {}

SpilledRanking::~SpilledRanking() {
  if (fd_ >= 0) ::close(fd_);
}

SpilledRanking::Record SpilledRanking::append(const std::string& line) {
  if (line.size() > UINT32_MAX) throw std::length_error("a ranking row of more than 4 GiB");
  const Record r{end_, static_cast<std::uint32_t>(line.size())};
  pending_ += line;
  end_ += line.size();
  if (pending_.size() >= kPendingBytes) {
    if (fd_ < 0) {
      memory_ += pending_;
    } else {
      std::uint64_t at = end_ - pending_.size();
      const char* p = pending_.data();
      std::size_t left = pending_.size();
      while (left > 0) {
        const ssize_t n = ::pwrite(fd_, p, left, static_cast<off_t>(at));
        if (n < 0) {
          if (errno == EINTR) continue;
          fail("cannot write");
        }
        p += n;
        at += static_cast<std::uint64_t>(n);
        left -= static_cast<std::size_t>(n);
      }
    }
    pending_.clear();
  }
  return r;
}

std::string SpilledRanking::read(Record r) const {
  const std::uint64_t written = end_ - pending_.size();
  if (r.offset >= written) return pending_.substr(r.offset - written, r.length);  // a record is never split
  if (fd_ < 0) return memory_.substr(r.offset, r.length);
  std::string out(r.length, '\0');
  std::size_t done = 0;
  while (done < out.size()) {
    const ssize_t n = ::pread(fd_, out.data() + done, out.size() - done, static_cast<off_t>(r.offset + done));
    if (n < 0) {
      if (errno == EINTR) continue;
      fail("cannot read");
    }
    if (n == 0) throw std::runtime_error("the ranking's temporary file is shorter than written");
    done += static_cast<std::size_t>(n);
  }
  return out;
}

void SpilledRanking::add(const analytics::RankingInput& unit) {
  if (finished_) throw std::logic_error("SpilledRanking::add after finish");
  records_.push_back(append(spill_form(unit)));
  auto [it, added] = site_index_.try_emplace(unit.site, static_cast<std::uint32_t>(site_names_.size()));
  if (added) site_names_.push_back(unit.site);
  site_of_.push_back(it->second);
}

void SpilledRanking::clear() {
  if (finished_) throw std::logic_error("SpilledRanking::clear after finish");
  records_.clear();
  site_of_.clear();
  site_index_.clear();
  site_names_.clear();
  pending_.clear();
  memory_.clear();
  end_ = 0;
  if (fd_ >= 0 && ::ftruncate(fd_, 0) != 0) fail("cannot empty");
}

void SpilledRanking::finish() {
  if (finished_) throw std::logic_error("SpilledRanking::finish twice");
  // Each site's units, in register order.
  std::vector<std::vector<std::uint32_t>> by_site(site_names_.size());
  for (std::uint32_t k = 0; k < site_of_.size(); ++k) by_site[site_of_[k]].push_back(k);
  std::vector<std::uint32_t>().swap(site_of_);
  site_index_.clear();
  // Site by site: the site view written into the units (load-transfer
  // targets in the first action), each unit written again as it now is and
  // given to the order. Row numbers of the order follow this pass.
  order_ = std::make_unique<analytics::RankingOrder>(as_of_, options_);
  order_->reserve(records_.size());
  std::vector<Record> ranked_rows;
  ranked_rows.reserve(records_.size());
  for (std::size_t s = 0; s < by_site.size(); ++s) {
    std::vector<analytics::RankingInput> units;
    units.reserve(by_site[s].size());
    for (const auto k : by_site[s]) units.push_back(of_spill_form(read(records_[k])));
    std::vector<std::uint32_t>().swap(by_site[s]);
    auto views = analytics::site_view(units, site_options_);
    analytics::apply_site_view(units, views);
    if (keep_sites_)
      for (const auto& v : views) sites_.push_back(append(site_element_text(v)));
    for (auto& u : units) {
      ranked_rows.push_back(append(spill_form(u)));
      order_->add(analytics::ranked_row(std::move(u), options_));
    }
  }
  records_ = std::move(ranked_rows);
  std::vector<std::string>().swap(site_names_);
  order_->finish();
  finished_ = true;
}

const analytics::FleetRanking& SpilledRanking::summary() const {
  if (!finished_) throw std::logic_error("SpilledRanking::summary before finish");
  return order_->summary();
}

TextElements SpilledRanking::sites() const {
  if (!finished_ || !keep_sites_) throw std::logic_error("SpilledRanking::sites without finish or keep_sites");
  return [this](const std::function<void(std::string_view)>& each) {
    for (const auto r : sites_) each(read(r));
  };
}

analytics::RankedRows SpilledRanking::rows() const {
  if (!finished_) throw std::logic_error("SpilledRanking::rows before finish");
  return [this](const analytics::RankedUnitSink& each) {
    for (std::size_t p = 0; p < order_->size(); ++p) {
      analytics::RankedUnit row =
          analytics::ranked_row(of_spill_form(read(records_[order_->row_at(p)])), options_);
      order_->place(p, row);
      each(row);
    }
  };
}

}  // namespace ferrum::assess
