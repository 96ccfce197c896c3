# The two commands of the README, plus the developer targets.
BUILD ?= build
JOBS ?= 2
CMAKE_FLAGS ?=

.PHONY: demo test bench bench-search clean deps configure build sanitize fuzz

deps:
	bash tools/install-deps.sh

configure: deps
	cmake -S . -B $(BUILD) -DCMAKE_BUILD_TYPE=Release $(CMAKE_FLAGS)

build: configure
	cmake --build $(BUILD) -j$(JOBS)

demo: build
	./$(BUILD)/vicinal demo

test: build
	cd $(BUILD) && ctest --output-on-failure -j$(JOBS)

# Benchmarks: a Release build with bench/ in build-bench, then the side-by-side
# comparison against the outside references (writes bench/results/latest.md).
BENCH_BUILD ?= build-bench
bench: deps
	cmake -S . -B $(BENCH_BUILD) -DCMAKE_BUILD_TYPE=Release -DVICINAL_BUILD_BENCHMARKS=ON $(CMAKE_FLAGS)
	cmake --build $(BENCH_BUILD) -j$(JOBS) --target vicinal karplus_bench j_matrix_bench \
	  frame_reader_bench fit_bench spin_bench library_bench parse_floor
	/usr/bin/python3 bench/compare.py --build $(BENCH_BUILD)

# Substructure search over a 100,000-compound library against a plain Open
# Babel scan (writes bench/results/search-scale.md; about 11 minutes the first
# time, while RDKit embeds the structures).
bench-search: deps
	cmake -S . -B $(BENCH_BUILD) -DCMAKE_BUILD_TYPE=Release -DVICINAL_BUILD_BENCHMARKS=ON $(CMAKE_FLAGS)
	cmake --build $(BENCH_BUILD) -j$(JOBS) --target vicinal
	/usr/bin/python3 bench/search_scale.py --build $(BENCH_BUILD)

# The whole test suite under AddressSanitizer + UndefinedBehaviorSanitizer (gcc)
# in build-sanitize. Leak suppressions for system libraries: tests/sanitize/lsan.supp.
# .ci/run runs it after `make test`.
SANITIZE_BUILD ?= build-sanitize
SANITIZE_ENV = ASAN_OPTIONS=detect_leaks=1:check_initialization_order=1:strict_init_order=1 \
  LSAN_OPTIONS=suppressions=$(CURDIR)/tests/sanitize/lsan.supp:print_suppressions=0 \
  UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1
sanitize: deps
	cmake -S . -B $(SANITIZE_BUILD) -DCMAKE_BUILD_TYPE=RelWithDebInfo -DVICINAL_SANITIZE=ON $(CMAKE_FLAGS)
	$(SANITIZE_ENV) cmake --build $(SANITIZE_BUILD) -j$(JOBS)
	cd $(SANITIZE_BUILD) && $(SANITIZE_ENV) ctest --output-on-failure -j$(JOBS)

# libFuzzer programs (clang) in build-fuzz, each run for FUZZ_SECONDS from its
# seeds in tests/fuzz/corpus/ (details in tests/fuzz/README.md).
FUZZ_BUILD ?= build-fuzz
FUZZ_SECONDS ?= 60
FUZZ_TARGETS ?=
fuzz: deps
	cmake -S . -B $(FUZZ_BUILD) -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=RelWithDebInfo \
	  -DVICINAL_FUZZ=ON -DVICINAL_BUILD_TESTS=OFF $(CMAKE_FLAGS)
	cmake --build $(FUZZ_BUILD) -j$(JOBS) --target fuzzers
	bash tests/fuzz/run.sh $(FUZZ_BUILD) $(FUZZ_SECONDS) $(FUZZ_TARGETS)

clean:
	rm -rf $(BUILD) $(BENCH_BUILD) $(SANITIZE_BUILD) $(FUZZ_BUILD) vicinal-demo
