#include "cli/app.h"

#include <ostream>
#include <sstream>

#include <CLI/CLI.hpp>

#include "cli/options.h"

#ifndef HEATDECK_VERSION
#define HEATDECK_VERSION "0.0.0"
#endif

namespace heatdeck::cli {

int Main(const std::vector<std::string>& args, Streams io) {
  CLI::App app{
      "heatdeck: heat-exchanger calculation decks, unit-checked, evaluated and written as "
      "traceable reports.\nResults are for a competent engineer to check; local codes, the "
      "equipment standards and licensed practice govern."};
  app.set_version_flag("--version", std::string("heatdeck ") + HEATDECK_VERSION);
  app.require_subcommand(1);
  app.fallthrough();

  GlobalOptions g;
  auto add_deck_options = [&](CLI::App* cmd) {
    cmd->add_option("--case", g.session.only_case, "Evaluate only this case (base or a case name)");
    cmd->add_option("--allow-path", g.session.allow_paths,
                    "A further folder that use and table may read");
    cmd->add_option("--stdlib", g.session.stdlib_dir, "Folder of templates (default: built in)");
    cmd->add_option("--date", g.session.date, "Report date (default: meta date)");
    cmd->add_option("--max-file-size", g.session.max_file_bytes, "Largest file read, in bytes");
    cmd->add_option("--max-depth", g.session.max_expression_depth, "Deepest expression nesting");
    cmd->add_option("--max-statements", g.session.max_statements, "Most statements in a deck");
    cmd->add_option("-j,--jobs", g.session.jobs, "Threads for sweeps (default: all cores)");
    cmd->add_option("--columns", g.session.sweep_columns,
                    "Quantities a sweep writes, besides the swept inputs (default: all)")
        ->delimiter(',');
    cmd->add_option("--max-points", g.session.max_sweep_points, "Most points in a sweep grid");
    cmd->add_option("--keep-points", g.session.keep_sweep_points,
                    "Largest sweep tabulated in reports and JSON (larger ones: csv only)");
    cmd->add_option_function<std::string>(
        "--shard",
        [&](const std::string& v) {
          int k = 0, n = 0;
          char slash = 0;
          std::istringstream ss(v);
          if (!(ss >> k >> slash >> n) || slash != '/' || k < 1 || n < 1 || k > n || !ss.eof()) {
            throw CLI::ValidationError("--shard", "expects K/N with 1 <= K <= N, e.g. 3/8");
          }
          g.session.shard = k;
          g.session.shards = n;
        },
        "Evaluate the K-th of N slices of the sweep grid (K/N)");
  };

  std::vector<std::string> decks;
  auto* check = app.add_subcommand("check", "Check and evaluate decks; write nothing");
  check->add_option("decks", decks, "Deck files")->required();
  add_deck_options(check);

  std::string out_dir = "out";
  std::vector<std::string> formats;
  auto* run = app.add_subcommand("run", "Evaluate decks and write reports");
  run->add_option("decks", decks, "Deck files")->required();
  run->add_option("-o,--out", out_dir, "Output folder, or - for standard output (one format)");
  run->add_option("-f,--format", formats,
                  "Formats: html, md, xlsx, json, csv (default: html,xlsx,json)")
      ->delimiter(',');
  add_deck_options(run);

  std::string filter;
  auto* units = app.add_subcommand("units", "List units and their SI factors");
  units->add_option("filter", filter,
                    "Show only units whose symbol, name or SI unit contains this");

  std::string fname;
  auto* functions = app.add_subcommand("functions", "List library functions, or show one");
  functions->add_option("name", fname, "A function name");

  auto* templates = app.add_subcommand("templates", "List the template library");
  templates->add_option("--stdlib", g.session.stdlib_dir,
                        "Folder of templates (default: built in)");
  std::string template_name, new_file;
  auto* new_deck = app.add_subcommand("new", "Start a deck from a template");
  new_deck->add_option("template", template_name, "A template name")->required();
  new_deck->add_option("file", new_file,
                       "Deck to write (default: standard output); never overwritten");
  new_deck->add_option("--stdlib", g.session.stdlib_dir, "Folder of templates (default: built in)");

  std::string rev, diff_format = "text";
  auto* diff = app.add_subcommand("diff", "Show what changed between two revisions of a deck");
  diff->add_option("decks", decks, "OLD.deck NEW.deck, or one deck with --rev")->required();
  diff->add_option("--rev", rev, "Compare DECK with its version at this git revision");
  diff->add_option("-f,--format", diff_format, "text, md or json (default: text)");
  diff->add_option("--case", g.session.only_case, "Compare only this case (base or a case name)");
  diff->add_option("--allow-path", g.session.allow_paths,
                   "A further folder that use and table may read");
  diff->add_option("--stdlib", g.session.stdlib_dir, "Folder of templates (default: built in)");

  std::vector<const char*> argv;
  for (const auto& a : args) argv.push_back(a.c_str());
  try {
    app.parse(static_cast<int>(argv.size()), argv.data());
  } catch (const CLI::CallForHelp&) {
    io.out << app.help();
    return kOk;
  } catch (const CLI::CallForAllHelp&) {
    io.out << app.help("", CLI::AppFormatMode::All);
    return kOk;
  } catch (const CLI::CallForVersion&) {
    io.out << "heatdeck " << HEATDECK_VERSION << "\n";
    return kOk;
  } catch (const CLI::ParseError& e) {
    io.err << "heatdeck: " << e.what() << "\n";
    io.err << "Run 'heatdeck --help' for the commands.\n";
    return kUsage;
  }

  if (*check) return RunCheck(decks, g, io);
  if (*run) return RunRun(decks, out_dir, formats, g, io);
  if (*units) return RunUnits(filter, io);
  if (*functions) return RunFunctions(fname, io);
  if (*templates) return RunTemplates(g.session.stdlib_dir, io);
  if (*new_deck) return RunNew(template_name, new_file, g.session.stdlib_dir, io);
  if (*diff) return RunDiff(decks, rev, diff_format, g, io);
  return kUsage;
}

}  // namespace heatdeck::cli
