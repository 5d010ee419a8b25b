// The safety block printed on the first and last page of every unit and
// fleet report, on the weekly cover and on every alert. Its text comes from
// report/safety_text.h, the one source of ferrum's cautions.
#pragma once

#include <string>
#include <vector>

#include "report/page_flow.h"
#include "report/safety_text.h"

namespace ferrum::report {

// Height the block needs at the flow's width.
double safety_block_height(PageFlow& flow);
// Draws the block with its top at `top` (page points), at the flow's margins.
void draw_safety_block(PageFlow& flow, double top);
// Places the block at the current flow position (new page when needed).
void add_safety_block(PageFlow& flow);

}  // namespace ferrum::report
