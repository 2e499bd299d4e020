#include "model/builder.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdlib>
#include <functional>
#include <set>

#include <fmt/format.h>

#include "lang/parser.h"

namespace heatdeck {

using units::Dimension;
using units::TempKind;

std::string NearestName(const std::string& word, const std::vector<std::string>& candidates) {
  const size_t limit = std::max<size_t>(1, word.size() / 3);
  std::string best;
  size_t best_d = limit + 1;
  std::vector<size_t> prev, cur;
  for (const auto& c : candidates) {
    if (c.size() > word.size() + limit || word.size() > c.size() + limit) continue;
    prev.assign(c.size() + 1, 0);
    cur.assign(c.size() + 1, 0);
    for (size_t j = 0; j <= c.size(); ++j) prev[j] = j;
    for (size_t i = 1; i <= word.size(); ++i) {
      cur[0] = i;
      for (size_t j = 1; j <= c.size(); ++j) {
        const size_t sub = prev[j - 1] + (word[i - 1] == c[j - 1] ? 0 : 1);
        cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, sub});
      }
      std::swap(prev, cur);
    }
    if (prev[c.size()] < best_d) {
      best_d = prev[c.size()];
      best = c;
    }
  }
  return best_d <= limit ? best : std::string();
}

namespace {

// A number of sweep points as a count: in full while a double holds it
// exactly ("100", not "100.000"), in scientific notation beyond.
std::string PointCount(double n) {
  return n < 1e15 ? fmt::format("{:.0f}", n) : units::FormatSig(n, 6);
}

const char* TempWord(TempKind k) {
  switch (k) {
    case TempKind::kAbsolute:
      return "an absolute temperature";
    case TempKind::kInterval:
      return "a temperature difference";
    default:
      return "a temperature";
  }
}

// A temperature kind for a Θ¹ result that came out of arithmetic.
TempKind KindFor(const Dimension& d, TempKind k) {
  if (!d.IsTemperature()) return TempKind::kNone;
  return k == TempKind::kNone ? TempKind::kEither : k;
}

class Builder {
 public:
  Builder(const BuildOptions& options, std::vector<std::unique_ptr<Deck>>* keep, Diagnostics& d)
      : options_(options), keep_(keep), diags_(d), model_(std::make_unique<Model>()) {}

  std::unique_ptr<Model> Run(const Deck& deck) {
    main_file_ = deck.file;
    Collect(deck, "", nullptr, "");
    ResolveAll();
    OrderQuantities();
    TypeAll();
    return std::move(model_);
  }

 private:
  // ---- collection ---------------------------------------------------------

  int AddQuantity(Quantity q) {
    auto [it, inserted] =
        model_->by_name.emplace(q.name, static_cast<int>(model_->quantities.size()));
    if (!inserted) {
      const Quantity& first = model_->quantities[static_cast<size_t>(it->second)];
      Diagnostic& d = diags_.Error(q.range, fmt::format("'{}' is defined twice", q.name));
      d.related.emplace_back(first.range, "first defined here");
      return -1;
    }
    model_->quantities.push_back(std::move(q));
    return it->second;
  }

  void AddItem(Section::Item::Kind kind, int index) {
    if (model_->sections.empty()) model_->sections.push_back(Section{});
    model_->sections.back().items.push_back(Section::Item{kind, index});
  }

  int CurrentSection() {
    if (model_->sections.empty()) model_->sections.push_back(Section{});
    return static_cast<int>(model_->sections.size()) - 1;
  }

  // Errors for statements a template may not hold.
  void NotInTemplate(const Stmt& s) {
    diags_.Error(
        SourceRange{
            s.range.file, s.range.line, s.range.col,
            s.range.col + static_cast<int>(std::string_view(StmtKeyword(s.kind)).size()) - 1},
        fmt::format("a template cannot hold '{}' statements; write them in the deck that uses "
                    "the template",
                    StmtKeyword(s.kind)));
  }

  // Collects the statements of one deck.  prefix is "" for the main deck and
  // "hx." for a template used as hx; bindings are the template's `with`
  // list (null for the main deck); scope is the prefix the bindings'
  // expressions are resolved in (the using deck's).
  void Collect(const Deck& deck, const std::string& prefix, const Stmt* use_stmt,
               const std::string& user_prefix) {
    const bool in_template = use_stmt != nullptr;
    std::set<std::string_view> bound;
    if (in_template) {
      for (const Binding& b : use_stmt->bindings) bound.insert(b.name);
    }
    for (const Stmt& s : deck.stmts) {
      switch (s.kind) {
        case StmtKind::kTitle:
          if (in_template) break;  // a template's title heads its section instead
          if (!model_->title.empty()) {
            diags_.Error(s.range, "the deck has a title already");
          }
          model_->title = s.text;
          break;
        case StmtKind::kMeta: {
          if (in_template) break;
          const std::string key(s.name);
          auto it = std::find_if(model_->meta.begin(), model_->meta.end(),
                                 [&](const auto& kv) { return kv.first == key; });
          if (it != model_->meta.end()) {
            diags_.Error(s.name_range, fmt::format("meta '{}' is given twice", key));
          } else {
            model_->meta.emplace_back(key, s.text);
          }
          break;
        }
        case StmtKind::kSection:
          model_->sections.push_back(Section{
              in_template ? fmt::format("{}: {}", prefix.substr(0, prefix.size() - 1), s.text)
                          : s.text,
              {}});
          break;
        case StmtKind::kNarrative:
          model_->narrative.push_back(s.text);
          AddItem(Section::Item::Kind::kNarrative, static_cast<int>(model_->narrative.size()) - 1);
          break;
        case StmtKind::kGiven:
        case StmtKind::kCalc: {
          Quantity q;
          q.name = prefix + std::string(s.name);
          q.kind = s.kind == StmtKind::kGiven ? QuantityKind::kGiven : QuantityKind::kCalc;
          q.stmt = &s;
          q.expr = s.expr;
          q.range = s.name_range;
          q.description = s.attrs.description;
          q.source = s.attrs.source;
          q.section = CurrentSection();
          q.prefix = prefix;
          std::string scope = prefix;
          if (in_template && s.kind == StmtKind::kGiven) {
            const Binding* b = nullptr;
            for (const Binding& x : use_stmt->bindings) {
              if (x.name == s.name) b = &x;
            }
            if (b != nullptr) {
              // A bound input: calculated from the using deck's expression.
              q.kind = QuantityKind::kCalc;
              q.expr = b->value;
              q.bound = true;
              q.binding_range = b->name_range;
              scope = user_prefix;
              if (q.source.empty()) {
                q.source =
                    fmt::format("bound by 'use … as {}'", prefix.substr(0, prefix.size() - 1));
              }
            } else {
              q.template_default = true;
            }
          }
          const int idx = AddQuantity(std::move(q));
          if (idx >= 0) {
            if (scope_of_.size() <= static_cast<size_t>(idx)) {
              scope_of_.resize(static_cast<size_t>(idx) + 1);
            }
            scope_of_[static_cast<size_t>(idx)] = std::move(scope);
            AddItem(Section::Item::Kind::kQuantity, idx);
          }
          break;
        }
        case StmtKind::kCheck: {
          CheckDef c;
          c.stmt = &s;
          c.expr = s.expr;
          c.description = s.attrs.description;
          c.prefix = prefix;
          c.section = CurrentSection();
          model_->checks.push_back(std::move(c));
          AddItem(Section::Item::Kind::kCheck, static_cast<int>(model_->checks.size()) - 1);
          break;
        }
        case StmtKind::kPrefer:
          if (in_template) break;  // display units are the using deck's choice
          for (const UnitRef& u : s.units) {
            units::Unit unit;
            if (ParseUnitAt(u.text, u.range, &unit)) model_->prefer.push_back(unit);
          }
          break;
        case StmtKind::kCase:
          if (in_template) {
            NotInTemplate(s);
          } else {
            case_stmts_.push_back(&s);
          }
          break;
        case StmtKind::kSweep:
          if (in_template) {
            NotInTemplate(s);
          } else {
            sweep_stmts_.push_back(&s);
          }
          break;
        case StmtKind::kSolve: {
          Quantity q;
          q.name = prefix + std::string(s.name);
          q.kind = QuantityKind::kSolved;
          q.stmt = &s;
          q.range = s.name_range;
          q.description = s.attrs.description;
          q.source = s.attrs.source;
          q.section = CurrentSection();
          q.prefix = prefix;
          const int idx = AddQuantity(std::move(q));
          if (idx >= 0) {
            SolveDef d;
            d.stmt = &s;
            d.unknown = idx;
            d.lhs = s.expr;
            d.rhs = s.expr2;
            model_->solves.push_back(d);
            AddItem(Section::Item::Kind::kSolve, static_cast<int>(model_->solves.size()) - 1);
          }
          break;
        }
        case StmtKind::kUse:
          CollectUse(deck, s, prefix);
          break;
        case StmtKind::kTable:
          CollectTable(deck, s, prefix);
          break;
        case StmtKind::kProfile:
          profile_stmts_.emplace_back(&s, prefix);
          break;
      }
    }
    if (in_template) {
      for (const Binding& b : use_stmt->bindings) {
        const int q = model_->Find(prefix + std::string(b.name));
        if (q >= 0 && model_->quantities[static_cast<size_t>(q)].bound) continue;
        if (q >= 0) {
          diags_.Error(b.name_range,
                       fmt::format("'{}' is calculated in the template; only its given inputs can "
                                   "be bound",
                                   b.name));
          continue;
        }
        Diagnostic& d =
            diags_.Error(b.name_range, fmt::format("the template has no input '{}'", b.name));
        std::vector<std::string> givens;
        for (const auto& qq : model_->quantities) {
          if (qq.prefix == prefix && (qq.template_default || qq.bound)) {
            givens.push_back(qq.name.substr(prefix.size()));
          }
        }
        const std::string near = NearestName(std::string(b.name), givens);
        if (!near.empty()) d.notes.push_back(fmt::format("did you mean '{}'?", near));
      }
    }
  }

