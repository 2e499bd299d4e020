// Diagnostics: located errors, warnings and notes, collected by every stage.
// Diagnostics are values; no stage throws one across a layer boundary.
#pragma once

#include <memory>
#include <string>
#include <string_view>
#include <vector>

namespace heatdeck {

// A range in one source file.  Lines and columns are 1-based; columns count
// bytes; last_col is inclusive.  file is empty only for diagnostics that have
// no place in a file (a command-line problem).
struct SourceRange {
  std::string_view file;
  int line = 0;
  int col = 0;
  int last_col = 0;  // on the same line; 0 when unknown
  bool valid() const { return line > 0; }
};

enum class Severity { kError, kWarning, kNote };

struct Diagnostic {
  Severity severity = Severity::kError;
  SourceRange range;
  std::string message;
  std::vector<std::string> notes;  // follow-up lines ("did you mean 'T_h1'?")
  // Related places: "first defined here", members of a cycle.
  std::vector<std::pair<SourceRange, std::string>> related;
};

class Diagnostics {
 public:
  Diagnostic& Error(SourceRange r, std::string message);
  Diagnostic& Warning(SourceRange r, std::string message);
  void Add(Diagnostic d) { list_.push_back(std::move(d)); }

  bool has_errors() const { return errors_ > 0; }
  int error_count() const { return errors_; }
  const std::vector<Diagnostic>& list() const { return list_; }
  // Stable order for printing: by file, line, column, then insertion.
  std::vector<const Diagnostic*> Sorted() const;

 private:
  std::vector<Diagnostic> list_;
  int errors_ = 0;
};

// Where a file's text lives, so diagnostics can quote the source line.
class SourceFiles {
 public:
  // Registers text under name and returns a stable view of the name
  // (SourceRange::file points into it).  Re-registering returns the old one.
  std::string_view Add(std::string name, std::string text);
  // The text registered under name, or an empty view.
  std::string_view Text(std::string_view name) const;
  // One line (1-based) of a file, without its newline.
  std::string_view Line(std::string_view name, int line) const;

 private:
  struct File {
    std::string name;
    std::string text;
  };
  std::vector<std::unique_ptr<File>> files_;
};

// Renders one diagnostic compiler-style:
//   file:line:col: error: message
//     <source line>
//     ^~~~
//   note: ...
// colour adds ANSI colours (only on a terminal, never with NO_COLOR).
std::string Render(const Diagnostic& d, const SourceFiles& files, bool colour);

}  // namespace heatdeck
