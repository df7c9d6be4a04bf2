#include "app/running/runner_journal.h"

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

namespace locind::app {
namespace {

constexpr char kHeaderPrefix[] = "locind finished units v3 ";

std::vector<std::string> SplitTabs(const std::string& line) {
  std::vector<std::string> out;
  size_t start = 0;
  while (true) {
    const size_t tab = line.find('\t', start);
    out.push_back(line.substr(start, tab == std::string::npos ? std::string::npos : tab - start));
    if (tab == std::string::npos) return out;
    start = tab + 1;
  }
}

bool WriteAll(int fd, const std::string& text) {
  size_t done = 0;
  while (done < text.size()) {
    const ssize_t n = ::write(fd, text.data() + done, text.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) return false;
    done += static_cast<size_t>(n);
  }
  return true;
}

}  // namespace

std::string EncodeUnit(const UnitResult& u) {
  std::string line = "unit";
  for (const size_t v : {static_cast<size_t>(u.unit.cell), static_cast<size_t>(u.unit.replicate),
                         u.rows.size(), u.edge_lines.size(), u.null_test_lines.size()}) {
    line.append("\t").append(std::to_string(v));
  }
  for (const ReplicateRow& r : u.rows) line.append("\t").append(FormatReplicateRow(r));
  for (const std::string& e : u.edge_lines) line.append("\t").append(e);
  for (const std::string& e : u.null_test_lines) line.append("\t").append(e);
  return line.append("\tend");
}

std::optional<UnitResult> DecodeUnit(const std::string& line) {
  const std::vector<std::string> f = SplitTabs(line);
  if (f.size() < 7 || f[0] != "unit" || f.back() != "end") return std::nullopt;
  UnitResult u;
  size_t rows = 0, edges = 0, nulls = 0;
  try {
    u.unit.cell = std::stoi(f[1]);
    u.unit.replicate = std::stoi(f[2]);
    rows = std::stoul(f[3]);
    edges = std::stoul(f[4]);
    nulls = std::stoul(f[5]);
  } catch (const std::exception&) {
    return std::nullopt;
  }
  // Sizes checked one at a time so that a corrupt count cannot overflow the sum.
  const size_t fields = f.size() - 7;
  if (rows > fields || edges > fields - rows || nulls != fields - rows - edges) return std::nullopt;
  for (size_t i = 0; i < rows; ++i) {
    std::optional<ReplicateRow> row = ParseReplicateRow(f[6 + i]);
    if (!row) return std::nullopt;
    u.rows.push_back(std::move(*row));
  }
  const auto edges_begin = f.begin() + 6 + static_cast<std::ptrdiff_t>(rows);
  const auto nulls_begin = edges_begin + static_cast<std::ptrdiff_t>(edges);
  u.edge_lines.assign(edges_begin, nulls_begin);
  u.null_test_lines.assign(nulls_begin, f.end() - 1);
  return u;
}

// `recorded` is the journal's first line. The identity is "<study hash> part
// K/N" (locind run): the same hash with another part is a share of this
// study; anything else (another hash, an older journal format) is another
// study or another version of this study file.
std::string ForeignJournalText(const std::string& dir, const std::string& identity,
                               const std::string& recorded) {
  const std::string prefix = kHeaderPrefix;
  const size_t space = identity.find(' ');
  const std::string hash = identity.substr(0, space);
  if (recorded.rfind(prefix + hash + " ", 0) == 0) {
    return dir + " holds another share of this study (" + recorded.substr(prefix.size() + hash.size() + 1) +
           ", not " + identity.substr(space + 1) + "); run this share with another --out and join the "
           "folders with locind merge";
  }
  return dir + " holds the results of another study, or of another version of this study file; "
               "give another --out, or delete " + dir + " to start this study afresh";
}

std::string ForeignJournal(const std::string& dir, const std::string& identity) {
  std::ifstream in(dir + "/" + Journal::FileName(), std::ios::binary);
  std::string line;
  if (!in || !std::getline(in, line) || in.eof() || line == kHeaderPrefix + identity) return "";
  return ForeignJournalText(dir, identity, line);
}

Result<std::unique_ptr<Journal>> Journal::Open(const std::string& dir, const std::string& identity) {
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec) return Status::Error("cannot create " + dir + ": " + ec.message());
  std::unique_ptr<Journal> j(new Journal());
  const std::string lock_path = dir + "/" + LockName();
  j->lock_fd_ = ::open(lock_path.c_str(), O_CREAT | O_RDWR | O_CLOEXEC, 0644);
  if (j->lock_fd_ < 0) return Status::Error("cannot open " + lock_path + ": " + std::strerror(errno));
  if (::flock(j->lock_fd_, LOCK_EX | LOCK_NB) != 0) {
    return Status::Error("another run is writing into " + dir + " (it holds " + lock_path +
                         "); wait for it or choose another --out");
  }
  j->path_ = dir + "/" + FileName();
  const std::string header = kHeaderPrefix + identity;
  std::ifstream in(j->path_, std::ios::binary);
  std::string line;
  std::streamoff good = 0;  // bytes of complete, valid lines
  if (in && std::getline(in, line) && !in.eof()) {
    if (line != header) return Status::Error(ForeignJournalText(dir, identity, line));
    good = static_cast<std::streamoff>(line.size() + 1);
    while (std::getline(in, line) && !in.eof()) {  // a last line without '\n' is torn
      std::optional<UnitResult> unit = DecodeUnit(line);
      if (!unit) break;
      good += static_cast<std::streamoff>(line.size() + 1);
      j->finished_[unit->unit] = std::move(*unit);
    }
  }
  in.close();
  j->fd_ = ::open(j->path_.c_str(), O_CREAT | O_WRONLY | O_CLOEXEC, 0644);
  if (j->fd_ < 0) return Status::Error("cannot open " + j->path_ + ": " + std::strerror(errno));
  // Drop a torn tail, then append after the last complete unit.
  if (::ftruncate(j->fd_, good) != 0 || ::lseek(j->fd_, 0, SEEK_END) < 0) {
    return Status::Error("cannot truncate " + j->path_ + ": " + std::strerror(errno));
  }
  if (good == 0 && !WriteAll(j->fd_, header + "\n")) {
    return Status::Error("cannot write " + j->path_);
  }
  return j;
}

Journal::~Journal() {
  if (fd_ >= 0) ::close(fd_);
  if (lock_fd_ >= 0) ::close(lock_fd_);  // releases the flock
}

Status Journal::Append(UnitResult unit) {
  const std::string line = EncodeUnit(unit) + "\n";
  std::lock_guard<std::mutex> hold(mutex_);
  if (!WriteAll(fd_, line)) return Status::Error("cannot append to " + path_);
  finished_[unit.unit] = std::move(unit);
  return Status::Ok();
}

}  // namespace locind::app
