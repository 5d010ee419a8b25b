#include "report/safety_block.h"

#include "report/text_wrap.h"

namespace ferrum::report {
namespace {

constexpr double kSize = 6.9;
constexpr double kPad = 6;
constexpr double kHeadingSize = 8.6;

// Wraps "lead text" so that the lead, set in bold, is measured in bold.
std::vector<std::string> wrap_caution(PageFlow& flow, const Caution& c, double width) {
  HPDF_Page page = flow.page();
  FontRef bold = flow.doc().font(FontFace::bold);
  FontRef regular = flow.doc().font(FontFace::regular);
  const std::string whole = c.lead + " " + c.text;
  const double lead_extra = text_width(page, bold, kSize, c.lead) - text_width(page, regular, kSize, c.lead);
  return wrap_text(whole, width, [&](std::string_view s) { return text_width(page, regular, kSize, s); },
                   lead_extra);
}

double line_height() { return kSize * 1.25; }

}  // namespace

const std::string& safety_heading() {
  static const std::string heading = "SAFETY — read before acting on this document";
  return heading;
}

const std::vector<Caution>& safety_cautions() {
  static const std::vector<Caution> cautions = {
      {"Qualified persons only.",
       "Work on or near energised equipment (sampling, infrared surveys, inspections) only by qualified "
       "persons under the applicable electrical-safety rules, e.g. NFPA 70E, OSHA 29 CFR 1910.269, "
       "EN 50110-1, or the local equivalent; keep minimum approach distances and hold a job briefing."},
      {"Isolate before contact.",
       "Isolate, lock out and tag out, verify absence of voltage and apply working earths before any "
       "contact; treat bushings and cables as live until discharged and earthed."},
      {"Arc flash.",
       "Assess the arc-flash hazard (incident energy) and wear arc-rated protective equipment; opening "
       "covers for thermography is an exposure."},
      {"Oil sampling.",
       "Sample only under the site's procedure, by trained personnel; never where the valve is under "
       "negative pressure. Hot oil and pressurised tanks can burn or spray."},
      {"Active arcing.",
       "Do not energise or re-energise a unit with signs of active arcing (acetylene appearing or rising, "
       "gas-relay operation) until an engineer has evaluated it."},
      {"Oil handling and PCB.",
       "Wear gloves and eye protection and contain spills. Oil in old units (built before 1979) may contain "
       "PCB: treat it as PCB-contaminated until tested, and follow the applicable disposal rules."},
      {"Combustible gases.",
       "Gas-relay and headspace gas can be flammable (H₂, C₂H₂): exclude ignition sources and use "
       "instruments rated for the atmosphere. A drained tank is a confined space: entry only under permit."},
      {"Decision support only.",
       "This document supports decisions; it gives no switching or entry instructions. Findings must be "
       "confirmed by qualified personnel, and local codes, the employer's safety rules and licensed "
       "engineering practice govern."},
  };
  return cautions;
}

const std::vector<Caution>& electrical_test_cautions() {
  static const std::vector<Caution> cautions = {
      {"De-energised, isolated and earthed.",
       "Electrical field tests are made only on a unit that is de-energised, isolated from every source, "
       "locked out and earthed, under the site's switching and permit procedure; remove the working earths "
       "only as the test procedure requires and only for the test."},
      {"Test voltages are hazardous.",
       "Test sets apply hazardous AC and DC voltages (up to several kV) to the windings and bushings; keep "
       "everyone clear of the unit, its leads and connected equipment while a test runs."},
      {"Discharge after DC tests.",
       "Windings hold a dangerous charge after insulation-resistance, winding-resistance and other DC "
       "tests: discharge and earth them (for at least as long as the test voltage was applied) before "
       "touching any lead or terminal."},
  };
  return cautions;
}

double safety_block_height(PageFlow& flow) {
  const double inner = flow.width() - 2 * kPad - 4;
  double h = kPad + kHeadingSize * 1.5 + kPad;
  for (const auto& c : safety_cautions())
    h += static_cast<double>(wrap_caution(flow, c, inner).size()) * line_height() + 1.5;
  return h;
}

void draw_safety_block(PageFlow& flow, double top) {
  HPDF_Page page = flow.page();
  const double x = flow.x();
  const double w = flow.width();
  const double h = safety_block_height(flow);
  const double inner = w - 2 * kPad - 4;
  fill_rect(page, x, top - h, w, h, palette::white);
  stroke_rect(page, x, top - h, w, h, palette::ink, 1.2);
  fill_rect(page, x, top - h, 4, h, palette::ink);  // heavy left edge: readable in B&W
  double y = top - kPad - kHeadingSize;
  draw_text(page, flow.doc().font(FontFace::bold), kHeadingSize, x + kPad + 4, y, safety_heading(),
            palette::ink);
  y -= kHeadingSize * 0.5;
  FontRef bold = flow.doc().font(FontFace::bold);
  FontRef regular = flow.doc().font(FontFace::regular);
  for (const auto& c : safety_cautions()) {
    bool first = true;
    for (const auto& line : wrap_caution(flow, c, inner)) {
      y -= line_height();
      const double lx = x + kPad + 4;
      if (first && line.size() >= c.lead.size() && line.compare(0, c.lead.size(), c.lead) == 0) {
        draw_text(page, bold, kSize, lx, y, c.lead, palette::ink);
        draw_text(page, regular, kSize, lx + text_width(page, bold, kSize, c.lead), y,
                  line.substr(c.lead.size()), palette::ink);
      } else {
        draw_text(page, regular, kSize, lx, y, line, palette::ink);
      }
      first = false;
    }
    y -= 1.5;
  }
}

void add_safety_block(PageFlow& flow) {
  const double h = safety_block_height(flow);
  flow.space(6);
  const double top = flow.take(h);
  draw_safety_block(flow, top);
  flow.space(6);
}

}  // namespace ferrum::report
