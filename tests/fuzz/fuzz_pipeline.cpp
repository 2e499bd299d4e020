// libFuzzer target: the whole pipeline on an in-memory deck, through
// evaluation (cases, small sweeps, solves) and the JSON writer.
//
// Besides crashes it checks one property of every sweep it meets: a grid
// point re-evaluates only what depends on the sweep lines that changed
// since the last point, so its row must equal a fresh evaluation of the
// deck at that point's inputs (bit for bit where the point evaluated, NaN
// where the fresh evaluation fails).  A difference aborts, and libFuzzer
// keeps the deck.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <utility>
#include <vector>

#include "eval/evaluator.h"
#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "report/json_writer.h"

namespace {

// Points compared per sweep: the first ones and then every k-th, so that
// each sweep line changes at least once in a small grid.
constexpr size_t kCompared = 24;

void CheckSweepRows(const heatdeck::Session& s) {
  const heatdeck::Model& m = s.model();
  const heatdeck::Plan plan = heatdeck::MakePlan(m);
  if (!plan.error.empty()) return;
  for (const heatdeck::SweepResult& sw : s.results().sweeps) {
    if (sw.rows.size() != sw.points || sw.points == 0) continue;  // not kept
    const size_t step = std::max<size_t>(1, sw.points / kCompared);
    for (size_t p = 0; p < sw.points; p += (p < kCompared / 2 ? 1 : step)) {
      std::vector<std::pair<int, double>> inputs;
      for (size_t k = 0; k < sw.swept.size(); ++k) inputs.emplace_back(sw.swept[k], sw.rows[p][k]);
      heatdeck::Evaluator fresh(m, plan);
      fresh.LoadInputs(inputs);
      heatdeck::CaseResult cr;
      fresh.EvaluateCase(&cr);
      for (size_t col = 0; col < sw.columns.size(); ++col) {
        const auto q = static_cast<size_t>(sw.columns[col]);
        const double got = sw.rows[p][col];
        const double want = cr.values[q];
        const bool same = got == want || (std::isnan(got) && std::isnan(want));
        const bool bad = cr.ok[q] ? (sw.row_errors[p].empty() && !same) : !std::isnan(got);
        if (bad) {
          std::fprintf(stderr, "sweep point %zu, '%s': %.17g in the sweep, %.17g fresh (%s)\n", p,
                       m.quantities[q].name.c_str(), got, want, cr.ok[q] ? "ok" : "failed");
          std::abort();
        }
      }
    }
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  heatdeck::SessionOptions options;
  options.jobs = 1;
  options.max_sweep_points = 256;  // keep each run short
  options.keep_sweep_points = 256;
  options.max_statements = 5000;
  heatdeck::Session s;
  if (s.LoadText("fuzz.deck", std::string(reinterpret_cast<const char*>(data), size), options) &&
      s.Evaluate()) {
    (void)heatdeck::WriteJson(s.results(), &s.diagnostics());
    CheckSweepRows(s);
  }
  return 0;
}
