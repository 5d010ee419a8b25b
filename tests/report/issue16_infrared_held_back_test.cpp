// Issue #16 in the unit report and the alert PDF: the load at survey time,
// the thermogram reference and the thermographer's note; the data a rejected
// file holds back; the alert's printed time. What is printed is ferrum's own
// layout (no standard); the sentences are checked as the reader sees them.
#include <gtest/gtest.h>

#include "report/alert_report.h"
#include "report/unit_report.h"
#include "tests/report/pdf_tools.h"
#include "tests/report/report_fixtures.h"

namespace ferrum::report {
namespace {
using namespace testing;

using Issue16ReportTest = RenderedPdfTest;

TEST_F(Issue16ReportTest, InfraredFindingShowsLoadImageAndNote) {
  auto unit = fixtures::filled_unit();
  ASSERT_FALSE(unit.infrared.empty());
  unit.infrared[0].load_pct = 63;
  unit.infrared[0].image_ref = "IR-0457.jpg";
  unit.infrared[0].note = "clamp discoloured, bolt loose";
  const std::string path = temp_path("issue16-ir.pdf");
  render_unit_report(unit, nullptr, {}, fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Load at survey"), std::string::npos);
  EXPECT_NE(text.find("63 %"), std::string::npos);
  EXPECT_NE(text.find("image IR-0457.jpg"), std::string::npos);
  EXPECT_NE(text.find("thermographer's note: clamp discoloured, bolt loose"), std::string::npos);
}

TEST_F(Issue16ReportTest, HeldBackDataIsNamedOnTheSummary) {
  auto unit = fixtures::filled_unit();
  unit.held_back.push_back({"oil", analytics::days_from_civil(2026, 11, 12), "2026-11-20", "lab/oil-nov.csv"});
  const std::string path = temp_path("issue16-held.pdf");
  render_unit_report(unit, nullptr, {}, fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Data held back"), std::string::npos);
  EXPECT_NE(text.find("A file rejected on 2026-11-20 (lab/oil-nov.csv) holds a newer oil sample (2026-11-12): ask "
                      "the lab to correct it and drop it again."),
            std::string::npos)
      << text;
  // Without held-back data the heading is absent.
  const std::string plain = temp_path("issue16-plain.pdf");
  render_unit_report(fixtures::filled_unit(), nullptr, {}, fixed_options(), plain);
  EXPECT_EQ(squash(pdf_raw_text(plain)).find("Data held back"), std::string::npos);
}

TEST_F(Issue16ReportTest, AlertPdfPrintsItsFindingAndTime) {
  AlertInfo a{"T1", "Quillmere", "infrared_priority_1", "2026-12-03 08:15:00 CET (UTC+01:00)",
              "infrared survey 2026-11-30: HV bushing H2 clamp, priority 1: repair immediately",
              "Have the connection repaired immediately."};
  const std::string path = temp_path("issue16-alert.pdf");
  render_alert(a, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Infrared finding: repair immediately (priority 1)"), std::string::npos) << text;
  EXPECT_NE(text.find("HV bushing H2 clamp"), std::string::npos);
  EXPECT_NE(text.find("2026-12-03 08:15:00 CET (UTC+01:00)"), std::string::npos);
}

}  // namespace
}  // namespace ferrum::report
