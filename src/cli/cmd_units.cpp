#include <ostream>

#include <fmt/format.h>

#include "cli/app.h"
#include "units/unit.h"

namespace heatdeck::cli {

int RunUnits(const std::string& filter, Streams io) {
  io.out << fmt::format("{:<10} {:<34} {:>24} {:<12} {}\n", "symbol", "name", "SI factor",
                        "SI unit", "notes");
  for (const units::UnitListing& u : units::ListUnits()) {
    if (!filter.empty() && u.symbol.find(filter) == std::string::npos &&
        u.name.find(filter) == std::string::npos && u.si_unit.find(filter) == std::string::npos) {
      continue;
    }
    std::string notes = u.note;
    if (u.offset != 0.0) {
      notes = fmt::format("SI = value * {} + {}{}", units::FormatExact(u.factor),
                          units::FormatExact(u.offset), notes.empty() ? "" : "; " + notes);
    }
    if (u.prefixable) notes += notes.empty() ? "takes SI prefixes" : "; takes SI prefixes";
    io.out << fmt::format("{:<10} {:<34} {:>24} {:<12} {}\n", u.symbol, u.name,
                          units::FormatExact(u.factor), u.si_unit.empty() ? "1" : u.si_unit, notes);
  }
  return kOk;
}

}  // namespace heatdeck::cli
