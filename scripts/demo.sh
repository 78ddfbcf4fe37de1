#!/usr/bin/env bash
# Builds the release preset (library, tools, examples) and designs the example sensor.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

scripts/install-deps.sh
cmake --preset release
cmake --build --preset release -j "${JOBS:-2}"
build/release/tools/counterflux design examples/garage_co.toml
