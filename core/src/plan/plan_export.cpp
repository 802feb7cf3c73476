// Plan exports as text: CSV (RFC 4180, via csv.hpp), plain text for print, and iCalendar
// (RFC 5545: CRLF line ends, lines folded at 75 octets, UID and DTSTAMP on every event, a
// VALARM reminder on every manual dose). The core returns text; the shell writes files.
#include <algorithm>
#include <cstdint>

#include <fmt/format.h>

#include "tidewright/common/csv.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/plan/plan.hpp"

namespace tw::plan {

namespace {
std::string hhmm(int minute) { return fmt::format("{:02d}:{:02d}", minute / 60, minute % 60); }

// RFC 5545 3.3.11: backslash, semicolon, comma and newline are escaped in TEXT values.
std::string ical_text(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '\\' || c == ';' || c == ',') {
      out += '\\';
      out += c;
    } else if (c == '\n') {
      out += "\\n";
    } else if (c != '\r') {
      out += c;
    }
  }
  return out;
}

// RFC 5545 3.1: lines longer than 75 octets are folded with CRLF + one space, never inside a
// UTF-8 sequence.
std::string ical_line(const std::string& line) {
  std::string out;
  std::size_t col = 0;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const auto c = static_cast<unsigned char>(line[i]);
    const bool continuation = (c & 0xC0) == 0x80;
    // A character's octets stay on one line: fold before a lead octet whose whole sequence
    // would pass the 75th octet (a 2-byte character at octet 75 made a 76-octet line).
    const std::size_t octets = c >= 0xF0 ? 4 : c >= 0xE0 ? 3 : c >= 0xC0 ? 2 : 1;
    if (!continuation && col + octets > 75) {
      out += "\r\n ";
      col = 1;
    }
    out += line[i];
    ++col;
  }
  return out + "\r\n";
}
}  // namespace

std::string plan_to_csv(const PlanInput& in, const Plan& plan) {
  std::string out = csv::format_row({"day", "time", "additive", "device", "amount", "unit", "capped_by",
                                     "alkalinity_dkh_after", "calcium_mg_l_after", "magnesium_mg_l_after",
                                     "ph_total_after", "omega_aragonite_after", "alkalinity_dkh_before_next",
                                     "ph_total_before_next", "omega_aragonite_before_next", "amount_set"});
  for (const auto& d : plan.doses) {
    const Delivery& dv = in.deliveries[d.delivery];
    out += csv::format_row(
        {std::to_string(d.day), hhmm(d.minute), dv.additive.name, dv.device, fmt::format("{:.3f}", d.amount),
         additives::to_string(dv.additive.unit), d.cap, fmt::format("{:.3f}", d.after.alkalinity_dkh),
         fmt::format("{:.1f}", d.after.calcium_mg_l), fmt::format("{:.1f}", d.after.magnesium_mg_l),
         fmt::format("{:.4f}", d.after.ph_total), fmt::format("{:.3f}", d.after.omega_aragonite),
         fmt::format("{:.3f}", d.before_next.alkalinity_dkh), fmt::format("{:.4f}", d.before_next.ph_total),
         fmt::format("{:.3f}", d.before_next.omega_aragonite),
         // Last, so the columns before it keep their places: what to set on the pump for `amount`.
         fmt::format("{:.3f}", dv.set_amount(d.amount))},
        true);
  }
  return out;
}

std::string verdict_to_text(const Plan& plan) {
  const Verdict& v = plan.verdict;
  std::string o = v.headline + "\n";
  if (!v.holds) {
    for (const auto& r : v.reasons) o += "  why: " + r + "\n";
    for (const auto& f : v.fixes) o += "  fix: " + f + "\n";
  }
  for (const auto& t : v.target_conflicts) o += t.message + "\n";
  return o;
}

