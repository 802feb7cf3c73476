# Header-only libraries from Debian (nlohmann-json3-dev, libcli11-dev, libfmt-dev, doctest-dev).
# Never add -I/usr/include wholesale: under Emscripten it clashes with Emscripten's own system
# headers (toolchain.md). Instead link each library's own directory into one private folder.
set(TW_THIRD_PARTY_INCLUDE "${CMAKE_BINARY_DIR}/third_party_include")
file(MAKE_DIRECTORY "${TW_THIRD_PARTY_INCLUDE}")
foreach(dir nlohmann CLI fmt doctest)
  if(NOT EXISTS "/usr/include/${dir}")
    message(FATAL_ERROR "/usr/include/${dir} is missing: run scripts/setup.sh to install the Debian packages")
  endif()
  if(NOT EXISTS "${TW_THIRD_PARTY_INCLUDE}/${dir}")
    file(CREATE_LINK "/usr/include/${dir}" "${TW_THIRD_PARTY_INCLUDE}/${dir}" SYMBOLIC)
  endif()
endforeach()

add_library(tw_third_party INTERFACE)
target_include_directories(tw_third_party SYSTEM INTERFACE "${TW_THIRD_PARTY_INCLUDE}")
# fmt: natively, Debian's compiled libfmt; header-only fmt compiles its implementation into every
# file that includes it (measured: shell/cmd_buffer.cpp 28 s -> 16 s with the library). Emscripten
# cannot link the native library, so the WebAssembly builds keep the header-only mode.
if(EMSCRIPTEN)
  target_compile_definitions(tw_third_party INTERFACE FMT_HEADER_ONLY=1)
else()
  find_package(fmt REQUIRED)
  target_link_libraries(tw_third_party INTERFACE fmt::fmt)
endif()
