// `heatdeck run DECK -f json -o -` against the schema documented in
// docs/json-schema.md.  The test reads the field tables of that page (path,
// type, presence), so the page is the schema: an output field without a row
// there, a row whose field is missing, or a value of another type fails.
// Numbers must read back as the evaluator's doubles, bit for bit.
#include <algorithm>
#include <bit>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "eval/results.h"
#include "heatdeck/session.h"
#include "model/model.h"
#include "process_runner.h"
#include "test_paths.h"

namespace heatdeck::testing {
namespace {

namespace fs = std::filesystem;
using nlohmann::json;

struct Row {
  std::set<std::string> types;
  bool always = false;
};
using Schema = std::map<std::string, Row>;

std::string Trim(std::string s) {
  while (!s.empty() && (s.front() == ' ')) s.erase(s.begin());
  while (!s.empty() && (s.back() == ' ')) s.pop_back();
  return s;
}

// Table rows "| `path` | type or type | always/optional | meaning |".
Schema ReadSchema() {
  Schema schema;
  std::istringstream in(ReadFile(RepoDir() + "/docs/json-schema.md"));
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("| `", 0) != 0) continue;
    std::vector<std::string> cells;
    std::string cell;
    for (size_t i = 1; i < line.size(); ++i) {
      if (line[i] == '|' && line[i - 1] != '\\') {
        cells.push_back(Trim(cell));
        cell.clear();
      } else {
        cell += line[i];
      }
    }
    if (cells.size() < 3) continue;
    const std::string path = cells[0].substr(1, cells[0].size() - 2);  // strip backticks
    Row row;
    std::string types = cells[1] + " or ";
    for (size_t at = 0, next; (next = types.find(" or ", at)) != std::string::npos; at = next + 4) {
      row.types.insert(types.substr(at, next - at));
    }
    EXPECT_TRUE(cells[2] == "always" || cells[2] == "optional") << line;
    row.always = cells[2] == "always";
    EXPECT_TRUE(schema.emplace(path, row).second) << "documented twice: " << path;
  }
  return schema;
}

const char* TypeName(const json& v) {
  switch (v.type()) {
    case json::value_t::string:
      return "string";
    case json::value_t::number_integer:
    case json::value_t::number_unsigned:
      return "integer";
    case json::value_t::number_float:
      return "number";
    case json::value_t::boolean:
      return "boolean";
    case json::value_t::null:
      return "null";
    case json::value_t::array:
      return "array";
    case json::value_t::object:
      return "object";
    default:
      return "?";
  }
}

bool TypeAllowed(const json& v, const Row& row) {
  const std::string t = TypeName(v);
  if (row.types.count(t) != 0) return true;
  return t == "integer" && row.types.count("number") != 0;  // 5 is a number too
}

class Validator {
 public:
  explicit Validator(Schema s) : schema_(std::move(s)) {}

  // Problems found in doc, one a line; "" when it follows the schema.
  std::string Check(const json& doc) {
    problems_.clear();
    objects_.clear();
    if (!doc.is_object()) return "the document is not an object\n";
    Walk(doc, "");
    for (const auto& [path, row] : schema_) {
      if (!row.always || path.size() < 2 || path.substr(path.size() - 2) == "[]") continue;
      const size_t dot = path.rfind('.');
      const std::string parent = dot == std::string::npos ? "" : path.substr(0, dot);
      const std::string key = dot == std::string::npos ? path : path.substr(dot + 1);
      for (const json* o : objects_[parent]) {
        if (!o->contains(key)) problems_ += "missing " + path + "\n";
      }
    }
    return problems_;
  }

  const std::set<std::string>& seen() const { return seen_; }

 private:
  const Row* Find(const std::string& path, const std::string& parent) const {
    auto it = schema_.find(path);
    if (it == schema_.end()) it = schema_.find(parent + ".*");
    return it == schema_.end() ? nullptr : &it->second;
  }

  void Node(const json& v, const std::string& path, const std::string& parent) {
    const Row* row = Find(path, parent);
    if (row == nullptr) {
      problems_ += "undocumented field " + path + "\n";
      return;
    }
    seen_.insert(path);
    if (!TypeAllowed(v, *row)) {
      problems_ += path + " is " + TypeName(v) + ": " + v.dump().substr(0, 80) + "\n";
      return;
    }
    Walk(v, path);
  }

