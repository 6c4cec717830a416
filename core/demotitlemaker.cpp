// SPDX-License-Identifier: MIT
#include "core/demotitlemaker.h"

#include "core/demorandom.h"

#include <array>

namespace slatewise::core {

namespace {
template <typename List>
const char* pick(DemoRandom& rng, const List& list)
{
    return list[rng.below(static_cast<std::uint32_t>(std::size(list)))];
}

// Invented place-name halves: "Quill" + "haven" = "Quillhaven".
constexpr const char* kPlaceHeads[] = {"Brack", "Quill", "Marrow", "Thistle", "Ember", "Gallow", "Wren",
                                       "Fallow", "Cinder", "Harrow", "Lark", "Tallow", "Rook", "Sable",
                                       "Vesper", "Oxen", "Pell", "Dunmar", "Corrin", "Hollin", "Kestle",
                                       "Morrow", "Tansy", "Orrel", "Skelly", "Ferro", "Nettle", "Aldrin"};
constexpr const char* kPlaceTails[] = {"haven", "moor", "wick", "mere", "combe", "stead", "holt",
                                       "gate",  "fell", "brook", "ridge", "wold", "sey", "thorpe"};
// Invented character names.
constexpr const char* kGiven[] = {"Odalie", "Brannoch", "Mirabeth", "Corvan", "Ellisande", "Thadrick", "Wenna",
                                  "Osrin",  "Peregrine", "Isaura", "Tobiah", "Marisol", "Quenby", "Laurel",
                                  "Fenwick", "Ysolde", "Hartley", "Junia", "Caspar", "Delphine", "Ambrose",
                                  "Rosalind", "Evander", "Sidony"};
constexpr const char* kFamily[] = {"Varrow", "Quist", "Allenby", "Morcant", "Thelwall", "Pennick", "Oakhurst",
                                   "Brisco", "Lindqvell", "Carrowe", "Ashdown", "Fennimore", "Halloran",
                                   "Sorrell", "Trevanion", "Wickersham"};
constexpr const char* kCollections[] = {"Files", "Chronicles", "Affair", "Saga", "Tales", "Mysteries",
                                        "Adventures", "Legacy", "Cycle", "Diaries"};
constexpr const char* kSubtitles[] = {"Low Tide", "The Second Lantern", "Return to the Mill", "Cold Harbour",
                                      "The Long Winter", "Ashes and Ink", "Night Ferry", "The Salt Road",
                                      "A Door in the Hill", "The Last Carnival", "Paper Crowns", "Under the Viaduct",
                                      "Glass Orchard", "The Lighthouse Ledger", "Copper Rain", "The Tin Crown"};
constexpr const char* kParts[] = {"", "", "II", "III", "IV", "V", "VI"};

struct GenreWords {
    std::array<const char*, 8> nouns;
    std::array<const char*, 6> adjectives;
};

// One row per genre, in the order of genreNames().
const std::array<GenreWords, 16> kWords{{
    {{"Letters", "Kitchen", "Harvest", "Inheritance", "Quarrel", "Winter", "Daughters", "Promise"},
     {"Quiet", "Borrowed", "Unmended", "Late", "Patient", "Second"}},                                // Drama
    {{"Mix-Up", "Picnic", "Caper", "Wedding", "Parrot", "Bake-Off", "Holiday", "Understudy"},
     {"Hopeless", "Tremendous", "Wobbly", "Unlikely", "Jolly", "Upside-Down"}},                      // Comedy
    {{"Alibi", "Crossing", "Signal", "Witness", "Deadline", "Safehouse", "Cipher", "Ransom"},
     {"Silent", "Narrow", "Sleepless", "Hidden", "Final", "Broken"}},                                // Thriller
    {{"Waltz", "Summer", "Postcards", "Serenade", "Courtship", "Promenade", "Orchard", "Valentine"},
     {"Tender", "Golden", "Distant", "Sudden", "Gentle", "Moonlit"}},                                // Romance
    {{"Beekeepers", "Tidewater", "Millstones", "Lamplighters", "Ferrymen", "Quarry", "Looms", "Choir"},
     {"Vanishing", "Working", "Ordinary", "Patient", "Forgotten", "Common"}},                         // Documentary
    {{"Button", "Teapot", "Lantern", "Paper Fox", "Snowkite", "Mouse", "Windmill", "Balloon"},
     {"Little", "Brave", "Tiny", "Clockwork", "Painted", "Sleepy"}},                                 // Animation
    {{"Orbit", "Relay", "Drift", "Colony", "Beacon", "Eclipse", "Array", "Meridian"},
     {"Far", "Hollow", "Ninth", "Silent", "Iron", "Outer"}},                                         // Science Fiction
    {{"Cellar", "Hollow", "Whisper", "Scarecrow", "Attic", "Lullaby", "Bell", "Marsh Light"},
     {"Crawling", "Pale", "Drowned", "Sleepless", "Crooked", "Grinning"}},                           // Horror
    {{"Dust", "Rider", "Canyon", "Drover", "Spur", "Homestead", "Stagecoach", "Claim"},
     {"Dry", "Lone", "Red", "Lawless", "Long", "Sundown"}},                                          // Western
    {{"Songbook", "Revue", "Chorus", "Ballroom", "Encore", "Jamboree", "Tap Shoes", "Overture"},
     {"Singing", "Dancing", "Swinging", "Merry", "Starry", "Lively"}},                               // Musical
    {{"Ledger", "Locket", "Inquest", "Footprints", "Portrait", "Key", "Clue", "Guest"},
     {"Missing", "Curious", "Twelfth", "Locked", "Unsigned", "Vanished"}},                           // Mystery
    {{"Expedition", "Compass", "Voyage", "Summit", "Treasure", "Map", "Caravan", "Glacier"},
     {"Great", "Wild", "Uncharted", "Bold", "Southern", "High"}},                                    // Adventure
    {{"Puppy", "Tree House", "Sleepover", "Grandpa", "Go-Kart", "Snow Day", "Birthday", "Pony"},
     {"Best", "Big", "Lucky", "Happy", "Noisy", "Magic"}},                                           // Family
    {{"Trenches", "Convoy", "Garrison", "Regiment", "Blockade", "Bridgehead", "Airfield", "Dispatch"},
     {"Last", "Burning", "Winter", "Forgotten", "Iron", "Grey"}},                                    // War
    {{"Heist", "Syndicate", "Racket", "Getaway", "Informant", "Stakeout", "Ledger", "Docks"},
     {"Dirty", "Crooked", "Midnight", "Easy", "Double", "Cold"}},                                    // Crime
    {{"Dragon", "Crown", "Sorceress", "Wyvern", "Oath", "Tower", "Enchantment", "Giant"},
     {"Elder", "Twilight", "Seventh", "Enchanted", "Thorned", "Starborn"}},                          // Fantasy
}};
} // namespace

const std::vector<std::string>& DemoTitleMaker::genreNames()
{
    static const std::vector<std::string> names{"Drama",   "Comedy",   "Thriller",  "Romance", "Documentary",
                                                "Animation", "Science Fiction", "Horror", "Western", "Musical",
                                                "Mystery", "Adventure", "Family",   "War",     "Crime",
                                                "Fantasy"};
    return names;
}

std::string DemoTitleMaker::place(DemoRandom& rng)
{
    return std::string(pick(rng, kPlaceHeads)) + pick(rng, kPlaceTails);
}

std::string DemoTitleMaker::character(DemoRandom& rng) { return pick(rng, kGiven); }

std::string DemoTitleMaker::noun(DemoRandom& rng, int genre)
{
    return pick(rng, kWords[static_cast<std::size_t>(genre)].nouns);
}

std::string DemoTitleMaker::adjective(DemoRandom& rng, int genre)
{
    return pick(rng, kWords[static_cast<std::size_t>(genre)].adjectives);
}

std::string DemoTitleMaker::unique(const std::string& candidate)
{
    if (m_used.insert(candidate).second)
        return candidate;
    return {};
}

std::string DemoTitleMaker::title(DemoRandom& rng, int genre)
{
    for (;;) {
        std::string t;
        switch (rng.below(9)) {
        case 0:
            t = place(rng) + " " + noun(rng, genre);
            break;
        case 1:
            t = "The " + noun(rng, genre) + " of " + place(rng);
            break;
        case 2:
            t = character(rng) + "'s " + noun(rng, genre);
            break;
        case 3:
            t = adjective(rng, genre) + " " + noun(rng, genre) + " at " + place(rng);
            break;
        case 4:
            t = character(rng) + " and the " + adjective(rng, genre) + " " + noun(rng, genre);
            break;
        case 5:
            // A comma, so the catalog exercises CSV quoting.
            t = "Goodbye, " + place(rng);
            if (rng.chance(0.5))
                t = noun(rng, genre) + ", " + place(rng);
            break;
        case 6:
            t = "The " + adjective(rng, genre) + " " + std::string(pick(rng, kFamily));
            break;
        case 7:
            // Quotation marks, doubled in the CSV.
            t = "The \"" + adjective(rng, genre) + "\" " + noun(rng, genre) + " of " + place(rng);
            if (!rng.chance(0.3))
                t = adjective(rng, genre) + " " + place(rng);
            break;
        default:
            t = character(rng) + " " + pick(rng, kFamily) + " and the " + noun(rng, genre);
            break;
        }
        if (auto u = unique(t); !u.empty())
            return u;
    }
}

std::string DemoTitleMaker::seriesName(DemoRandom& rng, int genre)
{
    for (;;) {
        std::string t;
        switch (rng.below(3)) {
        case 0:
            t = "The " + place(rng) + " " + pick(rng, kCollections);
            break;
        case 1:
            t = std::string(pick(rng, kGiven)) + " " + pick(rng, kFamily);
            break;
        default:
            t = "The " + adjective(rng, genre) + " " + noun(rng, genre) + " " + pick(rng, kCollections);
            break;
        }
        if (auto u = unique(t); !u.empty())
            return u;
    }
}

std::string DemoTitleMaker::seriesPartTitle(DemoRandom& rng, const std::string& series, int part, int /*genre*/)
{
    if (part == 1)
        return series;
    for (;;) {
        std::string t = series + " " + kParts[part];
        if (rng.chance(0.6))
            t += std::string(": ") + pick(rng, kSubtitles);
        if (auto u = unique(t); !u.empty())
            return u;
    }
}

std::string DemoTitleMaker::personName(DemoRandom& rng)
{
    return std::string(pick(rng, kGiven)) + " " + pick(rng, kFamily);
}

} // namespace slatewise::core
