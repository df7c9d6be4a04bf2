# Outside reference checks run by Debian's /usr/bin/python3 (networkx, SciPy).
add_test(NAME reference:f7_unrolled_dag_networkx
         COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/reference/f7_unrolled_dag.py
                 $<TARGET_FILE:locind>)
