#include "eval/sweep.h"

#include <algorithm>
#include <atomic>
#include <condition_variable>
#include <cstdint>
#include <limits>
#include <map>
#include <mutex>
#include <thread>

namespace heatdeck {

size_t SweepGridSize(const Model& model) {
  if (model.sweeps.empty()) return 0;
  size_t n = 1;
  for (const SweepDef& s : model.sweeps) n *= s.values.size();
  return n;
}

std::pair<size_t, size_t> ShardRange(size_t points, int k, int n) {
  // floor(points * j / n) without overflow: points = q * n + r.
  const auto nn = static_cast<size_t>(n);
  const size_t q = points / nn, r = points % nn;
  auto cut = [&](size_t j) { return q * j + r * j / nn; };
  return {cut(static_cast<size_t>(k - 1)), cut(static_cast<size_t>(k))};
}

std::vector<int> DefaultSweepColumns(const Model& model) {
  std::vector<int> cols;
  for (const SweepDef& s : model.sweeps) cols.push_back(s.quantity);
  for (size_t i = 0; i < model.quantities.size(); ++i) {
    if (std::find(cols.begin(), cols.end(), static_cast<int>(i)) == cols.end()) {
      cols.push_back(static_cast<int>(i));
    }
  }
  return cols;
}

namespace {

// A finished block of points: its rows and errors, and its bytes when the
// sink formats them.
struct Block {
  size_t first = 0, last = 0;
  std::vector<double> rows;
  std::vector<std::string> errors;
  std::string bytes;
};

// Blocks are computed by any worker and emitted in grid order.  A worker
// that finishes a block out of turn leaves it here and goes on computing
// (waiting for its turn idled a fast CPU behind a slow one); whoever hands
// in the block that is due emits it and every block queued after it.  At
// most `limit` blocks wait, so memory stays bounded; the block that is due
// is always accepted, so nothing waits for itself.
class Reorder {
 public:
  Reorder(size_t limit, SweepSink& sink) : limit_(limit), sink_(sink) {}

  void HandIn(size_t index, Block block) {
    std::unique_lock<std::mutex> lock(mu_);
    cv_.wait(lock, [&] { return index == next_ || waiting_.size() < limit_; });
    waiting_.emplace(index, std::move(block));
    if (emitting_) return;
    emitting_ = true;
    for (auto it = waiting_.find(next_); it != waiting_.end(); it = waiting_.find(next_)) {
      Block due = std::move(it->second);
      waiting_.erase(it);
      lock.unlock();
      Emit(due);
      lock.lock();
      ++next_;
      cv_.notify_all();
    }
    emitting_ = false;
  }

 private:
  void Emit(const Block& b) {
    if (sink_.Formats()) {
      sink_.Write(b.bytes);
      return;
    }
    const size_t ncol = b.last > b.first ? b.rows.size() / (b.last - b.first) : 0;
    for (size_t p = b.first; p < b.last; ++p) {
      sink_.Point(p, b.rows.data() + (p - b.first) * ncol, b.errors[p - b.first]);
    }
  }

  const size_t limit_;
  SweepSink& sink_;
  std::mutex mu_;
  std::condition_variable cv_;
  std::map<size_t, Block> waiting_;
  size_t next_ = 0;
  bool emitting_ = false;
};

}  // namespace

size_t RunSweep(const Model& model, const Plan& plan,
                const std::vector<std::pair<int, double>>& base_overrides,
                const SweepOptions& options, SweepSink& sink) {
  const size_t total = SweepGridSize(model);
  const std::pair<size_t, size_t> range = ShardRange(total, options.shard, options.shards);
  const size_t begin = range.first, end = range.second;
  if (begin >= end) return 0;
  const size_t block = std::max<size_t>(1, options.block);
  const size_t blocks = (end - begin + block - 1) / block;
  const size_t ncol = options.columns.size();
  const int jobs = static_cast<int>(std::max<size_t>(
      1, std::min<size_t>(static_cast<size_t>(std::max(1, options.jobs)), blocks)));
  std::vector<int> swept;
  for (const SweepDef& s : model.sweeps) swept.push_back(s.quantity);

  std::atomic<size_t> next_block{0};
  std::atomic<size_t> failures{0};
  Reorder order(4 * static_cast<size_t>(jobs), sink);

  auto worker = [&] {
    Evaluator ev(model, plan);
    ev.LoadInputs(base_overrides);
    CaseResult scratch;
    ev.EvaluateCase(&scratch);
    ev.PrepareSweep(swept);
    double* frame = ev.frame();
    // The grid digits of this worker's last point: a point re-evaluates only
    // from the outermost sweep line whose digit changed.
    std::vector<size_t> digit(model.sweeps.size()), seen(model.sweeps.size(), SIZE_MAX);
    const bool formats = sink.Formats();
    for (;;) {
      const size_t b = next_block.fetch_add(1);
      if (b >= blocks) break;
      const size_t first = begin + b * block;
      const size_t last = std::min(end, first + block);
      Block done;
      done.first = first;
      done.last = last;
      done.rows.resize((last - first) * ncol);
      done.errors.resize(last - first);
      std::vector<double>& rows = done.rows;
      std::vector<std::string>& errors = done.errors;
      for (size_t p = first; p < last; ++p) {
        // Mixed-radix digits of p: the first sweep line varies slowest.
        size_t rest = p;
        for (size_t s = model.sweeps.size(); s-- > 0;) {
          const size_t n = model.sweeps[s].values.size();
          digit[s] = rest % n;
          rest /= n;
        }
        size_t changed = 0;
        while (changed < digit.size() && digit[changed] == seen[changed]) ++changed;
        for (size_t s = changed; s < model.sweeps.size(); ++s) {
          frame[static_cast<size_t>(model.sweeps[s].quantity)] = model.sweeps[s].values[digit[s]];
          seen[s] = digit[s];
        }
        std::string& err = errors[p - first];
        err.clear();
        if (!ev.EvaluatePoint(&err, static_cast<int>(changed))) failures.fetch_add(1);
        double* row = rows.data() + (p - first) * ncol;
        for (size_t c = 0; c < ncol; ++c) row[c] = frame[static_cast<size_t>(options.columns[c])];
      }
      if (formats) {  // in the worker: this is the part that runs in parallel
        for (size_t p = first; p < last; ++p) {
          sink.Format(p, rows.data() + (p - first) * ncol, errors[p - first], &done.bytes);
        }
      }
      order.HandIn(b, std::move(done));
    }
  };
  if (jobs == 1) {
    worker();
  } else {
    std::vector<std::thread> threads;
    threads.reserve(static_cast<size_t>(jobs));
    for (int j = 0; j < jobs; ++j) threads.emplace_back(worker);
    for (auto& t : threads) t.join();
  }
  return failures.load();
}

}  // namespace heatdeck
