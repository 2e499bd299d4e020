// The model: a deck's statements resolved into named quantities with types,
// a dependency order, checks, cases, sweeps and solves.  Built by
// BuildModel (resolve + check); read by the compiler, the evaluator and the
// writers.  The model owns what it resolves; it points into the syntax trees,
// which the Session keeps alive.
#pragma once

#include <deque>
#include <memory>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

#include "lang/diagnostics.h"
#include "lang/syntax.h"
#include "library/registry.h"
#include "library/table.h"
#include "units/unit.h"

namespace heatdeck {

enum class QuantityKind { kGiven, kCalc, kSolved };
const char* QuantityKindName(QuantityKind k);  // "given", "calc", "solved"

// The type the checker gives every expression and quantity.
struct Type {
  units::Dimension dim;
  units::TempKind temp = units::TempKind::kNone;
  bool boolean = false;  // comparisons and logical operators
};

struct Quantity {
  std::string name;  // as referenced: "Q", or "hx.Q" for a template's
  QuantityKind kind = QuantityKind::kCalc;
  const Stmt* stmt = nullptr;  // the defining statement (solve statement for kSolved)
  const Expr* expr = nullptr;  // given: the literal; calc: the expression; solved: null
  SourceRange range;           // the name where it is defined
  Type type;
  units::Unit display;            // display unit (dimension equal to type.dim)
  bool display_explicit = false;  // `in UNIT` or the given's own unit
  std::string description;
  std::string source;
  std::vector<int> deps;          // quantities read directly, sorted, unique
  int section = -1;               // index into Model::sections, -1 before the first
  std::string prefix;             // template prefix, "" for the deck's own
  bool template_default = false;  // a template input left unbound
  bool bound = false;             // a template input bound by `use … with` (kind kCalc)
  SourceRange binding_range;      // where it is bound
  double given_si = 0.0;          // given: the literal in SI
};

struct CheckDef {
  const Stmt* stmt = nullptr;
  const Expr* expr = nullptr;
  std::string description;
  std::string prefix;  // template prefix
  int section = -1;
  std::vector<int> deps;
  // For a single comparison: the display unit of the two sides (from the
  // right-hand literal's unit, else the left quantity's display unit).
  units::Unit side_unit;
  bool has_sides = false;
};

struct CaseDef {
  std::string name;
  std::string description;
  const Stmt* stmt = nullptr;
  std::vector<std::pair<int, double>> overrides;  // quantity index, SI value
};

struct SweepDef {
  const Stmt* stmt = nullptr;
  int quantity = -1;           // the swept given
  std::vector<double> values;  // SI, in order
};

struct SolveDef {
  const Stmt* stmt = nullptr;
  int unknown = -1;       // the kSolved quantity
  double lo = 0, hi = 0;  // SI bracket
  const Expr* lhs = nullptr;
  const Expr* rhs = nullptr;
  std::vector<int> deps;      // quantities the condition reads
  units::Unit residual_unit;  // display unit of the condition's sides
  bool ok = false;            // the condition type-checked
};

// `profile counter|parallel: hot T_h1 to T_h2, cold T_c1 to T_c2 ["caption"]`
// asks the report for a temperature-profile figure.
struct ProfileDef {
  const Stmt* stmt = nullptr;
  bool counterflow = true;
  int hot_in = -1, hot_out = -1, cold_in = -1, cold_out = -1;  // quantity indices
  std::string caption;
  int section = -1;
};

struct UseDef {
  const Stmt* stmt = nullptr;
  std::string prefix;  // "hx" (nested: "hx.inner")
  std::string path;    // resolved file
};

struct TableDef {
  std::string name;
  const Stmt* stmt = nullptr;
  std::string path;  // resolved path
  library::Table table;
};

// One report section and what it holds, in source order.
struct Section {
  std::string title;  // "" for the implicit section before the first `section`
  struct Item {
    enum class Kind { kNarrative, kQuantity, kCheck, kSolve, kProfile } kind;
    int index;  // into narrative, quantities, checks, solves or profiles
  };
  std::vector<Item> items;
};

// What the checker knows about one expression node.
struct ExprInfo {
  Type type;
  bool literal = false;  // a number, or a negated number: si holds its value
  double si = 0.0;       // literals and constants: the value in SI
  int quantity = -1;     // names: the quantity index
  int constant = -1;     // names: index into BuiltinConstants()
  int builtin = -1;      // calls: index into BuiltinFunctions()
  // Literals with a unit: the parsed unit's index in Model::literal_units
  // (-1 for none).  Kept apart because few nodes have one: the info of
  // every node in a long deck then fits in 56 bytes instead of 120.
  int unit = -1;
  const library::FunctionInfo* fn = nullptr;  // calls: a library function
  int table = -1, column = -1;                // calls: NAME.COLUMN(x)
};

// ExprInfo per expression node.  A std::unordered_map keyed by the node's
// address cost a hash-node allocation and a cache miss per node, about a
// tenth of checking a large deck; nodes already carry a dense id
// (Expr::id, from the parser's arena), so the table is a Chunked indexed by
// that id.  The slot remembers its node, so a node whose id is taken by
// another (templates are parsed into decks of their own and number from 0
// again, and writers look up temporary nodes) lives in a hashed overflow
// instead.  References stay valid as the table grows, like the map's did.
class ExprInfoTable {
 public:
  using Entry = std::pair<const Expr*, ExprInfo>;

