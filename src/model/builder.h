// Resolution and checking: a parsed deck becomes a typed Model.
#pragma once

#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "lang/diagnostics.h"
#include "lang/syntax.h"
#include "model/model.h"

namespace heatdeck {

// Reads a file that a deck refers to (`use`, `table`).  Returns false and
// sets *why when the file cannot be read or lies outside the allowed folders.
// On success *name and *text view the name and text registered with the
// SourceFiles (they outlive the model), so diagnostics can quote the file.
using FileLoader =
    std::function<bool(const std::string& from_file, const std::string& path,
                       std::string_view* name, std::string_view* text, std::string* why)>;

struct BuildOptions {
  FileLoader load;  // null: `use` and `table` report that files cannot be read
  int max_use_depth = 16;
  double max_sweep_points = 1e7;  // points in a sweep grid
};

// Resolves names, builds the dependency order, checks every dimension and
// collects every error of the deck in diags.  Parsed template decks are kept
// in *keep (they must outlive the model).  The model is returned even when
// diags has errors (writers must not run then).
std::unique_ptr<Model> BuildModel(const Deck& deck, const BuildOptions& options,
                                  std::vector<std::unique_ptr<Deck>>* keep, Diagnostics& diags);

// Words used in "did you mean" hints: the candidate closest to `word`
// (edit distance at most max(1, len/3)), or "".
std::string NearestName(const std::string& word, const std::vector<std::string>& candidates);

}  // namespace heatdeck
