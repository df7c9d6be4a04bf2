# The layer check of scripts/check_includes.py, on small trees made by the test.
add_test(NAME scripts:check_includes_finds_upward_includes
         COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/scripts/check_includes_test.py
                 ${CMAKE_CURRENT_SOURCE_DIR}/scripts/check_includes.py)
# Every output file of a tiny study and of `learn --out` loads in pandas in the
# documented line (results/README.md); needs Debian's python3-pandas.
if(LOCIND_BUILD_APP)
  add_test(NAME scripts:output_files_load_in_pandas
           COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/scripts/output_files_test.py
                   $<TARGET_FILE:locind> ${CMAKE_CURRENT_SOURCE_DIR})
endif()
# The program's --version, aligned top-level help, and --help of every command.
if(LOCIND_BUILD_APP)
  add_test(NAME scripts:cli_version_and_help
           COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/tests/scripts/cli_top_level_test.py
                   $<TARGET_FILE:locind>)
endif()
