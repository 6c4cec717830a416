// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/run.h"

#include <cstdint>
#include <string>

namespace slatewise::core {

/// Size and seed of a synthetic workspace for benchmarks and tests. Per-user counts vary
/// uniformly between half and one and a half times the given means, so totals are close to
/// users * trainPerUser and users * withheldPerUser.
struct SyntheticSpec {
    std::uint32_t users = 1000;
    std::uint32_t items = 5000;
    std::uint32_t genres = 16;
    double trainPerUser = 50;
    double withheldPerUser = 10;
    std::uint32_t listLength = 100;
    std::uint64_t seed = 1;
};

/// A generated dataset and one run over it: the run has a score for every withheld pair and a
/// list of spec.listLength items (never train items) for every user.
struct SyntheticWorkspace {
    Dataset data;
    RunData run;
};

/// Builds the workspace in memory. Deterministic for a given spec (independent of the number
/// of threads). Items have 1-3 genres, about one in ten belongs to a series of 2-5 parts,
/// popularity follows a long tail, ratings are integers 1..5 from user/item biases and genre
/// affinity, timestamps increase per user and withheld rows come after train rows.
SyntheticWorkspace makeSynthetic(const SyntheticSpec& spec);

/// Writes catalog.csv, train.csv, withheld.csv, scores.csv and lists.csv (the formats of
/// docs/formats.md) into `dir`, which must exist. Train timestamps are Unix seconds, withheld
/// timestamps ISO 8601, so both forms are exercised.
Status writeSyntheticFiles(const SyntheticSpec& spec, const std::string& dir);

} // namespace slatewise::core
