// The syntax tree of a deck (LANGUAGE.md).  Every node carries its source
// range.  The Deck owns all nodes; links between them are non-owning
// pointers into its arena.  Text views point into the source buffer, which
// the caller keeps alive (SourceFiles) for as long as the Deck lives.
#pragma once

#include <functional>
#include <string>
#include <string_view>
#include <vector>

#include "lang/chunked.h"
#include "lang/diagnostics.h"

namespace heatdeck {

enum class ExprKind {
  kNumber,  // literal: value, optional unit
  kName,    // a quantity, constant, or (dotted) template name
  kCall,    // name(args...): built-in, library function or table column
  kNeg,     // unary minus
  kAdd,
  kSub,
  kMul,
  kDiv,
  kPow,
  kLt,
  kLe,
  kGt,
  kGe,
  kEq,
  kNe,
  kAnd,
  kOr,
  kNot,
};

// Source spelling of an operator kind ("+", "<=", "and").
const char* OperatorText(ExprKind k);
bool IsComparison(ExprKind k);
// Binding strength of an operator, 1 (or) … 8 (^); 9 for leaves and calls.
int Precedence(ExprKind k);
bool IsLogical(ExprKind k);  // and, or, not

struct Expr {
  ExprKind kind = ExprKind::kNumber;
  int id = 0;  // dense index in the deck's arena, for side tables
  SourceRange range;
  // kNumber: the number as written ("4.19"); kName/kCall: the (dotted) name.
  std::string_view text;
  // kNumber: the unit as written, empty for a plain number.
  std::string_view unit;
  SourceRange unit_range;
  double number = 0.0;            // kNumber: the value as written (not SI)
  std::vector<const Expr*> args;  // operands or call arguments
  bool parenthesized = false;     // the author wrote it inside ( )
};

enum class StmtKind {
  kTitle,
  kMeta,
  kSection,
  kNarrative,
  kGiven,
  kCalc,
  kCheck,
  kCase,
  kSweep,
  kSolve,
  kUse,
  kTable,
  kPrefer,
  kProfile,
};
const char* StmtKeyword(StmtKind k);

// Description and source, in any order after a statement.
struct Attrs {
  std::string description;
  std::string source;
  SourceRange description_range;
  SourceRange source_range;
};

// NAME = EXPR, in case overrides and `use … with` bindings.
struct Binding {
  std::string_view name;
  SourceRange name_range;
  const Expr* value = nullptr;
};

// A unit written as a whole token: `in kW`, `prefer kPa`.
struct UnitRef {
  std::string_view text;
  SourceRange range;
};

struct Stmt {
  StmtKind kind = StmtKind::kCalc;
  SourceRange range;  // the keyword (or name) to the end of the first line
  // given/calc/solve/sweep: the quantity; case: the case name; meta: the key;
  // use: the prefix; table: the table name.
  std::string_view name;
  SourceRange name_range;
  // title/meta/section/narrative text; use/table file path.
  std::string text;
  SourceRange text_range;
  // given: the literal; calc: the expression; check: the condition;
  // solve: left side of the condition.
  const Expr* expr = nullptr;
  const Expr* expr2 = nullptr;  // solve: right side of the condition
  UnitRef display;              // calc: `in UNIT` (text empty when absent)
  Attrs attrs;
  std::vector<Binding> bindings;  // case overrides, use … with
  const Expr* from = nullptr;     // sweep/solve
  const Expr* to = nullptr;       // sweep/solve
  const Expr* step = nullptr;     // sweep … step
  std::vector<const Expr*> over;  // sweep … over
  std::vector<UnitRef> units;     // prefer
  // profile: the hot inlet, hot outlet, cold inlet and cold outlet names;
  // name holds "counter" or "parallel".
  std::vector<const Expr*> streams;
};

// One parsed deck file.
struct Deck {
  std::string_view file;
  std::vector<Stmt> stmts;
  Chunked<Expr> exprs;  // arena; Expr::id indexes it

  Expr& NewExpr(ExprKind k, SourceRange r) {
    Expr& e = exprs.emplace_back();
    e.kind = k;
    e.range = r;
    e.id = static_cast<int>(exprs.size() - 1);
    return e;
  }
};

// A stable, readable text form for tests: one line per statement,
// expressions fully parenthesised, e.g. `calc Q = ((eps * C_min) * (T_h1 - T_c1)) in kW`.
std::string Dump(const Deck& deck);
std::string DumpExpr(const Expr& e);

// The expression as an engineer would write it: operators spaced, only the
// parentheses precedence needs plus the ones the author wrote.  When leaf is
// given and returns a non-empty text for a node, that text replaces the
// node (writers use it to substitute values for names).
std::string Pretty(const Expr& e, const std::function<std::string(const Expr&)>& leaf = {});

}  // namespace heatdeck
