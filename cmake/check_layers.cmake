# check_layers.cmake — fails the build when a lower layer includes a higher one.
#
# The layers, bottom to top (a folder may include its own layer and any layer below it):
#   util < model < scenario < run < analysis < output < report < {cli, ui}
# cli/ and ui/ sit side by side at the top and include neither each other. tests/ and bench/
# may include anything. Run as: cmake -DROOT=<source dir> -P check_layers.cmake
set(FP_LAYERS util model scenario run analysis output report cli ui)
set(FP_RANK_util 0)
set(FP_RANK_model 1)
set(FP_RANK_scenario 2)
set(FP_RANK_run 3)
set(FP_RANK_analysis 4)
set(FP_RANK_output 5)
set(FP_RANK_report 6)
set(FP_RANK_cli 7)
set(FP_RANK_ui 7)

set(bad "")
foreach(layer IN LISTS FP_LAYERS)
  file(GLOB_RECURSE files "${ROOT}/${layer}/*.hpp" "${ROOT}/${layer}/*.cpp")
  foreach(f IN LISTS files)
    file(STRINGS "${f}" lines REGEX "^[ \t]*#[ \t]*include[ \t]*\"")
    foreach(line IN LISTS lines)
      string(REGEX REPLACE "^[ \t]*#[ \t]*include[ \t]*\"([^\"]*)\".*" "\\1" inc "${line}")
      string(REGEX MATCH "^([a-z_]+)/" m "${inc}")
      if(NOT m)
        # a bare name must be a generated header (version.hpp) or a file of the same folder
        get_filename_component(dir "${f}" DIRECTORY)
        if(NOT inc STREQUAL "version.hpp" AND NOT EXISTS "${dir}/${inc}")
          string(APPEND bad "  ${f}: #include \"${inc}\" (name the layer folder)\n")
        endif()
        continue()
      endif()
      set(target "${CMAKE_MATCH_1}")
      if(NOT DEFINED FP_RANK_${target})
        continue()  # a library's own folder layout (e.g. backends/) is not ours
      endif()
      if(FP_RANK_${target} GREATER FP_RANK_${layer}
         OR (FP_RANK_${target} EQUAL FP_RANK_${layer} AND NOT target STREQUAL layer))
        file(RELATIVE_PATH rel "${ROOT}" "${f}")
        string(APPEND bad "  ${rel}: includes \"${inc}\" (${layer}/ may include only ${layer}/ and the layers below it)\n")
      endif()
    endforeach()
  endforeach()
endforeach()
if(bad)
  message(FATAL_ERROR "layer check failed: a lower layer includes a higher one\n${bad}"
          "layers, bottom to top: util < model < scenario < run < analysis < output < report < {cli, ui}")
endif()
