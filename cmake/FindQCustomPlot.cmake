# SPDX-License-Identifier: MIT
# Debian's libqcustomplot-dev ships a library and a header but no CMake package.
find_path(QCustomPlot_INCLUDE_DIR qcustomplot.h)
find_library(QCustomPlot_LIBRARY NAMES QCustomPlotQt6 NO_DEFAULT_PATH PATHS /usr/lib/${CMAKE_LIBRARY_ARCHITECTURE} /usr/lib /usr/local/lib)
include(FindPackageHandleStandardArgs)
find_package_handle_standard_args(QCustomPlot REQUIRED_VARS QCustomPlot_LIBRARY QCustomPlot_INCLUDE_DIR)
if(QCustomPlot_FOUND AND NOT TARGET QCustomPlot::QCustomPlot)
  add_library(QCustomPlot::QCustomPlot UNKNOWN IMPORTED)
  set_target_properties(QCustomPlot::QCustomPlot PROPERTIES
    IMPORTED_LOCATION "${QCustomPlot_LIBRARY}"
    INTERFACE_INCLUDE_DIRECTORIES "${QCustomPlot_INCLUDE_DIR}"
    INTERFACE_COMPILE_DEFINITIONS "QCUSTOMPLOT_USE_LIBRARY")
endif()