std::string plan_to_text(const PlanInput& in, const Plan& plan) {
  std::string o = verdict_to_text(plan);
  if (plan.uncertainty) {
    if (plan.uncertainty->retest) o += "TEST AGAIN: " + plan.uncertainty->retest->message + "\n";
    if (plan.uncertainty->cost) o += "How sure: " + plan.uncertainty->cost->summary + "\n";
  }
  o += "\n";
  o += fmt::format("Dose plan for {} ({:g} L, salinity {:g}, {:g} C, room air {:g} ppm CO2)\n",
                              in.system.name, in.system.volume_l, in.system.salinity, in.system.temperature_c,
                              in.system.air_co2_ppm);
  o += "pH values are on the TOTAL scale. After-dose values: fully mixed, before gas exchange.\n\nLimits:\n";
  for (const auto& s : limit_specs()) {
    o += fmt::format("  {:<30} {:>8g} {:<9} (default {:g}; {})\n", s.key, plan.limits.get(s.id), s.unit,
                     s.default_value, s.source);
  }
  for (const auto& r : plan.limits.record) o += "  " + r + "\n";
  const bool bands = plan.uncertainty.has_value();
  o += "\nDay  start alk  end alk  end Ca  end Mg  end pH  ";
  if (bands) o += "alk 95 %      Ca 95 %   pH 95 %    ";
  for (const auto& d : in.deliveries) o += fmt::format("{} ({})  ", d.additive.name, additives::to_string(d.additive.unit));
  // A pump that delivers other than it is set gets a second column: what to set on it.
  for (const auto& d : in.deliveries) {
    if (d.calibration != 1.0) o += fmt::format("set on {} ({})  ", d.device, additives::to_string(d.additive.unit));
  }
  o += "\n";
  for (const auto& d : plan.days) {
    o += fmt::format("{:>3}  {:>9.2f}  {:>7.2f}  {:>6.0f}  {:>6.0f}  {:>6.3f}  ", d.day, d.start.alkalinity_dkh,
                     d.end.alkalinity_dkh, d.end.calcium_mg_l, d.end.magnesium_mg_l, d.end.ph_total);
    if (bands) {
      auto b = [](const std::optional<Band95>& x, int dp) {
        return x ? fmt::format("{:.{}f}-{:.{}f}", x->low, dp, x->high, dp) : std::string("-");
      };
      o += fmt::format("{:<12}  {:<8}  {:<9}  ", b(d.end_band[0], 1), b(d.end_band[1], 0), b(d.end_ph_band, 2));
    }
    for (double a : d.amount_per_delivery) o += fmt::format("{:>10.2f}  ", a);
    for (std::size_t k = 0; k < in.deliveries.size() && k < d.amount_per_delivery.size(); ++k) {
      if (in.deliveries[k].calibration != 1.0) o += fmt::format("{:>10.2f}  ", in.deliveries[k].set_amount(d.amount_per_delivery[k]));
    }
    o += "\n";
  }
  const char* names[] = {"alkalinity", "calcium", "magnesium"};
  o += "\n";
  for (std::size_t p = 0; p < 3; ++p) {
    o += plan.target_day[p] ? fmt::format("{} in its band from day {}\n", names[p], *plan.target_day[p])
                            : fmt::format("{} does not reach its band within {} days\n", names[p], in.horizon_days);
  }
  if (!plan.findings.empty()) o += "\nFindings:\n";
  for (const auto& f : plan.findings) o += "  - " + f + "\n";
  if (!plan.cautions.empty()) o += "\nCautions:\n";
  for (const auto& c : plan.cautions) o += "  ! " + c + "\n";
  return o;
}

// FNV-1a, 64 bits (Fowler, Noll, Vo): a short stable key of a system's name for UIDs.
static std::uint64_t fnv1a64(const std::string& text) {
  std::uint64_t h = 14695981039346656037ULL;
  for (unsigned char c : text) {
    h ^= c;
    h *= 1099511628211ULL;
  }
  return h;
}

