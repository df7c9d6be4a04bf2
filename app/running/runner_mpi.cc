// RankGroup over MPI (built with the LOCIND_MPI option).
//
// Only each rank's main thread calls MPI (MPI_THREAD_FUNNELED). Worker
// threads run units from a local queue and leave the results in an outbox;
// the main thread feeds the queue, forwards the results and answers
// messages. Between two MPI_Iprobe calls it waits on the outbox for at most
// kPoll, so a waiting rank costs next to no CPU (a blocking MPI_Recv spins in
// Open MPI and would take a core from the workers).
//
// Messages are text (MPI_CHAR), tagged:
//   kTagReady    rank -> lead  the hash of the study it prepared ("-": none)
//   kTagStart    lead -> rank  "dispatch", or "static" and the rank's units
//                              "cell replicate cell replicate ..."
//   kTagRequest  rank -> lead  how many units its idle threads want
//   kTagUnits    lead -> rank  that many units or fewer; none: no more left
//   kTagResult   rank -> lead  one finished unit (EncodeUnit, the journal line)
//   kTagStop     lead -> rank  the run is over (or failed); the rank answers
//   kTagStopped  rank -> lead  ... with this, once its threads have ended
// A rank reads the lead's messages in the order they were sent (one source,
// any tag), so it always sees its start before the stop.
#include <mpi.h>

#include <algorithm>
#include <chrono>
#include <condition_variable>
#include <deque>
#include <mutex>
#include <optional>
#include <sstream>
#include <stdexcept>
#include <thread>

#include "base/hashing.h"
#include "app/io/error.h"
#include "app/results/results_writer.h"
#include "app/running/runner_journal.h"
#include "app/running/runner_mpi.h"
#include "app/running/runner_replicate.h"
#include "app/study/study_file.h"

namespace locind::app {
namespace {

constexpr auto kPoll = std::chrono::milliseconds(1);

enum Tag : int {
  kTagReady = 1,
  kTagStart,
  kTagRequest,
  kTagUnits,
  kTagResult,
  kTagStop,
  kTagStopped,
};

std::string EncodeUnits(const std::vector<Unit>& units) {
  std::string text;
  for (const Unit& u : units) {
    text.append(text.empty() ? "" : " ").append(std::to_string(u.cell));
    text.append(" ").append(std::to_string(u.replicate));
  }
  return text;
}

std::vector<Unit> DecodeUnits(std::istream& in) {
  std::vector<Unit> units;
  for (Unit u; in >> u.cell >> u.replicate;) units.push_back(u);
  return units;
}

void Send(const std::string& text, int to, Tag tag) {
  MPI_Send(text.data(), static_cast<int>(text.size()), MPI_CHAR, to, tag, MPI_COMM_WORLD);
}

// The status of a message waiting from `from` (MPI_ANY_SOURCE for anyone).
std::optional<MPI_Status> Waiting(int from) {
  int flag = 0;
  MPI_Status status;
  MPI_Iprobe(from, MPI_ANY_TAG, MPI_COMM_WORLD, &flag, &status);
  if (!flag) return std::nullopt;
  return status;
}

// Receives the message Waiting() announced.
std::string Receive(const MPI_Status& status) {
  int count = 0;
  MPI_Get_count(&status, MPI_CHAR, &count);
  std::string text(static_cast<size_t>(count), '\0');
  MPI_Recv(text.data(), count, MPI_CHAR, status.MPI_SOURCE, status.MPI_TAG, MPI_COMM_WORLD,
           MPI_STATUS_IGNORE);
  return text;
}

uint64_t StudyHash(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths) {
  return base::HashText(StudyJson(study, cells, truths));
}

// Worker threads of one rank, fed by its main thread.
class LocalPool {
 public:
  LocalPool(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths,
            int threads)
      : study_(study), cells_(cells), truths_(truths), threads_(threads) {
    for (int t = 0; t < threads; ++t) pool_.emplace_back([this] { Work(); });
  }
  // Drops the units not started and waits for the running ones.
  ~LocalPool() {
    {
      std::lock_guard<std::mutex> hold(mutex_);
      queue_.clear();
      closed_ = true;
    }
    has_work_.notify_all();
    for (std::thread& t : pool_) t.join();
  }

