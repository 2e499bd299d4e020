#include <stdexcept>

#include "model/model.h"

namespace heatdeck {
namespace {

// Ids past the end grow the table only this far ahead of its size, so that
// a stray id cannot make it huge; such a node goes to the overflow.
constexpr size_t kMaxGrowth = 1u << 20;

}  // namespace

ExprInfo& ExprInfoTable::operator[](const Expr* e) {
  if (e->id >= 0) {
    const auto i = static_cast<size_t>(e->id);
    if (i >= slots_.size() && i < 2 * slots_.size() + kMaxGrowth) slots_.resize(i + 1);
    if (i < slots_.size()) {
      Entry& slot = slots_[i];
      if (slot.first == e) return slot.second;
      if (slot.first == nullptr) {
        slot.first = e;
        return slot.second;
      }
    }
  }
  auto [it, inserted] = overflow_.try_emplace(e, nullptr);
  if (inserted) it->second = &overflow_store_.emplace_back(e, ExprInfo{});
  return it->second->second;
}

const ExprInfoTable::Entry* ExprInfoTable::find(const Expr* e) const {
  if (e->id >= 0 && static_cast<size_t>(e->id) < slots_.size()) {
    const Entry& slot = slots_[static_cast<size_t>(e->id)];
    if (slot.first == e) return &slot;
  }
  if (overflow_.empty()) return nullptr;
  auto it = overflow_.find(e);
  return it == overflow_.end() ? nullptr : it->second;
}

const ExprInfo& ExprInfoTable::at(const Expr* e) const {
  const Entry* x = find(e);
  if (x == nullptr) throw std::out_of_range("ExprInfoTable::at: no info for this expression");
  return x->second;
}

}  // namespace heatdeck
