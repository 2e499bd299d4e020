// Google Benchmark: the stages of the pipeline, each on its own, for
// benchmark B1 (../shared/bench/b1_double_pipe.deck; HEATDECK_SHARED
// overrides the shared folder) and for generated chain decks (deck_gen.h):
//
//   Lex        the lexer alone, token by token to the end
//   Parse      lexer + parser: text to syntax tree
//   Build      resolution + dimension checking: syntax tree to Model
//   Compile    the evaluation plan and the evaluator's compiled programs,
//              with their first evaluation
//   EvalCase   a full evaluation of the base case (every message), again
//   EvalPoint  one sweep point on the fast path (B1 only), cycling the grid
#include <benchmark/benchmark.h>

#include <cstdlib>
#include <fstream>
#include <memory>
#include <sstream>
#include <string>
#include <vector>

#include "deck_gen.h"
#include "eval/evaluator.h"
#include "eval/results.h"
#include "lang/diagnostics.h"
#include "lang/lexer.h"
#include "lang/parser.h"
#include "model/builder.h"

#ifndef HEATDECK_SHARED_DEFAULT
#define HEATDECK_SHARED_DEFAULT "../shared"
#endif

namespace {

using namespace heatdeck;

constexpr std::string_view kName = "bench.deck";

// B1's text, or "" when it cannot be read.
const std::string& B1Text() {
  static const std::string text = [] {
    const char* env = std::getenv("HEATDECK_SHARED");
    const std::string dir = env != nullptr ? env : HEATDECK_SHARED_DEFAULT;
    std::ifstream in(dir + "/bench/b1_double_pipe.deck", std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
  }();
  return text;
}

const std::string& ChainText(int statements) {
  static std::vector<std::pair<int, std::string>> cache;
  for (const auto& [n, t] : cache) {
    if (n == statements) return t;
  }
  cache.emplace_back(statements, bench::ChainDeck(statements));
  return cache.back().second;
}

// Everything a stage needs from the ones before it, built once per benchmark.
struct Loaded {
  Diagnostics diags;
  Deck deck;
  std::vector<std::unique_ptr<Deck>> keep;
  std::unique_ptr<Model> model;
  Plan plan;
};

std::unique_ptr<Loaded> Load(const std::string& text, benchmark::State& state) {
  auto l = std::make_unique<Loaded>();
  l->deck = Parse(kName, text, l->diags);
  l->model = BuildModel(l->deck, BuildOptions{}, &l->keep, l->diags);
  if (l->diags.has_errors()) {
    state.SkipWithError("the deck has errors");
    return nullptr;
  }
  l->plan = MakePlan(*l->model);
  return l;
}

// The deck text for a benchmark: B1 when range(0) is 0, else a chain deck
// of range(0) statements.
const std::string* Text(benchmark::State& state) {
  const auto n = static_cast<int>(state.range(0));
  const std::string& t = n == 0 ? B1Text() : ChainText(n);
  if (t.empty()) {
    state.SkipWithError("cannot read ../shared/bench/b1_double_pipe.deck (set HEATDECK_SHARED)");
    return nullptr;
  }
  state.SetLabel(n == 0 ? "B1" : "chain");
  return &t;
}

void SetBytes(benchmark::State& state, const std::string& text) {
  state.SetBytesProcessed(static_cast<int64_t>(state.iterations()) *
                          static_cast<int64_t>(text.size()));
}

void BM_Lex(benchmark::State& state) {
  const std::string* text = Text(state);
  if (text == nullptr) return;
  for (auto _ : state) {
    Diagnostics diags;
    Lexer lex(kName, *text, diags);
    size_t tokens = 0;
    while (lex.Next().kind != TokKind::kEof) ++tokens;
    benchmark::DoNotOptimize(tokens);
  }
  SetBytes(state, *text);
}

void BM_Parse(benchmark::State& state) {
  const std::string* text = Text(state);
  if (text == nullptr) return;
  for (auto _ : state) {
    Diagnostics diags;
    Deck deck = Parse(kName, *text, diags);
    benchmark::DoNotOptimize(deck);
  }
  SetBytes(state, *text);
}

void BM_Build(benchmark::State& state) {
  const std::string* text = Text(state);
  if (text == nullptr) return;
  Diagnostics parse_diags;
  const Deck deck = Parse(kName, *text, parse_diags);
  for (auto _ : state) {
    Diagnostics diags;
    std::vector<std::unique_ptr<Deck>> keep;
    std::unique_ptr<Model> model = BuildModel(deck, BuildOptions{}, &keep, diags);
    if (diags.has_errors()) {
      state.SkipWithError("the deck has errors");
      break;
    }
    benchmark::DoNotOptimize(model.get());
  }
  SetBytes(state, *text);
}

void BM_Compile(benchmark::State& state) {
  const std::string* text = Text(state);
  if (text == nullptr) return;
  const auto l = Load(*text, state);
  if (l == nullptr) return;
  for (auto _ : state) {
    const Plan plan = MakePlan(*l->model);
    Evaluator ev(*l->model, plan);
    CaseResult c;
    ev.LoadInputs({});
    ev.EvaluateCase(&c);
    benchmark::DoNotOptimize(c);
  }
  state.counters["quantities"] = static_cast<double>(l->model->quantities.size());
}

void BM_EvalCase(benchmark::State& state) {
  const std::string* text = Text(state);
  if (text == nullptr) return;
  const auto l = Load(*text, state);
  if (l == nullptr) return;
  Evaluator ev(*l->model, l->plan);
  CaseResult first;  // compiles (BM_Compile); not timed here
  ev.LoadInputs({});
  ev.EvaluateCase(&first);
  for (auto _ : state) {
    CaseResult c;
    ev.LoadInputs({});
    ev.EvaluateCase(&c);
    benchmark::DoNotOptimize(c);
  }
  state.counters["quantities"] = static_cast<double>(l->model->quantities.size());
}

// One sweep point of B1 as the sweep runs it: set the swept inputs, then
// EvaluatePoint(); the points cycle through the grid in order.
void BM_EvalPoint(benchmark::State& state) {
  const std::string* text = Text(state);
  if (text == nullptr) return;
  const auto l = Load(*text, state);
  if (l == nullptr) return;
  const Model& m = *l->model;
  Evaluator ev(m, l->plan);
  ev.LoadInputs({});
  CaseResult scratch;
  ev.EvaluateCase(&scratch);
  std::vector<int> swept;
  for (const SweepDef& s : m.sweeps) swept.push_back(s.quantity);
  ev.PrepareSweep(swept);
  double* frame = ev.frame();
  std::vector<size_t> digit(m.sweeps.size(), 0);
  std::string error;
  size_t failed = 0;
  for (auto _ : state) {
    for (size_t s = 0; s < m.sweeps.size(); ++s) {
      frame[static_cast<size_t>(m.sweeps[s].quantity)] = m.sweeps[s].values[digit[s]];
    }
    error.clear();
    if (!ev.EvaluatePoint(&error)) ++failed;
    // Next point: the last sweep line varies fastest.
    for (size_t s = m.sweeps.size(); s-- > 0;) {
      if (++digit[s] < m.sweeps[s].values.size()) break;
      digit[s] = 0;
    }
  }
  if (failed > 0) state.SkipWithError("a sweep point failed");
  state.SetItemsProcessed(static_cast<int64_t>(state.iterations()));
}

// B1 (0) and chain decks of 1 000 and 10 000 statements.
void Decks(benchmark::internal::Benchmark* b) {
  b->Arg(0)->Arg(1000)->Arg(10000);
  b->ArgName("statements");
  b->Unit(benchmark::kMicrosecond);
}

BENCHMARK(BM_Lex)->Apply(Decks);
BENCHMARK(BM_Parse)->Apply(Decks);
BENCHMARK(BM_Build)->Apply(Decks);
BENCHMARK(BM_Compile)->Apply(Decks);
BENCHMARK(BM_EvalCase)->Apply(Decks);
BENCHMARK(BM_EvalPoint)->Arg(0)->ArgName("b1")->Unit(benchmark::kNanosecond);

}  // namespace

BENCHMARK_MAIN();
