// Sweeps: the full grid of every `sweep` line, evaluated in parallel blocks
// and handed to a sink strictly in grid order, so results are identical
// whatever the thread count and a million points stream through without
// being held in memory.
#pragma once

#include <cstddef>
#include <string>
#include <utility>
#include <vector>

#include "eval/evaluator.h"
#include "model/model.h"

namespace heatdeck {

struct SweepOptions {
  int jobs = 1;               // worker threads (>= 1)
  int shard = 1, shards = 1;  // evaluate the shard-th of `shards` contiguous slices (1-based)
  std::vector<int> columns;   // quantities written per point (swept inputs first)
  size_t block = 512;         // points per work unit
};

// Receives points in grid order.  values has one SI value per column (NaN
// where not evaluated); error is empty when the point evaluated.
//
// A sink that turns points into bytes (a CSV stream) says so with
// Formats(): the workers then call Format() in parallel, each appending a
// block of points to its own buffer, and only Write() of the finished
// blocks is serialised, in grid order.  Other sinks get Point() in order.
class SweepSink {
 public:
  virtual ~SweepSink() = default;
  virtual void Point(size_t index, const double* values, const std::string& error) = 0;
  virtual bool Formats() const { return false; }
  // Thread-safe: appends point `index` to *out.
  virtual void Format(size_t /*index*/, const double* /*values*/, const std::string& /*error*/,
                      std::string* /*out*/) const {}
  virtual void Write(const std::string& /*bytes*/) {}
};

// Number of points in the grid (product of the sweep lines' sizes).
size_t SweepGridSize(const Model& model);
// The [begin, end) range of grid indices in shard k of n (1-based k).
std::pair<size_t, size_t> ShardRange(size_t points, int k, int n);
// The default columns: the swept inputs, then every other quantity in
// deck order.
std::vector<int> DefaultSweepColumns(const Model& model);

// Evaluates the grid for the given base inputs (a case's overrides) and
// feeds the sink.  Returns the number of points that failed.
size_t RunSweep(const Model& model, const Plan& plan,
                const std::vector<std::pair<int, double>>& base_overrides,
                const SweepOptions& options, SweepSink& sink);

}  // namespace heatdeck
