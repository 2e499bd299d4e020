// Helpers for the workbook tests: run the heatdeck binary, read a workbook
// back through tests/report/xlsx_recalc.py (Python's zipfile and XML
// parser, so the tests read the file as any other program would), and find
// cells by defined name or by the text in column A.
#pragma once

#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <regex>
#include <string>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "test_paths.h"

namespace heatdeck::testing {

// Runs a shell command; returns its exit status and puts its standard
// output (and error, when merged by the command) in *out.
inline int RunCommand(const std::string& command, std::string* out) {
  out->clear();
  FILE* pipe = popen(command.c_str(), "r");
  if (pipe == nullptr) return -1;
  char buf[4096];
  size_t n;
  while ((n = fread(buf, 1, sizeof buf, pipe)) > 0) out->append(buf, n);
  const int status = pclose(pipe);
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

inline std::string Quote(const std::string& s) {
  std::string q = "'";
  for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return q + "'";
}

// A fresh folder under the system's temporary folder, removed with the object.
class TempFolder {
 public:
  explicit TempFolder(const std::string& tag) {
    path_ = std::filesystem::temp_directory_path() /
            ("heatdeck_" + tag + "_" + std::to_string(getpid()) + "_" + std::to_string(counter_++));
    std::filesystem::remove_all(path_);
    std::filesystem::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  std::string path() const { return path_.string(); }
  std::string operator/(const std::string& name) const { return (path_ / name).string(); }

 private:
  static inline int counter_ = 0;
  std::filesystem::path path_;
};

inline std::string DataDeck(const std::string& name) {
  return RepoDir() + "/tests/report/data/" + name;
}

// Runs `heatdeck run DECK -o OUT -f xlsx [extra]` and returns the workbook's
// path ("" after a failure, which the call records).
inline std::string WriteWorkbook(const std::string& deck, const std::string& out_dir,
                                 const std::string& extra = "") {
  if (!std::filesystem::exists(HD_BINARY)) {
    ADD_FAILURE() << "the heatdeck binary is missing (build the heatdeck target): " << HD_BINARY;
    return "";
  }
  std::string out;
  const int status = RunCommand(std::string(Quote(HD_BINARY)) + " run " + Quote(deck) + " -o " +
                                    Quote(out_dir) + " -f xlsx " + extra + " 2>&1",
                                &out);
  const std::string stem = std::filesystem::path(deck).stem().string();
  const std::string path = out_dir + "/" + stem + ".xlsx";
  if ((status != 0 && status != 1) || !std::filesystem::exists(path)) {
    ADD_FAILURE() << "heatdeck failed on " << deck << " (" << status << "):\n" << out;
    return "";
  }
  return path;
}

// The heatdeck JSON results of a deck.
inline nlohmann::json JsonResults(const std::string& deck) {
  std::string out;
  RunCommand(std::string(Quote(HD_BINARY)) + " run " + Quote(deck) + " -o - -f json 2>/dev/null",
             &out);
  nlohmann::json j = nlohmann::json::parse(out, nullptr, false);
  if (j.is_discarded()) ADD_FAILURE() << "no JSON from heatdeck for " << deck << ":\n" << out;
  return j;
}

// The workbook as JSON: {"sheets": [{"name", "cells": {"C5": {"t", "s", "f",
// "v"}}, "notes": {"C5": text}}], "names": [{"name", "local", "sheet",
// "ref"}], "core": core.xml text, "charts": {part: xml}, "parts": [...]}.
inline nlohmann::json DumpWorkbook(const std::string& path) {
  std::string out;
  const int status = RunCommand("python3 " + Quote(RepoDir() + "/tests/report/xlsx_recalc.py") +
                                    " dump " + Quote(path) + " 2>&1",
                                &out);
  nlohmann::json j = nlohmann::json::parse(out, nullptr, false);
  if (status != 0 || j.is_discarded()) {
    ADD_FAILURE() << "cannot read the workbook " << path << ":\n" << out;
    return nlohmann::json::object();
  }
  return j;
}

inline const nlohmann::json* Sheet(const nlohmann::json& book, const std::string& name) {
  for (const auto& s : book["sheets"]) {
    if (s["name"] == name) return &s;
  }
  return nullptr;
}

// The cell a workbook-scoped (local < 0) or sheet-local defined name points at.
inline std::string NamedCell(const nlohmann::json& book, const std::string& name, int local = -1) {
  for (const auto& n : book["names"]) {
    if (n["name"] != name) continue;
    if (local < 0 ? !n["local"].is_null() : n["local"] != local) continue;
    return n["ref"].get<std::string>();
  }
  return "";
}

// The row number (as text) of an A1 reference: "C12" -> "12".
inline std::string RowOf(const std::string& ref) {
  return std::regex_replace(ref, std::regex("^[A-Z]+"), "");
}

inline nlohmann::json CellAt(const nlohmann::json& sheet, const std::string& ref) {
  const auto& cells = sheet["cells"];
  return cells.contains(ref) ? cells[ref] : nlohmann::json::object();
}

}  // namespace heatdeck::testing
