# Runs CMD with ARGS and fails unless the exit status is EXPECT, the error output
# is a single line, and (if given) that line contains EXPECT_TEXT.
execute_process(COMMAND ${CMD} ${ARGS} RESULT_VARIABLE status ERROR_VARIABLE err
                OUTPUT_VARIABLE out)
if(NOT status EQUAL EXPECT)
  message(FATAL_ERROR "exit status ${status}, expected ${EXPECT}\nstderr: ${err}")
endif()
string(STRIP "${err}" err)
string(FIND "${err}" "\n" newline)
if(err STREQUAL "" OR NOT newline EQUAL -1)
  message(FATAL_ERROR "expected one line on stderr, got:\n${err}")
endif()
if(DEFINED EXPECT_TEXT)
  string(FIND "${err}" "${EXPECT_TEXT}" found)
  if(found EQUAL -1)
    message(FATAL_ERROR "stderr:\n${err}\ndoes not contain:\n${EXPECT_TEXT}")
  endif()
endif()
message(STATUS "ok: ${err}")
