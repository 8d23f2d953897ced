#include <config.h>
#include <stdio.h>
#include "coaxline.h"
int main(void) { printf("coaxline %s\n", cxl_version()); return 0; }
