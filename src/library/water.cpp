// Family 'water' of the heat-transfer library (LIBRARY.md).
#include "library/registry.h"

namespace heatdeck::library {

// Not yet written: registers nothing until this family lands.
void RegisterWater(std::vector<FunctionInfo>& /*out*/) {}

}  // namespace heatdeck::library