  void Add(const std::vector<Unit>& units) {
    {
      std::lock_guard<std::mutex> hold(mutex_);
      queue_.insert(queue_.end(), units.begin(), units.end());
    }
    has_work_.notify_all();
  }
  // No more units will come; threads end once the queue is empty.
  void Close() {
    {
      std::lock_guard<std::mutex> hold(mutex_);
      closed_ = true;
    }
    has_work_.notify_all();
  }
  // How many more units the threads could start now.
  int Wanted() {
    std::lock_guard<std::mutex> hold(mutex_);
    return std::max(0, threads_ - busy_ - static_cast<int>(queue_.size()));
  }
  // The finished units, after waiting up to kPoll for one.
  std::vector<UnitResult> Take() {
    std::unique_lock<std::mutex> lock(mutex_);
    has_result_.wait_for(lock, kPoll, [this] { return !outbox_.empty(); });
    std::vector<UnitResult> out;
    out.swap(outbox_);
    return out;
  }

 private:
  void Work() {
    while (true) {
      Unit u;
      {
        std::unique_lock<std::mutex> lock(mutex_);
        has_work_.wait(lock, [this] { return !queue_.empty() || closed_; });
        if (queue_.empty()) return;
        u = queue_.front();
        queue_.pop_front();
        ++busy_;
      }
      UnitResult result = RunUnit(study_, cells_[u.cell], truths_, u.replicate);
      {
        std::lock_guard<std::mutex> hold(mutex_);
        outbox_.push_back(std::move(result));
        --busy_;
      }
      has_result_.notify_one();
    }
  }

