#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <ostream>

#include <fmt/format.h>

#include "cli/app.h"
#include "cli/deck_runner.h"
#include "eval/results.h"
#include "lang/diagnostics.h"
#include "report/csv_writer.h"
#include "report/output.h"
#include "report/writers.h"

namespace heatdeck::cli {

namespace fs = std::filesystem;

namespace {

// Streams the deck's sweep as CSV; the header only in the first shard, so
// that shards concatenated in order equal the whole.
bool WriteSweepCsv(Session& session, std::FILE* out, bool header, std::string* error) {
  CsvWriter csv(out);
  size_t n = 0;
  const bool ok = session.StreamSweep(
      [&](const std::vector<Session::SweepColumn>& cols) {
        n = cols.size();
        if (!header) return;
        std::vector<std::string> names, units;
        for (const auto& c : cols) {
          names.push_back(c.name);
          units.push_back(c.unit);
        }
        csv.Header(names, units);
      },
      [&](const double* values, const std::string& err, std::string* line) {
        CsvWriter::AppendRow(line, values, n, err);
      },
      [&](const std::string& bytes) { csv.Write(bytes); }, error);
  if (ok && !csv.ok()) *error = "write error";
  std::fflush(out);
  return ok && csv.ok();
}

}  // namespace

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
    if (to_stdout && formats[0] == Format::kCsv) {
      std::string error;
      if (!WriteSweepCsv(session, stdout, g.session.shard == 1, &error)) {
        io.err << "heatdeck: " << error << "\n";
        return kUsage;
      }
      status = std::max(status, s);
      continue;
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
      const bool written =
          f == Format::kCsv
              ? WriteViaTemp(
                    target,
                    [&](const std::string& tmp, std::string* err) {
                      std::FILE* file = std::fopen(tmp.c_str(), "wb");
                      if (file == nullptr) {
                        *err = "cannot create the file";
                        return false;
                      }
                      const bool ok = WriteSweepCsv(session, file, g.session.shard == 1, err);
                      return std::fclose(file) == 0 && ok;
                    },
                    &error)
              : WriteOutput(session.results(), session.diagnostics(), f, target, &error);
      if (!written) {
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
