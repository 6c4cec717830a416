// SPDX-License-Identifier: MIT
#pragma once

#include "core/error.h"
#include "core/progress.h"

#include <cstdint>
#include <string>
#include <vector>

namespace slatewise::core {

/// One generated file: its name relative to the demo folder and its exact bytes.
struct DemoFile {
    std::string name;
    std::string content;
};

/// The files of one simulated run, relative to the demo folder.
struct DemoRunFiles {
    std::string name;
    std::string scoresFile;
    std::string listsFile;
    std::string character;
};

/// Facts about the generated club that the demo summary and the tests rely on.
struct DemoFacts {
    std::size_t titles = 0, genres = 0, series = 0, members = 0;
    std::size_t trainRows = 0, withheldRows = 0;
    std::vector<std::string> bingeMembers; ///< ids of members whose train history ends in a binge
    std::vector<std::string> coldMembers;  ///< fewer than 5 train ratings
    std::vector<std::string> lateJoiners;  ///< joined after the runs were produced: no lists
    std::vector<std::string> seriesFans;
};

struct DemoOutput {
    std::vector<DemoFile> files;
    std::vector<DemoRunFiles> runs;
    DemoFacts facts;
};

/// Generates the invented film-club demo (catalog, members, train and withheld ratings and
/// three simulated runs) from one seed. The same seed gives the same bytes on every
/// platform: the generator uses its own random source (DemoRandom), only exactly rounded
/// arithmetic, total orders for every sort and fixed number formatting.
class DemoGenerator {
public:
    static constexpr std::uint64_t kDefaultSeed = 20261127;

    static DemoOutput generate(std::uint64_t seed = kDefaultSeed, const Progress& progress = {});
    /// Writes every file under `dir` (created when missing), replacing files of the same name.
    static Status write(const DemoOutput& output, const std::string& dir);

    /// The file names the generator writes, for the demo command and the tests.
    static std::vector<std::string> fileNames();
    static std::vector<DemoRunFiles> runFiles();
    static constexpr const char* kCatalogFile = "catalog.csv";
    static constexpr const char* kTrainFile = "train.csv";
    static constexpr const char* kWithheldFile = "withheld.csv";
    static constexpr const char* kMembersFile = "members.csv";
};

} // namespace slatewise::core
