# locind_base: status, random streams, hashing, number formatting (everything may use it).
locind_layer(locind_base
  DEPS Boost::headers Threads::Threads
  SOURCES
    base/hashing.cc
    base/memory_tuning.cc
    base/number_format.cc
    base/random_stream.cc
)
