#include <ostream>

#include <fmt/format.h>

#include "cli/app.h"
#include "library/registry.h"
#include "model/builder.h"
#include "units/unit.h"

namespace heatdeck::cli {

namespace {

std::string Signature(const library::FunctionInfo& f) {
  std::string s = fmt::format("{}(", f.name);
  for (size_t i = 0; i < f.args.size(); ++i) {
    if (i > 0) s += ", ";
    const std::string u = f.args[i].dim.SiUnit();
    s += fmt::format("{} [{}]", f.args[i].name, u.empty() ? "1" : u);
  }
  const std::string r = f.result.SiUnit();
  return s + fmt::format(") -> [{}]", r.empty() ? "1" : r);
}

}  // namespace

int RunFunctions(const std::string& name, Streams io) {
  const auto& all = library::Functions();
  if (name.empty()) {
    std::string family;
    for (const auto& f : all) {
      if (family != f.family) {
        family = f.family;
        io.out << fmt::format("{}{}:\n", family == all.front().family ? "" : "\n", family);
      }
      io.out << "  " << Signature(f) << "\n";
    }
    io.out << "\n'heatdeck functions NAME' shows a function's formula, source and validity.\n";
    return kOk;
  }
  const library::FunctionInfo* f = library::FindFunction(name);
  if (f == nullptr) {
    std::vector<std::string> names;
    for (const auto& g : all) names.emplace_back(g.name);
    const std::string near = NearestName(name, names);
    io.err << fmt::format("heatdeck: no function '{}'{}\n", name,
                          near.empty() ? "" : fmt::format("; did you mean '{}'?", near));
    return kUsage;
  }
  io.out << Signature(*f) << "\n\n";
  io.out << "  arguments:\n";
  for (const auto& a : f->args) {
    const std::string u = a.dim.SiUnit();
    std::string what = a.dim.dimensionless() ? "plain number" : a.dim.Describe();
    if (a.kind == units::TempKind::kAbsolute) what = "absolute temperature";
    if (a.kind == units::TempKind::kInterval) what = "temperature difference";
    io.out << fmt::format("    {:<10} {} [{}]\n", a.name, what, u.empty() ? "1" : u);
  }
  io.out << fmt::format("  formula:   {}\n", f->formula);
  io.out << fmt::format("  source:    {}\n", f->source);
  io.out << fmt::format("  validity:  {}\n", f->validity);
  io.out << fmt::format("  example:   {}\n", f->example);
  io.out << fmt::format(
      "  workbook:  {}\n",
      f->spreadsheet != nullptr
          ? fmt::format("live formula {}", f->spreadsheet)
          : std::string("value only (no closed form; the cell notes the method)"));
  return kOk;
}

}  // namespace heatdeck::cli
