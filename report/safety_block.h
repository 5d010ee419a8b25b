// The safety cautions printed on the first and last page of every unit
// report and on every alert. The wording is fixed in code on purpose: no
// option, argument or configuration key can remove or shorten it.
// Content: general
// cautions that defer to local codes, employer rules and licensed practice.
#pragma once

#include <string>
#include <vector>

#include "report/page_flow.h"

namespace ferrum::report {

struct Caution {
  std::string lead;  // printed in bold, e.g. "Energised equipment."
  std::string text;
};

// Cautions of the electrical field tests, printed with their section of the
// unit report (the general block above is printed as well).
const std::vector<Caution>& electrical_test_cautions();

// Heading of the block; contains the word "SAFETY".
const std::string& safety_heading();
const std::vector<Caution>& safety_cautions();

// Height the block needs at the flow's width.
double safety_block_height(PageFlow& flow);
// Draws the block with its top at `top` (page points), at the flow's margins.
void draw_safety_block(PageFlow& flow, double top);
// Places the block at the current flow position (new page when needed).
void add_safety_block(PageFlow& flow);

}  // namespace ferrum::report
