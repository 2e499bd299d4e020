// `heatdeck templates` and `heatdeck new`, run in-process through
// cli::Main: the listing names every stdlib template with its title and
// method line; a new deck binds every input of its template, checks clean
// and evaluates to exactly what the template gives alone; an existing file
// is never overwritten.
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "cli/app.h"
#include "eval/results.h"
#include "heatdeck/session.h"
#include "lang/diagnostics.h"
#include "model/model.h"
#include "test_paths.h"

namespace heatdeck {
namespace {

namespace fs = std::filesystem;
using testing::ReadFile;
using testing::RepoDir;

struct Ran {
  int status = -1;
  std::string out, err;
};

Ran Heatdeck(std::vector<std::string> args) {
  args.insert(args.begin(), "heatdeck");
  std::ostringstream out, err;
  Ran r;
  r.status = cli::Main(args, cli::Streams{out, err});
  r.out = out.str();
  r.err = err.str();
  return r;
}

// A fresh folder, removed with its contents at the end of the test.
class ScratchDir {
 public:
  ScratchDir() {
    std::string pattern = (fs::temp_directory_path() / "hd_templates_XXXXXX").string();
    if (mkdtemp(pattern.data()) != nullptr) path_ = pattern;
  }
  ~ScratchDir() {
    std::error_code ec;
    if (!path_.empty()) fs::remove_all(path_, ec);
  }
  ScratchDir(const ScratchDir&) = delete;
  ScratchDir& operator=(const ScratchDir&) = delete;
  std::string File(const std::string& name) const { return path_ + "/" + name; }
  bool ok() const { return !path_.empty(); }