  void CollectUse(const Deck& deck, const Stmt& s, const std::string& prefix) {
    if (!options_.load) {
      diags_.Error(s.text_range, "templates cannot be read here");
      return;
    }
    if (static_cast<int>(use_stack_.size()) >= options_.max_use_depth) {
      diags_.Error(s.text_range,
                   fmt::format("templates nested more than {} deep", options_.max_use_depth));
      return;
    }
    std::string_view name;
    std::string why;
    std::string_view text;
    if (!options_.load(std::string(deck.file), s.text, &name, &text, &why)) {
      diags_.Error(s.text_range, fmt::format("cannot use '{}': {}", s.text, why));
      return;
    }
    if (std::find(use_stack_.begin(), use_stack_.end(), name) != use_stack_.end() ||
        name == std::string(main_file_)) {
      std::string chain = std::string(main_file_) + " -> ";
      for (const auto& f : use_stack_) chain += f + " -> ";
      diags_.Error(s.text_range, fmt::format("cycle of templates: {}{}", chain, name));
      return;
    }
    const std::string sub = prefix + std::string(s.name) + ".";
    if (!used_prefixes_.insert(sub).second) {
      diags_.Error(s.name_range, fmt::format("the prefix '{}' is used twice", s.name));
      return;
    }
    keep_->push_back(std::make_unique<Deck>());
    Deck& t = *keep_->back();
    std::string_view file;
    file = name;
    t = Parse(file, text, diags_);
    std::string title;
    for (const Stmt& ts : t.stmts) {
      if (ts.kind == StmtKind::kTitle) title = ts.text;
    }
    const std::string label = sub.substr(0, sub.size() - 1);
    const std::string resume =
        model_->sections.empty() ? std::string() : model_->sections.back().title;
    model_->sections.push_back(Section{title.empty() ? fmt::format("{}: template {}", label, s.text)
                                                     : fmt::format("{}: {}", label, title),
                                       {}});
    model_->uses.push_back(UseDef{&s, label, std::string(name)});
    use_stack_.emplace_back(name);
    Collect(t, sub, &s, prefix);
    use_stack_.pop_back();
    // The using deck's statements after the `use` continue its own section.
    model_->sections.push_back(Section{resume.empty() ? "" : resume + " (continued)", {}});
  }

  void CollectTable(const Deck& deck, const Stmt& s, const std::string& prefix) {
    TableDef t;
    t.name = prefix + std::string(s.name);
    t.stmt = &s;
    if (!options_.load) {
      diags_.Error(s.text_range, "tables cannot be read here");
      return;
    }
    std::string_view name;
    std::string why;
    std::string_view text;
    if (!options_.load(std::string(deck.file), s.text, &name, &text, &why)) {
      diags_.Error(s.text_range, fmt::format("cannot read table '{}': {}", s.text, why));
      return;
    }
    const std::string_view file = name;
    std::vector<library::TableError> errors;
    if (!library::ParseTableCsv(text, &t.table, &errors)) {
      for (const auto& e : errors) {
        diags_.Error(SourceRange{file, e.line, e.column, e.column}, e.message);
      }
      return;
    }
    t.path = name;
    for (const auto& other : model_->tables) {
      if (other.name == t.name) {
        Diagnostic& d =
            diags_.Error(s.name_range, fmt::format("table '{}' is defined twice", t.name));
        d.related.emplace_back(other.stmt->name_range, "first defined here");
        return;
      }
    }
    model_->tables.push_back(std::move(t));
  }

  // Parses a unit written at `range`; reports errors there.
  bool ParseUnitAt(std::string_view text, SourceRange range, units::Unit* out,
                   const std::string& hint = {}) {
    units::UnitError err;
    if (units::ParseUnit(text, out, &err)) return true;
    SourceRange r = range;
    r.col = range.col + err.offset;
    r.last_col = r.col + std::max(err.length, 1) - 1;
    std::string message = err.message;
    // A word that names a quantity or a constant was surely meant as a
    // factor: there is no implicit multiplication.
    bool names_value = model_->Find(std::string(text)) >= 0;
    for (const auto& c : BuiltinConstants()) names_value = names_value || text == c.name;
    if (!hint.empty() && names_value) message += "; " + hint;
    diags_.Error(r, message);
    return false;
  }

  // ---- name resolution ----------------------------------------------------

  std::vector<std::string> CandidateNames(const std::string& prefix) const {
    std::vector<std::string> v;
    for (const auto& q : model_->quantities) {
      if (q.prefix == prefix) v.push_back(q.name.substr(prefix.size()));
    }
    for (const auto& c : BuiltinConstants()) v.emplace_back(c.name);
    return v;
  }

  std::vector<std::string> CandidateFunctions() const {
    std::vector<std::string> v;
    for (const auto& b : BuiltinFunctions()) v.emplace_back(b.name);
    for (const auto& f : library::Functions()) v.emplace_back(f.name);
    return v;
  }

