# Writes the manual pages of fickcast and fickcast-post (section 1, roff) from their own --help
# texts, so the installed manual says exactly what the commands say. Run at install time:
#   cmake -DSOLVER=... -DPOST=... -DVERSION=... -DOUTPUT=DIR -P write_manual.cmake
# Each page: NAME, then each help text verbatim (no-fill), one section per verb.

function(help_text program arguments result)
  execute_process(COMMAND ${program} ${arguments} OUTPUT_VARIABLE text ERROR_VARIABLE error
    RESULT_VARIABLE code)
  if(NOT code EQUAL 0)
    message(FATAL_ERROR "write_manual: '${program} ${arguments}' failed (exit ${code}): ${error}")
  endif()
  # roff: a backslash is written \e; a line starting with . or ' is protected by \&.
  string(REPLACE "\\" "\\e" text "${text}")
  string(REGEX REPLACE "(^|\n)([.'])" "\\1\\\\&\\2" text "${text}")
  set(${result} "${text}" PARENT_SCOPE)
endfunction()

function(write_page program name summary sections output)
  string(TIMESTAMP today "%Y-%m-%d" UTC)
  set(page ".TH ${name} 1 \"${today}\" \"${name} ${VERSION}\" \"User commands\"\n")
  string(APPEND page ".SH NAME\n${name} \\- ${summary}\n")
  foreach(section IN LISTS sections)
    string(REPLACE ":" ";" parts "${section}")
    list(GET parts 0 heading)
    list(GET parts 1 arguments)
    string(REPLACE "," ";" arguments "${arguments}")
    help_text(${program} "${arguments}" text)
    string(APPEND page ".SH ${heading}\n.nf\n${text}\n.fi\n")
  endforeach()
  string(APPEND page ".SH SEE ALSO\nfickcast(1), fickcast-post(1); the demo cases in share/fickcast/cases.\n")
  file(WRITE ${output} "${page}")
endfunction()

foreach(variable SOLVER POST VERSION OUTPUT)
  if(NOT DEFINED ${variable})
    message(FATAL_ERROR "write_manual: -D${variable}=... is missing")
  endif()
endforeach()
file(MAKE_DIRECTORY ${OUTPUT})
write_page(${SOLVER} fickcast "finite-element solver for Fick's second law in layered, porous and heterogeneous media"
  "DESCRIPTION:--help;RUN:run,--help;CHECK:check,--help;SWEEP:sweep,--help;SIZE:size,--help;VERIFY:verify,--help"
  ${OUTPUT}/fickcast.1)
set(post_sections "DESCRIPTION:--help")
foreach(command compare integrate plots report sample)
  string(TOUPPER ${command} heading)
  list(APPEND post_sections "${heading}:${command},--help")
endforeach()
write_page(${POST} fickcast-post "samples, integrals, comparisons, plots and reports from fickcast's results folders"
  "${post_sections}" ${OUTPUT}/fickcast-post.1)
