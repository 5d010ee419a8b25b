// The one source of ferrum's safety cautions. Every output takes its text
// from here: the SAFETY block of every PDF (report/safety_block), the one-line
// caution of the CSV files, the console and the JSON documents, and, kept
// equal by a test (tests/report/safety_text_test.cpp), the README's Safety
// section and the man page's SAFETY section.
//
// The wording is fixed in code on purpose: no option, argument or
// configuration key can remove or shorten it. It names the hazards of the
// work (energised equipment, arc flash, isolation and lockout, working at
// height, oil fire and tank rupture, sampling near energised equipment,
// confined space, oil and PCB handling, combustible gases, electrical tests)
// and defers to local codes, the employer's rules and licensed practice.
#pragma once

#include <string>
#include <vector>

namespace ferrum::report {

struct Caution {
  std::string lead;  // printed in bold, e.g. "Arc flash."
  std::string text;
};

// Heading of the block; contains the word "SAFETY".
const std::string& safety_heading();
// Every caution, in the order printed.
const std::vector<Caution>& safety_cautions();
// Cautions of the electrical field tests, printed with their section of the
// unit report (the general block is printed as well).
const std::vector<Caution>& electrical_test_cautions();
// The caution of outputs that have room for one line only (CSV, console,
// JSON): starts with "SAFETY:", names the deference to qualified persons and
// local codes, and points to the full cautions.
const std::string& one_line_caution();
// The same line as a comment line of a CSV file ("# SAFETY: ...", no newline).
std::string csv_caution_line();

// The cautions as the README's Safety section body (Markdown bullets, one
// line each) and as the man page's SAFETY section body (roff); the test
// compares the committed files with these.
std::string safety_markdown();
std::string safety_roff();

}  // namespace ferrum::report
