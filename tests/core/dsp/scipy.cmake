# Outside cross-check of core/dsp against scipy.signal / scipy.stats (ScipyCrossCheckTest.cpp).
# The test runs tests/reference/scipy_reference.py with HUMWISE_PYTHON (Debian /usr/bin/python3
# with python3-numpy and python3-scipy) at test time; it skips with a message when the
# interpreter or scipy is missing. Included from tests/core/dsp/CMakeLists.txt.
humwise_add_test(test_core_dsp_scipy SOURCES ${CMAKE_CURRENT_LIST_DIR}/ScipyCrossCheckTest.cpp)
