// SPDX-License-Identifier: MIT
#pragma once

#include <set>
#include <string>
#include <vector>

namespace slatewise::core {

class DemoRandom;

/// Makes invented film titles and series names for the demo catalog. Every title is built
/// around an invented place or character name from fixed word lists, so none of them is
/// the title of a real film. Titles are unique within one maker.
class DemoTitleMaker {
public:
    /// The genre names of the demo catalog, in a fixed order (index = genre number).
    static const std::vector<std::string>& genreNames();

    /// A standalone title whose words suit the genre (index into genreNames()).
    std::string title(DemoRandom& rng, int genre);
    /// A series name, e.g. "The Quillhaven Files".
    std::string seriesName(DemoRandom& rng, int genre);
    /// The title of part `part` (1-based) of a series.
    std::string seriesPartTitle(DemoRandom& rng, const std::string& series, int part, int genre);
    /// An invented person's name (for the README's cast and the demo summary).
    std::string personName(DemoRandom& rng);

private:
    std::string place(DemoRandom& rng);
    std::string character(DemoRandom& rng);
    std::string noun(DemoRandom& rng, int genre);
    std::string adjective(DemoRandom& rng, int genre);
    std::string unique(const std::string& candidate);

    std::set<std::string> m_used;
};

} // namespace slatewise::core
