# The layer check of scripts/check_includes.py, on small trees made by the test.
add_test(NAME scripts:check_includes_finds_upward_includes
         COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/scripts/check_includes_test.py
                 ${CMAKE_CURRENT_SOURCE_DIR}/scripts/check_includes.py)
