// SPDX-License-Identifier: MIT
#pragma once

#include <string>
#include <vector>

namespace slatewise::cli {

/// Each subcommand lives in its own <name>command.cpp and receives the arguments after
/// its name. It returns the process exit code (see args.h).
using CommandFn = int (*)(const std::vector<std::string>& args);

struct CommandEntry {
    const char* name;
    const char* summary;
    CommandFn run;
};

int importCommand(const std::vector<std::string>& args);
int addRunCommand(const std::vector<std::string>& args);
int infoCommand(const std::vector<std::string>& args);
int evaluateCommand(const std::vector<std::string>& args);
int worstCommand(const std::vector<std::string>& args);
int explainCommand(const std::vector<std::string>& args);
int compareCommand(const std::vector<std::string>& args);
int demoDataCommand(const std::vector<std::string>& args);
int demoCommand(const std::vector<std::string>& args);
int fitCommand(const std::vector<std::string>& args);
int rerankCommand(const std::vector<std::string>& args);
int exportCommand(const std::vector<std::string>& args);
int reportCommand(const std::vector<std::string>& args);

const std::vector<CommandEntry>& commands();

} // namespace slatewise::cli
