#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# First command of the README: install, build, build the demo workspace and summarise it.
set -euo pipefail
root=$(cd "$(dirname "$0")/.." && pwd)
build=${SLATEWISE_BUILD_DIR:-$root/build}
"$root/scripts/install-deps.sh"
"$root/scripts/build.sh" >/dev/null
mkdir -p "$root/out"
"$build/app/slatewise" demo "$root/out/film-club.sqlite" --replace
"$build/app/slatewise" info "$root/out/film-club.sqlite"
