# Writes OUT, a C++ file holding every DIR/NNN_name.sql as a raw string, in
# version order: ferrum::store::embedded_migrations().
file(GLOB files ${DIR}/*.sql)
list(SORT files)
set(body "")
foreach(f ${files})
  get_filename_component(name ${f} NAME_WE)
  string(REGEX MATCH "^[0-9]+" version ${name})
  math(EXPR version "${version} + 0")
  file(READ ${f} sql)
  string(APPEND body "    {${version}, \"${name}\", R\"ferrumsql(${sql})ferrumsql\"},\n")
endforeach()
file(WRITE ${OUT}.tmp "// Generated from schema/migrations by schema/embed_sql.cmake. Do not edit.\n#include \"schema/migrations.h\"\n\nnamespace ferrum::store {\n\nconst std::vector<Migration>& embedded_migrations() {\n  static const std::vector<Migration> all = {\n${body}  };\n  return all;\n}\n\n}  // namespace ferrum::store\n")
file(COPY_FILE ${OUT}.tmp ${OUT} ONLY_IF_DIFFERENT)
