#include "report/writers.h"

#include "report/html_writer.h"
#include "report/json_writer.h"
#include "report/markdown_writer.h"
#include "report/output.h"
#include "report/xlsx_writer.h"

namespace heatdeck {

bool ParseFormat(std::string_view name, Format* out) {
  if (name == "html")
    *out = Format::kHtml;
  else if (name == "md" || name == "markdown")
    *out = Format::kMarkdown;
  else if (name == "xlsx")
    *out = Format::kXlsx;
  else if (name == "json")
    *out = Format::kJson;
  else if (name == "csv")
    *out = Format::kCsv;
  else
    return false;
  return true;
}

const char* FormatName(Format f) {
  switch (f) {
    case Format::kHtml:
      return "html";
    case Format::kMarkdown:
      return "md";
    case Format::kXlsx:
      return "xlsx";
    case Format::kJson:
      return "json";
    case Format::kCsv:
      return "csv";
  }
  return "";
}

const char* Extension(Format f) { return FormatName(f); }

bool IsTextFormat(Format f) { return f != Format::kXlsx; }

bool RenderText(const Results& results, const Diagnostics& diags, Format f, std::string* out,
                std::string* error) {
  switch (f) {
    case Format::kJson:
      *out = WriteJson(results, &diags);
      return true;
    case Format::kHtml:
      return WriteHtml(results, out, error);
    case Format::kMarkdown:
      return WriteMarkdown(results, out, error);
    case Format::kCsv:
      *error = "csv output is for sweeps, and this deck has no sweep";
      return false;
    case Format::kXlsx:
      *error = "xlsx is not a text format";
      return false;
  }
  return false;
}

bool WriteOutput(const Results& results, const Diagnostics& diags, Format f,
                 const std::string& path, std::string* error) {
  if (f == Format::kXlsx) {
    return WriteViaTemp(
        path,
        [&](const std::string& tmp, std::string* err) { return WriteXlsx(results, tmp, err); },
        error);
  }
  std::string text;
  if (!RenderText(results, diags, f, &text, error)) return false;
  return WriteFileAtomic(path, text, error);
}

}  // namespace heatdeck
