// The study file reader: YAML in our own vocabulary (configs/README.md) to a
// validated StudySpec.
//
// Validation runs before any work and does not stop at the first problem:
// unknown keys, wrong types and impossible values are all reported, one
// Error each (FILE:LINE:COLUMN: FIELD: message), in file order.
#pragma once

#include <string>
#include <variant>
#include <vector>

#include "app/io/error.h"
#include "app/study/study_spec.h"

namespace locind::app {

using StudyOrErrors = std::variant<StudySpec, std::vector<Error>>;

// Parses study text; `file` names the source in errors and gives the default
// study name (its stem).
StudyOrErrors ParseStudyText(const std::string& text, const std::string& file);

// Reads and parses a study file.
StudyOrErrors ReadStudyFile(const std::string& path);

// The tests accepted for each kind of data.
const std::vector<std::string>& EventTests();  // EventTestNames() of app/study/test_choice.h
const std::vector<std::string>& PathTests();   // PathTestNameList() of app/study/test_choice.h

}  // namespace locind::app
