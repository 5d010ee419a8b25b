// Work-status file kind (issue #16): detection, the action reference, the
// status vocabulary, dates, duplicates. The rules tested are ferrum's drop
// contract (schema/drop-files.md, "Work status"); no engineering value is
// checked here.
#include <gtest/gtest.h>

#include "tests/ingest/ingest_test_support.h"

namespace ferrum::ingest {
namespace {

using namespace ferrum::ingest::testing;

const std::string kHeader = "unit_id,action,status,date,note\n";

TEST(WorkStatusRows, AGoodFileIsTheSeventhKindAndEveryRowParsed) {
  // test_now() is 2026-06-01: a booking may lie ahead, work done may not.
  const auto c = check_text(kHeader +
                            "T1,T1/oil-resample,booked,2026-06-20,crew A\n"
                            "T1,T1/ir-repair:HV bushing H1,Done,2026-05-30,\n"
                            "T2,cooling-check,cancelled,2026-05-01,not needed after fan repair\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_EQ(c.summary.kind, FileKind::work_status);
  ASSERT_EQ(c.rows.work.size(), 3u);
  const auto& w = c.rows.work;
  EXPECT_EQ(w[0].unit_id, "T1");
  EXPECT_EQ(w[0].status.reference, "T1/oil-resample");
  EXPECT_EQ(w[0].status.status, "booked");
  EXPECT_EQ(w[0].status.date, analytics::days_from_civil(2026, 6, 20));
  EXPECT_EQ(w[0].status.note, "crew A");
  EXPECT_EQ(w[1].status.reference, "T1/ir-repair:HV bushing H1");
  EXPECT_EQ(w[1].status.status, "done");  // any case
  EXPECT_EQ(w[2].status.reference, "T2/cooling-check");  // the need alone: the row's unit is added
  EXPECT_EQ(w[2].status.status, "cancelled");
}

TEST(WorkStatusRows, AMalformedRowRejectsTheFileWithLineAndColumn) {
  const auto c = check_text(kHeader +
                            "T1,T1/oil-resample,booked,2026-06-20,\n"
                            "T1,T1/oil-resample,done,2026-13-40,\n"
                            "T9,T9/oil-resample,done,2026-05-01,\n"
                            "T1,,done,2026-05-01,\n");
  EXPECT_FALSE(c.summary.acceptable());
  EXPECT_TRUE(has_problem(c.summary, 3, "date", "")) << problems_text(c.summary);
  EXPECT_TRUE(has_problem(c.summary, 4, "unit_id", "not in the units register")) << problems_text(c.summary);
  EXPECT_TRUE(has_problem(c.summary, 5, "action", "missing")) << problems_text(c.summary);
  for (const Problem& p : c.summary.problems.kept())
    if (p.line == 3) {
      EXPECT_EQ(p.column_number, 4);  // the date column
    }
}

TEST(WorkStatusRows, AnUnknownStatusIsAProblemNamingTheAllowedOnes) {
  const auto c = check_text(kHeader + "T1,T1/oil-resample,scheduled,2026-05-20,\n");
  EXPECT_FALSE(c.summary.acceptable());
  EXPECT_TRUE(has_problem(c.summary, 2, "status", "booked, done or cancelled")) << problems_text(c.summary);
}

TEST(WorkStatusRows, OnlyABookingMayLieAhead) {
  const auto c = check_text(kHeader +
                            "T1,T1/oil-resample,booked,2026-07-01,\n"
                            "T1,T1/oil-resample,done,2026-07-01,\n");
  EXPECT_FALSE(c.summary.acceptable());
  EXPECT_FALSE(has_problem(c.summary, 2, "date", "")) << problems_text(c.summary);
  EXPECT_TRUE(has_problem(c.summary, 3, "date", "in the future")) << problems_text(c.summary);
}

TEST(WorkStatusRows, AReferenceForAnotherUnitAndADuplicateRowAreProblems) {
  const auto c = check_text(kHeader +
                            "T1,T2/oil-resample,done,2026-05-20,\n"
                            "T1,T1/outage,booked,2026-08-01,\n"
                            "T1,outage,booked,2026-08-01,again\n"
                            "T1,T1/,done,2026-05-20,\n");
  EXPECT_FALSE(c.summary.acceptable());
  EXPECT_TRUE(has_problem(c.summary, 2, "action", "for unit T2")) << problems_text(c.summary);
  EXPECT_TRUE(has_problem(c.summary, 4, "", "duplicate row")) << problems_text(c.summary);
  EXPECT_TRUE(has_problem(c.summary, 5, "action", "names no action")) << problems_text(c.summary);
}

}  // namespace
}  // namespace ferrum::ingest