  void ResolveAll() {
    for (size_t i = 0; i < model_->quantities.size(); ++i) {
      Quantity& q = model_->quantities[i];
      if (q.expr == nullptr) continue;
      static const std::string kNoScope;
      Resolve(q.expr, i < scope_of_.size() ? scope_of_[i] : kNoScope, q.deps);
      SortUnique(q.deps);
    }
    for (CheckDef& c : model_->checks) {
      Resolve(c.expr, c.prefix, c.deps);
      SortUnique(c.deps);
    }
    for (SolveDef& d : model_->solves) {
      const std::string& prefix = model_->quantities[static_cast<size_t>(d.unknown)].prefix;
      Resolve(d.lhs, prefix, d.deps);
      Resolve(d.rhs, prefix, d.deps);
      SortUnique(d.deps);
    }
  }

  // NAME.COLUMN(x) with NAME a table in scope: fills info and returns true.
  bool ResolveTableCall(const Expr* e, const std::string& prefix, ExprInfo& info) {
    const std::string name(e->text);
    const size_t dot = name.rfind('.');
    if (dot == std::string::npos) return false;
    const std::string table = prefix + name.substr(0, dot);
    const std::string column = name.substr(dot + 1);
    for (size_t t = 0; t < model_->tables.size(); ++t) {
      const TableDef& td = model_->tables[t];
      if (td.name != table) continue;
      const int c = td.table.Find(column);
      if (c < 1) {
        std::vector<std::string> cols;
        std::string list;
        for (size_t k = 1; k < td.table.columns.size(); ++k) {
          cols.push_back(td.table.columns[k].name);
          list += (k > 1 ? ", " : "") + td.table.columns[k].name;
        }
        Diagnostic& d = diags_.Error(
            e->range, c == 0 ? fmt::format("'{}' is the argument column of table '{}'; interpolate "
                                           "one of: {}",
                                           column, table, list)
                             : fmt::format("table '{}' has no column '{}' (it has: {})", table,
                                           column, list));
        const std::string near = NearestName(column, cols);
        if (!near.empty() && c != 0) d.notes.push_back(fmt::format("did you mean '{}'?", near));
        info.table = -2;  // reported
        return true;
      }
      info.table = static_cast<int>(t);
      info.column = c;
      return true;
    }
    return false;
  }

  // Sorted and unique, as a std::set would give them, without a tree node
  // per name read.
  static void SortUnique(std::vector<int>& v) {
    std::sort(v.begin(), v.end());
    v.erase(std::unique(v.begin(), v.end()), v.end());
  }

  // Resolves names and calls; appends the quantities read to deps (with
  // repeats; the caller sorts them).
  void Resolve(const Expr* e, const std::string& prefix, std::vector<int>& deps) {
    if (e == nullptr) return;
    ExprInfo& info = model_->info[e];
    switch (e->kind) {
      case ExprKind::kNumber:
        return;
      case ExprKind::kName: {
        const std::string name(e->text);
        const int q = model_->Find(prefix + name);
        if (q >= 0) {
          info.quantity = q;
          deps.push_back(q);
          return;
        }
        const auto& consts = BuiltinConstants();
        for (size_t i = 0; i < consts.size(); ++i) {
          if (name == consts[i].name) {
            info.constant = static_cast<int>(i);
            return;
          }
        }
        Diagnostic& d = diags_.Error(e->range, fmt::format("unknown name '{}'", name));
        const std::string near = NearestName(name, CandidateNames(prefix));
        if (!near.empty()) d.notes.push_back(fmt::format("did you mean '{}'?", near));
        return;
      }
      case ExprKind::kCall: {
        const std::string name(e->text);
        const auto& builtins = BuiltinFunctions();
        bool found = false;
        for (size_t i = 0; i < builtins.size(); ++i) {
          if (name == builtins[i].name) {
            info.builtin = static_cast<int>(i);
            found = true;
          }
        }
        if (!found) info.fn = library::FindFunction(name);
        if (!found && info.fn == nullptr && ResolveTableCall(e, prefix, info)) {
          for (const Expr* a : e->args) Resolve(a, prefix, deps);
          return;
        }
        if (!found && info.fn == nullptr) {
          const int q = model_->Find(prefix + name);
          if (q >= 0) {
            diags_.Error(e->range, fmt::format("'{}' is a quantity, not a function; write "
                                               "'{} * (…)' to multiply",
                                               name, name));
          } else {
            Diagnostic& d =
                diags_.Error(SourceRange{e->range.file, e->range.line, e->range.col,
                                         e->range.col + static_cast<int>(name.size()) - 1},
                             fmt::format("unknown function '{}'", name));
            const std::string near = NearestName(name, CandidateFunctions());
            if (!near.empty()) d.notes.push_back(fmt::format("did you mean '{}'?", near));
            d.notes.push_back("'heatdeck functions' lists every function");
          }
        }
        for (const Expr* a : e->args) Resolve(a, prefix, deps);
        return;
      }
      default:
        for (const Expr* a : e->args) Resolve(a, prefix, deps);
        return;
    }
  }

  // ---- dependency order ---------------------------------------------------

  // Orders quantities so that each comes after what it reads; reports every
  // cycle with its members.  Iterative (decks may hold 100 000 statements).
  bool OrderQuantities() {
    const auto& qs = model_->quantities;
    const size_t n = qs.size();
    std::vector<int> state(n, 0);  // 0 new, 1 on stack, 2 done
    model_->order.reserve(n);
    bool ok = true;
    std::vector<std::pair<int, size_t>> stack;
    for (size_t root = 0; root < n; ++root) {
      if (state[root] != 0) continue;
      stack.emplace_back(static_cast<int>(root), 0);
      state[root] = 1;
      while (!stack.empty()) {
        auto& [v, next] = stack.back();
        const auto& deps = qs[static_cast<size_t>(v)].deps;
        if (next < deps.size()) {
          const int w = deps[next++];
          if (state[static_cast<size_t>(w)] == 0) {
            state[static_cast<size_t>(w)] = 1;
            stack.emplace_back(w, 0);
          } else if (state[static_cast<size_t>(w)] == 1) {
            ReportCycle(stack, w);
            ok = false;
          }
          continue;
        }
        state[static_cast<size_t>(v)] = 2;
        model_->order.push_back(v);
        stack.pop_back();
      }
    }
    return ok;
  }

  void ReportCycle(const std::vector<std::pair<int, size_t>>& stack, int w) {
    auto it = std::find_if(stack.begin(), stack.end(), [&](const auto& p) { return p.first == w; });
    std::vector<int> members;
    for (; it != stack.end(); ++it) members.push_back(it->first);
    in_cycle_.resize(model_->quantities.size(), false);
    for (int m : members) in_cycle_[static_cast<size_t>(m)] = true;
    // Report each cycle once, at its member that comes first in the file.
    std::vector<int> key = members;
    std::sort(key.begin(), key.end());
    if (!reported_cycles_.insert(key).second) return;
    const auto& qs = model_->quantities;
    std::string path;
    for (int m : members) path += qs[static_cast<size_t>(m)].name + " -> ";
    path += qs[static_cast<size_t>(members.front())].name;
    const int first = *std::min_element(members.begin(), members.end(), [&](int a, int b) {
      return qs[static_cast<size_t>(a)].range.line < qs[static_cast<size_t>(b)].range.line;
    });
    Diagnostic& d = diags_.Error(qs[static_cast<size_t>(first)].range,
                                 fmt::format("dependency cycle: {}", path));
    for (int m : members) {
      const Quantity& q = qs[static_cast<size_t>(m)];
      d.related.emplace_back(q.range, fmt::format("'{}' is part of the cycle", q.name));
    }
  }

