# Writes the service worker with a cache name that changes whenever the app changes, so an
# installed copy picks up a new build and drops the old cache.
# Usage: cmake -DIN=sw.js -DOUT=build/sw.js "-DHASH_FILES=a;b;c" -P service_worker.cmake
set(all "")
foreach(f ${HASH_FILES})
  if(EXISTS "${f}")
    file(SHA256 "${f}" h)
    string(APPEND all "${h}")
  endif()
endforeach()
string(SHA256 version "${all}")
string(SUBSTRING "${version}" 0 12 TW_BUILD_HASH)
configure_file("${IN}" "${OUT}" @ONLY)
