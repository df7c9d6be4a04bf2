locind_test(tests/app/graph_file_test.cc)
locind_test(tests/app/graph_command_test.cc)
