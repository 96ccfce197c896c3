#!/usr/bin/env bash
# Installs every Debian package vicinal needs to build, test, benchmark and run
# its demo. This is the only place packages are listed. Idempotent: packages
# already installed are skipped, so a second run does nothing.
set -euo pipefail

packages=(
  # toolchain
  build-essential cmake pkg-config git ccache
  # core libraries
  libsqlite3-dev sqlite3 libeigen3-dev libceres-dev libopenbabel-dev openbabel
  libcli11-dev nlohmann-json3-dev libfmt-dev libfast-float-dev libcairo2-dev libjemalloc-dev
  fonts-dejavu-core
  # tests and benchmarks
  libgtest-dev libgmock-dev libbenchmark-dev
  # outside references used by validation tests and benchmarks
  python3 python3-numpy python3-scipy python3-rdkit python3-mdtraj python3-openbabel
  # browser test of the HTML report
  chromium
  # sanitizers and fuzzing
  clang libclang-rt-14-dev
)

missing=()
for p in "${packages[@]}"; do
  status=$(dpkg-query -W -f='${Status}' "$p" 2>/dev/null || true)
  [[ "$status" == "install ok installed" ]] || missing+=("$p")
done

if [[ ${#missing[@]} -eq 0 ]]; then
  echo "install-deps: all ${#packages[@]} packages present"
  exit 0
fi

cmd="apt-get install -y --no-install-recommends ${missing[*]}"
if [[ $(id -u) -ne 0 ]]; then
  echo "install-deps: ${#missing[@]} packages are missing and installing them needs root." >&2
  echo "Run as root:  apt-get update && $cmd" >&2
  exit 1
fi

echo "install-deps: installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
$cmd