  void Walk(const json& v, const std::string& path) {
    if (v.is_object()) {
      objects_[path].push_back(&v);
      for (auto it = v.begin(); it != v.end(); ++it) {
        Node(it.value(), path.empty() ? it.key() : path + "." + it.key(), path);
      }
    } else if (v.is_array()) {
      for (const json& e : v) Node(e, path + "[]", path);
    }
  }

  Schema schema_;
  std::string problems_;
  std::map<std::string, std::vector<const json*>> objects_;
  std::set<std::string> seen_;
};

std::vector<std::string> ExampleDecks() {
  std::vector<std::string> v;
  for (const auto& e : fs::directory_iterator(RepoDir() + "/examples")) {
    if (e.path().extension() == ".deck") v.push_back("examples/" + e.path().filename().string());
  }
  std::sort(v.begin(), v.end());
  return v;
}

std::string Sha256Sum(const std::string& path) {
  std::string out;
  FILE* p = popen(("sha256sum '" + path + "'").c_str(), "r");
  if (p == nullptr) return out;
  char buf[256];
  while (fgets(buf, sizeof buf, p) != nullptr) out += buf;
  pclose(p);
  return out.substr(0, out.find(' '));
}

TEST(JsonSchema, TheDocumentedTablesAreReadable) {
  const Schema s = ReadSchema();
  EXPECT_GE(s.size(), 60u);
  for (const char* path : {"tool",
                           "version",
                           "deck",
                           "sha256",
                           "title",
                           "date",
                           "meta",
                           "cases",
                           "sweeps",
                           "files",
                           "diagnostics",
                           "cases[].name",
                           "cases[].description",
                           "cases[].overridden",
                           "cases[].quantities[].name",
                           "cases[].quantities[].kind",
                           "cases[].quantities[].value",
                           "cases[].quantities[].unit",
                           "cases[].quantities[].si_value",
                           "cases[].quantities[].si_unit",
                           "cases[].quantities[].expression",
                           "cases[].quantities[].description",
                           "cases[].quantities[].source",
                           "cases[].quantities[].line",
                           "cases[].quantities[].warnings",
                           "cases[].quantities[].notes",
                           "cases[].quantities[].errors",
                           "cases[].quantities[].template",
                           "cases[].quantities[].template_default",
                           "cases[].checks[].expression",
                           "cases[].checks[].evaluated",
                           "cases[].checks[].pass",
                           "cases[].checks[].lhs_si",
                           "cases[].checks[].rhs_si",
                           "cases[].checks[].margin",
                           "cases[].checks[].si_unit",
                           "cases[].checks[].unit",
                           "cases[].checks[].lhs",
                           "cases[].checks[].rhs",
                           "cases[].checks[].margin_display",
                           "cases[].checks[].line",
                           "cases[].checks[].description",
                           "cases[].failed_checks"}) {
    EXPECT_EQ(s.count(path), 1u) << path << " is not documented";
  }
}

// The validator itself: it must catch what it is there to catch.
TEST(JsonSchema, ValidatorRejectsWrongTypesMissingAndUndocumentedFields) {
  const Schema s = ReadSchema();
  Validator v(s);
  json doc = json::parse(ReadFile(RepoDir() + "/tests/cli/golden/ok_first_deck.json"));
  EXPECT_EQ(v.Check(doc), "");
  json wrong = doc;
  wrong["cases"][0]["quantities"][0]["line"] = "12";
  EXPECT_NE(v.Check(wrong).find("cases[].quantities[].line is string"), std::string::npos);
  json missing = doc;
  missing["cases"][0]["checks"][1].erase("margin");
  EXPECT_NE(v.Check(missing).find("missing cases[].checks[].margin"), std::string::npos);
  json extra = doc;
  extra["cases"][0]["quantities"][3]["colour"] = "red";
  EXPECT_NE(v.Check(extra).find("undocumented field cases[].quantities[].colour"),
            std::string::npos);
}