  ExprInfoTable() = default;
  // The overflow points into its own store: moving keeps those addresses,
  // copying would not.
  ExprInfoTable(const ExprInfoTable&) = delete;
  ExprInfoTable& operator=(const ExprInfoTable&) = delete;
  ExprInfoTable(ExprInfoTable&&) = default;
  ExprInfoTable& operator=(ExprInfoTable&&) = default;

  // The node's info, default-constructed on first use.
  ExprInfo& operator[](const Expr* e);
  // The node's info; throws std::out_of_range when it has none.
  const ExprInfo& at(const Expr* e) const;
  // The node's entry, or end() (null) when it has none.
  const Entry* find(const Expr* e) const;
  const Entry* end() const { return nullptr; }
  // Calls f(node, info) for every node with info, in no particular order.
  template <typename F>
  void ForEach(F&& f) const {
    for (size_t i = 0; i < slots_.size(); ++i) {
      const Entry& x = slots_[i];
      if (x.first != nullptr) f(x.first, x.second);
    }
    for (const Entry& x : overflow_store_) f(x.first, x.second);
  }

 private:
  Chunked<Entry> slots_;  // by Expr::id; first is null while unused
  std::unordered_map<const Expr*, Entry*> overflow_;
  std::deque<Entry> overflow_store_;
};

// Built-in math functions of the language (LANGUAGE.md "Expressions").
enum class Builtin {
  kMin,
  kMax,
  kAbs,
  kSqrt,
  kExp,
  kLn,
  kLog10,
  kSin,
  kCos,
  kTan,
  kAsin,
  kAcos,
  kAtan,
  kSinh,
  kCosh,
  kTanh,
  kIf
};
struct BuiltinInfo {
  const char* name;
  Builtin id;
  int min_args, max_args;  // max -1: any number
};
const std::vector<BuiltinInfo>& BuiltinFunctions();

struct ConstantInfo {
  const char* name;
  double si;
  units::Dimension dim;
  const char* description;
};
const std::vector<ConstantInfo>& BuiltinConstants();

struct Model {
  std::string title;
  std::vector<std::pair<std::string, std::string>> meta;  // in deck order
  std::vector<std::string> narrative;
  std::vector<Section> sections;
  std::vector<Quantity> quantities;
  std::unordered_map<std::string, int> by_name;
  std::vector<CheckDef> checks;
  std::vector<CaseDef> cases;
  std::vector<SweepDef> sweeps;
  std::vector<SolveDef> solves;
  std::vector<TableDef> tables;
  std::vector<UseDef> uses;
  std::vector<ProfileDef> profiles;
  std::vector<int> order;  // quantity indices in dependency order
  ExprInfoTable info;
  std::vector<units::Unit> literal_units;  // see ExprInfo::unit
  // prefer: display unit per dimension (absolute temperature separately).
  std::vector<units::Unit> prefer;

  const ExprInfo& Info(const Expr* e) const { return info.at(e); }
  // The unit a literal was written with; an empty unit for none.
  const units::Unit& LiteralUnit(const ExprInfo& i) const {
    static const units::Unit kNone;
    return i.unit < 0 ? kNone : literal_units[static_cast<size_t>(i.unit)];
  }
  int Find(const std::string& name) const {
    auto it = by_name.find(name);
    return it == by_name.end() ? -1 : it->second;
  }
};

}  // namespace heatdeck