  // ---- types ----------------------------------------------------------------

  // How a value is spelled in messages: the unit the deck used for it.
  std::string UnitWords(const Expr* e) const {
    const ExprInfo& info = model_->info.at(e);
    std::string u;
    if (e->kind == ExprKind::kNumber && !e->unit.empty())
      u = model_->LiteralUnit(info).text;
    else if (e->kind == ExprKind::kName && info.quantity >= 0) {
      const Quantity& q = model_->quantities[static_cast<size_t>(info.quantity)];
      if (q.display.dim == info.type.dim) u = q.display.text;
    }
    if (u.empty()) u = info.type.dim.SiUnit();
    return u.empty() ? "a plain number" : u;
  }

  // Returns the type of e, recording it; bad = an error was reported below
  // (callers then stay silent to avoid cascades).
  Type TypeOf(const Expr* e, bool* bad) {
    ExprInfo& info = model_->info[e];
    Type t;
    switch (e->kind) {
      case ExprKind::kNumber: {
        info.literal = true;
        if (!e->unit.empty()) {
          // "2 x": a word after a number is a unit; say how to multiply.
          const bool word = std::all_of(e->unit.begin(), e->unit.end(), [](char c) {
            return std::isalnum(static_cast<unsigned char>(c)) != 0 || c == '_';
          });
          const std::string hint =
              word ? fmt::format("write {} * {} to multiply", e->text, e->unit) : std::string();
          units::Unit unit;
          if (!ParseUnitAt(e->unit, e->unit_range, &unit, hint)) {
            *bad = true;
            break;
          }
          t.dim = unit.dim;
          t.temp = unit.kind;
          info.si = unit.ToSi(e->number);
          if (info.unit < 0) {  // typed once; a second visit keeps its slot
            info.unit = static_cast<int>(model_->literal_units.size());
            model_->literal_units.push_back(std::move(unit));
          }
        } else {
          info.si = e->number;
        }
        break;
      }
      case ExprKind::kName: {
        if (info.quantity >= 0) {
          const size_t qi = static_cast<size_t>(info.quantity);
          if (bad_[qi]) *bad = true;
          t = model_->quantities[qi].type;
        } else if (info.constant >= 0) {
          t.dim = BuiltinConstants()[static_cast<size_t>(info.constant)].dim;
          info.si = BuiltinConstants()[static_cast<size_t>(info.constant)].si;
        } else {
          *bad = true;
        }
        break;
      }
      case ExprKind::kNeg: {
        t = TypeOf(e->args[0], bad);
        if (*bad) break;
        if (e->args[0]->kind == ExprKind::kNumber) {
          // -5 degC is (-5) degC, not -(5 degC): the sign belongs to the number.
          const ExprInfo& li = model_->info.at(e->args[0]);
          info.literal = true;
          info.unit = li.unit;
          info.si = e->args[0]->unit.empty() ? -e->args[0]->number
                                             : model_->LiteralUnit(li).ToSi(-e->args[0]->number);
          break;
        }
        if (t.temp == TempKind::kAbsolute) {
          diags_.Error(e->range, "cannot negate an absolute temperature");
          *bad = true;
        }
        if (!*bad && t.boolean) BoolMisuse(e->args[0], bad);
        break;
      }
      case ExprKind::kAdd:
      case ExprKind::kSub:
        t = TypeAddSub(e, bad);
        break;
      case ExprKind::kMul:
      case ExprKind::kDiv: {
        const Type a = TypeOf(e->args[0], bad);
        const Type b = TypeOf(e->args[1], bad);
        if (*bad) break;
        if (a.boolean) BoolMisuse(e->args[0], bad);
        if (b.boolean) BoolMisuse(e->args[1], bad);
        t.dim = e->kind == ExprKind::kMul ? a.dim * b.dim : a.dim / b.dim;
        t.temp = KindFor(t.dim, TempKind::kNone);
        break;
      }
      case ExprKind::kPow:
        t = TypePow(e, bad);
        break;
      case ExprKind::kCall:
        t = TypeCall(e, bad);
        break;
      case ExprKind::kLt:
      case ExprKind::kLe:
      case ExprKind::kGt:
      case ExprKind::kGe:
      case ExprKind::kEq:
      case ExprKind::kNe: {
        const Type a = TypeOf(e->args[0], bad);
        const Type b = TypeOf(e->args[1], bad);
        t.boolean = true;
        if (*bad) break;
        if (a.boolean || b.boolean) {
          BoolMisuse(a.boolean ? e->args[0] : e->args[1], bad);
          break;
        }
        if (!(a.dim == b.dim)) {
          diags_.Error(e->range, fmt::format("cannot compare {} with {}", UnitWords(e->args[0]),
                                             UnitWords(e->args[1])));
          *bad = true;
        } else if (!TempCompatible(a.temp, b.temp)) {
          diags_.Error(e->range, fmt::format("cannot compare {} with {}", TempWord(a.temp),
                                             TempWord(b.temp)));
          *bad = true;
        }
        break;
      }
      case ExprKind::kAnd:
      case ExprKind::kOr:
      case ExprKind::kNot: {
        t.boolean = true;
        for (const Expr* a : e->args) {
          const Type at = TypeOf(a, bad);
          if (!*bad && !at.boolean) {
            diags_.Error(a->range, fmt::format("'{}' needs a comparison on each side",
                                               OperatorText(e->kind)));
            *bad = true;
          }
        }
        break;
      }
    }
    info.type = t;
    return t;
  }

  void BoolMisuse(const Expr* e, bool* bad) {
    diags_.Error(e->range,
                 "a comparison gives true or false, not a value; use if(condition, a, b)");
    *bad = true;
  }

  static bool TempCompatible(TempKind a, TempKind b) {
    if (a == TempKind::kEither || b == TempKind::kEither) return true;
    return a == b;
  }

  Type TypeAddSub(const Expr* e, bool* bad) {
    const Type a = TypeOf(e->args[0], bad);
    const Type b = TypeOf(e->args[1], bad);
    Type t;
    if (*bad) return t;
    if (a.boolean || b.boolean) {
      BoolMisuse(a.boolean ? e->args[0] : e->args[1], bad);
      return t;
    }
    const bool add = e->kind == ExprKind::kAdd;
    if (!(a.dim == b.dim)) {
      diags_.Error(e->range, fmt::format("cannot {} {} and {}", add ? "add" : "subtract",
                                         UnitWords(e->args[0]), UnitWords(e->args[1])));
      *bad = true;
      return t;
    }
    t.dim = a.dim;
    if (!a.dim.IsTemperature()) return t;
    using TK = TempKind;
    const TK x = a.temp, y = b.temp;
    if (add) {
      if (x == TK::kAbsolute && y == TK::kAbsolute) {
        diags_.Error(e->range,
                     "cannot add two absolute temperatures; for a mean write "
                     "T_a + 0.5 * (T_b - T_a)");
        *bad = true;
      } else if (x == TK::kAbsolute || y == TK::kAbsolute) {
        t.temp = TK::kAbsolute;
      } else if (x == TK::kInterval && y == TK::kInterval) {
        t.temp = TK::kInterval;
      } else {
        t.temp = TK::kEither;
      }
    } else {
      if (x == TK::kAbsolute && y == TK::kAbsolute)
        t.temp = TK::kInterval;
      else if (x == TK::kAbsolute)
        t.temp = TK::kAbsolute;
      else if (y == TK::kAbsolute && x == TK::kInterval) {
        diags_.Error(e->range,
                     "cannot subtract an absolute temperature from a temperature difference");
        *bad = true;
      } else if (y == TK::kAbsolute) {
        t.temp = TK::kInterval;
      } else if (x == TK::kInterval && y == TK::kInterval) {
        t.temp = TK::kInterval;
      } else {
        t.temp = TK::kEither;
      }
    }
    return t;
  }

