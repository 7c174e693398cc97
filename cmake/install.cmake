# Install rules: the library, its headers, the CLI, the stdlib and a CMake package (whittle::whittle).
include(GNUInstallDirs)
include(CMakePackageConfigHelpers)

set_target_properties(whittle_lib PROPERTIES EXPORT_NAME whittle)
# The umbrella header is included as <whittle/whittle.h>; the module headers as "ir/circuit.h".
target_include_directories(whittle_lib INTERFACE
  $<BUILD_INTERFACE:${PROJECT_SOURCE_DIR}/include>
  $<INSTALL_INTERFACE:${CMAKE_INSTALL_INCLUDEDIR}>)

# One archive per library folder (libwhittle_ir.a, ...); whittle::whittle links them all.
install(TARGETS whittle_lib ${WHITTLE_LIBRARY_MODULES} EXPORT whittleTargets
  ARCHIVE DESTINATION ${CMAKE_INSTALL_LIBDIR}
  LIBRARY DESTINATION ${CMAKE_INSTALL_LIBDIR})
install(TARGETS whittle RUNTIME DESTINATION ${CMAKE_INSTALL_BINDIR})
# Only the public headers: the compile entry and what it names (the IR, the targets, the pass
# records, the report), and the readers. The other headers are the library's own; a consumer
# that needs one is asking for an API we do not promise (tests/scripts/install_test.py checks
# that these headers are self-contained and that no other header is installed).
set(WHITTLE_PUBLIC_HEADERS
  compiler/compile.h
  ir/angle.h ir/circuit.h ir/error.h ir/lit_vec.h ir/printer.h ir/resources.h ir/source_loc.h ir/target.h
  frontend/diagnostics.h frontend/limits.h frontend/load.h
  passes/pass.h passes/pipeline.h
  output/report.h output/cost_by_line.h)
foreach(h ${WHITTLE_PUBLIC_HEADERS})
  get_filename_component(dir ${h} DIRECTORY)
  install(FILES ${PROJECT_SOURCE_DIR}/${h} DESTINATION ${CMAKE_INSTALL_INCLUDEDIR}/whittle/${dir})
endforeach()
install(FILES ${PROJECT_SOURCE_DIR}/include/whittle/whittle.h DESTINATION ${CMAKE_INSTALL_INCLUDEDIR}/whittle)
file(GLOB WHITTLE_STDLIB_FILES CONFIGURE_DEPENDS ${PROJECT_SOURCE_DIR}/frontend/stdlib/*.wq)
install(FILES ${WHITTLE_STDLIB_FILES} DESTINATION ${CMAKE_INSTALL_DATADIR}/whittle/stdlib)

set(WHITTLE_CMAKE_DIR ${CMAKE_INSTALL_LIBDIR}/cmake/whittle)
install(EXPORT whittleTargets NAMESPACE whittle:: DESTINATION ${WHITTLE_CMAKE_DIR})
configure_package_config_file(${PROJECT_SOURCE_DIR}/cmake/whittleConfig.cmake.in
  ${PROJECT_BINARY_DIR}/whittleConfig.cmake INSTALL_DESTINATION ${WHITTLE_CMAKE_DIR})
write_basic_package_version_file(${PROJECT_BINARY_DIR}/whittleConfigVersion.cmake
  VERSION ${PROJECT_VERSION} COMPATIBILITY SameMinorVersion)
install(FILES ${PROJECT_BINARY_DIR}/whittleConfig.cmake ${PROJECT_BINARY_DIR}/whittleConfigVersion.cmake
  DESTINATION ${WHITTLE_CMAKE_DIR})
