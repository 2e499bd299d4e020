#include "cli/deck_runner.h"

#include <filesystem>
#include <ostream>
#include <system_error>

#include <fmt/format.h>

#include "cli/heap.h"
#include "eval/results.h"
#include "lang/diagnostics.h"

namespace heatdeck::cli {

namespace {

void PrintDiagnostics(const Session& s, Streams io) {
  for (const Diagnostic* d : s.diagnostics().Sorted()) io.err << Render(*d, s.files(), io.colour);
}

// Validity warnings recorded on quantities, printed like diagnostics so the
// engineer sees them without opening the report.
void PrintQuantityWarnings(const Session& s, Streams io) {
  const Results& r = s.results();
  const Model& m = s.model();
  for (const CaseResult& c : r.cases) {
    for (size_t qi = 0; qi < c.messages.size(); ++qi) {
      for (const QuantityMessage& msg : c.messages[qi]) {
        if (msg.kind != QuantityMessage::Kind::kWarning) continue;
        const Quantity& q = m.quantities[qi];
        Diagnostic d;
        d.severity = Severity::kWarning;
        d.range = q.expr != nullptr ? q.expr->range : q.range;
        d.message = c.name == "base" ? fmt::format("{}: {}", q.name, msg.text)
                                     : fmt::format("case '{}': {}: {}", c.name, q.name, msg.text);
        io.err << Render(d, s.files(), io.colour);
      }
    }
  }
}

}  // namespace

int LoadAndEvaluate(const std::string& path, const GlobalOptions& g, Streams io, Session* session) {
  std::error_code ec;
  const std::uintmax_t bytes = std::filesystem::file_size(path, ec);
  // A deck over the size limit is refused by Load: nothing to prepare.
  if (!ec && bytes <= g.session.max_file_bytes) PrepareHeapFor(bytes);
  if (!session->Load(path, g.session)) {
    PrintDiagnostics(*session, io);
    return kDeckErrors;
  }
  const bool ok = session->Evaluate();
  PrintDiagnostics(*session, io);
  if (ok) PrintQuantityWarnings(*session, io);
  return session->ExitStatus();
}

std::string Summary(const std::string& path, const Session& s) {
  const int errors = s.diagnostics().error_count();
  if (errors > 0) {
    return fmt::format("{}: {} error{}", path, errors, errors == 1 ? "" : "s");
  }
  const Results& r = s.results();
  const Model& m = s.model();
  int checks = 0, failed = 0, warnings = 0;
  for (const CaseResult& c : r.cases) {
    checks += static_cast<int>(c.checks.size());
    failed += c.failed_checks;
    warnings += c.warnings;
  }
  std::string line = fmt::format("{}: {} quantities", path, m.quantities.size());
  if (r.cases.size() > 1) line += fmt::format(", {} cases", r.cases.size());
  line += fmt::format(", {} check{}: {} passed, {} failed", checks, checks == 1 ? "" : "s",
                      checks - failed, failed);
  if (warnings > 0) line += fmt::format("; {} warning{}", warnings, warnings == 1 ? "" : "s");
  return line;
}

}  // namespace heatdeck::cli
