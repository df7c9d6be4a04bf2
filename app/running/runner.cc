#include "app/running/runner.h"

#include <atomic>
#include <mutex>
#include <thread>

#include "app/running/runner_replicate.h"

namespace locind::app {

void RunUnits(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths,
              const std::vector<Unit>& units, int threads, const UnitSink& sink,
              Progress* progress, const std::vector<int>& learners) {
  std::atomic<size_t> next{0};
  std::mutex sink_mutex;
  auto work = [&]() {
    for (size_t i = next++; i < units.size(); i = next++) {
      const Unit& u = units[i];
      UnitResult result = RunUnit(study, cells[u.cell], truths, u.replicate, learners);
      {
        std::lock_guard<std::mutex> hold(sink_mutex);
        sink(std::move(result));
      }
      if (progress != nullptr) progress->Advance();
    }
  };
  const int count = std::max(1, std::min<int>(threads, static_cast<int>(units.size())));
  std::vector<std::thread> pool;
  for (int t = 1; t < count; ++t) pool.emplace_back(work);
  work();
  for (std::thread& t : pool) t.join();
}

}  // namespace locind::app
