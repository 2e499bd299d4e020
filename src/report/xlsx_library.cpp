#include "report/xlsx_library.h"

#include <dlfcn.h>

#include <fmt/format.h>

#ifndef HEATDECK_XLSXWRITER_SONAME
#error "the build names the libxlsxwriter to open (CMakeLists.txt)"
#endif

namespace heatdeck::xlsx {
namespace {

struct Loaded {
  Library lib;
  std::string error;  // empty when every entry point was found
};

Loaded Load() {
  Loaded r;
  void* handle = dlopen(HEATDECK_XLSXWRITER_SONAME, RTLD_NOW | RTLD_LOCAL);
  if (handle == nullptr) {
    const char* e = dlerror();
    r.error = fmt::format("cannot load {}: {}", HEATDECK_XLSXWRITER_SONAME,
                          e != nullptr ? e : "unknown error");
    return r;
  }
  // POSIX guarantees that dlsym's object pointer converts to the function
  // pointer it stands for.
#define HD_XLSX_LOOKUP(name)                                                           \
  r.lib.name = reinterpret_cast<decltype(r.lib.name)>(dlsym(handle, #name));           \
  if (r.lib.name == nullptr && r.error.empty()) {                                      \
    r.error = fmt::format("{} has no function {}", HEATDECK_XLSXWRITER_SONAME, #name); \
  }
  HD_XLSX_FUNCTIONS(HD_XLSX_LOOKUP)
#undef HD_XLSX_LOOKUP
  return r;
}

}  // namespace

const Library* XlsxLibrary(std::string* why) {
  static const Loaded loaded = Load();
  if (!loaded.error.empty()) {
    *why = loaded.error;
    return nullptr;
  }
  return &loaded.lib;
}

}  // namespace heatdeck::xlsx
