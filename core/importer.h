// SPDX-License-Identifier: MIT
#pragma once

#include "core/dataset.h"
#include "core/error.h"
#include "core/progress.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace slatewise::core {

/// Errors listed before an import stops (the rest of the file is not read).
inline constexpr std::size_t kMaxReportedErrors = 20;

/// What a file holds; decides which columns are looked for.
enum class FileRole { Catalog, Train, Withheld, Scores, Lists };

std::string_view toString(FileRole role);

/// Options shared by import and add-run (the command line's flags).
struct ReadOptions {
    char delimiter = 0;             ///< 0 = by extension (.tsv tab, otherwise comma)
    bool strict = false;            ///< leakage (withheld pair also in train) is an error, not a warning
    bool allowUnknownItems = false; ///< unknown item ids are added to the catalog (empty title, no
                                    ///< genres) with a note instead of being errors
};

/// Everything `slatewise import` needs. Files are paths; messages quote them as given.
struct ImportRequest {
    std::string workspacePath;
    std::string catalogPath;
    std::string trainPath;
    std::string withheldPath;
    std::optional<RatingScale> scale; ///< nullopt = infer from the ratings
    bool replace = false;             ///< overwrite an existing workspace (only once all succeeded)
    ReadOptions options;
};

struct ImportReport {
    std::int64_t items = 0, users = 0, genres = 0, series = 0;
    std::int64_t trainRows = 0, withheldRows = 0;
    std::int64_t leakedPairs = 0; ///< withheld (user,item) pairs also present in train
    std::int64_t unknownItemsAdded = 0;
    RatingScale scale;            ///< as stored; scale.inferred tells whether it was read off the data
    std::vector<Note> notes;
    double seconds = 0;           ///< wall time of the whole import
};

/// Creates a workspace from catalog, train and withheld files. Writes a temporary file in the
/// workspace's directory and renames it over the target only when everything succeeded: on
/// any error or cancel nothing is left behind and an existing file is untouched. Refuses an
/// existing workspace unless `replace`. Up to kMaxReportedErrors errors are returned.
Result<ImportReport> importWorkspace(const ImportRequest& request, const Progress& progress = {});

struct AddRunRequest {
    std::string workspacePath;
    std::string name;
    std::string scoresPath; ///< empty = no scores
    std::string listsPath;  ///< empty = no lists
    bool replace = false;   ///< replace a run of the same name (in the same transaction)
    ReadOptions options;
};

struct AddRunReport {
    std::int64_t runId = 0;
    std::int64_t scoreRows = 0;
    std::int64_t scoresOutsideWithheld = 0; ///< stored, but not used by withheld-pair measures
    std::int64_t withheldWithoutScore = 0;
    std::int64_t listRows = 0, listUsers = 0;
    std::int64_t usersAdded = 0;            ///< users seen only in this run's files
    std::int64_t unknownItemsAdded = 0;
    bool replaced = false;
    std::vector<Note> notes;
    double seconds = 0;
};

/// Adds an imported run (scores and/or lists) in one transaction: on any error the workspace
/// file is byte-for-byte unchanged. Users that appear only in these files are added to the
/// users table (they have no train or withheld rows) with a note.
Result<AddRunReport> addRun(const AddRunRequest& request, const Progress& progress = {});

/// The first rows of a file and what each column will be used for, for the guided import.
struct FilePreview {
    std::string path;
    char delimiter = ',';
    bool hasBom = false;
    std::uint64_t size = 0;
    std::vector<std::string> header;
    /// Per header column: the column name it is read as ("user_id", ...) or empty when the
    /// column is ignored under `role`.
    std::vector<std::string> columnRoles;
    std::optional<FileRole> role;  ///< the role given, or guessed from the header
    std::vector<std::string> missingColumns; ///< required columns of `role` not found
    std::vector<std::vector<std::string>> rows;
    std::vector<Note> notes;
    std::vector<Error> errors;     ///< problems within the previewed rows
};

/// Reads the header and up to `maxRows` records. `role` nullopt = guess from the header.
Result<FilePreview> previewFile(const std::string& path, std::size_t maxRows = 20,
                                std::optional<FileRole> role = std::nullopt, char delimiter = 0);

/// Parses "MIN:MAX:STEP" (STEP 0 = continuous), e.g. "1:5:1" or "0.5:5:0.5".
std::optional<RatingScale> parseScale(const std::string& text);

} // namespace slatewise::core
