# `cmake --install build [--prefix DIR]` and a Debian package (`cpack -G DEB` in build/):
#   bin/fickcast, bin/fickcast-post         the commands
#   lib/fickcast/libfickcast_core.so        the solver library, found through the commands' RUNPATH
#   share/fickcast/cases, share/fickcast/meshes   the demo cases (they name their meshes as ../meshes/...)
#   share/man/man1/fickcast.1, fickcast-post.1    manual pages written from the commands' --help
#   share/doc/fickcast/README.md
set(FICKCAST_INSTALL_LIBDIR lib/fickcast)
set_target_properties(fickcast PROPERTIES INSTALL_RPATH "$ORIGIN/../${FICKCAST_INSTALL_LIBDIR}")
install(TARGETS fickcast fickcast-post RUNTIME DESTINATION bin)
install(TARGETS fickcast_core LIBRARY DESTINATION ${FICKCAST_INSTALL_LIBDIR})
install(DIRECTORY ${PROJECT_SOURCE_DIR}/cases/ DESTINATION share/fickcast/cases FILES_MATCHING PATTERN "*.ini")
install(DIRECTORY ${PROJECT_SOURCE_DIR}/meshes/ DESTINATION share/fickcast/meshes)
install(FILES ${PROJECT_SOURCE_DIR}/README.md DESTINATION share/doc/fickcast)
# The manual pages run the installed commands' --help (so they describe what was installed).
install(CODE "
  set(root \"\$ENV{DESTDIR}\${CMAKE_INSTALL_PREFIX}\")
  execute_process(COMMAND \${CMAKE_COMMAND} -DSOLVER=\${root}/bin/fickcast -DPOST=\${root}/bin/fickcast-post
    -DVERSION=${PROJECT_VERSION} -DOUTPUT=\${root}/share/man/man1
    -P ${PROJECT_SOURCE_DIR}/cmake/write_manual.cmake RESULT_VARIABLE code)
  if(NOT code EQUAL 0)
    message(FATAL_ERROR \"fickcast: writing the manual pages failed\")
  endif()
  message(STATUS \"Written: \${root}/share/man/man1/fickcast.1 and fickcast-post.1\")
")

set(CPACK_PACKAGE_NAME fickcast)
set(CPACK_PACKAGE_VENDOR "fickcast developers")
set(CPACK_PACKAGE_DESCRIPTION_SUMMARY
  "finite-element solver for Fick's second law in layered, porous and heterogeneous media")
set(CPACK_PACKAGE_VERSION ${PROJECT_VERSION})
set(CPACK_PACKAGING_INSTALL_PREFIX /usr)
set(CPACK_GENERATOR DEB)
set(CPACK_DEBIAN_FILE_NAME DEB-DEFAULT)
set(CPACK_DEBIAN_PACKAGE_MAINTAINER "fickcast developers <fickcast@localhost>")
set(CPACK_DEBIAN_PACKAGE_SECTION science)
# The run-time libraries (deal.II, VTK, PLplot, ...) found by dpkg-shlibdeps from the binaries;
# the PNG/SVG plots also need PLplot's cairo driver, which is loaded at run time, not linked.
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS ON)
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS_PRIVATE_DIRS ${PROJECT_BINARY_DIR}/solver)
set(CPACK_DEBIAN_PACKAGE_DEPENDS "plplot-driver-cairo, openmpi-bin, libudunits2-data")
include(CPack)
