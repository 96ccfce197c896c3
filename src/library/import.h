// Importing an exchange file into a library: read, check and store in one
// transaction. With more than one thread, the file is read (rows parsed,
// structures identified with Open Babel) on a second thread while this one
// stores the batches already read; Open Babel is called on the reading thread
// only, so its thread safety is never relied on.
#pragma once

#include <string>

#include "core/progress.h"
#include "library/formats.h"
#include "library/store.h"

namespace vicinal::library {

struct ImportOutcome {
  ImportResult read;   // rejects and the count of couplings read (no entries)
  StoreReport stored;
};

// vicinal::Error as read_exchange_file and Library::store; then nothing of
// the file is stored.
ImportOutcome import_file(Library& library, const std::string& path, const ImportOptions& options,
                          Progress& progress, int threads);

}  // namespace vicinal::library
