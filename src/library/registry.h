// The heat-transfer library's function registry.  Plain C++ on SI doubles:
// nothing here knows about decks.  Every function is registered once with its
// name, dimension signature, formula text, published source, validity range
// and, where a closed form exists, a spreadsheet translation.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "units/dimension.h"

namespace heatdeck::library {

// Receives what a call has to say.  The library never prints.  Warning() and
// Error() are only called on the unusual path, so they may allocate; Note()
// takes a static string so that the normal path never allocates.
class Sink {
 public:
  virtual ~Sink() = default;
  // A validity warning: the result is returned but is outside the method's
  // range.  The text names the range, the value and the source.
  virtual void Warning(std::string message) = 0;
  // The call has no meaningful result (the function then returns NaN).  The
  // text names the offending values.
  virtual void Error(std::string message) = 0;
  // A remark recorded on the quantity (e.g. the regime nu_tube chose).
  virtual void Note(const char* static_text) = 0;
};

// A sink that keeps everything; for tests and one-off calls.
class RecordingSink : public Sink {
 public:
  void Warning(std::string message) override { warnings.push_back(std::move(message)); }
  void Error(std::string message) override { errors.push_back(std::move(message)); }
  void Note(const char* static_text) override { notes.emplace_back(static_text); }
  std::vector<std::string> warnings;
  std::vector<std::string> errors;
  std::vector<std::string> notes;
};

// args has exactly FunctionInfo::args.size() values, in SI.
using Fn = double (*)(const double* args, Sink& sink);

struct ArgSpec {
  const char* name;      // as in LIBRARY.md: "D_in", "NTU"
  units::Dimension dim;  // expected dimension (dimensionless accepts plain numbers)
  // For temperature arguments: kAbsolute (T_*), kInterval (dT_*); kNone otherwise.
  units::TempKind kind = units::TempKind::kNone;
};

struct FunctionInfo {
  const char* name;    // "res_cyl"
  const char* family;  // "resistance", "fins", "mtd", "entu", "convection", "friction", "water",
                       // "air", "groups"
  std::vector<ArgSpec> args;
  units::Dimension result;
  units::TempKind result_kind = units::TempKind::kNone;
  const char* formula;   // plain-text formula for reports: "ln(D_out/D_in)/(2*pi*k*L)"
  const char* source;    // published source of the method
  const char* validity;  // validity range, and what happens outside it (error / warning)
  const char*
      example;  // a one-line deck example: "R_w = res_cyl(25.4 mm, 28.6 mm, 16 W/(m*K), 6 m)"
  // Spreadsheet formula (Excel / OpenFormula function names) with {0}, {1}, …
  // standing for the SI arguments, or nullptr where no closed form exists
  // (iterative solves, series, IAPWS).  The workbook writer substitutes
  // each argument's own formula text, parenthesised.
  const char* spreadsheet;
  Fn fn;
};

// Every function, in a stable order (family, then LIBRARY.md order).
const std::vector<FunctionInfo>& Functions();
// nullptr when there is no such function.
const FunctionInfo* FindFunction(std::string_view name);

// Convenience for tests and the checker: calls f with args.
double Call(const FunctionInfo& f, const std::vector<double>& args, Sink& sink);

// Per-family registration, called once by Functions().
void RegisterGroups(std::vector<FunctionInfo>& out);
void RegisterResistance(std::vector<FunctionInfo>& out);
void RegisterFins(std::vector<FunctionInfo>& out);
void RegisterMtd(std::vector<FunctionInfo>& out);
void RegisterEntu(std::vector<FunctionInfo>& out);
void RegisterConvection(std::vector<FunctionInfo>& out);
void RegisterFriction(std::vector<FunctionInfo>& out);
void RegisterWater(std::vector<FunctionInfo>& out);
void RegisterAir(std::vector<FunctionInfo>& out);

}  // namespace heatdeck::library
