#!/usr/bin/env bash
# Builds the release preset (library, tools, examples), designs the example sensor
# and writes its compensation tables (C header, CSV, JSON, record, SVG plot) to
# build/tables/garage_co/, with the interpolation error they are proven to meet.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

scripts/install-deps.sh
cmake --preset release
cmake --build --preset release -j "${JOBS:-2}"
build/release/tools/counterflux design examples/garage_co.toml
build/release/tools/counterflux table examples/garage_co.toml --out build/tables/garage_co \
  --svg build/tables/garage_co/garage_co.svg
echo "counterflux: tables for firmware in build/tables/garage_co/ (see the proof above)"
