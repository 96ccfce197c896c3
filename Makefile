# The two commands of the README, plus the developer targets.
BUILD ?= build
JOBS ?= 2
CMAKE_FLAGS ?=

.PHONY: demo test bench clean deps configure build

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

clean:
	rm -rf $(BUILD) $(BENCH_BUILD) vicinal-demo
