#!/usr/bin/env bash
# Installs every Debian package counterflux needs to build, test and cross-compile.
# Fast when everything is already there (checked with dpkg -s, no apt-get at all).
set -euo pipefail

packages=(
  cmake ninja-build g++ clang
  libtomlplusplus-dev libcli11-dev nlohmann-json3-dev libeigen3-dev
  doctest-dev libbenchmark-dev libplplot-dev valgrind
  gcc-arm-none-eabi libnewlib-arm-none-eabi libstdc++-arm-none-eabi-newlib qemu-system-arm
  python3 git ca-certificates
)

missing=()
for p in "${packages[@]}"; do
  if ! dpkg -s "$p" >/dev/null 2>&1; then
    missing+=("$p")
  fi
done

if [ "${#missing[@]}" -eq 0 ]; then
  echo "install-deps: all ${#packages[@]} packages already installed"
  exit 0
fi

if [ "$(id -u)" -eq 0 ]; then
  sudo=()
elif command -v sudo >/dev/null 2>&1; then
  sudo=(sudo)
else
  echo "install-deps: need root (or sudo) to install: ${missing[*]}" >&2
  exit 1
fi

echo "install-deps: installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
"${sudo[@]}" apt-get update
"${sudo[@]}" apt-get install -y --no-install-recommends "${missing[@]}"
