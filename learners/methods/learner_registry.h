// The registry of learning methods: name, one-line description, factory.
// The command line lists it (`locind learn --methods`) and builds methods by
// name from it; a new method is one row in learner_registry.cc.
#pragma once

#include <memory>
#include <string_view>
#include <vector>

#include "learners/methods/learner.h"

namespace locind::learners {

// Settings a method may read; each method ignores the ones it does not use.
struct MethodSettings {
  int screening_size = 1;  // screen: extra processes in C besides b
  double penalty = -1;     // penalized-fit: scale of the L1 weight; <= 0 means 1
};

// What a method can report at all, as bits of MethodEntry::reports (checked
// against each method's code): edge groups it can output, and whether it
// marks its edges solid/dashed. A group it cannot output caps its power.
enum MethodReports : unsigned {
  kReportsDirected = 1,    // a -> b, a != b
  kReportsLoops = 2,       // a -> a
  kReportsBidirected = 4,  // a <-> b
  kReportsMarks = 8,       // solid/dashed marks (LearnResult::has_marks)
};

struct MethodEntry {
  const char* name;
  const char* description;  // one line, no tab
  bool uses_tests;          // false: the method reads the data itself
  std::unique_ptr<Learner> (*make)(const MethodSettings& settings);
  unsigned reports;         // MethodReports bits
};

// Every method, in a fixed order.
const std::vector<MethodEntry>& LearningMethods();

// The entry called `name`, or nullptr.
const MethodEntry* FindMethod(std::string_view name);

}  // namespace locind::learners
