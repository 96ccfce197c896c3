#include "library/compound_cache.h"

#include <iterator>
#include <stdexcept>

namespace vicinal::library {

CompoundBuilder& CompoundCache::at(const std::string& key) {
  Slot& slot = slots_.at(key);
  if (!slot.whole) {
    slot.whole = std::make_unique<CompoundBuilder>(*slot.parked);  // a copy: kept should this throw
    slot.parked.reset();
    slot.place = recent_.insert(recent_.begin(), &slot);
  }
  use(slot);
  return *slot.whole;
}

CompoundBuilder& CompoundCache::add(const std::string& key, std::unique_ptr<CompoundBuilder> builder) {
  auto [it, added] = slots_.try_emplace(key);
  if (!added) throw std::logic_error("CompoundCache::add: the key was added before");
  Slot& slot = it->second;
  slot.whole = std::move(builder);
  slot.place = recent_.insert(recent_.begin(), &slot);
  use(slot);
  return *slot.whole;
}

void CompoundCache::use(Slot& slot) {
  recent_.splice(recent_.begin(), recent_, slot.place);
  // Park from the least recently used end; a compound that cannot be parked
  // (PDB) stays whole and is passed over.
  auto it = std::prev(recent_.end());
  while (recent_.size() > whole_ && it != recent_.begin()) {
    Slot* old = *it;
    auto before = std::prev(it);
    if (old->whole->can_park()) {
      old->parked = std::move(*old->whole).park();
      old->whole.reset();
      recent_.erase(it);
    }
    it = before;
  }
}

}  // namespace vicinal::library
