#include "app/io/external_program.h"

#include <cerrno>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <fcntl.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

extern char** environ;

namespace locind::app {
namespace {

std::string Slurp(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

// A private scratch folder for the program's streams, removed on scope exit.
struct Scratch {
  std::string dir;
  Scratch() {
    std::string pattern = (std::filesystem::temp_directory_path() / "locind-program-XXXXXX").string();
    if (::mkdtemp(pattern.data()) != nullptr) dir = pattern;
  }
  ~Scratch() {
    std::error_code ec;
    if (!dir.empty()) std::filesystem::remove_all(dir, ec);
  }
};

}  // namespace

// The streams go through files rather than pipes: nothing can deadlock on a
// full pipe, and the outputs here are small (an SVG or a DOM dump).
Result<ProgramOutput> RunProgram(const std::vector<std::string>& argv, const std::string& input) {
  Scratch scratch;
  if (scratch.dir.empty()) return Status::Error("cannot create a temporary folder: " + std::string(std::strerror(errno)));
  const std::string in_path = scratch.dir + "/stdin", out_path = scratch.dir + "/stdout",
                    err_path = scratch.dir + "/stderr";
  std::ofstream(in_path, std::ios::binary) << input;
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, in_path.c_str(), O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
  posix_spawn_file_actions_addopen(&actions, 2, err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
  std::vector<char*> args;
  for (const std::string& a : argv) args.push_back(const_cast<char*>(a.c_str()));
  args.push_back(nullptr);
  pid_t pid = 0;
  const int spawned = posix_spawnp(&pid, args[0], &actions, nullptr, args.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  if (spawned != 0) return Status::Error("cannot start " + argv[0] + ": " + std::strerror(spawned));
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0) {
    if (errno != EINTR) return Status::Error("lost " + argv[0] + ": " + std::strerror(errno));
  }
  ProgramOutput result;
  result.out = Slurp(out_path);
  result.err = Slurp(err_path);
  if (WIFSIGNALED(status)) {
    return Status::Error(argv[0] + " was killed by signal " + std::to_string(WTERMSIG(status)));
  }
  result.exit_code = WEXITSTATUS(status);
  return result;
}

}  // namespace locind::app
