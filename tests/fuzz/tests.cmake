# Replays the kept fuzzing corpus (tests/fuzz/corpus/<reader>/) through the
# readers in the normal test build; no fuzzing happens here.
include(tests/fuzz/entries.cmake)
locind_test(tests/fuzz/corpus_replay_test.cc)
target_link_libraries(corpus_replay_test PRIVATE locind_fuzz_entries)
