# locind_cli: the command line: one file per command and the guard (main.cc is the executable).
locind_layer(locind_cli
  DEPS locind_report Boost::program_options
  SOURCES
    app/cli/command_guard.cc
    app/cli/graph_command.cc
    app/cli/learn_command.cc
    app/cli/merge_command.cc
    app/cli/options.cc
    app/cli/plan_command.cc
    app/cli/report_command.cc
    app/cli/run_command.cc
    app/cli/score_command.cc
    app/cli/simulate_command.cc
    app/cli/test_command.cc
    app/cli/version.cc
)
# locind --version: the commit the build was configured from (re-run cmake to
# refresh it), "unknown" outside a git checkout or without git.
find_package(Git QUIET)
set(LOCIND_GIT_COMMIT "unknown")
if(GIT_FOUND)
  execute_process(COMMAND ${GIT_EXECUTABLE} rev-parse --short=12 HEAD
                  WORKING_DIRECTORY ${CMAKE_CURRENT_SOURCE_DIR}
                  OUTPUT_VARIABLE locind_git_out OUTPUT_STRIP_TRAILING_WHITESPACE
                  RESULT_VARIABLE locind_git_rc ERROR_QUIET)
  if(locind_git_rc EQUAL 0 AND locind_git_out)
    set(LOCIND_GIT_COMMIT "${locind_git_out}")
  endif()
endif()
set_source_files_properties(app/cli/version.cc PROPERTIES COMPILE_DEFINITIONS
  "LOCIND_VERSION=\"${PROJECT_VERSION}\";LOCIND_GIT_COMMIT=\"${LOCIND_GIT_COMMIT}\";LOCIND_YAML_CPP_VERSION=\"${yaml-cpp_VERSION}\"")
target_link_libraries(locind_cli PUBLIC Eigen3::Eigen)
