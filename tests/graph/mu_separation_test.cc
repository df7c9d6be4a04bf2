#include "graph/mu_separation.h"

#include <doctest/doctest.h>

TEST_CASE("placeholder build check") { CHECK(true); }
