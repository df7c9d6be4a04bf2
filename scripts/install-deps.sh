#!/usr/bin/env bash
# Installs the Debian 12 packages locind needs to build, test and report.
# Runs apt-get only when something is missing; uses sudo when not root.
set -euo pipefail

packages=(
  cmake g++ make ninja-build pkg-config ccache
  libeigen3-dev libboost-random-dev libboost-program-options-dev libboost-math-dev
  libyaml-cpp-dev libbenchmark-dev doctest-dev
  graphviz libgraphviz-dev gnuplot-nox
  chromium fonts-dejavu-core
  libopenmpi-dev openmpi-bin
  python3 python3-networkx python3-scipy python3-numpy python3-pandas
  clang libclang-rt-14-dev
)

missing=()
for p in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$p")
  fi
done

if ((${#missing[@]} == 0)); then
  echo "install-deps: all ${#packages[@]} packages present"
  exit 0
fi

sudo_cmd=()
if [ "$(id -u)" -ne 0 ]; then
  sudo_cmd=(sudo)
fi
echo "install-deps: installing ${missing[*]}"
"${sudo_cmd[@]}" apt-get update -q
"${sudo_cmd[@]}" env DEBIAN_FRONTEND=noninteractive \
  apt-get install -y -q --no-install-recommends "${missing[@]}"
