#include <filesystem>
#include <ostream>

#include <fmt/format.h>

#include "cli/app.h"
#include "cli/deck_runner.h"
#include "eval/results.h"
#include "lang/diagnostics.h"
#include "report/writers.h"

namespace heatdeck::cli {

namespace fs = std::filesystem;

int RunRun(const std::vector<std::string>& decks, const std::string& out_dir,
           const std::vector<std::string>& format_names, const GlobalOptions& g, Streams io) {
  std::vector<Format> formats;
  for (const std::string& name :
       format_names.empty() ? std::vector<std::string>{"html", "xlsx", "json"} : format_names) {
    Format f;
    if (!ParseFormat(name, &f)) {
      io.err << fmt::format("heatdeck: unknown format '{}' (html, md, xlsx, json, csv)\n", name);
      return kUsage;
    }
    if (std::find(formats.begin(), formats.end(), f) == formats.end()) formats.push_back(f);
  }
  const bool to_stdout = out_dir == "-";
  if (to_stdout && (formats.size() != 1 || decks.size() != 1 || !IsTextFormat(formats[0]))) {
    io.err << "heatdeck: '-o -' writes one text format of one deck to standard output\n";
    return kUsage;
  }
  if (!to_stdout) {
    std::error_code ec;
    fs::create_directories(out_dir, ec);
    if (ec || !fs::is_directory(out_dir)) {
      io.err << fmt::format("heatdeck: cannot create the output folder '{}': {}\n", out_dir,
                            ec ? ec.message() : "not a folder");
      return kUsage;
    }
  }
  int status = kOk;
  for (const std::string& path : decks) {
    Session session;
    const int s = LoadAndEvaluate(path, g, io, &session);
    if (s == kDeckErrors) {
      io.err << Summary(path, session) << "\n";
      status = std::max(status, s);
      continue;  // nothing is written for a deck with errors
    }
    if (to_stdout) {
      std::string text, error;
      if (!RenderText(session.results(), session.diagnostics(), formats[0], &text, &error)) {
        io.err << "heatdeck: " << error << "\n";
        return kUsage;
      }
      io.out << text;
      io.out.flush();
      status = std::max(status, s);
      continue;
    }
    const std::string stem = fs::path(path).stem().string();
    for (Format f : formats) {
      const std::string target = (fs::path(out_dir) / (stem + "." + Extension(f))).string();
      std::string error;
      if (!WriteOutput(session.results(), session.diagnostics(), f, target, &error)) {
        io.err << fmt::format("heatdeck: {}: {}\n", target, error);
        status = std::max(status, kUsage);
        continue;
      }
      io.out << fmt::format("wrote {}\n", target);
    }
    io.err << Summary(path, session) << "\n";
    status = std::max(status, s);
  }
  return status;
}

}  // namespace heatdeck::cli
