// Library import (CSV read + store in one transaction into a fresh file) and
// lookup by compound name, by number of coupling rows (straight-chain
// alcohols from SMILES, see write_rows: mostly the 3D build of each new
// compound), and one compound's couplings from a 1,000,000-coupling library,
// beside SQLite's own cost of reading the same rows.
#include <benchmark/benchmark.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "core/progress.h"
#include "library/coupling_row.h"
#include "library/formats.h"
#include "library/query.h"
#include "library/store.h"

namespace {

namespace fs = std::filesystem;
using namespace vicinal::library;

// Writes `rows` coupling rows: straight-chain alcohols C2O..C30O (no
// symmetry, so every CH-CH pair is a distinct coupling), one H-H coupling per
// neighbouring pair of carbons; hydrogens follow the heavy atoms. The same
// scheme as bench/make_inputs.py, ends limited to OH here.
std::string write_rows(int rows) {
  const auto path = fs::temp_directory_path() / ("vicinal-bench-" + std::to_string(rows) + ".csv");
  std::ofstream out(path);
  out << "compound,smiles,measurement,solvent,temperature_k,field_mhz,source,nuclei,j_hz,sigma_hz\n";
  int written = 0;
  for (int measurement = 0; written < rows; ++measurement)
    for (int n = 2; n <= 30 && written < rows; ++n) {
      int first_h = n + 2;  // on C1 (3 H), then 2 on each further carbon
      for (int c = 0; c + 1 < n && written < rows; ++c, ++written) {
        const int next_h = first_h + (c == 0 ? 3 : 2);
        out << 'C' << n << "O chain," << (c == 0 ? std::string(n, 'C') + "O" : "") << ",run " << measurement
            << ",CDCl3," << 280 + measurement << ",400,generated,\"" << first_h << ',' << next_h << "\","
            << 6.5 + 0.01 * ((c + measurement) % 50) << ",0.1\n";
        first_h = next_h;
      }
    }
  return path.string();
}

void import_csv(benchmark::State& state) {
  const std::string csv = write_rows(static_cast<int>(state.range(0)));
  const auto db = fs::temp_directory_path() / "vicinal-bench-import.sqlite";
  vicinal::NoProgress progress;
  for (auto _ : state) {
    state.PauseTiming();
    fs::remove(db);
    state.ResumeTiming();
    auto library = Library::create(db.string());
    auto read = read_csv(csv, {});
    auto report = library->store(read.entries, progress);
    benchmark::DoNotOptimize(report.couplings_added);
  }
  state.SetItemsProcessed(state.iterations() * state.range(0));
  fs::remove(db);
  fs::remove(csv);
}

void find_by_name(benchmark::State& state) {
  const std::string csv = write_rows(static_cast<int>(state.range(0)));
  const auto db = fs::temp_directory_path() / "vicinal-bench-find.sqlite";
  fs::remove(db);
  vicinal::NoProgress progress;
  auto library = Library::create(db.string());
  library->store(read_csv(csv, {}).entries, progress);
  FindQuery query;
  query.name = "C5O";
  for (auto _ : state) {
    auto found = find_couplings(library->db(), query);
    benchmark::DoNotOptimize(found.couplings.data());
  }
  library.reset();
  fs::remove(db);
  fs::remove(csv);
}

// One compound's couplings from a large library (what `library show` reads):
// the library compare.py built by importing the 1,000,000-coupling file,
// named by VICINAL_BENCH_LIBRARY, and the compound named by the environment
// variable `compound_variable`. Skipped when they are not set.
void lookup(benchmark::State& state, const char* compound_variable) {
  const char* path = std::getenv("VICINAL_BENCH_LIBRARY");
  const char* name = std::getenv(compound_variable);
  if (!path || !name) {
    state.SkipWithError("VICINAL_BENCH_LIBRARY or the compound's variable not set");
    return;
  }
  Library library(path);
  std::size_t couplings = 0;
  for (auto _ : state) {
    const auto entries = library.read_entries({find_compound(library.db(), name)});
    couplings = 0;
    for (const auto& s : entries.at(0).sets) couplings += s.couplings.size();
    benchmark::DoNotOptimize(couplings);
  }
  state.counters["couplings"] = static_cast<double>(couplings);
}

// The floor under lookup_compound: SQLite alone running the same couplings
// query for the same compound and reading every column once through the C
// API, with nothing copied and no records built. The bulk compound's lookup
// cannot be faster than this with the library's schema.
void lookup_compound_sqlite_floor(benchmark::State& state) {
  const char* path = std::getenv("VICINAL_BENCH_LIBRARY");
  const char* name = std::getenv("VICINAL_BENCH_COMPOUND");
  if (!path || !name) {
    state.SkipWithError("VICINAL_BENCH_LIBRARY or VICINAL_BENCH_COMPOUND not set");
    return;
  }
  Library library(path);
  const std::int64_t id = find_compound(library.db(), name);
  sqlite3* db = library.db().handle();
  sqlite3_stmt* query = nullptr;
  const std::string sql = compound_couplings_query();
  if (sqlite3_prepare_v2(db, sql.c_str(), -1, &query, nullptr) != SQLITE_OK) {
    state.SkipWithError(sqlite3_errmsg(db));
    return;
  }
  std::size_t couplings = 0;
  for (auto _ : state) {
    // One read transaction per lookup, as read_entries takes.
    sqlite3_exec(db, "BEGIN", nullptr, nullptr, nullptr);
    sqlite3_bind_int64(query, 1, id);
    couplings = 0;
    std::size_t bytes = 0;
    while (sqlite3_step(query) == SQLITE_ROW) {
      for (int c = 0; c < sqlite3_column_count(query); ++c) {
        switch (sqlite3_column_type(query, c)) {
          case SQLITE_INTEGER: bytes += static_cast<std::size_t>(sqlite3_column_int64(query, c) & 1); break;
          case SQLITE_FLOAT: bytes += sqlite3_column_double(query, c) > 0; break;
          case SQLITE_TEXT:
            benchmark::DoNotOptimize(sqlite3_column_text(query, c));
            bytes += static_cast<std::size_t>(sqlite3_column_bytes(query, c));
            break;
          default: break;
        }
      }
      ++couplings;
    }
    sqlite3_reset(query);
    sqlite3_exec(db, "COMMIT", nullptr, nullptr, nullptr);
    benchmark::DoNotOptimize(bytes);
  }
  sqlite3_finalize(query);
  state.counters["couplings"] = static_cast<double>(couplings);
}

// A compound of the bulk file: about 2,000 couplings over 78 measurement sets.
void lookup_compound(benchmark::State& state) { lookup(state, "VICINAL_BENCH_COMPOUND"); }
// A compound measured as a group would: a few dozen couplings in three solvents.
void lookup_typical_compound(benchmark::State& state) { lookup(state, "VICINAL_BENCH_TYPICAL_COMPOUND"); }

}  // namespace

// Sizes are small because import builds 3D coordinates for every new compound
// (tens of ms each, more with Open Babel OpenMP threads spinning): see latest.md.
BENCHMARK(import_csv)->Arg(30)->Arg(100)->Arg(300)->Unit(benchmark::kMillisecond)->Iterations(1);
BENCHMARK(find_by_name)->Arg(30)->Arg(100)->Arg(300)->Unit(benchmark::kMillisecond);
BENCHMARK(lookup_compound)->Unit(benchmark::kMillisecond);
BENCHMARK(lookup_compound_sqlite_floor)->Unit(benchmark::kMillisecond);
BENCHMARK(lookup_typical_compound)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