  // The value of a constant dimensionless expression (numbers and
  // arithmetic only); false when it is not constant.
  bool ConstValue(const Expr* e, double* v) const {
    switch (e->kind) {
      case ExprKind::kNumber:
        if (!e->unit.empty()) return false;
        *v = e->number;
        return true;
      case ExprKind::kNeg:
        if (!ConstValue(e->args[0], v)) return false;
        *v = -*v;
        return true;
      case ExprKind::kAdd:
      case ExprKind::kSub:
      case ExprKind::kMul:
      case ExprKind::kDiv: {
        double a, b;
        if (!ConstValue(e->args[0], &a) || !ConstValue(e->args[1], &b)) return false;
        *v = e->kind == ExprKind::kAdd   ? a + b
             : e->kind == ExprKind::kSub ? a - b
             : e->kind == ExprKind::kMul ? a * b
                                         : a / b;
        return std::isfinite(*v);
      }
      default:
        return false;
    }
  }

  Type TypePow(const Expr* e, bool* bad) {
    const Type base = TypeOf(e->args[0], bad);
    const Type ex = TypeOf(e->args[1], bad);
    Type t;
    if (*bad) return t;
    if (base.boolean || ex.boolean) {
      BoolMisuse(base.boolean ? e->args[0] : e->args[1], bad);
      return t;
    }
    if (!ex.dim.dimensionless()) {
      diags_.Error(e->args[1]->range, fmt::format("an exponent must be a plain number, not {}",
                                                  UnitWords(e->args[1])));
      *bad = true;
      return t;
    }
    if (base.dim.dimensionless()) return t;
    double p = 0;
    if (!ConstValue(e->args[1], &p)) {
      diags_.Error(e->args[1]->range,
                   fmt::format("{} raised to a variable power has no fixed unit; the exponent "
                               "must be a constant number",
                               UnitWords(e->args[0])));
      *bad = true;
      return t;
    }
    for (int den = 1; den <= 12; ++den) {
      const double num = p * den;
      if (std::fabs(num - std::round(num)) < 1e-9 && std::fabs(num) < 100) {
        if (base.dim.PowRational(static_cast<int>(std::lround(num)), den, &t.dim)) {
          t.temp = KindFor(t.dim, TempKind::kNone);
          return t;
        }
      }
    }
    diags_.Error(e->range, fmt::format("{} raised to {} has no whole-numbered unit",
                                       UnitWords(e->args[0]), units::FormatExact(p)));
    *bad = true;
    return t;
  }

  Type TypeCall(const Expr* e, bool* bad) {
    ExprInfo& info = model_->info[e];
    std::vector<Type> args;
    bool arg_bad = false;
    for (const Expr* a : e->args) args.push_back(TypeOf(a, &arg_bad));
    Type t;
    if (arg_bad || (info.builtin < 0 && info.fn == nullptr && info.table < 0)) {
      *bad = true;
      return t;
    }
    const std::string name(e->text);
    if (info.table >= 0) return TypeTableCall(e, info, args, bad);
    if (info.builtin >= 0) {
      const BuiltinInfo& b = BuiltinFunctions()[static_cast<size_t>(info.builtin)];
      const int n = static_cast<int>(args.size());
      if (n < b.min_args || (b.max_args >= 0 && n > b.max_args)) {
        diags_.Error(e->range, b.min_args == b.max_args
                                   ? fmt::format("{} takes {} argument{}, got {}", name, b.min_args,
                                                 b.min_args == 1 ? "" : "s", n)
                                   : fmt::format("{} takes at least {} argument, got {}", name,
                                                 b.min_args, n));
        *bad = true;
        return t;
      }
      const size_t first_value = b.id == Builtin::kIf ? 1 : 0;
      if (b.id == Builtin::kIf && !args[0].boolean) {
        diags_.Error(e->args[0]->range, "the first argument of if is a condition such as a > b");
        *bad = true;
        return t;
      }
      for (size_t i = first_value; i < args.size(); ++i) {
        if (args[i].boolean) {
          BoolMisuse(e->args[i], bad);
          return t;
        }
      }
      switch (b.id) {
        case Builtin::kMin:
        case Builtin::kMax:
        case Builtin::kIf: {
          t = args[first_value];
          for (size_t i = first_value + 1; i < args.size(); ++i) {
            if (!(args[i].dim == t.dim)) {
              diags_.Error(e->range,
                           fmt::format("{} needs arguments of one kind: {} and {}", name,
                                       UnitWords(e->args[first_value]), UnitWords(e->args[i])));
              *bad = true;
              return t;
            }
            if (!TempCompatible(t.temp, args[i].temp)) {
              diags_.Error(e->range, fmt::format("{} mixes {} and {}", name, TempWord(t.temp),
                                                 TempWord(args[i].temp)));
              *bad = true;
              return t;
            }
            if (t.temp == TempKind::kEither) t.temp = args[i].temp;
          }
          return t;
        }
        case Builtin::kAbs:
          return args[0];
        case Builtin::kSqrt:
          if (!args[0].dim.PowRational(1, 2, &t.dim)) {
            diags_.Error(e->range, fmt::format("the square root of {} has no whole-numbered unit",
                                               UnitWords(e->args[0])));
            *bad = true;
          }
          t.temp = KindFor(t.dim, TempKind::kNone);
          return t;
        default:
          if (!args[0].dim.dimensionless()) {
            diags_.Error(e->args[0]->range,
                         fmt::format("the argument of {} must be a plain number, not {}", name,
                                     UnitWords(e->args[0])));
            *bad = true;
          }
          return t;
      }
    }
    const library::FunctionInfo& f = *info.fn;
    if (args.size() != f.args.size()) {
      diags_.Error(e->range, fmt::format("{} takes {} argument{} ({}), got {}", name, f.args.size(),
                                         f.args.size() == 1 ? "" : "s", ArgList(f), args.size()));
      *bad = true;
      return t;
    }
    for (size_t i = 0; i < args.size(); ++i) {
      const library::ArgSpec& spec = f.args[i];
      if (args[i].boolean) {
        BoolMisuse(e->args[i], bad);
        return t;
      }
      if (!(args[i].dim == spec.dim)) {
        diags_.Error(e->args[i]->range,
                     fmt::format("argument {} of {} ({}) expects {}, got {}", i + 1, name,
                                 spec.name, Expectation(spec.dim), UnitWords(e->args[i])));
        *bad = true;
      } else if (spec.kind == TempKind::kAbsolute && args[i].temp == TempKind::kInterval) {
        diags_.Error(e->args[i]->range,
                     fmt::format("argument {} of {} ({}) is an absolute temperature, got a "
                                 "temperature difference",
                                 i + 1, name, spec.name));
        *bad = true;
      } else if (spec.kind == TempKind::kInterval && args[i].temp == TempKind::kAbsolute) {
        diags_.Error(e->args[i]->range,
                     fmt::format("argument {} of {} ({}) is a temperature difference, got an "
                                 "absolute temperature",
                                 i + 1, name, spec.name));
        *bad = true;
      }
    }
    t.dim = f.result;
    t.temp = KindFor(f.result, f.result_kind);
    return t;
  }

