// Checking a libpq connection string from ferrum.ini (store.h), on its own
// so that the configuration reader needs only libpq (tests/fuzz builds it alone).
#include <libpq-fe.h>

#include <string>

#include "schema/store.h"

namespace ferrum::store {

std::string postgresql_conninfo_problem(const std::string& conninfo) {
  char* err = nullptr;
  PQconninfoOption* options = PQconninfoParse(conninfo.c_str(), &err);
  if (!options) {
    std::string msg = err ? err : "out of memory";
    PQfreemem(err);
    while (!msg.empty() && msg.back() == '\n') msg.pop_back();
    return "not a libpq connection string (" + msg + ")";
  }
  std::string problem;
  for (const PQconninfoOption* o = options; o->keyword; ++o)
    if (std::string(o->keyword) == "password" && o->val && *o->val)
      problem = "holds a password; put it in the libpq password file (~/.pgpass of the daemon's user, or PGPASSFILE) instead";
  PQconninfoFree(options);
  return problem;
}

}  // namespace ferrum::store
