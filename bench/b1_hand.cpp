// Benchmark B1 by hand: the 29 quantities of ../shared/bench/b1_double_pipe.deck
// written as plain C++ on SI doubles, over the same grid in the same order
// (the first sweep line varies slowest), writing the CSV that
//
//   heatdeck run b1_double_pipe.deck -f csv -o DIR -j 1 --columns Q,T_h2,T_c2
//
// writes: the swept inputs and Q, T_h2, T_c2 in their display units, each
// number formatted with fmt "{}", and an empty error column.  One thread;
// it is the practical limit that heatdeck's sweep throughput is compared
// with (tools/bench.sh, target P1).
//
//   b1_hand OUT.csv [N_M_H N_M_C N_L]
//   b1_hand --levels OUT.csv [N_M_H N_M_C N_L]
//   b1_hand --base     the base case, for the README's table
//
// The plain loop computes every formula at every point: the limit of the
// issue's P1 target.  With --levels it computes each group of formulas only
// when a sweep line it reads changes, as heatdeck's sweeps do; tools/bench.sh
// prints that comparison too (for information: it shows what heatdeck's
// interpreter costs once both skip the same work).
//
// The optional counts shorten the sweep lines to their first N values (the
// smoke run of tools/bench.sh uses a generated deck with the same starts and
// steps and fewer points).
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <vector>

#include <fmt/format.h>

namespace {

// Unit conversion to SI as heatdeck does it: value * factor + offset.
constexpr double kMm = 0.001;
constexpr double kZeroCelsius = 273.15;
constexpr double kPi = 3.141592653589793;

double Celsius(double t) { return t * 1.0 + kZeroCelsius; }

// A sweep line "from A to B step S" (SI): A + k*S for k = 0 … n with
// n = floor((B - A)/S + 1e-9), each value read back from its 13-digit
// decimal (LANGUAGE.md, sweeps).
std::vector<double> SweepLine(double a, double b, double step, long limit) {
  const double n = std::floor((b - a) / step + 1e-9);
  long count = static_cast<long>(n) + 1;
  if (limit > 0 && limit < count) count = limit;
  std::vector<double> v;
  for (long k = 0; k < count; ++k) {
    const double x = a + static_cast<double>(k) * step;
    v.push_back(std::strtod(fmt::format("{:.13g}", x).c_str(), nullptr));
  }
  return v;
}

// The deck's givens in SI.
struct Givens {
  double D_i = 25.4 * kMm;
  double t_w = 1.6 * kMm;
  double k_w = 16;
  double D_a = 50 * kMm;
  double L = 6;
  double m_h = 0.5;
  double T_h1 = Celsius(80);
  double m_c = 0.7;
  double T_c1 = Celsius(20);
  double cp_h = 4190;
  double mu_h = 4.04e-4;
  double k_h = 0.663;
  double cp_c = 4178;
  double mu_c = 7.97e-4;
  double k_c = 0.615;
  double Rf_i = 0.0002;
  double Rf_o = 0.0002;
};

// The 29 calculated quantities, SI.
struct Values {
  double D_o, Re_h, Pr_h, f_h, Nu_h, h_i, D_hyd, A_fl, Re_c, Pr_c, f_c, Nu_c, h_o, A_i, A_o;
  double R_tot, UA, U_o, C_h, C_c, C_min, C_max, Cr, NTU, eps, Q, T_h2, T_c2, dT_lm;
};

// The deck's formulas, in four groups by the sweep lines they read: the hot
// side reads m_h, the cold side m_c, the capacity rates both, the rest L as
// well.  The plain loop runs all four at every point; with --levels each
// group runs only when a line it reads changed (what heatdeck's sweep does).
inline void EvaluateHot(const Givens& g, double m_h, Values* v) {
  const double D_i = g.D_i, t_w = g.t_w, cp_h = g.cp_h, mu_h = g.mu_h, k_h = g.k_h;
  v->D_o = D_i + 2 * t_w;
  v->Re_h = 4 * m_h / (kPi * D_i * mu_h);
  v->Pr_h = cp_h * mu_h / k_h;
  v->f_h = std::pow(0.790 * std::log(v->Re_h) - 1.64, -2.0);
  v->Nu_h = (v->f_h / 8) * (v->Re_h - 1000) * v->Pr_h /
            (1 + 12.7 * std::sqrt(v->f_h / 8) * (std::pow(v->Pr_h, 2.0 / 3.0) - 1));
  v->h_i = v->Nu_h * k_h / D_i;
}

inline void EvaluateCold(const Givens& g, double m_c, Values* v) {
  const double D_a = g.D_a, cp_c = g.cp_c, mu_c = g.mu_c, k_c = g.k_c;
  v->D_hyd = D_a - v->D_o;
  v->A_fl = kPi / 4 * (D_a * D_a - v->D_o * v->D_o);
  v->Re_c = m_c * v->D_hyd / (v->A_fl * mu_c);
  v->Pr_c = cp_c * mu_c / k_c;
  v->f_c = std::pow(0.790 * std::log(v->Re_c) - 1.64, -2.0);
  v->Nu_c = (v->f_c / 8) * (v->Re_c - 1000) * v->Pr_c /
            (1 + 12.7 * std::sqrt(v->f_c / 8) * (std::pow(v->Pr_c, 2.0 / 3.0) - 1));
  v->h_o = v->Nu_c * k_c / v->D_hyd;
}

inline void EvaluateRates(const Givens& g, double m_h, double m_c, Values* v) {
  v->C_h = m_h * g.cp_h;
  v->C_c = m_c * g.cp_c;
  v->C_min = v->C_h < v->C_c ? v->C_h : v->C_c;
  v->C_max = v->C_h > v->C_c ? v->C_h : v->C_c;
  v->Cr = v->C_min / v->C_max;
}

inline void EvaluateLength(const Givens& g, double L, Values* v) {
  const double D_i = g.D_i, k_w = g.k_w, T_h1 = g.T_h1, T_c1 = g.T_c1;
  const double D_o = v->D_o, h_i = v->h_i, h_o = v->h_o;
  v->A_i = kPi * D_i * L;
  v->A_o = kPi * D_o * L;
  v->R_tot = 1 / (h_i * v->A_i) + g.Rf_i / v->A_i + std::log(D_o / D_i) / (2 * kPi * k_w * L) +
             g.Rf_o / v->A_o + 1 / (h_o * v->A_o);
  v->UA = 1 / v->R_tot;
  v->U_o = v->UA / v->A_o;
  v->NTU = v->UA / v->C_min;
  const double NTU = v->NTU, Cr = v->Cr;
  v->eps = (1 - std::exp(-NTU * (1 - Cr))) / (1 - Cr * std::exp(-NTU * (1 - Cr)));
  v->Q = v->eps * v->C_min * (T_h1 - T_c1);
  v->T_h2 = T_h1 - v->Q / v->C_h;
  v->T_c2 = T_c1 + v->Q / v->C_c;
  const double T_h2 = v->T_h2, T_c2 = v->T_c2;
  v->dT_lm = ((T_h1 - T_c2) - (T_h2 - T_c1)) / std::log((T_h1 - T_c2) / (T_h2 - T_c1));
}

inline void Evaluate(const Givens& g, double m_h, double m_c, double L, Values* v) {
  EvaluateHot(g, m_h, v);
  EvaluateCold(g, m_c, v);
  EvaluateRates(g, m_h, m_c, v);
  EvaluateLength(g, L, v);
}

// The base case (the deck as written) for comparison with the README's table.
int PrintBase() {
  const Givens g;
  Values v;
  Evaluate(g, g.m_h, g.m_c, g.L, &v);
  std::printf(
      "Re_h %.17g\nRe_c %.17g\nh_i %.17g\nh_o %.17g\nU_o %.17g\nNTU %.17g\neps %.17g\n"
      "Q %.17g\nT_h2 %.17g\nT_c2 %.17g\ndT_lm %.17g\n",
      v.Re_h, v.Re_c, v.h_i, v.h_o, v.U_o, v.NTU, v.eps, v.Q, v.T_h2 - kZeroCelsius,
      v.T_c2 - kZeroCelsius, v.dT_lm);
  return 0;
}

}  // namespace

