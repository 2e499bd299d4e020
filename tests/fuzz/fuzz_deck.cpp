// libFuzzer target: lexer + parser + model builder (resolution and the
// dimension checker) on arbitrary bytes.  Nothing may crash or hang.
#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "lang/diagnostics.h"
#include "lang/parser.h"
#include "model/builder.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  heatdeck::SourceFiles files;
  heatdeck::Diagnostics diags;
  const std::string_view name = files.Add("fuzz.deck", text);
  heatdeck::Deck deck = heatdeck::Parse(name, files.Text(name), diags);
  heatdeck::BuildOptions options;  // no file access: use/table report an error
  std::vector<std::unique_ptr<heatdeck::Deck>> keep;
  auto model = heatdeck::BuildModel(deck, options, &keep, diags);
  for (const heatdeck::Diagnostic* d : diags.Sorted()) (void)heatdeck::Render(*d, files, false);
  return 0;
}