Result<std::string> plan_to_icalendar(const PlanInput& in, const Plan& plan, const std::string& dtstamp_utc,
                                      IcsDoses doses) {
  // The shape, then a real date and time of day (month 1 to 12, day in its month, 00:00:00 to
  // 23:59:59) by the one date rule of datetime.hpp.
  const bool digits = dtstamp_utc.size() == 16 &&
                      std::all_of(dtstamp_utc.begin(), dtstamp_utc.begin() + 8, ::isdigit) &&
                      std::all_of(dtstamp_utc.begin() + 9, dtstamp_utc.begin() + 15, ::isdigit);
  if (!digits || dtstamp_utc[8] != 'T' || dtstamp_utc[15] != 'Z') {
    return Error{"dtstamp_utc", "dtstamp_utc '" + dtstamp_utc + "' must look like 20261201T120000Z (UTC date-time)"};
  }
  const std::string iso = dtstamp_utc.substr(0, 4) + "-" + dtstamp_utc.substr(4, 2) + "-" + dtstamp_utc.substr(6, 2) +
                          "T" + dtstamp_utc.substr(9, 2) + ":" + dtstamp_utc.substr(11, 2) + ":" +
                          dtstamp_utc.substr(13, 2) + "Z";
  if (!datetime::parse_datetime(iso) || dtstamp_utc.substr(9, 2) == "24") {
    return Error{"dtstamp_utc", "dtstamp_utc '" + dtstamp_utc + "' is not a real UTC date-time; accepted: month 01 to "
                                    "12, a day of that month, time 000000 to 235959"};
  }
  auto start = datetime::parse_datetime(in.start_date + "T00:00:00Z");
  if (!start) return Error{"start_date", "start_date must be a date YYYY-MM-DD (" + start.error().message + ")"};
  const std::int64_t day0 = *start / 86400;
  std::string o;
  o += ical_line("BEGIN:VCALENDAR");
  o += ical_line("VERSION:2.0");
  o += ical_line("PRODID:-//Tidewright//dose plan//EN");
  o += ical_line("CALSCALE:GREGORIAN");
  for (std::size_t i = 0; i < plan.doses.size(); ++i) {
    const DoseRecord& d = plan.doses[i];
    const Delivery& dv = in.deliveries[d.delivery];
    if (doses == IcsDoses::HandOnly && !dv.manual) continue;
    const auto date = datetime::civil_from_days(day0 + d.day - 1);
    const std::string when = fmt::format("{:04d}{:02d}{:02d}T{:02d}{:02d}00", date.year, date.month, date.day,
                                         d.minute / 60, d.minute % 60);
    std::string what = fmt::format("{:.2f} {} {}", d.amount, additives::to_string(dv.additive.unit), dv.additive.name);
    if (dv.calibration != 1.0) {
      what += fmt::format(" (set {:.2f} {} at calibration {:g})", dv.set_amount(d.amount), additives::to_string(dv.additive.unit),
                          dv.calibration);
    }
    o += ical_line("BEGIN:VEVENT");
    o += ical_line(fmt::format("UID:{:016x}-{}-{}-{}@tidewright.plan", fnv1a64(in.system.name), in.start_date, i,
                               d.delivery));
    o += ical_line("DTSTAMP:" + dtstamp_utc);
    o += ical_line("DTSTART:" + when);  // floating local time (RFC 5545 3.3.5 form 1)
    o += ical_line("DURATION:PT5M");
    o += ical_line("SUMMARY:" + ical_text(fmt::format("Dose {} ({})", what, dv.device)));
    o += ical_line("DESCRIPTION:" + ical_text(fmt::format(
        "{} for {}. Expected right after: alkalinity {:.2f} dKH, calcium {:.0f} mg/L, pH {:.3f} (total scale), "
        "Omega aragonite {:.2f}.{}",
        what, in.system.name, d.after.alkalinity_dkh, d.after.calcium_mg_l, d.after.ph_total,
        d.after.omega_aragonite, dv.additive.caustic ? " Caustic: eye protection and gloves." : "")));
    if (dv.manual) {
      o += ical_line("BEGIN:VALARM");
      o += ical_line("ACTION:DISPLAY");
      o += ical_line("TRIGGER:-PT10M");
      o += ical_line("DESCRIPTION:" + ical_text("Dose due: " + what));
      o += ical_line("END:VALARM");
    }
    o += ical_line("END:VEVENT");
  }
  o += ical_line("END:VCALENDAR");
  return o;
}

}  // namespace tw::plan
