// Every row of the shared reference CSVs run through the deck path (parse ->
// check -> evaluate), not only the C++ function: each row becomes a deck
//   x = FUNCTION(arg1 UNIT, arg2 UNIT, ...)
// with every argument written in the coherent SI unit of its dimension.
#include <cmath>
#include <string>

#include <fmt/format.h>
#include <gtest/gtest.h>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "library/registry.h"
#include "model/model.h"
#include "reference_csv.h"
#include "units/unit.h"

namespace heatdeck {
namespace {

// The deck text for one call; "" when the function is not registered.
std::string DeckFor(const std::string& function, const std::vector<double>& args) {
  const library::FunctionInfo* f = library::FindFunction(function);
  if (f == nullptr || f->args.size() != args.size()) return "";
  std::string call = function + "(";
  for (size_t i = 0; i < args.size(); ++i) {
    if (i > 0) call += ", ";
    const std::string unit = f->args[i].dim.SiUnit();
    call += units::FormatExact(args[i]);
    if (!unit.empty()) call += " " + unit;
  }
  return "x = " + call + ")\n";
}

struct Outcome {
  bool loaded = false;
  bool evaluated = false;
  double value = NAN;
  std::vector<std::string> warnings;
  std::string errors;  // rendered diagnostics
};

Outcome RunDeck(const std::string& deck) {
  Outcome o;
  Session s;
  o.loaded = s.LoadText("row.deck", deck, SessionOptions{});
  if (o.loaded) o.evaluated = s.Evaluate();
  for (const Diagnostic* d : s.diagnostics().Sorted()) o.errors += Render(*d, s.files(), false);
  if (o.evaluated) {
    const CaseResult& c = s.results().cases.at(0);
    const int q = s.model().Find("x");
    o.value = c.values.at(static_cast<size_t>(q));
    for (const auto& m : c.messages.at(static_cast<size_t>(q))) {
      if (m.kind == QuantityMessage::Kind::kWarning) o.warnings.push_back(m.text);
    }
  }
  return o;
}

TEST(LibraryThroughDecks, EveryCheckRowPasses) {
  const auto rows = testing::LoadReference("library_checks.csv");
  ASSERT_GT(rows.size(), 250u);
  int checked = 0;
  for (const auto& row : rows) {
    const std::string fn = row.at("function");
    const std::string deck = DeckFor(fn, testing::SplitArgs(row.at("args")));
    ASSERT_FALSE(deck.empty()) << fn << " is not registered with that many arguments";
    const Outcome o = RunDeck(deck);
    ASSERT_TRUE(o.evaluated) << deck << o.errors;
    const double expected = std::stod(row.at("expected"));
    const double tol = std::stod(row.at("rel_tol"));
    const double bound = expected == 0.0 ? tol : tol * std::fabs(expected);
    EXPECT_LE(std::fabs(o.value - expected), bound)
        << deck << "expected " << row.at("expected") << " (" << row.at("source") << "), got "
        << units::FormatExact(o.value);
    ++checked;
  }
  EXPECT_EQ(checked, static_cast<int>(rows.size()));
}

TEST(LibraryThroughDecks, EveryErrorRowStopsOrWarns) {
  const auto rows = testing::LoadReference("library_errors.csv");
  ASSERT_GT(rows.size(), 40u);
  for (const auto& row : rows) {
    const std::string fn = row.at("function");
    const std::string deck = DeckFor(fn, testing::SplitArgs(row.at("args")));
    ASSERT_FALSE(deck.empty()) << fn;
    const Outcome o = RunDeck(deck);
    ASSERT_TRUE(o.loaded) << deck << o.errors;  // the deck itself is well-formed
    if (row.at("expect") == "error") {
      EXPECT_FALSE(o.evaluated) << deck << "should stop: " << row.at("why");
      // A located error, naming the quantity, at the call.
      EXPECT_NE(o.errors.find("row.deck:1:5: error: cannot evaluate 'x': " + fn), std::string::npos)
          << deck << o.errors;
    } else {
      EXPECT_TRUE(o.evaluated) << deck << o.errors;
      EXPECT_TRUE(std::isfinite(o.value)) << deck;
      EXPECT_FALSE(o.warnings.empty()) << deck << "should warn: " << row.at("why");
    }
  }
}

// Issue 3's own examples, as an engineer would meet them.
TEST(LibraryThroughDecks, VapourIsALocatedError) {
  const Outcome o = RunDeck("given T = 400 K\ngiven p = 1 atm\nrho = water_rho(T, p)\n");
  EXPECT_FALSE(o.evaluated);
  EXPECT_NE(o.errors.find("row.deck:3:7: error: cannot evaluate 'rho': water_rho: "),
            std::string::npos)
      << o.errors;
  EXPECT_NE(o.errors.find("vapour"), std::string::npos) << o.errors;
}

TEST(LibraryThroughDecks, DittusBoelterBelowRangeWarnsAndEvaluates) {
  const Outcome o = RunDeck("x = nu_dittus_boelter(3000, 5, 0.4)\n");
  ASSERT_TRUE(o.evaluated) << o.errors;
  // 0.023 * 3000^0.8 * 5^0.4 by hand: 3000^0.8 = exp(0.8 ln 3000) = 602.6...,
  // 5^0.4 = 1.9037; the product with 0.023 is 26.38...
  EXPECT_NEAR(o.value, 0.023 * std::pow(3000.0, 0.8) * std::pow(5.0, 0.4), 1e-12);
  ASSERT_EQ(o.warnings.size(), 1u);
  EXPECT_NE(o.warnings[0].find("10000"), std::string::npos) << o.warnings[0];
}

TEST(LibraryThroughDecks, ArgumentDimensionsAreChecked) {
  const Outcome o = RunDeck("x = res_cyl(25 mm, 16 W/(m*K), 30 mm, 2 m)\n");
  EXPECT_FALSE(o.loaded);
  EXPECT_NE(o.errors.find("row.deck:1:20: error: argument 2 of res_cyl (D_out) expects a length "
                          "(m), got W/(m*K)"),
            std::string::npos)
      << o.errors;
}

}  // namespace
}  // namespace heatdeck
