/*
 * list_routes.c — prints the API's route table (gc_api_routes: the fixed
 * routes and one per registered preset), one route per line as
 * "<pattern>\t<name>", in the order the router tries them. Used by
 * tests/fuzz/make_corpus.py to name the fuzz_routes seeds, so the seed
 * corpus follows the registry without a second list of routes.
 */
#include "api/api.h"

#include <stdio.h>

int main(void)
{
    size_t n = 0;
    const gc_api_route *r = gc_api_routes(&n);
    for (size_t i = 0; i < n; i++)
        printf("%s\t%s\n", r[i].pattern, r[i].name ? r[i].name : "");
    return 0;
}
