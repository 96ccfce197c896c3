// The compounds of one file being imported, by the key of the structure that
// gave them. The most recently used stay whole (molecule, labels, identity);
// the others are parked as their records and worked out again from their
// molfiles when a later row names them. Without this, a file of many
// compounds kept every compound's Open Babel molecules to its end: importing
// 100,000 small compounds took 6.9 GB (2.4 GB with it).
#pragma once

#include <cstddef>
#include <list>
#include <map>
#include <memory>
#include <optional>
#include <string>

#include "library/entry_builder.h"

namespace vicinal::library {

class CompoundCache {
 public:
  // Files mostly give a compound's rows together; 1,024 compounds whole
  // (about 60 MB) cover files that interleave fewer compounds than that.
  static constexpr std::size_t kWholeByDefault = 1024;
  explicit CompoundCache(std::size_t whole = kWholeByDefault) : whole_(whole) {}

  bool contains(const std::string& key) const { return slots_.count(key) > 0; }
  // The cache's own copy of a key added before: lasts as long as the cache.
  const std::string& stored_key(const std::string& key) const { return slots_.find(key)->first; }
  // The compound added under `key` (most recently used now), worked out again
  // if it was parked. vicinal::Error when that fails; std::out_of_range for a
  // key never added.
  CompoundBuilder& at(const std::string& key);
  // Adds a compound under a key not added before; may park the least
  // recently used.
  CompoundBuilder& add(const std::string& key, std::unique_ptr<CompoundBuilder> builder);

  std::size_t whole() const { return recent_.size(); }  // for tests

 private:
  struct Slot {
    std::unique_ptr<CompoundBuilder> whole;
    std::optional<CompoundBuilder::Parked> parked;
    std::list<Slot*>::iterator place;  // in recent_, while whole
  };
  void use(Slot& slot);  // moves a whole slot to the front, parking from the back

  std::size_t whole_;
  std::map<std::string, Slot> slots_;
  std::list<Slot*> recent_;  // whole slots, most recently used first
};

}  // namespace vicinal::library
