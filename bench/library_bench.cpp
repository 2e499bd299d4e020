// Google Benchmark: one benchmark per library family, each calling a
// representative function with arguments inside its validity range (no
// warning, so the normal, allocation-free path is measured).
#include <benchmark/benchmark.h>

#include <vector>

#include "library/registry.h"

namespace {

using heatdeck::library::FindFunction;

class NullSink : public heatdeck::library::Sink {
 public:
  void Warning(std::string) override {}
  void Error(std::string) override {}
  void Note(const char*) override {}
};

void Call(benchmark::State& state, const char* name, std::vector<double> args) {
  const auto* f = FindFunction(name);
  NullSink sink;
  for (auto _ : state) {
    args[0] *= 1.0000000001;  // defeat constant folding; stays in range
    benchmark::DoNotOptimize(f->fn(args.data(), sink));
  }
}

void BM_Groups(benchmark::State& s) { Call(s, "reynolds_tube", {0.5, 0.0254, 4.04e-4}); }
void BM_Resistance(benchmark::State& s) { Call(s, "res_cyl", {0.0254, 0.0286, 16.0, 6.0}); }
void BM_Fins(benchmark::State& s) { Call(s, "fin_eff_annular", {60.0, 200.0, 4e-4, 0.0127, 0.03}); }
void BM_Mtd(benchmark::State& s) { Call(s, "fcorr_shell", {400.0, 350.0, 300.0, 330.0, 2.0}); }
void BM_Entu(benchmark::State& s) { Call(s, "eff_cross_unmixed", {2.0, 0.6}); }
void BM_Convection(benchmark::State& s) { Call(s, "nu_gnielinski", {5e4, 4.0}); }
void BM_Friction(benchmark::State& s) { Call(s, "f_colebrook", {5e4, 1e-4}); }
void BM_Water(benchmark::State& s) { Call(s, "water_k", {330.0, 3e5}); }
void BM_Air(benchmark::State& s) { Call(s, "air_pr", {320.0}); }

BENCHMARK(BM_Groups);
BENCHMARK(BM_Resistance);
BENCHMARK(BM_Fins);
BENCHMARK(BM_Mtd);
BENCHMARK(BM_Entu);
BENCHMARK(BM_Convection);
BENCHMARK(BM_Friction);
BENCHMARK(BM_Water);
BENCHMARK(BM_Air);

}  // namespace

BENCHMARK_MAIN();
