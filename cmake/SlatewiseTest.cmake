# SPDX-License-Identifier: MIT
# The one place that registers tests with CTest. Every tests/<area>/tst_*.cpp becomes one
# executable and one test; every tests/reference/check_*.py becomes one test run by Debian's
# python3 (which carries numpy, scipy and scikit-learn).

set(SLATEWISE_TEST_DATA_DIR "${PROJECT_SOURCE_DIR}/tests/data")

# Tests find their data and the command line through these definitions, never the
# working directory.
add_library(slatewise_testpaths INTERFACE)
target_compile_definitions(slatewise_testpaths INTERFACE
  SLATEWISE_TEST_DATA_DIR="${SLATEWISE_TEST_DATA_DIR}"
  SLATEWISE_SOURCE_DIR="${PROJECT_SOURCE_DIR}"
  SLATEWISE_CLI="$<TARGET_FILE:slatewise>")

function(slatewise_add_qt_test source)
  cmake_parse_arguments(ARG "" "" "LIBS" ${ARGN})
  get_filename_component(name ${source} NAME_WE)
  add_executable(${name} ${source})
  set_target_properties(${name} PROPERTIES AUTOMOC ON)
  target_link_libraries(${name} PRIVATE ${ARG_LIBS} Qt6::Test slatewise_warnings)
  target_include_directories(${name} PRIVATE ${PROJECT_SOURCE_DIR}/tests)
  target_link_libraries(${name} PRIVATE slatewise_testpaths)
  add_dependencies(${name} slatewise)
  add_test(NAME ${name} COMMAND ${name})
  set_tests_properties(${name} PROPERTIES ENVIRONMENT "QT_QPA_PLATFORM=offscreen" TIMEOUT 900)
endfunction()

function(slatewise_add_tests_in dir)
  cmake_parse_arguments(ARG "" "" "LIBS" ${ARGN})
  file(GLOB sources CONFIGURE_DEPENDS ${dir}/tst_*.cpp)
  foreach(source ${sources})
    slatewise_add_qt_test(${source} LIBS ${ARG_LIBS})
  endforeach()
endfunction()

function(slatewise_add_reference_checks dir)
  file(GLOB scripts CONFIGURE_DEPENDS ${dir}/check_*.py)
  foreach(script ${scripts})
    get_filename_component(name ${script} NAME_WE)
    add_test(NAME ${name} COMMAND /usr/bin/python3 ${script}
      --cli $<TARGET_FILE:slatewise> --workdir ${CMAKE_CURRENT_BINARY_DIR}/${name}.work)
    set_tests_properties(${name} PROPERTIES TIMEOUT 900)
  endforeach()
endfunction()

function(slatewise_add_benchmarks dir)
  cmake_parse_arguments(ARG "" "" "LIBS" ${ARGN})
  file(GLOB sources CONFIGURE_DEPENDS ${dir}/bench_*.cpp)
  foreach(source ${sources})
    get_filename_component(name ${source} NAME_WE)
    add_executable(${name} ${source})
    target_link_libraries(${name} PRIVATE ${ARG_LIBS} slatewise_warnings slatewise_testpaths)
    target_include_directories(${name} PRIVATE ${PROJECT_SOURCE_DIR}/tests)
  endforeach()
endfunction()
