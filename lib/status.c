/* status.c - status strings and the runtime version. */
#include <config.h>
#include "coaxline.h"

const char *cxl_version(void)
{
    return CXL_VERSION_STRING;
}

const char *cxl_strerror(cxl_status status)
{
    switch (status) {
    case CXL_OK:            return "success";
    case CXL_EINVAL:        return "invalid argument";
    case CXL_ERANGE:        return "value out of range";
    case CXL_EPARSE:        return "cannot parse text";
    case CXL_ENOTFOUND:     return "not found";
    case CXL_ENOMEM:        return "out of memory";
    case CXL_EIO:           return "input/output error";
    case CXL_ENOCONV:       return "numerical method did not converge";
    case CXL_EEXTRAPOLATE:  return "outside the range the model supports";
    case CXL_EDUPLICATE:    return "duplicate name";
    case CXL_ETOOLONG:      return "text too long";
    case CXL_EINCONSISTENT: return "measurements are inconsistent";
    }
    return "unknown status";
}
