// SPDX-License-Identifier: MIT
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace slatewise::core {

class DemoRandom;

inline constexpr int kDemoLatentDims = 4;
using DemoLatent = std::array<double, kDemoLatentDims>;

/// One invented title of the demo catalog with its hidden generative parameters.
struct DemoTitle {
    std::string id;
    std::string title;
    int year = 0;
    std::vector<int> genres; ///< ascending genre numbers (index into DemoTitleMaker::genreNames())
    int series = -1;         ///< index into DemoTasteModel::series() or -1
    int part = 0;            ///< 1-based part within the series; 0 when standalone
    double quality = 0.0;    ///< hidden: shifts every member's rating (stars)
    int popularityRank = 0;  ///< 0 = most often chosen
    double popularity = 0.0; ///< hidden: long-tail weight 1 / (rank + 8)
    DemoLatent latent{};     ///< hidden taste factors
};

struct DemoSeries {
    std::string name;
    int genre = 0;
    std::vector<int> parts; ///< title indices in part order
};

/// The kind of member, which decides how many titles they watch and how.
enum class DemoMemberKind { Light, Steady, Heavy, SeriesFan, HarshCritic, Binge, Cold, LateJoiner };

std::string_view toString(DemoMemberKind kind);

struct DemoMember {
    std::string id;
    DemoMemberKind kind = DemoMemberKind::Steady;
    double bias = 0.0;              ///< hidden: stars above or below the average rater
    std::vector<double> genreTaste; ///< hidden: affinity per genre
    DemoLatent latent{};            ///< hidden taste factors
    int interactions = 0;           ///< how many titles the member rates in all
    int bingeGenre = -1;            ///< for Binge members: the genre of the recent binge
    std::int64_t joined = 0;        ///< Unix seconds
};

/// The generative model behind the demo: a catalog of invented titles and a club of
/// members, each with hidden tastes. A member's expected rating of a title is
///   3.3 + member bias + title quality + 0.75 * affinity,
/// affinity = mean over the title's genres of the member's genre taste + latent dot product,
/// and the chance of choosing a title is its long-tail popularity times a taste factor.
class DemoTasteModel {
public:
    /// The time span of the demo: two years of club evenings ending on the Friday meeting.
    static constexpr std::int64_t kStart = 1733011200;            ///< 2024-12-01T00:00:00Z
    static constexpr std::int64_t kEnd = kStart + 726LL * 86400;  ///< 2026-11-27T00:00:00Z
    static constexpr std::int64_t kRunsProduced = kStart + 705LL * 86400; ///< 2026-11-06

    static DemoTasteModel build(DemoRandom& rng);

    const std::vector<DemoTitle>& titles() const { return m_titles; }
    const std::vector<DemoSeries>& series() const { return m_series; }
    const std::vector<DemoMember>& members() const { return m_members; }
    const std::vector<std::string>& genreNames() const;

    /// Taste match of a member for a title, roughly -2..2.
    double affinity(int member, int title) const;
    /// Expected rating before noise and rounding (unclamped).
    double expectedRating(int member, int title) const;
    /// Unnormalised probability that the member picks the title next.
    double choiceWeight(int member, int title) const;
    /// Rating a member with no history would be predicted: the title's average.
    double titleMean(int title) const;
    /// Titles whose only genre is `genre`.
    std::vector<int> pureTitles(int genre) const;

private:
    void buildCatalog(DemoRandom& rng);
    void buildMembers(DemoRandom& rng);

    std::vector<DemoTitle> m_titles;
    std::vector<DemoSeries> m_series;
    std::vector<DemoMember> m_members;
};

} // namespace slatewise::core
