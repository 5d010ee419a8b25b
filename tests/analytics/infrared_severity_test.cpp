#include "analytics/infrared_severity.h"

#include <gtest/gtest.h>

#include <algorithm>

#include "analytics/thermal_assessment.h"

namespace ferrum::analytics {
namespace {

// ANSI/NETA MTS ΔT table (checked against a public reproduction): every band on both sides.
TEST(InfraredSeverity, NetaOverReferenceBands) {
  EXPECT_EQ(neta_priority_over_reference(0.9), 0);
  EXPECT_EQ(neta_priority_over_reference(1.0), 4);
  EXPECT_EQ(neta_priority_over_reference(3.0), 4);
  EXPECT_EQ(neta_priority_over_reference(3.1), 3);
  EXPECT_EQ(neta_priority_over_reference(15.0), 3);
  EXPECT_EQ(neta_priority_over_reference(15.1), 1);  // the table has no priority 2 over reference
  EXPECT_EQ(neta_priority_over_reference(-5), 0);
}

TEST(InfraredSeverity, NetaOverAmbientBands) {
  EXPECT_EQ(neta_priority_over_ambient(0.9), 0);
  EXPECT_EQ(neta_priority_over_ambient(1.0), 4);
  EXPECT_EQ(neta_priority_over_ambient(10.0), 4);
  EXPECT_EQ(neta_priority_over_ambient(10.1), 3);
  EXPECT_EQ(neta_priority_over_ambient(20.0), 3);
  EXPECT_EQ(neta_priority_over_ambient(20.1), 2);
  EXPECT_EQ(neta_priority_over_ambient(40.0), 2);
  EXPECT_EQ(neta_priority_over_ambient(40.1), 1);
}

// NETA priority 4 -> severity 1, priority 1 -> severity 4 (ferrum numbers severity upwards).
TEST(InfraredSeverity, SeverityRunsOppositeToPriority) {
  EXPECT_EQ(severity_from_neta_priority(4), 1);
  EXPECT_EQ(severity_from_neta_priority(1), 4);
  EXPECT_EQ(severity_from_neta_priority(0), 0);
}

// Computed from the Infraspection Institute load correction: 10 K at 50 % load -> 40 K with
// n = 2, 30.3 K with n = 1.6.
TEST(InfraredSeverity, LoadCorrectionWorkedValue) {
  EXPECT_DOUBLE_EQ(rise_at_rated_load(10, 50, 2.0), 40.0);
  EXPECT_NEAR(rise_at_rated_load(10, 50, 1.6), 30.3, 0.05);
}

TEST(InfraredSeverity, SimilarComponentDecidesAmbientOnlyWithoutOne) {
  InfraredScan s;
  s.component = "HV bushing H1 connector";
  s.spot_c = 45;
  s.reference_c = 35;  // 10 K -> 40 K corrected at 50 % (n = 2): > 15 -> NETA 1 (ANSI/NETA MTS table)
  s.ambient_c = 30;    // 15 K over ambient: reported, not classified while a reference exists
  s.load_pct = 50;
  auto f = assess_infrared_scan(s, {});
  EXPECT_EQ(*f.rise_over_reference_k, 10);
  EXPECT_EQ(*f.rise_over_ambient_k, 15);
  EXPECT_EQ(*f.corrected_rise_k, 40);
  EXPECT_EQ(*f.severity, 4);
  // The label people read is the maintenance priority, spelled out; the
  // severity number stays in JSON (ANSI/NETA MTS thermographic table: "major
  // discrepancy, repair immediately").
  EXPECT_EQ(f.severity_text.rfind("priority 1: repair immediately", 0), 0u) << f.severity_text;
  EXPECT_EQ(f.severity_text.find("severity"), std::string::npos);
  EXPECT_FALSE(f.low_load);
  // At rated load 10 K over a similar component is NETA 3 (4-15 °C) -> severity 2.
  s.load_pct = 100;
  f = assess_infrared_scan(s, {});
  EXPECT_EQ(*f.severity, 2);
  // A sound connection: 0.5 K over its neighbour, 15 K over ambient -> no finding
  // (ferrum's reading: the ambient column is used only without a similar component).
  s.spot_c = 35.5;
  f = assess_infrared_scan(s, {});
  EXPECT_FALSE(f.severity);
  // Only the ambient reading available: 15 K over ambient at rated load -> NETA 3 (11-20 °C) -> severity 2.
  s.spot_c = 45;
  s.reference_c.reset();
  f = assess_infrared_scan(s, {});
  EXPECT_EQ(*f.severity, 2);
  EXPECT_NE(f.severity_text.find("over ambient"), std::string::npos);
}

TEST(InfraredSeverity, OilHeatedPartsAreNotClassifiedByTheConnectionTable) {
  InfraredScan s;
  s.component = "Main tank top";
  s.spot_c = 60;
  s.ambient_c = 20;  // 40 K over ambient would be NETA 2 for a connection
  s.load_pct = 50;
  const auto f = assess_infrared_scan(s, {});
  EXPECT_FALSE(f.severity);
  EXPECT_EQ(*f.rise_over_ambient_k, 40);
  EXPECT_FALSE(f.corrected_rise_k);
  EXPECT_TRUE(is_oil_heated_part("cooler bank 2"));
  EXPECT_FALSE(is_oil_heated_part("LV bushing X2 connector"));
}

TEST(InfraredSeverity, LowLoadScanFlagged) {
  InfraredScan s;
  s.spot_c = 32;
  s.reference_c = 30;
  s.load_pct = 39.9;
  InfraredOptions o;
  auto f = assess_infrared_scan(s, o);
  EXPECT_TRUE(f.low_load);
  EXPECT_NE(f.severity_text.find("unreliable"), std::string::npos);
  s.load_pct = 40;
  EXPECT_FALSE(assess_infrared_scan(s, o).low_load);
}

TEST(InfraredSeverity, ExponentClampedToPublishedRange) {
  InfraredScan s;
  s.spot_c = 40;
  s.reference_c = 30;
  s.load_pct = 50;
  InfraredOptions o;
  o.load_exponent = 3.0;  // outside 1.6..2.0
  EXPECT_DOUBLE_EQ(*assess_infrared_scan(s, o).corrected_rise_k, 40.0);
}

TEST(InfraredSeverity, NothingToCompareWith) {
  InfraredScan s;
  s.spot_c = 80;
  const auto f = assess_infrared_scan(s, {});
  EXPECT_FALSE(f.severity);
  EXPECT_NE(f.severity_text.find("not classified"), std::string::npos);
}

InfraredScan scan(Day date, const char* component, double spot, double reference) {
  InfraredScan s;
  s.date = date;
  s.component = component;
  s.spot_c = spot;
  s.reference_c = reference;
  return s;
}

TEST(InfraredSeverity, SurveyKeepsLatestPerComponentUpToAsOf) {
  const std::vector<InfraredScan> v = {scan(100, "A", 60, 30), scan(200, "A", 31, 30),
                                       scan(300, "A", 90, 30),  // after as_of
                                       scan(150, "B", 50, 30)};
  const auto f = assess_infrared_survey(v, 250, {});
  ASSERT_EQ(f.size(), 2u);
  EXPECT_EQ(f[0].component, "B");  // 20 K over reference: most severe first
  EXPECT_EQ(f[1].date, 200);
}

// Issue #16: a rise below the camera's resolution (default 1 K) is not
// extrapolated to rated load and is no job; a rise above it is corrected and
// classified as before.
InfraredScan scan_at_load(double rise_k, double load_pct) {
  InfraredScan s;
  s.date = days_from_civil(2026, 9, 22);
  s.component = "LV bushing X2 clamp";
  s.reference_c = 30;
  s.spot_c = 30 + rise_k;
  s.ambient_c = 20;
  s.load_pct = load_pct;
  s.image_ref = "IR-0457.jpg";
  s.note = "clamp discoloured";
  return s;
}

std::size_t infrared_jobs(const InfraredScan& s, const ThermalOptions& o = {}) {
  UnitData d;
  d.info.unit_id = "T9";
  d.infrared.push_back(s);
  UnitAssessment a;
  assess_thermal(d, days_from_civil(2026, 12, 1), o, a);
  return static_cast<std::size_t>(std::count_if(a.actions.begin(), a.actions.end(), [](const Action& x) {
    return x.text.find("LV bushing X2 clamp") != std::string::npos;
  }));
}

TEST(InfraredSeverity, RiseBelowResolutionIsNotCorrectedAndNoJob) {
  // 0.4 K at 25 % load would be 6.4 K at rated load (x 16, Infraspection
  // Institute correction with n = 2) and NETA priority 3; it is within a
  // camera's accuracy (common practice, no published source), so no finding.
  const auto f = assess_infrared_scan(scan_at_load(0.4, 25), {});
  EXPECT_NEAR(*f.rise_over_reference_k, 0.4, 1e-9);
  EXPECT_FALSE(f.corrected_rise_k);
  EXPECT_FALSE(f.severity);
  EXPECT_NE(f.severity_text.find("below the camera resolution of 1.0 K"), std::string::npos) << f.severity_text;
  EXPECT_EQ(infrared_jobs(scan_at_load(0.4, 25)), 0u);
}

TEST(InfraredSeverity, RiseAboveResolutionIsCorrectedAndAJob) {
  // 1.5 K at 50 % load -> 6.0 K at rated load (Infraspection Institute
  // correction, n = 2): 3..15 K over a similar component, NETA priority 3
  // (ANSI/NETA MTS ΔT table), severity 2.
  const auto f = assess_infrared_scan(scan_at_load(1.5, 50), {});
  EXPECT_NEAR(*f.corrected_rise_k, 6.0, 1e-9);
  EXPECT_EQ(f.severity, 2);
  EXPECT_EQ(infrared_jobs(scan_at_load(1.5, 50)), 1u);
}

TEST(InfraredSeverity, ResolutionIsConfigurable) {
  // With a coarser camera (2 K, ferrum.ini [analysis] infrared_resolution_k)
  // the 1.5 K rise is no longer a job (common practice, no published source).
  ThermalOptions o;
  o.infrared.resolution_k = 2.0;
  EXPECT_FALSE(assess_infrared_scan(scan_at_load(1.5, 50), o.infrared).severity);
  EXPECT_EQ(infrared_jobs(scan_at_load(1.5, 50), o), 0u);
}

TEST(InfraredSeverity, FindingKeepsLoadImageAndNote) {
  const auto f = assess_infrared_scan(scan_at_load(12, 80), {});
  EXPECT_EQ(f.load_pct, 80);
  EXPECT_EQ(f.image_ref, "IR-0457.jpg");
  EXPECT_EQ(f.note, "clamp discoloured");
}

}  // namespace
}  // namespace ferrum::analytics
