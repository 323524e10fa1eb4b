// doctest_main.cpp — the test runner's main (its own file: doctest's main is slow to compile).
#define DOCTEST_CONFIG_IMPLEMENT_WITH_MAIN
#include <doctest/doctest.h>
