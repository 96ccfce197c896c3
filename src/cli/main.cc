#include <omp.h>

#include "cli/command.h"

int main(int argc, char** argv) {
  // Open Babel's force-field code runs OpenMP regions whose idle threads
  // spin-wait; on a busy two-core machine that made 3D builds 30 times slower
  // (bench/README.md). vicinal parallelises its own hot loops, so Open Babel
  // gets one thread.
  omp_set_num_threads(1);
  return vicinal::cli::run(argc, argv);
}
