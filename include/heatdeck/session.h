// heatdeck's public entry point: load a deck, check it, evaluate it.
//
//   heatdeck::Session s;
//   if (s.Load("cooler.deck", {}) && s.Evaluate()) { /* s.results() */ }
//   for (auto* d : s.diagnostics().Sorted()) std::cerr << Render(*d, s.files(), false);
//
// The pipeline reads top to bottom in Session::Load and Session::Evaluate:
// lex -> parse -> resolve -> check -> compile -> evaluate.  Writers
// (report/) take the Results.
#pragma once

#include <functional>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace heatdeck {

class Diagnostics;
class SourceFiles;
struct Model;
struct Results;

struct SessionOptions {
  // Folders besides the deck's own tree that `use` and `table` may read.
  std::vector<std::string> allow_paths;
  // Folder of installed templates; empty: the templates built into the binary.
  std::string stdlib_dir;
  // Evaluate only this case ("base" or a case name); empty: all cases.
  std::string only_case;
  // Report date; overrides `meta date`.  Never taken from the clock.
  std::string date;
  // Sweeps: worker threads (0: all cores), the shard to evaluate (1 of 1:
  // all), the quantities written per point (empty: all), and the largest
  // sweep whose rows are kept in the results for the report and JSON
  // (larger ones stream to CSV only).
  int jobs = 0;
  int shard = 1, shards = 1;
  std::vector<std::string> sweep_columns;
  size_t keep_sweep_points = 10000;
  double max_sweep_points = 1e7;
  // Limits against hostile input.
  size_t max_file_bytes = 64u << 20;
  int max_expression_depth = 200;
  int max_statements = 1000000;
};

class Session {
 public:
  Session();
  ~Session();
  Session(const Session&) = delete;
  Session& operator=(const Session&) = delete;

  // Reads, parses, resolves and checks a deck file.  Returns false when the
  // deck has errors (see diagnostics()); nothing has been evaluated then.
  bool Load(const std::string& path, const SessionOptions& options);
  // The same for text in memory; `name` is used in diagnostics and as the
  // folder base for relative paths ("" = current folder).
  bool LoadText(const std::string& name, std::string text, const SessionOptions& options);

  // Evaluates the base case and every case.  Returns false when a quantity
  // could not be evaluated (a located error in diagnostics()).  Check
  // failures are results, not errors.
  bool Evaluate();

  const Model& model() const;
  const Results& results() const;
  const Diagnostics& diagnostics() const;
  const SourceFiles& files() const;

  // Exit status for `check` and `run` (LANGUAGE.md): 0 all good, 1 a check
  // failed, 2 the deck has errors.
  int ExitStatus() const;

  // Streams the deck's sweep (for the case chosen in the options, else
  // base): `on_header` once, then `format_row` per point — display-unit
  // values of the columns and the point's error ("" if none), appended as
  // bytes to *out — and `write` with those bytes in grid order.
  // format_row is called from the sweep's worker threads at once, so it
  // must touch nothing shared; write is called by one thread at a time.
  // Returns false and sets *error when the deck has no sweep or a column
  // name is unknown.
  struct SweepColumn {
    std::string name;
    std::string unit;  // display unit
  };
  bool StreamSweep(const std::function<void(const std::vector<SweepColumn>&)>& on_header,
                   const std::function<void(const double* values, const std::string& error,
                                            std::string* out)>& format_row,
                   const std::function<void(const std::string& bytes)>& write, std::string* error);

 private:
  std::vector<std::pair<int, double>> CaseOverrides() const;
  int EffectiveJobs() const;
  bool SweepColumnsFor(std::vector<int>* columns, std::string* why) const;

  struct State;
  std::unique_ptr<State> s_;
};

}  // namespace heatdeck