  const StudySpec& study_;
  const std::vector<Cell>& cells_;
  const StudyTruths& truths_;
  const int threads_;
  std::mutex mutex_;
  std::condition_variable has_work_, has_result_;
  std::deque<Unit> queue_;
  std::vector<UnitResult> outbox_;
  int busy_ = 0;
  bool closed_ = false;
  std::vector<std::thread> pool_;
};

// Longest observation length first (the cost of a unit grows with it), so
// the last units handed out are the short ones and no rank is left with a
// long one while the others wait: the longest-processing-time-first rule
// (Graham 1969, SIAM J. Appl. Math. 17(2), 416-429).
std::deque<Unit> DispatchOrder(const std::vector<Cell>& cells, std::vector<Unit> units) {
  std::stable_sort(units.begin(), units.end(), [&cells](const Unit& a, const Unit& b) {
    return cells[a.cell].length > cells[b.cell].length;
  });
  return std::deque<Unit>(units.begin(), units.end());
}

// Hands out units from the lead's queue.
std::vector<Unit> TakeFront(std::deque<Unit>& queue, int count) {
  std::vector<Unit> units;
  while (count-- > 0 && !queue.empty()) {
    units.push_back(queue.front());
    queue.pop_front();
  }
  return units;
}

UnitResult DecodeResult(const std::string& text, int from) {
  std::optional<UnitResult> unit = DecodeUnit(text);
  if (!unit) throw InternalError("rank " + std::to_string(from) + " sent a malformed result");
  return std::move(*unit);
}

// A rank's side once the lead has started it: runs units until told to stop.
void ServeUnits(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths,
                int threads, std::istream& start) {
  std::string mode;
  start >> mode;
  const bool dispatch = mode == "dispatch";
  LocalPool pool(study, cells, truths, threads);
  bool exhausted = !dispatch, asked = false;
  if (!dispatch) {
    pool.Add(DecodeUnits(start));
    pool.Close();
  }
  while (true) {
    if (!exhausted && !asked) {
      if (const int wanted = pool.Wanted(); wanted > 0) {
        Send(std::to_string(wanted), 0, kTagRequest);
        asked = true;
      }
    }
    for (const UnitResult& r : pool.Take()) Send(EncodeUnit(r), 0, kTagResult);
    while (const std::optional<MPI_Status> status = Waiting(0)) {
      std::istringstream text(Receive(*status));
      if (status->MPI_TAG == kTagStop) return;
      if (status->MPI_TAG != kTagUnits) continue;
      asked = false;
      const std::vector<Unit> units = DecodeUnits(text);
      if (units.empty()) {
        exhausted = true;
        pool.Close();
      } else {
        pool.Add(units);
      }
    }
  }
}

}  // namespace

bool BuiltWithMpi() { return true; }

RankGroup::RankGroup(const std::string& assign) {
  if (!assign.empty() && assign != "dispatch" && assign != "static") {
    throw UsageError{"--mpi-assign must be dispatch or static"};
  }
  dispatch_ = assign != "static";
  if (LauncherRanks() <= 1) return;
  int provided = 0;
  MPI_Init_thread(nullptr, nullptr, MPI_THREAD_FUNNELED, &provided);
  MPI_Comm_rank(MPI_COMM_WORLD, &rank_);
  MPI_Comm_size(MPI_COMM_WORLD, &size_);
  if (provided < MPI_THREAD_FUNNELED) {
    MPI_Finalize();
    throw InternalError("the MPI library offers no thread support (MPI_THREAD_FUNNELED)");
  }
  joined_ = true;
}

RankGroup::~RankGroup() {
  if (!joined_) return;
  if (lead()) StopOthers();
  MPI_Finalize();
}

std::string RankGroup::Describe(int threads) const {
  if (size_ == 1) return "";
  return std::to_string(size_) + " ranks x " + std::to_string(threads) +
         (threads == 1 ? " thread" : " threads") + (dispatch_ ? ", dispatch" : ", static");
}

void RankGroup::StopOthers() {
  if (stopped_) return;
  stopped_ = true;
  for (int r = 1; r < size_; ++r) Send("", r, kTagStop);
  // Results and requests still on their way are read and dropped.
  for (int stopped = 0; stopped < size_ - 1;) {
    if (const std::optional<MPI_Status> status = Waiting(MPI_ANY_SOURCE)) {
      Receive(*status);
      if (status->MPI_TAG == kTagStopped) ++stopped;
    } else {
      std::this_thread::sleep_for(kPoll);
    }
  }
}

void RankGroup::RunUnits(const StudySpec& study, const std::vector<Cell>& cells,
                         const StudyTruths& truths, const std::vector<Unit>& units, int threads,
                         const UnitSink& sink, Progress* progress) {
  if (size_ == 1) {
    app::RunUnits(study, cells, truths, units, threads, sink, progress);
    return;
  }
  std::deque<Unit> queue;
  std::vector<std::vector<Unit>> shares(static_cast<size_t>(size_));
  if (dispatch_) {
    queue = DispatchOrder(cells, units);
  } else {
    for (size_t i = 0; i < units.size(); ++i) shares[i % shares.size()].push_back(units[i]);
  }
  const std::string hash = std::to_string(StudyHash(study, cells, truths));
  LocalPool pool(study, cells, truths, threads);
  if (!dispatch_) {
    pool.Add(shares[0]);
    pool.Close();
  }
  size_t received = 0;
  auto accept = [&](UnitResult r) {
    sink(std::move(r));
    if (progress != nullptr) progress->Advance();
    ++received;
  };
  while (received < units.size()) {
    if (dispatch_) {
      pool.Add(TakeFront(queue, pool.Wanted()));
      if (queue.empty()) pool.Close();
    }
    for (UnitResult& r : pool.Take()) accept(std::move(r));
    while (const std::optional<MPI_Status> status = Waiting(MPI_ANY_SOURCE)) {
      const std::string text = Receive(*status);
      const int from = status->MPI_SOURCE;
      if (status->MPI_TAG == kTagReady) {
        if (text != hash) {
          throw InternalError("rank " + std::to_string(from) + " read another study from its "
                                   "copy of the study file, or could not read it");
        }
        Send((dispatch_ ? "dispatch" : "static ") + EncodeUnits(shares[from]), from, kTagStart);
      } else if (status->MPI_TAG == kTagRequest) {
        Send(EncodeUnits(TakeFront(queue, std::stoi(text))), from, kTagUnits);
      } else if (status->MPI_TAG == kTagResult) {
        accept(DecodeResult(text, from));
      }
    }
  }
  StopOthers();
}

int RankGroup::Serve(const std::string& study_path, int threads) {
  // Read and prepare while the lead does the same, silently: the lead
  // reports a bad study file.
  StudyOrErrors read = ReadStudyFile(study_path);
  const StudySpec* study = std::get_if<StudySpec>(&read);
  std::vector<Cell> cells;
  std::optional<StudyTruths> truths;
  if (study != nullptr) {
    cells = ExpandGrid(*study);
    truths.emplace(*study, cells);
  }
  Send(study == nullptr ? "-" : std::to_string(StudyHash(*study, cells, *truths)), 0, kTagReady);
  while (true) {  // the start, or a stop when the lead failed or needs no help
    const std::optional<MPI_Status> status = Waiting(0);
    if (!status) {
      std::this_thread::sleep_for(kPoll);
      continue;
    }
    std::istringstream text(Receive(*status));
    if (status->MPI_TAG == kTagStart && study != nullptr) ServeUnits(*study, cells, *truths, threads, text);
    if (status->MPI_TAG == kTagStart || status->MPI_TAG == kTagStop) break;
  }
  Send("", 0, kTagStopped);
  return kExitOk;
}

}  // namespace locind::app