 private:
  std::string path_;
};

const std::vector<std::string>& TemplateNames() {
  static const std::vector<std::string> names = {"double_pipe", "shell_tube", "finned_coil",
                                                 "insulated_pipe", "overall_u"};
  return names;
}

std::string Rendered(const Session& s) {
  std::string text;
  for (const Diagnostic* d : s.diagnostics().Sorted()) text += Render(*d, s.files(), false);
  return text;
}

TEST(TemplatesCommand, ListsEveryTemplateWithTitleAndMethodLine) {
  const Ran r = Heatdeck({"templates"});
  EXPECT_EQ(r.status, cli::kOk) << r.err;
  EXPECT_EQ(r.err, "");
  // name, title (the template's own), and the start of its first narrative line
  const std::vector<std::vector<std::string>> expected = {
      {"double_pipe", "Double-pipe exchanger: rating by effectiveness-NTU",
       "Rates a double-pipe exchanger of given length"},
      {"shell_tube", "Shell-and-tube exchanger: sizing by LMTD and F",
       "Sizing: the duty follows from the hot stream's"},
      {"finned_coil", "Finned-tube coil in crossflow: rating by effectiveness-NTU",
       "Rates a coil of staggered, annular-finned tubes"},
      {"insulated_pipe", "Insulated pipe: heat loss and jacket temperature",
       "The heat conducted from the fluid through the"},
      {"overall_u", "Overall heat-transfer coefficient with fins and fouling on both sides",
       "The general series expression for a wall"},
  };
  for (const auto& e : expected) {
    const size_t at = r.out.find("\n" + e[0] + " ");
    const size_t first = r.out.rfind(e[0] + " ", 0) == 0 ? 0 : at;
    ASSERT_NE(first, std::string::npos) << e[0] << " not listed:\n" << r.out;
    const size_t line_end = r.out.find('\n', first + 1);
    EXPECT_NE(r.out.substr(first, line_end - first).find(e[1]), std::string::npos)
        << e[0] << ": title";
    EXPECT_EQ(r.out.find(e[2], line_end), line_end + 5) << e[0] << ": method line\n" << r.out;
  }
  // The same from the installed folder of files.
  const Ran files = Heatdeck({"templates", "--stdlib", RepoDir() + "/stdlib"});
  EXPECT_EQ(files.status, cli::kOk) << files.err;
  EXPECT_EQ(files.out, r.out);
}

TEST(TemplatesCommand, MissingFolderIsAUsageError) {
  const Ran r = Heatdeck({"templates", "--stdlib", RepoDir() + "/no_such_folder"});
  EXPECT_EQ(r.status, cli::kUsage);
  EXPECT_NE(r.err.find("cannot read the template folder"), std::string::npos) << r.err;
}

// For every template: the new deck checks clean, binds every given of the
// template, and every template quantity evaluates to the very value the
// template gives on its own (same inputs, same arithmetic).
TEST(NewCommand, DeckFromEachTemplateEvaluatesLikeTheTemplate) {
  ScratchDir dir;
  ASSERT_TRUE(dir.ok());
  for (const std::string& name : TemplateNames()) {
    const std::string file = dir.File(name + "_job.deck");
    const Ran made = Heatdeck({"new", name, file});
    ASSERT_EQ(made.status, cli::kOk) << name << ": " << made.err;
    EXPECT_NE(made.out.find(file), std::string::npos) << made.out;
    ASSERT_TRUE(fs::exists(file));

    const Ran check = Heatdeck({"check", file});
    EXPECT_EQ(check.status, cli::kOk) << name << ":\n" << check.out << check.err;
    EXPECT_EQ(check.err, "") << name;

    Session alone, job;
    ASSERT_TRUE(alone.Load(RepoDir() + "/stdlib/" + name + ".deck", {}) && alone.Evaluate())
        << Rendered(alone);
    ASSERT_TRUE(job.Load(file, {}) && job.Evaluate()) << Rendered(job);
    const Model& ma = alone.model();
    const Model& mj = job.model();
    const CaseResult& ca = alone.results().cases.front();
    const CaseResult& cj = job.results().cases.front();
    int compared = 0, bound = 0;
    for (size_t i = 0; i < ma.quantities.size(); ++i) {
      const std::string prefixed = name + "." + ma.quantities[i].name;
      const int j = mj.Find(prefixed);
      ASSERT_GE(j, 0) << prefixed;
      EXPECT_EQ(cj.values[static_cast<size_t>(j)], ca.values[i]) << prefixed;
      ++compared;
      if (ma.quantities[i].kind == QuantityKind::kGiven) {
        // Bound to the new deck's given of the same name and value.
        EXPECT_TRUE(mj.quantities[static_cast<size_t>(j)].bound) << prefixed << " left unbound";
        const int own = mj.Find(ma.quantities[i].name);
        ASSERT_GE(own, 0) << name << ": no given " << ma.quantities[i].name;
        EXPECT_EQ(mj.quantities[static_cast<size_t>(own)].kind, QuantityKind::kGiven);
        EXPECT_EQ(cj.values[static_cast<size_t>(own)], ca.values[i]);
        EXPECT_EQ(mj.quantities[static_cast<size_t>(own)].description,
                  ma.quantities[i].description);
        ++bound;
      }
    }
    EXPECT_GT(bound, 5) << name;
    EXPECT_GT(compared, bound) << name;
    // The template's checks come along under the prefix, plus the example check.
    EXPECT_EQ(mj.checks.size(), ma.checks.size() + 1) << name;
    EXPECT_EQ(job.results().failed_checks(), 0) << name;
    // The main results are re-exported under their own names.
    const std::string text = ReadFile(file);
    EXPECT_NE(text.find("section \"Results\""), std::string::npos) << name;
    EXPECT_NE(text.find("use \"stdlib/" + name + ".deck\" as " + name + " with"), std::string::npos)
        << name;
    EXPECT_NE(text.find("title \""), std::string::npos) << name;
    EXPECT_NE(text.find("meta prepared"), std::string::npos) << name;
  }
}

TEST(NewCommand, ReExportsResultsAndAnExampleCheck) {
  ScratchDir dir;
  ASSERT_TRUE(dir.ok());
  const std::string file = dir.File("cooler.deck");
  ASSERT_EQ(Heatdeck({"new", "double_pipe", file}).status, cli::kOk);
  Session job;
  ASSERT_TRUE(job.Load(file, {}) && job.Evaluate()) << Rendered(job);
  const Model& m = job.model();
  const CaseResult& c = job.results().cases.front();
  const int q = m.Find("Q"), hq = m.Find("double_pipe.Q");
  ASSERT_GE(q, 0);
  ASSERT_GE(hq, 0);
  EXPECT_EQ(c.values[static_cast<size_t>(q)], c.values[static_cast<size_t>(hq)]);
  EXPECT_EQ(m.quantities[static_cast<size_t>(q)].display.text, "kW");
  // The template gives 69.72 kW on its defaults (see stdlib_test); the example
  // check's limit is that value floored to two figures.
  const std::string text = ReadFile(file);
  EXPECT_NE(text.find("check Q >= 69 kW"), std::string::npos) << text;
  EXPECT_NEAR(c.values[static_cast<size_t>(q)], 69722.3, 0.1);
}

TEST(NewCommand, WithoutFileWritesTheDeckToStandardOutput) {
  ScratchDir dir;
  ASSERT_TRUE(dir.ok());
  const Ran out = Heatdeck({"new", "stdlib/overall_u.deck"});
  EXPECT_EQ(out.status, cli::kOk) << out.err;
  EXPECT_EQ(out.err, "");
  const std::string file = dir.File("u.deck");
  ASSERT_EQ(Heatdeck({"new", "overall_u", file}).status, cli::kOk);
  EXPECT_EQ(out.out, ReadFile(file));
}

TEST(NewCommand, RefusesToOverwriteAnExistingFile) {
  ScratchDir dir;
  ASSERT_TRUE(dir.ok());
  const std::string file = dir.File("mine.deck");
  { std::ofstream(file) << "title \"my own work\"\n"; }
  const Ran r = Heatdeck({"new", "shell_tube", file});
  EXPECT_EQ(r.status, cli::kUsage);
  EXPECT_EQ(r.out, "");
  EXPECT_NE(r.err.find("exists"), std::string::npos) << r.err;
  EXPECT_EQ(ReadFile(file), "title \"my own work\"\n");
}

TEST(NewCommand, UnknownTemplateSuggestsTheNearest) {
  const Ran r = Heatdeck({"new", "shell_and_tube"});
  EXPECT_EQ(r.status, cli::kUsage);
  EXPECT_EQ(r.out, "");
  EXPECT_NE(r.err.find("no template 'shell_and_tube'"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("did you mean 'shell_tube'"), std::string::npos) << r.err;
}

}  // namespace
}  // namespace heatdeck
