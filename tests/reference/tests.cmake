# Outside reference checks run by Debian's /usr/bin/python3 (networkx, SciPy).
add_test(NAME reference:f7_unrolled_dag_networkx
         COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/reference/f7_unrolled_dag.py
                 $<TARGET_FILE:locind>)
# OU stationary covariance and exact transition against SciPy.
add_executable(ou_covariance_probe tests/reference/ou_covariance_probe.cc)
target_link_libraries(ou_covariance_probe PRIVATE locind_core)
add_test(NAME reference:ou_lyapunov_scipy
         COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/reference/ou_lyapunov_scipy.py
                 $<TARGET_FILE:ou_covariance_probe>)
