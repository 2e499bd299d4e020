// Family 'air' of the heat-transfer library (LIBRARY.md).
#include "library/registry.h"

namespace heatdeck::library {

// Not yet written: registers nothing until this family lands.
void RegisterAir(std::vector<FunctionInfo>& /*out*/) {}

}  // namespace heatdeck::library
