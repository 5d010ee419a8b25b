#include "report/safety_text.h"

namespace ferrum::report {

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
      {"Working at height.",
       "Climbing the tank, conservator or radiators, or taking gas from the gas-accumulation relay on top of "
       "the tank, needs fall protection. Never climb an energised unit within the approach distance of its "
       "bushings."},
      {"Oil fire and tank rupture.",
       "Mineral insulating oil burns, and an internal fault can rupture the tank and ignite the oil. Keep "
       "clear of pressure-relief devices and their discharge path, do no hot work without a permit, and "
       "follow the site's fire plan."},
      {"Sampling near energised equipment.",
       "Taking an oil or gas sample from an energised unit is work near energised equipment, under the "
       "site's procedure and by trained personnel. Keep the time at the unit short; from a unit that is "
       "gassing, sample only with the responsible engineer's permission, and consider sampling after "
       "de-energising. Never sample where the valve is under negative pressure: air drawn into the tank "
       "can cause an internal flashover. Hot oil and pressurised tanks can burn or spray."},
      {"Active arcing.",
       "Do not energise or re-energise a unit with signs of active arcing (acetylene appearing or rising, "
       "gas-relay operation) until an engineer has evaluated it."},
      {"Confined space.",
       "A drained tank, or one filled with nitrogen or dry air, is a confined space whose atmosphere can "
       "lack oxygen: enter only under permit, test the atmosphere before and during entry, and keep an "
       "attendant outside and a rescue plan ready."},
      {"Oil handling and PCB.",
       "Wear gloves and eye protection and contain spills. Oil of a unit built or topped up before PCBs "
       "were banned in your jurisdiction, or of unknown history, may contain PCB: treat it as contaminated "
       "until tested, never heat or burn it, and follow the applicable disposal rules."},
      {"Combustible gases.",
       "Gas-relay and headspace gas can be flammable (H₂, C₂H₂): exclude ignition sources and use "
       "instruments rated for the atmosphere."},
      {"Electrical tests.",
       "Test only a de-energised unit that is isolated and earthed. Test voltages are hazardous: keep "
       "everyone clear of the unit and the leads while a test runs. Windings hold a charge after DC tests "
       "(winding resistance, insulation resistance): discharge and earth them before touching the leads."},
      {"Decision support only.",
       "This document supports decisions; it gives no switching or entry instructions. Findings must be "
       "confirmed by qualified personnel, and local codes, the employer's safety rules and licensed "
       "engineering practice govern. The tool advises; a qualified engineer decides."},
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

const std::string& one_line_caution() {
  static const std::string line =
      "SAFETY: decision support only; a qualified engineer decides. Energised equipment, arc flash, "
      "height, oil fire, confined space, PCB and combustible gases: work only under local codes and the "
      "employer's rules (see the cautions in every PDF report).";
  return line;
}

std::string csv_caution_line() { return "# " + one_line_caution(); }

std::string safety_markdown() {
  std::string md;
  for (const auto& c : safety_cautions()) md += "- **" + c.lead + "** " + c.text + "\n";
  return md;
}

std::string safety_roff() {
  std::string roff;
  for (const auto& c : safety_cautions()) {
    roff += ".TP\n.B \"" + c.lead + "\"\n";
    // A line starting with a dot or an apostrophe would be a roff request.
    std::string text = c.text;
    if (!text.empty() && (text[0] == '.' || text[0] == '\'')) text = "\\&" + text;
    roff += text + "\n";
  }
  return roff;
}

}  // namespace ferrum::report
