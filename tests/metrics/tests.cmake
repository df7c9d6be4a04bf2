locind_test(tests/metrics/intervals_test.cc)
locind_test(tests/metrics/replicate_score_test.cc)
locind_test(tests/metrics/pvalue_calibration_test.cc)
locind_test(tests/metrics/error_attribution_test.cc)
