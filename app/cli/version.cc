#include "app/cli/version.h"

#include <Eigen/Core>
#include <boost/version.hpp>

// Set by app/cli/sources.cmake at configure time; the fallbacks keep the file
// compiling when it is built some other way.
#ifndef LOCIND_VERSION
#define LOCIND_VERSION "unknown"
#endif
#ifndef LOCIND_GIT_COMMIT
#define LOCIND_GIT_COMMIT "unknown"
#endif
#ifndef LOCIND_YAML_CPP_VERSION
#define LOCIND_YAML_CPP_VERSION "unknown"
#endif

namespace locind::app {
namespace {

std::string Compiler() {
#if defined(__clang__)
  return std::string("clang ") + __clang_version__;
#elif defined(__GNUC__)
  return std::string("g++ ") + __VERSION__;
#else
  return "unknown";
#endif
}

}  // namespace

std::string VersionText() {
  std::string boost = BOOST_LIB_VERSION;  // "1_74"
  for (char& c : boost) c = c == '_' ? '.' : c;
  return std::string("locind ") + LOCIND_VERSION + "\ncommit: " + LOCIND_GIT_COMMIT +
         "\ncompiler: " + Compiler() + "\neigen: " + std::to_string(EIGEN_WORLD_VERSION) + "." +
         std::to_string(EIGEN_MAJOR_VERSION) + "." + std::to_string(EIGEN_MINOR_VERSION) +
         "\nboost: " + boost + "\nyaml-cpp: " + LOCIND_YAML_CPP_VERSION + "\n";
}

}  // namespace locind::app
