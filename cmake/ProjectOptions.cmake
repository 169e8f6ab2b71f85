# One INTERFACE target carries the options every Plumbline target shares.
add_library(plumbline_options INTERFACE)
target_compile_features(plumbline_options INTERFACE cxx_std_23)
set(CMAKE_CXX_EXTENSIONS OFF)
# No fused multiply-add unless written: the vector-lane code (vectorExpit, the four-lane loess
# fits) promises the scalar code's bits on every machine, and a compiler free to fuse a*b + c
# would break that. GCC already does not fuse in ISO mode; clang does by default.
target_compile_options(plumbline_options INTERFACE
  -Wall -Wextra -Wpedantic -Wshadow -Wconversion -Wno-sign-conversion -ffp-contract=off)
target_compile_definitions(plumbline_options INTERFACE
  QT_NO_CONTEXTLESS_CONNECT
  QT_NO_CAST_FROM_ASCII
  QT_NO_CAST_TO_ASCII
  QT_NO_URL_CAST_FROM_STRING
  QT_NO_NARROWING_CONVERSIONS_IN_CONNECT)

# Sanitizer build (CI runs the core and CLI tests with it): AddressSanitizer with leak
# detection and UndefinedBehaviorSanitizer, every finding fatal.
option(PLUMBLINE_SANITIZE "Build with AddressSanitizer and UndefinedBehaviorSanitizer" OFF)
# Fuzzing build: clang with libFuzzer; the core is instrumented for coverage and sanitized.
option(PLUMBLINE_FUZZ "Build the libFuzzer harnesses of the intake and the analysis-file reader (clang)" OFF)
if(PLUMBLINE_FUZZ)
  target_compile_options(plumbline_options INTERFACE
    -fsanitize=fuzzer-no-link,address,undefined -fno-sanitize-recover=undefined -fno-omit-frame-pointer -O1 -g1
    -Wno-deprecated-declarations) # libstdc++ 12 under clang 19: std::get_temporary_buffer
  target_link_options(plumbline_options INTERFACE -fsanitize=address,undefined)
endif()
if(PLUMBLINE_SANITIZE)
  # -O1 and line tables only: the instrumented build compiles in reasonable time on two cores
  # and its reports still name file and line.
  target_compile_options(plumbline_options INTERFACE
    -fsanitize=address,undefined -fno-sanitize-recover=undefined -fno-omit-frame-pointer -O1 -g1)
  target_link_options(plumbline_options INTERFACE -fsanitize=address,undefined)
endif()
