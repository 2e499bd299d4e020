// libFuzzer target: the whole pipeline on an in-memory deck, through
// evaluation (cases, small sweeps, solves) and the JSON writer.
#include <cstddef>
#include <cstdint>
#include <string>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "report/json_writer.h"

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
  }
  return 0;
}
