// Common main for every test executable. QT_QPA_PLATFORM=offscreen is set before anything
// else so that GUI tests (and gtest discovery at build time) work without a display.
#include <gtest/gtest.h>

#include <cstdlib>

int main(int argc, char** argv) {
    setenv("QT_QPA_PLATFORM", "offscreen", 0);
    ::testing::InitGoogleTest(&argc, argv);
    return RUN_ALL_TESTS();
}