  Type TypeTableCall(const Expr* e, const ExprInfo& info, const std::vector<Type>& args,
                     bool* bad) {
    Type t;
    const TableDef& td = model_->tables[static_cast<size_t>(info.table)];
    const units::Unit& arg_unit = td.table.columns[0].unit;
    const units::Unit& col_unit = td.table.columns[static_cast<size_t>(info.column)].unit;
    if (args.size() != 1) {
      diags_.Error(e->range, fmt::format("{} takes one argument ({}), got {}", e->text,
                                         td.table.columns[0].name, args.size()));
      *bad = true;
      return t;
    }
    if (args[0].boolean) {
      BoolMisuse(e->args[0], bad);
      return t;
    }
    if (!(args[0].dim == arg_unit.dim)) {
      diags_.Error(e->args[0]->range,
                   fmt::format("table '{}' is interpolated in {} [{}], got {}", td.name,
                               td.table.columns[0].name, arg_unit.text, UnitWords(e->args[0])));
      *bad = true;
      return t;
    }
    if (!TempCompatible(args[0].temp, arg_unit.kind)) {
      diags_.Error(e->args[0]->range,
                   fmt::format("table '{}' is interpolated in {}, got {}", td.name,
                               TempWord(arg_unit.kind), TempWord(args[0].temp)));
      *bad = true;
      return t;
    }
    t.dim = col_unit.dim;
    t.temp = KindFor(col_unit.dim, col_unit.kind);
    return t;
  }

  static std::string Expectation(const Dimension& d) {
    if (d.dimensionless()) return "a plain number";
    const std::string words = d.Describe();
    const std::string si = d.SiUnit();
    if (words == si) return si;
    const bool vowel =
        !words.empty() && std::string_view("aeiou").find(words[0]) != std::string_view::npos;
    return fmt::format("{} {} ({})", vowel ? "an" : "a", words, si);
  }

  static std::string ArgList(const library::FunctionInfo& f) {
    std::string s;
    for (size_t i = 0; i < f.args.size(); ++i) {
      if (i > 0) s += ", ";
      s += f.args[i].name;
    }
    return s;
  }

  // Display unit for a quantity without `in`: prefer, else coherent SI.
  units::Unit DefaultDisplay(const Type& t) const {
    for (const units::Unit& u : model_->prefer) {
      if (!(u.dim == t.dim)) continue;
      if (t.dim.IsTemperature()) {
        const bool abs_unit = u.kind == TempKind::kAbsolute;
        const bool int_unit = u.kind == TempKind::kInterval;
        if (t.temp == TempKind::kInterval && abs_unit) continue;
        if (t.temp != TempKind::kInterval && int_unit) continue;
      }
      return u;
    }
    units::Unit u;
    u.text = t.dim.SiUnit();
    u.dim = t.dim;
    u.kind = KindFor(t.dim, TempKind::kEither);
    return u;
  }

  void TypeAll() {
    bad_.assign(model_->quantities.size(), false);
    in_cycle_.resize(model_->quantities.size(), false);
    for (int qi : model_->order) {
      Quantity& q = model_->quantities[static_cast<size_t>(qi)];
      bool bad = false;
      if (in_cycle_[static_cast<size_t>(qi)]) {
        bad_[static_cast<size_t>(qi)] = true;  // reported as a cycle; its type is unknown
        continue;
      }
      if (q.kind == QuantityKind::kSolved) {
        TypeSolved(q, &bad);
        bad_[static_cast<size_t>(qi)] = bad;
        continue;
      }
      if (q.expr == nullptr) continue;
      q.type = TypeOf(q.expr, &bad);
      if (q.bound && !bad) {
        TypeBinding(q, &bad);
        bad_[static_cast<size_t>(qi)] = bad;
        continue;
      }
      if (!bad && q.type.boolean) {
        diags_.Error(q.expr->range,
                     "a quantity cannot be a comparison; use a check, or if(condition, a, b)");
        bad = true;
      }
      if (q.kind == QuantityKind::kGiven && !bad) {
        const ExprInfo& li = model_->info.at(q.expr);
        q.given_si = li.si;
        const units::Unit& written = model_->LiteralUnit(li);
        if (!written.text.empty()) {
          q.display = written;
          q.display_explicit = true;
        } else {
          q.display = DefaultDisplay(q.type);
        }
      } else if (!bad) {
        AssignDisplay(q, &bad);
      }
      bad_[static_cast<size_t>(qi)] = bad;
    }
    for (CheckDef& c : model_->checks) TypeCheck(c);
    for (SolveDef& d : model_->solves) TypeSolveCondition(d);
    for (const Stmt* st : case_stmts_) CollectCase(*st);
    for (const Stmt* st : sweep_stmts_) CollectSweep(*st);
    for (const auto& [st, prefix] : profile_stmts_) CollectProfile(*st, prefix);
  }

  // A template input bound by `with`: the binding must have the dimension of
  // the template's literal; it is shown in the template's unit.
  void TypeBinding(Quantity& q, bool* bad) {
    bool lit_bad = false;
    const Type lit = TypeOf(q.stmt->expr, &lit_bad);
    if (lit_bad) {
      *bad = true;
      return;
    }
    const ExprInfo& li = model_->info.at(q.stmt->expr);
    if (!(lit.dim == q.type.dim)) {
      diags_.Error(q.expr->range, fmt::format("'{}' of the template is {}, but it is bound to {}",
                                              q.name, Expectation(lit.dim), UnitWords(q.expr)));
      *bad = true;
      return;
    }
    if (!TempCompatible(lit.temp, q.type.temp)) {
      diags_.Error(q.expr->range, fmt::format("'{}' of the template is {}, but it is bound to {}",
                                              q.name, TempWord(lit.temp), TempWord(q.type.temp)));
      *bad = true;
      return;
    }
    if (q.type.temp == TempKind::kEither) q.type.temp = lit.temp;
    const units::Unit& written = model_->LiteralUnit(li);
    q.display = written.text.empty() ? DefaultDisplay(q.type) : written;
    q.display_explicit = !written.text.empty();
  }

  // A literal of a case, sweep or solve: its SI value and type; false after
  // reporting an error.
  bool LiteralValue(const Expr* e, Type* t, double* si) {
    bool bad = false;
    *t = TypeOf(e, &bad);
    if (bad) return false;
    *si = model_->info.at(e).si;
    return true;
  }

  const units::Unit& LiteralUnit(const Expr* e) const {
    return model_->LiteralUnit(model_->info.at(e));
  }

  // Checks that a literal suits the given it overrides.
  bool FitsGiven(const Quantity& q, const Expr* lit, const Type& t, const char* what) {
    if (!(t.dim == q.type.dim)) {
      diags_.Error(lit->range, fmt::format("{} of '{}' must be {}, got {}", what, q.name,
                                           Expectation(q.type.dim), UnitWords(lit)));
      return false;
    }
    if (!TempCompatible(t.temp, q.type.temp)) {
      diags_.Error(lit->range, fmt::format("{} of '{}' must be {}, got {}", what, q.name,
                                           TempWord(q.type.temp), TempWord(t.temp)));
      return false;
    }
    return true;
  }

