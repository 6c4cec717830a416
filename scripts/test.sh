#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Second command of the README (and all of CI): install, build, run every test.
set -euo pipefail
root=$(cd "$(dirname "$0")/.." && pwd)
build=${SLATEWISE_BUILD_DIR:-$root/build}
"$root/scripts/install-deps.sh"
"$root/scripts/build.sh"
cd "$build"
ctest --output-on-failure --parallel "$(nproc)" --timeout 1200
