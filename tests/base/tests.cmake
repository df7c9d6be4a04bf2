locind_test(tests/base/hashing_test.cc)
locind_test(tests/base/memory_tuning_test.cc)
