// Wording of the receipt a contractor reads (issue 19, item 8). Plumbing
// only: no engineering value, so no published source applies.
#include <gtest/gtest.h>

#include "daemon/pipeline/receipt.h"

namespace ferrum::ingest {
namespace {

Receipt rejected_with(long long problem_count) {
  Receipt r;
  r.file = "lab.csv";
  r.party = "northlab";
  r.status = "rejected";
  r.received_at = "2026-10-05T08:00:00Z";
  r.stored_as = "quarantine/northlab/lab.csv";
  for (long long i = 0; i < problem_count; ++i)
    r.problems.push_back({2 + i, "h2_ppm", 3, "-1", "hydrogen cannot be negative", ""});
  r.problem_count = problem_count;
  r.warnings.push_back({"c2h2_ppm", "value below detection limit", 3, 1, {3}});
  return r;
}

TEST(ReceiptText, OneProblemIsCorrectedAsIt) {
  const std::string text = rejected_with(1).to_text();
  EXPECT_NE(text.find("1 problem found. Correct it and drop the whole file again."), std::string::npos) << text;
  EXPECT_EQ(text.find("Correct them"), std::string::npos) << text;
}

// Every output carries the caution, receipts included (they go to field
// crews and labs); a rejected file's copy is said to be kept, unchanged.
TEST(ReceiptText, CarriesTheCautionAndSaysTheRejectedCopyIsKept) {
  const auto r = rejected_with(1);
  const std::string text = r.to_text();
  EXPECT_NE(text.find("SAFETY"), std::string::npos) << text;
  EXPECT_NE(text.find("kept by the site among its rejected files, unchanged"), std::string::npos) << text;
  EXPECT_NE(r.to_json().find("\"caution\": \"SAFETY"), std::string::npos) << r.to_json();
}

TEST(ReceiptText, SeveralProblemsAreCorrectedAsThem) {
  const std::string text = rejected_with(2).to_text();
  EXPECT_NE(text.find("2 problems found. Correct them and drop the whole file again."), std::string::npos) << text;
}

TEST(ReceiptText, RejectedFileDoesNotClaimItWasTaken) {
  const std::string text = rejected_with(1).to_text();
  EXPECT_NE(text.find("Warnings ("), std::string::npos) << text;
  EXPECT_EQ(text.find("still taken"), std::string::npos) << text;
}

TEST(ReceiptText, AcceptedFileWarningsSayItWasTaken) {
  Receipt r = rejected_with(0);
  r.status = "accepted";
  r.stored_as = "archive/northlab/lab.csv";
  const std::string text = r.to_text();
  EXPECT_NE(text.find("Warnings (the file was still taken as a whole):"), std::string::npos) << text;
}

}  // namespace
}  // namespace ferrum::ingest

namespace ferrum::ingest {
namespace {

TEST(ReceiptText, NamesTheSiteCopyNotAServerPath) {
  Receipt r = rejected_with(1);
  r.stored_as = "quarantine/lab.1a2b3c4d.csv";
  const std::string text = r.to_text();
  EXPECT_NE(text.find("site copy:   lab.1a2b3c4d.csv (kept by the site"), std::string::npos) << text;
  EXPECT_EQ(text.find("quarantine/"), std::string::npos) << text;
  EXPECT_NE(r.to_json().find("\"quarantine/lab.1a2b3c4d.csv\""), std::string::npos);  // machines keep the path
}

TEST(ReceiptText, RepeatedWarningListsItsLines) {
  WarningLog log;
  for (std::int64_t line = 2; line < 40; line += 3) log.add(line, "c2h2_ppm", "value below detection limit");
  Receipt r = rejected_with(0);
  r.status = "accepted";
  r.warnings = log.entries();
  const std::string text = r.to_text();
  EXPECT_NE(text.find("lines 2, 5, 8, 11, 14, 17, 20, 23, 26, 29, 32, 35, 38, column c2h2_ppm: value below detection "
                      "limit (13 times)"),
            std::string::npos)
      << text;
  EXPECT_EQ(Receipt::from_json(r.to_json()).warnings.at(0).lines, r.warnings.at(0).lines);
  for (std::int64_t line = 41; line < 200; ++line) log.add(line, "c2h2_ppm", "value below detection limit");
  r.warnings = log.entries();
  EXPECT_EQ(r.warnings.at(0).lines.size(), Warning::kMaxLines);
  // 13 lines above, then 41..47: more were seen than are listed, so marked.
  EXPECT_NE(r.to_text().find("38, 41, 42, 43, 44, 45, 46, 47, ..., column c2h2_ppm"), std::string::npos) << r.to_text();
}

TEST(ReceiptText, SepLineIsAcknowledgedAndSurvivesJson) {
  Receipt r = rejected_with(0);
  r.status = "accepted";
  r.separator_note = "values separated by ';', as the file's sep= first line says";
  EXPECT_NE(r.to_text().find("separator:   values separated by ';'"), std::string::npos) << r.to_text();
  EXPECT_EQ(Receipt::from_json(r.to_json()).separator_note, r.separator_note);
  r.separator_note.clear();
  EXPECT_EQ(r.to_json().find("separator_note"), std::string::npos);
}

// Issue 19, item 8: an accepted receipt gives the date range of its data and
// how many rows were new and how many already on file.
TEST(ReceiptText, AcceptedFileSaysNewRowsOnFileAndDates) {
  Receipt r = rejected_with(0);
  r.status = "accepted";
  r.kind = "load_series";
  r.rows = 60;
  r.rows_new = 45;
  r.rows_on_file = 15;
  r.data_from = "2026-03-01";
  r.data_to = "2026-03-03";
  const std::string text = r.to_text();
  EXPECT_NE(text.find("rows:        45 new, 15 already on file (an earlier file delivered them; this file's values "
                      "now stand)\n"),
            std::string::npos)
      << text;
  EXPECT_NE(text.find("dates:       2026-03-01 to 2026-03-03\n"), std::string::npos) << text;
  const Receipt back = Receipt::from_json(r.to_json());
  EXPECT_EQ(back.rows_new, 45);
  EXPECT_EQ(back.rows_on_file, 15);
  EXPECT_EQ(back.data_to, "2026-03-03");
  r.rows_on_file = 1;
  EXPECT_NE(r.to_text().find("1 already on file (an earlier file delivered it;"), std::string::npos) << r.to_text();
  r.rows_on_file = 0;
  EXPECT_NE(r.to_text().find("rows:        45 new, none already on file\n"), std::string::npos) << r.to_text();
  // A receipt written before the counts existed reads back without them.
  r.rows_new.reset();
  r.rows_on_file.reset();
  EXPECT_EQ(r.to_json().find("rows_new"), std::string::npos);
  EXPECT_FALSE(Receipt::from_json(r.to_json()).rows_new);
  EXPECT_EQ(r.to_text().find(" new, "), std::string::npos);
}

}  // namespace
}  // namespace ferrum::ingest
