/*
 * handlers.h — private to the API layer: the route handlers (one file per
 * resource) that routes.c puts into the route table. Each is a pure function
 * of the request (api.h): no global mutable state.
 */
#ifndef GC_API_HANDLERS_H
#define GC_API_HANDLERS_H

#include "api/api.h"

int gc_api_h_openapi(const gc_api_request *req, gc_api_response *resp);    /* openapi.c */
int gc_api_h_gases(const gc_api_request *req, gc_api_response *resp);      /* gases.c */
int gc_api_h_properties(const gc_api_request *req, gc_api_response *resp); /* properties.c */

#endif
