// The journal of finished units: how a run survives being killed.
//
// DIR/finished_units.log is append-only: a header line naming the study (a
// hash of its resolved form and the part), then one line per finished unit
// holding all its rows, written with a single write() as soon as the unit is
// done. A run killed at any moment (even kill -9) leaves at most a torn last
// line; the next run with the same command drops it, keeps every complete
// unit and runs only the rest. The final files are built from the journal,
// so they are the same whether the run was interrupted or not.
//
// DIR/run.lock is held with flock() while a run writes into DIR: a second
// run into the same folder is refused. The kernel releases the lock when the
// process ends, however it ends, so a killed run never leaves a stale lock.
#pragma once

#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <string>

#include "app/results/results_rows.h"
#include "base/status.h"

namespace locind::app {

// One unit as a journal line (no newline) and back; nullopt for a torn or
// malformed line.
std::string EncodeUnit(const UnitResult& unit);
std::optional<UnitResult> DecodeUnit(const std::string& line);

// The plain message for a result folder whose journal (first line
// `recorded`) was written for another study or share than `identity`, with
// what to do.
std::string ForeignJournalText(const std::string& dir, const std::string& identity,
                               const std::string& recorded);

// That message when DIR's journal belongs to another study or share than
// `identity`; "" when DIR has no journal yet or it is this one's.
std::string ForeignJournal(const std::string& dir, const std::string& identity);

class Journal {
 public:
  // Creates DIR when needed, takes its lock and reads the units already
  // finished. Fails when another run holds the lock, or when the journal
  // belongs to a different study or part (`identity` differs).
  static Result<std::unique_ptr<Journal>> Open(const std::string& dir, const std::string& identity);
  ~Journal();
  Journal(const Journal&) = delete;
  Journal& operator=(const Journal&) = delete;

  // The units finished so far, by unit.
  const std::map<Unit, UnitResult>& finished() const { return finished_; }

  // Appends a unit and flushes it to the file. Thread-safe.
  Status Append(UnitResult unit);

  static std::string FileName() { return "finished_units.log"; }
  static std::string LockName() { return "run.lock"; }

 private:
  Journal() = default;
  int lock_fd_ = -1;
  int fd_ = -1;
  std::string path_;
  std::mutex mutex_;
  std::map<Unit, UnitResult> finished_;
};

}  // namespace locind::app
