#include <config.h>
#include <check.h>
#include <stdlib.h>
#include "coaxline.h"
START_TEST(test_placeholder_parse) {
    double v; ck_assert_int_eq(cxl_units_parse_length("10m", CXL_UNITS_METRIC, &v, NULL), CXL_OK);
    ck_assert_double_eq(v, 10.0);
} END_TEST
int main(void) {
    Suite *s = suite_create("units"); TCase *tc = tcase_create("core");
    tcase_add_test(tc, test_placeholder_parse); suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s); srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr); srunner_free(sr); return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
