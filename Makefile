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

clean:
	rm -rf $(BUILD) vicinal-demo
