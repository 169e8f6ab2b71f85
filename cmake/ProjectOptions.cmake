# One INTERFACE target carries the options every Plumbline target shares.
add_library(plumbline_options INTERFACE)
target_compile_features(plumbline_options INTERFACE cxx_std_23)
set(CMAKE_CXX_EXTENSIONS OFF)
target_compile_options(plumbline_options INTERFACE
  -Wall -Wextra -Wpedantic -Wshadow -Wconversion -Wno-sign-conversion)
target_compile_definitions(plumbline_options INTERFACE
  QT_NO_CONTEXTLESS_CONNECT
  QT_NO_CAST_FROM_ASCII
  QT_NO_CAST_TO_ASCII
  QT_NO_URL_CAST_FROM_STRING
  QT_NO_NARROWING_CONVERSIONS_IN_CONNECT)
