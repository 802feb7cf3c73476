# Turns a file into a C++ source with `extern const unsigned char SYMBOL[]` and
# `extern const unsigned long SYMBOL_size` (used for fonts and the demo journal: embedded at
# build time, never read from a runtime path). Usage: cmake -DIN=f -DOUT=f.cpp -DSYMBOL=name -P embed.cmake
file(READ "${IN}" hex HEX)
string(LENGTH "${hex}" n)
math(EXPR size "${n} / 2")
string(REGEX REPLACE "([0-9a-f][0-9a-f])" "0x\\1," body "${hex}")
string(REGEX REPLACE "(0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,0x..,)" "\\1\n" body "${body}")
file(WRITE "${OUT}.tmp" "// Generated from ${IN} by web/cmake/embed.cmake. Do not edit.\n"
  "extern const unsigned char ${SYMBOL}[];\nextern const unsigned long ${SYMBOL}_size;\n"
  "alignas(4) const unsigned char ${SYMBOL}[] = {\n${body}0x00};\n"
  "const unsigned long ${SYMBOL}_size = ${size};\n")
file(RENAME "${OUT}.tmp" "${OUT}")