TEST(JsonSchema, ExamplesMatchTheDocumentedSchema) {
  const Schema s = ReadSchema();
  const ProcessResult version = RunHeatdeck({"--version"}, RepoDir());
  ASSERT_EQ(version.out.rfind("heatdeck ", 0), 0u) << version.out;
  const std::string tool_version = Trim(version.out.substr(9, version.out.find('\n') - 9));
  for (const std::string& deck : ExampleDecks()) {
    SCOPED_TRACE(deck);
    const ProcessResult r = RunHeatdeck({"run", deck, "-f", "json", "-o", "-"}, RepoDir());
    ASSERT_FALSE(r.signalled);
    ASSERT_TRUE(r.status == 0 || r.status == 1) << r.err;
    const json doc = json::parse(r.out);
    Validator v(s);
    EXPECT_EQ(v.Check(doc), "");
    // Values the schema page promises beyond their types.
    EXPECT_EQ(doc["tool"], "heatdeck");
    EXPECT_EQ(doc["version"], tool_version) << "the JSON must name the version --version prints";
    EXPECT_EQ(doc["deck"], deck);
    EXPECT_EQ(doc["sha256"], Sha256Sum(RepoDir() + "/" + deck));
    EXPECT_EQ(doc["files"][0]["path"], deck);
    EXPECT_EQ(doc["files"][0]["sha256"], doc["sha256"]);
    EXPECT_EQ(doc["cases"][0]["name"], "base");
    for (const json& c : doc["cases"]) {
      int failed = 0;
      for (const json& q : c["quantities"]) {
        EXPECT_TRUE(q["kind"] == "given" || q["kind"] == "calc" || q["kind"] == "solved") << q;
      }
      for (const json& k : c["checks"]) failed += k["pass"] == false ? 1 : 0;
      EXPECT_EQ(c["failed_checks"], failed);
    }
  }
}

TEST(JsonSchema, EveryGoldenDocumentMatchesTheDocumentedSchema) {
  const Schema s = ReadSchema();
  Validator v(s);
  std::set<std::string> seen;
  int documents = 0;
  for (const auto& e : fs::recursive_directory_iterator(RepoDir() + "/tests/cli/golden")) {
    if (e.path().extension() != ".json") continue;
    SCOPED_TRACE(e.path().string());
    EXPECT_EQ(v.Check(json::parse(ReadFile(e.path().string()))), "");
    seen.insert(v.seen().begin(), v.seen().end());
    ++documents;
  }
  EXPECT_GE(documents, 10);
  // The golden decks exercise cases, sweeps and failed checks.
  for (const char* path :
       {"cases[].overridden[]", "sweeps[].rows[].si_values[]", "sweeps[].columns[].si_unit",
        "cases[].checks[].margin_display", "cases[].solves[].value_si",
        "cases[].quantities[].template_default", "cases[].checks[].template"}) {
    EXPECT_EQ(seen.count(path), 1u) << path;
  }
}

// A deck that uses a template and a table, run in a folder of its own.
struct TemplateRun {
  ProcessResult result;
  json doc;
};

TemplateRun RunTemplateDeck() {
  TempDir dir;
  const std::string golden = RepoDir() + "/tests/cli/golden/";
  fs::copy_file(golden + "tpl_wall.deck", dir.path() + "/tpl_wall.deck");
  fs::copy_file(golden + "oil_props.csv", dir.path() + "/oil_props.csv");
  {
    std::ofstream f(dir.path() + "/uses.deck");
    f << "given k_cu = 380 W/(m*K)\n"
         "use \"tpl_wall.deck\" as wall with k = k_cu, L = 2 * 3 m\n"
         "UA_wall = 1 / wall.R in W/K\n"
         "table oil = \"oil_props.csv\" source \"Invented demo data\"\n"
         "cp = oil.cp(40 degC) in kJ/(kg*K)\n";
  }
  TemplateRun t;
  t.result = RunHeatdeck({"run", "uses.deck", "-f", "json", "-o", "-"}, dir.path());
  if (t.result.status == 0) t.doc = json::parse(t.result.out);
  return t;
}

TEST(JsonSchema, TemplateFieldsMatchTheDocumentedSchema) {
  const TemplateRun t = RunTemplateDeck();
  ASSERT_EQ(t.result.status, 0) << t.result.err;
  Validator v(ReadSchema());
  EXPECT_EQ(v.Check(t.doc), "");
  std::map<std::string, json> q;
  for (const json& x : t.doc["cases"][0]["quantities"]) q[x["name"]] = x;
  EXPECT_EQ(q["wall.D_in"]["template"], "wall");
  EXPECT_EQ(q["wall.D_in"]["template_default"], true);  // unbound input
  EXPECT_EQ(q["wall.k"]["template"], "wall");
  EXPECT_FALSE(q["wall.k"].contains("template_default"));  // bound with `with`
  EXPECT_FALSE(q["UA_wall"].contains("template"));
  ASSERT_EQ(t.doc["cases"][0]["checks"].size(), 1u);
  EXPECT_EQ(t.doc["cases"][0]["checks"][0]["template"], "wall");
  // interpolated between 20 degC (1.88) and 60 degC (2.03): 1.955 kJ/(kg K)
  EXPECT_DOUBLE_EQ(q["cp"]["si_value"].get<double>(), 1955.0);
  ASSERT_EQ(t.doc["files"].size(), 3u);
}

