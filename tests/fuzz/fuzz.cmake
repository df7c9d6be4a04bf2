# libFuzzer programs for the readers (configure with -DLOCIND_FUZZ=ON and
# CMAKE_CXX_COMPILER=clang++; see DEVELOPERS.md, "Fuzzing"). Every source of
# the project is compiled with -fsanitize=fuzzer-no-link,address,undefined by
# the top-level CMakeLists.txt; each program here adds the libFuzzer main.
include(tests/fuzz/entries.cmake)
foreach(reader study_file graph_file event_csv path_csv)
  add_executable(${reader}_fuzz tests/fuzz/reader_fuzz.cc)
  target_compile_definitions(${reader}_fuzz PRIVATE LOCIND_FUZZ_READER="${reader}")
  target_link_libraries(${reader}_fuzz PRIVATE locind_fuzz_entries)
  target_link_options(${reader}_fuzz PRIVATE -fsanitize=fuzzer)
endforeach()
