# locind_cli: the command line: one file per command and the guard (main.cc is the executable).
locind_layer(locind_cli
  DEPS locind_report Boost::program_options
  SOURCES
    app/cli/command_guard.cc
    app/cli/graph_command.cc
    app/cli/learn_command.cc
    app/cli/merge_command.cc
    app/cli/plan_command.cc
    app/cli/report_command.cc
    app/cli/run_command.cc
    app/cli/score_command.cc
    app/cli/simulate_command.cc
    app/cli/test_command.cc
)
