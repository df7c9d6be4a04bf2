#include "app/io/child_process.h"

#include <algorithm>
#include <cerrno>
#include <chrono>
#include <csignal>
#include <cstring>

#include <fcntl.h>
#include <poll.h>
#include <spawn.h>
#include <sys/socket.h>
#include <sys/wait.h>
#include <unistd.h>

extern char** environ;

namespace locind::app {
namespace {

using Clock = std::chrono::steady_clock;

// A line longer than this is cut and answered (the child is misbehaving).
constexpr size_t kMaxLine = 1 << 20;

void CloseFd(int& fd) {
  if (fd >= 0) ::close(fd);
  fd = -1;
}

// The three channels. Standard input is a socket so that writing to a child
// that stopped reading gives EPIPE (send with MSG_NOSIGNAL) instead of a
// SIGPIPE that would end locind itself.
struct Channels {
  int in_parent = -1, in_child = -1;
  int out_parent = -1, out_child = -1;
  int err_parent = -1, err_child = -1;

  bool Open() {
    int in[2], out[2], err[2];
    if (::socketpair(AF_UNIX, SOCK_STREAM | SOCK_CLOEXEC, 0, in) != 0) return false;
    in_parent = in[0];
    in_child = in[1];
    // Never block on a child that does not read its answers: a full socket
    // ends the conversation (EAGAIN) instead of stalling past the limit.
    ::fcntl(in_parent, F_SETFL, ::fcntl(in_parent, F_GETFL) | O_NONBLOCK);
    if (::pipe2(out, O_CLOEXEC) != 0) return false;
    out_parent = out[0];
    out_child = out[1];
    if (::pipe2(err, O_CLOEXEC) != 0) return false;
    err_parent = err[0];
    err_child = err[1];
    return true;
  }
  void CloseChildEnds() {
    CloseFd(in_child);
    CloseFd(out_child);
    CloseFd(err_child);
  }
  ~Channels() {
    CloseChildEnds();
    CloseFd(in_parent);
    CloseFd(out_parent);
    CloseFd(err_parent);
  }
};

int Spawn(const ChildRequest& request, Channels& c, pid_t& pid) {
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_adddup2(&actions, c.in_child, 0);
  posix_spawn_file_actions_adddup2(&actions, c.out_child, 1);
  posix_spawn_file_actions_adddup2(&actions, c.err_child, 2);
  posix_spawn_file_actions_addchdir_np(&actions, request.folder.c_str());
  posix_spawnattr_t attr;
  posix_spawnattr_init(&attr);
  posix_spawnattr_setpgroup(&attr, 0);  // a group of its own, killed as one
  sigset_t defaults;
  sigemptyset(&defaults);
  sigaddset(&defaults, SIGPIPE);
  posix_spawnattr_setsigdefault(&attr, &defaults);
  posix_spawnattr_setflags(&attr, POSIX_SPAWN_SETPGROUP | POSIX_SPAWN_SETSIGDEF);
  std::vector<char*> args;
  for (const std::string& a : request.argv) args.push_back(const_cast<char*>(a.c_str()));
  args.push_back(nullptr);
  const int spawned = posix_spawnp(&pid, args[0], &actions, &attr, args.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  posix_spawnattr_destroy(&attr);
  return spawned;
}

// The conversation: reads both output streams, answers complete lines,
// until both streams end or the deadline passes.
class Conversation {
 public:
  Conversation(const ChildRequest& request, Channels& c, Clock::time_point deadline)
      : request_(request), c_(c), deadline_(deadline) {}

  // Returns false when the deadline passed first.
  bool Run() {
    while (c_.out_parent >= 0 || c_.err_parent >= 0) {
      const int wait_ms = RemainingMs();
      if (wait_ms <= 0) return false;
      pollfd fds[2];
      int n = 0;
      if (c_.out_parent >= 0) fds[n++] = pollfd{c_.out_parent, POLLIN, 0};
      if (c_.err_parent >= 0) fds[n++] = pollfd{c_.err_parent, POLLIN, 0};
      const int ready = ::poll(fds, n, wait_ms);
      if (ready < 0 && errno != EINTR) return false;
      for (int i = 0; i < n && ready > 0; ++i) {
        if (fds[i].revents == 0) continue;
        if (fds[i].fd == c_.out_parent) ReadOut();
        else ReadErr();
      }
    }
    return true;
  }

  std::string err_tail;

 private:
  int RemainingMs() const {
    return static_cast<int>(
        std::chrono::duration_cast<std::chrono::milliseconds>(deadline_ - Clock::now()).count());
  }

  void ReadOut() {
    char buf[4096];
    const ssize_t got = ::read(c_.out_parent, buf, sizeof buf);
    if (got <= 0) {
      if (got < 0 && errno == EINTR) return;
      CloseFd(c_.out_parent);
      return;
    }
    line_.append(buf, static_cast<size_t>(got));
    for (size_t end; (end = line_.find('\n')) != std::string::npos;) {
      Answer(line_.substr(0, end));
      line_.erase(0, end + 1);
    }
    if (line_.size() > kMaxLine) {
      Answer(line_.substr(0, kMaxLine));
      line_.clear();
    }
  }

  void Answer(std::string line) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (!request_.answer || c_.in_parent < 0) return;
    const std::string reply = request_.answer(line) + "\n";
    size_t sent = 0;
    while (sent < reply.size()) {
      const ssize_t n = ::send(c_.in_parent, reply.data() + sent, reply.size() - sent, MSG_NOSIGNAL);
      if (n < 0 && errno == EINTR) continue;
      if (n <= 0) {  // the child stopped reading (or is not): keep reading its output
        CloseFd(c_.in_parent);
        return;
      }
      sent += static_cast<size_t>(n);
    }
  }

  void ReadErr() {
    char buf[4096];
    const ssize_t got = ::read(c_.err_parent, buf, sizeof buf);
    if (got <= 0) {
      if (got < 0 && errno == EINTR) return;
      CloseFd(c_.err_parent);
      return;
    }
    err_tail.append(buf, static_cast<size_t>(got));
    if (err_tail.size() > 2 * kErrTailBytes) err_tail.erase(0, err_tail.size() - kErrTailBytes);
  }

  const ChildRequest& request_;
  Channels& c_;
  Clock::time_point deadline_;
  std::string line_;
};

// Waits for `pid` until the deadline; false when it is still running then.
bool WaitUntil(pid_t pid, Clock::time_point deadline, int& status) {
  while (true) {
    const pid_t r = ::waitpid(pid, &status, WNOHANG);
    if (r == pid) return true;
    if (r < 0 && errno != EINTR) return true;
    if (Clock::now() >= deadline) return false;
    ::usleep(5000);
  }
}

}  // namespace

std::string ChildOutcome::Describe() const {
  if (!started) return "could not start: " + message;
  if (timed_out) return "time limit passed (killed)";
  if (signal != 0) return "killed by signal " + std::to_string(signal) + " (" + strsignal(signal) + ")";
  return "exit code " + std::to_string(exit_code);
}

ChildOutcome RunChild(const ChildRequest& request) {
  ChildOutcome outcome;
  const Clock::time_point start = Clock::now();
  const auto limit = std::chrono::duration_cast<Clock::duration>(
      std::chrono::duration<double>(std::max(0.0, request.time_limit_seconds)));
  const Clock::time_point deadline = start + limit;
  Channels channels;
  if (!channels.Open()) {
    outcome.message = std::string("cannot create pipes: ") + std::strerror(errno);
    return outcome;
  }
  pid_t pid = 0;
  if (const int spawned = Spawn(request, channels, pid); spawned != 0) {
    outcome.message = request.argv[0] + ": " + std::strerror(spawned);
    return outcome;
  }
  outcome.started = true;
  channels.CloseChildEnds();
  Conversation conversation(request, channels, deadline);
  const bool in_time = conversation.Run();
  CloseFd(channels.in_parent);  // end of input for a child still reading
  int status = 0;
  if (!in_time || !WaitUntil(pid, deadline, status)) {
    ::kill(-pid, SIGKILL);
    while (::waitpid(pid, &status, 0) < 0 && errno == EINTR) {
    }
    outcome.timed_out = true;
  }
  outcome.err_tail = conversation.err_tail.size() > kErrTailBytes
                         ? conversation.err_tail.substr(conversation.err_tail.size() - kErrTailBytes)
                         : conversation.err_tail;
  if (!outcome.timed_out) {
    if (WIFSIGNALED(status)) outcome.signal = WTERMSIG(status);
    if (WIFEXITED(status)) outcome.exit_code = WEXITSTATUS(status);
  }
  outcome.seconds = std::chrono::duration<double>(Clock::now() - start).count();
  return outcome;
}

}  // namespace locind::app