  // A name a case or sweep may vary: a given of the main deck (a template's
  // inputs are bound with `use … with` instead).
  int InputNamed(std::string_view name, SourceRange range, const char* what) {
    const int qi = model_->Find(std::string(name));
    if (qi < 0) {
      Diagnostic& d = diags_.Error(range, fmt::format("unknown input '{}'", name));
      std::vector<std::string> names;
      for (const auto& q : model_->quantities) {
        if (q.kind == QuantityKind::kGiven) names.push_back(q.name);
      }
      const std::string near = NearestName(std::string(name), names);
      if (!near.empty()) d.notes.push_back(fmt::format("did you mean '{}'?", near));
      return -1;
    }
    const Quantity& q = model_->quantities[static_cast<size_t>(qi)];
    if (q.kind != QuantityKind::kGiven) {
      Diagnostic& d = diags_.Error(
          range, fmt::format("{} can change only a given input; '{}' is {}", what, name,
                             q.kind == QuantityKind::kSolved ? "solved for" : "calculated"));
      d.related.emplace_back(q.range, "defined here");
      return -1;
    }
    if (bad_[static_cast<size_t>(qi)]) return -1;
    return qi;
  }

  void CollectCase(const Stmt& s) {
    const std::string name(s.name);
    if (name == "base") {
      diags_.Error(s.name_range, "'base' is the deck as written; name the case otherwise");
      return;
    }
    for (const CaseDef& c : model_->cases) {
      if (c.name == name) {
        Diagnostic& d = diags_.Error(s.name_range, fmt::format("case '{}' is defined twice", name));
        d.related.emplace_back(c.stmt->name_range, "first defined here");
        return;
      }
    }
    CaseDef c;
    c.name = name;
    c.description = s.attrs.description;
    c.stmt = &s;
    bool ok = true;
    for (const Binding& b : s.bindings) {
      const int qi = InputNamed(b.name, b.name_range, "a case");
      if (qi < 0) {
        ok = false;
        continue;
      }
      for (const auto& [other, v] : c.overrides) {
        if (other == qi) {
          diags_.Error(b.name_range, fmt::format("case '{}' sets '{}' twice", name, b.name));
          ok = false;
        }
      }
      Type t;
      double si = 0;
      if (!LiteralValue(b.value, &t, &si) ||
          !FitsGiven(model_->quantities[static_cast<size_t>(qi)], b.value, t, "the value")) {
        ok = false;
        continue;
      }
      c.overrides.emplace_back(qi, si);
    }
    if (ok) model_->cases.push_back(std::move(c));
  }

  void CollectSweep(const Stmt& s) {
    const int qi = InputNamed(s.name, s.name_range, "a sweep");
    if (qi < 0) return;
    for (const SweepDef& d : model_->sweeps) {
      if (d.quantity == qi) {
        Diagnostic& dg = diags_.Error(s.name_range, fmt::format("'{}' is swept twice", s.name));
        dg.related.emplace_back(d.stmt->name_range, "first swept here");
        return;
      }
    }
    const Quantity& q = model_->quantities[static_cast<size_t>(qi)];
    SweepDef d;
    d.stmt = &s;
    d.quantity = qi;
    if (s.step != nullptr) {
      Type ta, tb, ts;
      double a = 0, b = 0, st = 0;
      if (!LiteralValue(s.from, &ta, &a) || !LiteralValue(s.to, &tb, &b) ||
          !LiteralValue(s.step, &ts, &st)) {
        return;
      }
      if (!FitsGiven(q, s.from, ta, "the start") || !FitsGiven(q, s.to, tb, "the end")) return;
      if (!(ts.dim == q.type.dim)) {
        diags_.Error(s.step->range, fmt::format("the step of '{}' must be {}, got {}", q.name,
                                                Expectation(q.type.dim), UnitWords(s.step)));
        return;
      }
      if (ts.temp == TempKind::kAbsolute) {
        diags_.Error(s.step->range, "a step is a temperature difference; write it in K or ddegC");
        return;
      }
      // The step is an interval: its SI size uses the unit's factor alone.
      const Expr* step_lit = s.step->kind == ExprKind::kNeg ? s.step->args[0] : s.step;
      const double step_si = step_lit->unit.empty()
                                 ? st
                                 : (s.step->kind == ExprKind::kNeg ? -1.0 : 1.0) *
                                       step_lit->number * LiteralUnit(step_lit).factor;
      if (!(step_si != 0.0) || !std::isfinite(step_si)) {
        diags_.Error(s.step->range, "a sweep step cannot be zero");
        return;
      }
      const double span = (b - a) / step_si;
      if (span < 0) {
        diags_.Error(s.step->range, fmt::format("the step goes away from the end: from {} to {} "
                                                "needs a step of the other sign",
                                                Pretty(*s.from), Pretty(*s.to)));
        return;
      }
      // LANGUAGE.md: A + k*S for k = 0 … n, n = floor((B - A)/S + 1e-9).
      const double n = std::floor(span + 1e-9);
      if (n + 1 > static_cast<double>(options_.max_sweep_points)) {
        diags_.Error(s.range, fmt::format("the sweep of '{}' has {} points, over the limit of {} "
                                          "(raise it with --max-points)",
                                          q.name, PointCount(n + 1), options_.max_sweep_points));
        return;
      }
      const long count = static_cast<long>(n) + 1;
      d.values.reserve(static_cast<size_t>(count));
      // A + k*S carries binary rounding (0.1 + 5 * 0.01 = 0.15000000000000002);
      // the value nearest to its 13-digit decimal is the one the engineer meant.
      for (long k = 0; k < count; ++k) {
        const double v = a + static_cast<double>(k) * step_si;
        d.values.push_back(std::strtod(fmt::format("{:.13g}", v).c_str(), nullptr));
      }
    } else {
      for (const Expr* v : s.over) {
        Type t;
        double si = 0;
        if (!LiteralValue(v, &t, &si) || !FitsGiven(q, v, t, "a value")) return;
        d.values.push_back(si);
      }
    }
    double total = static_cast<double>(d.values.size());
    for (const SweepDef& other : model_->sweeps) total *= static_cast<double>(other.values.size());
    if (total > static_cast<double>(options_.max_sweep_points)) {
      diags_.Error(s.range, fmt::format("the sweep grid has {} points, over the limit of {} "
                                        "(raise it with --max-points)",
                                        PointCount(total), options_.max_sweep_points));
      return;
    }
    model_->sweeps.push_back(std::move(d));
  }

  void TypeSolved(Quantity& q, bool* bad) {
    const Stmt& s = *q.stmt;
    Type ta, tb;
    double a = 0, b = 0;
    if (!LiteralValue(s.from, &ta, &a) || !LiteralValue(s.to, &tb, &b)) {
      *bad = true;
      return;
    }
    if (!(ta.dim == tb.dim) || !TempCompatible(ta.temp, tb.temp)) {
      diags_.Error(s.to->range, fmt::format("the bracket's ends differ: {} and {}",
                                            UnitWords(s.from), UnitWords(s.to)));
      *bad = true;
      return;
    }
    if (!(a < b) && !(b < a)) {
      diags_.Error(s.to->range, "the bracket's two ends are equal");
      *bad = true;
      return;
    }
    q.type = ta;
    if (q.type.temp == TempKind::kEither) q.type.temp = tb.temp;
    const units::Unit& u = LiteralUnit(s.from->kind == ExprKind::kNeg ? s.from->args[0] : s.from);
    q.display = u.text.empty() ? DefaultDisplay(q.type) : u;
    q.display_explicit = !u.text.empty();
    for (SolveDef& d : model_->solves) {
      if (d.stmt == &s) {
        d.lo = std::min(a, b);
        d.hi = std::max(a, b);
      }
    }
  }

