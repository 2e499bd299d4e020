#include "library/registry.h"

#include <algorithm>

namespace heatdeck::library {

const std::vector<FunctionInfo>& Functions() {
  static const std::vector<FunctionInfo> all = [] {
    std::vector<FunctionInfo> v;
    RegisterGroups(v);
    RegisterResistance(v);
    RegisterFins(v);
    RegisterMtd(v);
    RegisterEntu(v);
    RegisterConvection(v);
    RegisterFriction(v);
    RegisterWater(v);
    RegisterAir(v);
    return v;
  }();
  return all;
}

const FunctionInfo* FindFunction(std::string_view name) {
  const auto& all = Functions();
  auto it =
      std::find_if(all.begin(), all.end(), [&](const FunctionInfo& f) { return name == f.name; });
  return it == all.end() ? nullptr : &*it;
}

double Call(const FunctionInfo& f, const std::vector<double>& args, Sink& sink) {
  return f.fn(args.data(), sink);
}

}  // namespace heatdeck::library
