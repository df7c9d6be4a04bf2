locind_test(tests/base/hashing_test.cc)