// DESIGN.md: "same deck, same bytes".  A template's or table's path must
// not carry the folder the project happens to be checked out in.
TEST(JsonSchema, TemplateAndTablePathsDoNotDependOnTheCheckoutFolder) {
  const TemplateRun t = RunTemplateDeck();
  ASSERT_EQ(t.result.status, 0) << t.result.err;
  ASSERT_EQ(t.doc["files"].size(), 3u);
  for (const json& f : t.doc["files"]) {
    const std::string path = f["path"];
    EXPECT_FALSE(fs::path(path).is_absolute()) << path;
  }
}

bool SameBits(double a, double b) {
  return std::bit_cast<std::uint64_t>(a) == std::bit_cast<std::uint64_t>(b);
}

// Parses `value` back and compares it with the evaluator's double.
::testing::AssertionResult ReadsBackAs(const json& value, double expected) {
  if (!std::isfinite(expected)) {
    return value.is_null() ? ::testing::AssertionSuccess()
                           : ::testing::AssertionFailure() << "non-finite written as " << value;
  }
  if (!value.is_number()) return ::testing::AssertionFailure() << value << " is not a number";
  const double got = value.get<double>();
  if (SameBits(got, expected)) return ::testing::AssertionSuccess();
  return ::testing::AssertionFailure()
         << std::hexfloat << got << " read back, evaluator had " << expected;
}

TEST(JsonSchema, NumbersReadBackAsTheEvaluatorsDoublesBitForBit) {
  for (const std::string& deck : ExampleDecks()) {
    SCOPED_TRACE(deck);
    const ProcessResult r = RunHeatdeck({"run", deck, "-f", "json", "-o", "-"}, RepoDir());
    ASSERT_TRUE(r.status == 0 || r.status == 1) << r.err;
    const json doc = json::parse(r.out);
    Session s;
    ASSERT_TRUE(s.Load(RepoDir() + "/" + deck, {}));
    ASSERT_TRUE(s.Evaluate());
    const Model& m = s.model();
    ASSERT_EQ(doc["cases"].size(), s.results().cases.size());
    for (size_t ci = 0; ci < s.results().cases.size(); ++ci) {
      const CaseResult& c = s.results().cases[ci];
      const json& quantities = doc["cases"][ci]["quantities"];
      ASSERT_EQ(quantities.size(), m.quantities.size());
      for (size_t i = 0; i < m.quantities.size(); ++i) {
        SCOPED_TRACE(m.quantities[i].name);
        EXPECT_EQ(quantities[i]["name"], m.quantities[i].name);
        EXPECT_TRUE(ReadsBackAs(quantities[i]["si_value"], c.values[i]));
        EXPECT_TRUE(
            ReadsBackAs(quantities[i]["value"], m.quantities[i].display.FromSi(c.values[i])));
      }
      const json& checks = doc["cases"][ci]["checks"];
      ASSERT_EQ(checks.size(), c.checks.size());
      for (size_t k = 0; k < c.checks.size(); ++k) {
        SCOPED_TRACE(checks[k]["expression"].get<std::string>());
        EXPECT_EQ(checks[k]["pass"], c.checks[k].pass);
        if (!m.checks[k].has_sides) continue;
        EXPECT_TRUE(ReadsBackAs(checks[k]["lhs_si"], c.checks[k].lhs_si));
        EXPECT_TRUE(ReadsBackAs(checks[k]["rhs_si"], c.checks[k].rhs_si));
        EXPECT_TRUE(ReadsBackAs(checks[k]["margin"], c.checks[k].margin_si));
        EXPECT_TRUE(
            ReadsBackAs(checks[k]["lhs"], m.checks[k].side_unit.FromSi(c.checks[k].lhs_si)));
      }
      const json& solves = doc["cases"][ci]["solves"];
      ASSERT_EQ(solves.size(), c.solves.size());
      for (size_t k = 0; k < c.solves.size(); ++k) {
        if (!c.solves[k].converged) continue;
        EXPECT_TRUE(ReadsBackAs(solves[k]["value_si"], c.solves[k].value_si));
        EXPECT_TRUE(ReadsBackAs(solves[k]["residual_si"], c.solves[k].residual_si));
      }
    }
  }
}

}  // namespace
}  // namespace heatdeck::testing
