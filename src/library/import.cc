#include "library/import.h"

#include <condition_variable>
#include <deque>
#include <exception>
#include <mutex>
#include <optional>
#include <thread>

namespace vicinal::library {

namespace {

// Batches from the reading thread to the storing one. At most two wait, so a
// large file takes the memory of about four: one being read, two waiting and
// one being stored.
class BatchQueue {
 public:
  // Reading side. Throws Stopped once the storing side has given up.
  struct Stopped {};
  void push(EntryBatch&& batch) {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return stopped_ || batches_.size() < 2; });
    if (stopped_) throw Stopped{};
    batches_.push_back(std::move(batch));
    changed_.notify_all();
  }
  void finish(std::exception_ptr failure) {
    std::lock_guard lock(mutex_);
    finished_ = true;
    failure_ = failure;
    changed_.notify_all();
  }

  // Storing side: the next batch, nothing at the end, or the reading side's error.
  std::optional<EntryBatch> pop() {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return finished_ || !batches_.empty(); });
    if (!batches_.empty()) {
      EntryBatch batch = std::move(batches_.front());
      batches_.pop_front();
      changed_.notify_all();
      return batch;
    }
    if (failure_) std::rethrow_exception(failure_);
    return std::nullopt;
  }
  void stop() {
    std::lock_guard lock(mutex_);
    stopped_ = true;
    changed_.notify_all();
  }

 private:
  std::mutex mutex_;
  std::condition_variable changed_;
  std::deque<EntryBatch> batches_;
  bool finished_ = false, stopped_ = false;
  std::exception_ptr failure_;
};

// Stores batches in one transaction, begun at the first batch so that the
// library is not locked while the start of the file is read.
class BatchStore {
 public:
  BatchStore(Library& library, Progress& progress) : library_(library), progress_(progress) {}
  void add(const EntryBatch& batch) {
    if (!tx_) {
      progress_.start("importing", batch.file_total, batch.unit);
      tx_.emplace(library_);
    }
    tx_->add(batch.entries);
    progress_.advance(batch.read_so_far);
  }
  StoreReport commit() {
    if (!tx_) return {};
    auto report = tx_->commit();
    progress_.finish();
    return report;
  }

 private:
  Library& library_;
  Progress& progress_;
  std::optional<StoreTransaction> tx_;
};

}  // namespace

ImportOutcome import_file(Library& library, const std::string& path, const ImportOptions& options,
                          Progress& progress, int threads) {
  ImportOutcome out;
  BatchStore store(library, progress);
  if (threads <= 1) {
    out.read = read_exchange_file(path, options, [&](EntryBatch&& batch) { store.add(batch); });
    out.stored = store.commit();
    return out;
  }
  BatchQueue queue;
  std::thread reader([&] {
    std::exception_ptr failure;
    try {
      out.read = read_exchange_file(path, options, [&](EntryBatch&& batch) { queue.push(std::move(batch)); });
    } catch (const BatchQueue::Stopped&) {
    } catch (...) {
      failure = std::current_exception();
    }
    queue.finish(failure);
  });
  try {
    while (auto batch = queue.pop()) store.add(*batch);
    out.stored = store.commit();
  } catch (...) {
    queue.stop();
    reader.join();
    throw;
  }
  reader.join();
  return out;
}

}  // namespace vicinal::library
