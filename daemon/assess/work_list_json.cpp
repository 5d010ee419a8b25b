#include "daemon/assess/work_list_json.h"

#include <Poco/JSON/Array.h>

namespace ferrum::assess {
namespace {

Poco::Dynamic::Var day(analytics::Day d) {
  return d == 0 ? Poco::Dynamic::Var() : Poco::Dynamic::Var(analytics::format_day(d));
}

Poco::Dynamic::Var text_or_null(const std::string& s) {
  return s.empty() ? Poco::Dynamic::Var() : Poco::Dynamic::Var(s);
}

}  // namespace

Poco::JSON::Object::Ptr to_json(const std::vector<analytics::WorkListRow>& rows, analytics::Day as_of,
                                 const analytics::WorkListFilter& filter) {
  using Poco::JSON::Array;
  using Poco::JSON::Object;
  Object::Ptr doc = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  doc->set("as_of", analytics::format_day(as_of));
  Object::Ptr f = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  f->set("site", text_or_null(filter.site));
  f->set("crew", text_or_null(filter.crew));
  doc->set("filter", f);
  Array::Ptr list = new Array;
  for (const auto& r : rows) {
    Object::Ptr x = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    x->set("reference", r.reference);
    x->set("unit_id", r.unit_id);
    x->set("site", r.site);
    x->set("priority", r.priority);
    x->set("found", day(r.found));
    x->set("source", text_or_null(r.source));
    x->set("due", day(r.due));
    x->set("overdue", r.overdue);
    x->set("status", r.status.empty() ? std::string("open") : r.status);
    x->set("booked_date", r.status == "booked" ? day(r.work_date) : Poco::Dynamic::Var());
    x->set("outage", r.outage);
    x->set("crew", text_or_null(r.crew));
    x->set("text", r.text);
    x->set("note", text_or_null(r.work_note));
    list->add(x);
  }
  doc->set("actions", list);
  return doc;
}

}  // namespace ferrum::assess