int main(int argc, char** argv) {
  if (argc == 2 && std::string(argv[1]) == "--base") return PrintBase();
  const bool levels = argc > 1 && std::string(argv[1]) == "--levels";
  if (levels) {
    --argc;
    ++argv;
  }
  if (argc != 2 && argc != 5) {
    std::fprintf(stderr, "usage: b1_hand [--levels] OUT.csv [N_M_H N_M_C N_L] | b1_hand --base\n");
    return 2;
  }
  const long lim_h = argc == 5 ? std::atol(argv[2]) : 0;
  const long lim_c = argc == 5 ? std::atol(argv[3]) : 0;
  const long lim_l = argc == 5 ? std::atol(argv[4]) : 0;
  std::FILE* out = std::fopen(argv[1], "wb");
  if (out == nullptr) {
    std::perror(argv[1]);
    return 1;
  }
  const Givens g;
  // Sweeps: m_h, m_c (kg/s), L (m).
  const std::vector<double> sweep_m_h = SweepLine(0.2, 1.0, 0.008, lim_h);
  const std::vector<double> sweep_m_c = SweepLine(0.3, 1.2, 0.009, lim_c);
  const std::vector<double> sweep_L = SweepLine(2, 10, 0.08, lim_l);

  double checksum = 0;
  fmt::memory_buffer buf;
  fmt::format_to(std::back_inserter(buf),
                 "m_h [kg/s],m_c [kg/s],L [m],Q [kW],T_h2 [degC],T_c2 [degC],error\n");
  Values v{};
  for (const double m_h : sweep_m_h) {
    if (levels) EvaluateHot(g, m_h, &v);
    for (const double m_c : sweep_m_c) {
      if (levels) {
        EvaluateCold(g, m_c, &v);
        EvaluateRates(g, m_h, m_c, &v);
      }
      for (const double L : sweep_L) {
        if (levels) {
          EvaluateLength(g, L, &v);
        } else {
          Evaluate(g, m_h, m_c, L, &v);
        }
        // U_o and dT_lm are not written; the checksum keeps every quantity
        // computed.
        checksum += v.U_o + v.dT_lm;
        // Display units kg/s, m, kW, degC: (value - offset) / factor.
        fmt::format_to(std::back_inserter(buf), "{},{},{},{},{},{},\n", m_h, m_c, L, v.Q / 1000,
                       (v.T_h2 - kZeroCelsius) / 1, (v.T_c2 - kZeroCelsius) / 1);
        if (buf.size() > (1u << 16)) {
          std::fwrite(buf.data(), 1, buf.size(), out);
          buf.clear();
        }
      }
    }
  }
  std::fwrite(buf.data(), 1, buf.size(), out);
  std::fprintf(stderr, "b1_hand: %zu points (checksum %.17g)\n",
               sweep_m_h.size() * sweep_m_c.size() * sweep_L.size(), checksum);
  return std::fclose(out) == 0 ? 0 : 1;
}