  void TypeSolveCondition(SolveDef& d) {
    bool bad = false;
    const Type l = TypeOf(d.lhs, &bad);
    const Type r = TypeOf(d.rhs, &bad);
    if (bad) return;
    if (l.boolean || r.boolean) {
      BoolMisuse(l.boolean ? d.lhs : d.rhs, &bad);
      return;
    }
    if (!(l.dim == r.dim)) {
      diags_.Error(d.stmt->range, fmt::format("the condition compares {} with {}", UnitWords(d.lhs),
                                              UnitWords(d.rhs)));
      return;
    }
    if (!TempCompatible(l.temp, r.temp)) {
      diags_.Error(d.stmt->range, fmt::format("the condition compares {} with {}", TempWord(l.temp),
                                              TempWord(r.temp)));
      return;
    }
    // The condition must depend on the unknown, or no bracket can help.
    std::vector<bool> seen(model_->quantities.size(), false);
    std::vector<int> stack(d.deps.begin(), d.deps.end());
    bool reaches = false;
    while (!stack.empty() && !reaches) {
      const int v = stack.back();
      stack.pop_back();
      if (seen[static_cast<size_t>(v)]) continue;
      seen[static_cast<size_t>(v)] = true;
      if (v == d.unknown) reaches = true;
      for (int w : model_->quantities[static_cast<size_t>(v)].deps) stack.push_back(w);
    }
    if (!reaches) {
      diags_.Error(d.stmt->range,
                   fmt::format("the condition does not depend on '{}', so solving for it cannot "
                               "change it",
                               model_->quantities[static_cast<size_t>(d.unknown)].name));
      return;
    }
    d.residual_unit = DefaultDisplay(l);
    if (d.lhs->kind == ExprKind::kName) {
      const int q = model_->info.at(d.lhs).quantity;
      if (q >= 0) d.residual_unit = model_->quantities[static_cast<size_t>(q)].display;
    }
    d.ok = true;
  }

  void CollectProfile(const Stmt& s, const std::string& prefix) {
    ProfileDef p;
    p.stmt = &s;
    p.counterflow = s.name == "counter";
    p.caption = s.attrs.description;
    int* slots[4] = {&p.hot_in, &p.hot_out, &p.cold_in, &p.cold_out};
    for (size_t i = 0; i < 4; ++i) {
      const Expr* e = s.streams[i];
      const int qi = model_->Find(prefix + std::string(e->text));
      if (qi < 0) {
        diags_.Error(e->range, fmt::format("unknown name '{}'", e->text));
        return;
      }
      const Quantity& q = model_->quantities[static_cast<size_t>(qi)];
      if (bad_[static_cast<size_t>(qi)]) return;
      if (!q.type.dim.IsTemperature() || q.type.temp == TempKind::kInterval) {
        diags_.Error(e->range,
                     fmt::format("'{}' must be an absolute temperature for a profile", e->text));
        return;
      }
      *slots[i] = qi;
    }
    p.section = CurrentSection();
    model_->profiles.push_back(p);
    AddItem(Section::Item::Kind::kProfile, static_cast<int>(model_->profiles.size()) - 1);
  }

  void AssignDisplay(Quantity& q, bool* bad) {
    const UnitRef& d = q.stmt->display;
    if (d.text.empty()) {
      q.display = DefaultDisplay(q.type);
      return;
    }
    units::Unit u;
    if (!ParseUnitAt(d.text, d.range, &u)) {
      *bad = true;
      return;
    }
    if (!(u.dim == q.type.dim)) {
      diags_.Error(d.range,
                   fmt::format("'{}' is {}, which cannot be shown in {} ({})", q.name,
                               Expectation(q.type.dim).substr(0), u.text,
                               u.dim.dimensionless() ? "a plain number" : u.dim.Describe()));
      *bad = true;
      return;
    }
    if (q.type.temp == TempKind::kInterval && u.kind == TempKind::kAbsolute) {
      diags_.Error(d.range,
                   fmt::format("'{}' is a temperature difference; show it in K or ddeg{} rather "
                               "than {}",
                               q.name, u.text == "degF" ? "F" : "C", u.text));
      *bad = true;
      return;
    }
    if (q.type.temp == TempKind::kAbsolute && u.kind == TempKind::kInterval) {
      diags_.Error(d.range, fmt::format("'{}' is an absolute temperature; show it in degC, degF "
                                        "or K rather than {}",
                                        q.name, u.text));
      *bad = true;
      return;
    }
    q.display = u;
    q.display_explicit = true;
  }

  void TypeCheck(CheckDef& c) {
    bool bad = false;
    const Type t = TypeOf(c.expr, &bad);
    if (bad || !t.boolean) return;
    if (!IsComparison(c.expr->kind)) return;
    c.has_sides = true;
    const Expr* lhs = c.expr->args[0];
    const Expr* rhs = c.expr->args[1];
    const ExprInfo& li = model_->info.at(lhs);
    const ExprInfo& ri = model_->info.at(rhs);
    auto literal_unit = [&](const Expr* e, units::Unit* u) {
      const Expr* lit = e->kind == ExprKind::kNeg ? e->args[0] : e;
      if (lit->kind != ExprKind::kNumber || lit->unit.empty()) return false;
      *u = LiteralUnit(lit);
      return true;
    };
    units::Unit u;
    if (literal_unit(rhs, &u) || literal_unit(lhs, &u)) {
      // An interval compared with a literal like 5 K keeps K; an absolute
      // compared with 45 degC keeps degC.
    } else if (lhs->kind == ExprKind::kName && li.quantity >= 0) {
      u = model_->quantities[static_cast<size_t>(li.quantity)].display;
    } else if (rhs->kind == ExprKind::kName && ri.quantity >= 0) {
      u = model_->quantities[static_cast<size_t>(ri.quantity)].display;
    } else {
      Type side = li.type;
      if (side.temp == TempKind::kEither) side.temp = ri.type.temp;
      u = DefaultDisplay(side);
    }
    c.side_unit = u;
  }

  const BuildOptions& options_;
  std::vector<std::unique_ptr<Deck>>* keep_;
  Diagnostics& diags_;
  std::unique_ptr<Model> model_;
  // Per quantity: the prefix its expression's names resolve in (the using
  // deck's for a bound template input).
  std::vector<std::string> scope_of_;
  std::string_view main_file_;
  std::vector<std::string> use_stack_;
  std::set<std::string> used_prefixes_;
  std::vector<const Stmt*> case_stmts_;
  std::vector<const Stmt*> sweep_stmts_;
  std::vector<std::pair<const Stmt*, std::string>> profile_stmts_;
  std::set<std::vector<int>> reported_cycles_;
  std::vector<bool> bad_;
  std::vector<bool> in_cycle_;
};

}  // namespace

std::unique_ptr<Model> BuildModel(const Deck& deck, const BuildOptions& options,
                                  std::vector<std::unique_ptr<Deck>>* keep, Diagnostics& diags) {
  Builder b(options, keep, diags);
  return b.Run(deck);
}

}  // namespace heatdeck
