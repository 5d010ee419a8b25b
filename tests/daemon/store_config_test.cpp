// ferrum.ini [store] and [site] serves (the shared PostgreSQL store).
// Plumbing: no engineering value is checked here, so no published source applies.
#include <gtest/gtest.h>

#include "daemon/config/site_config.h"
#include "tests/daemon/temp_ini.h"

using namespace ferrum;

namespace {

config::SiteConfig load(const std::string& extra) {
  return ferrum::testing::load_ini_text("[party.planning]\nkinds = *\nsites = *\n" + extra, "store");
}

TEST(StoreConfig, SqliteServingEverySiteIsTheDefault) {
  const auto c = load("");
  EXPECT_EQ(c.store.backend, "sqlite");
  EXPECT_FALSE(c.store.shared());
  EXPECT_TRUE(c.store.serves_site("Anywhere"));
}

TEST(StoreConfig, PostgresqlWithAConnectionString) {
  const auto c = load("[store]\nbackend = PostgreSQL\npostgresql = host=/var/run/postgresql dbname=ferrum user=ferrum\n");
  EXPECT_TRUE(c.store.shared());
  EXPECT_EQ(c.store.postgresql, "host=/var/run/postgresql dbname=ferrum user=ferrum");
}

TEST(StoreConfig, APasswordInFerrumIniIsRefused) {
  for (const char* conninfo : {"host=db dbname=ferrum user=ferrum password=secret",
                               "postgresql://ferrum:secret@db/ferrum"}) {
    try {
      load(std::string("[store]\nbackend = postgresql\npostgresql = ") + conninfo + "\n");
      ADD_FAILURE() << conninfo << " was accepted";
    } catch (const config::ConfigError& e) {
      EXPECT_NE(std::string(e.what()).find("password file"), std::string::npos) << e.what();
    }
  }
}

TEST(StoreConfig, MistakesAreRefused) {
  EXPECT_THROW(load("[store]\nbackend = mysql\n"), config::ConfigError);
  EXPECT_THROW(load("[store]\nbackend = postgresql\n"), config::ConfigError);  // no connection string
  EXPECT_THROW(load("[store]\npostgresql = host='unterminated\n"), config::ConfigError);
  EXPECT_THROW(load("[site]\nserves = North, *\n"), config::ConfigError);
}

TEST(StoreConfig, ServesNamesSubstations) {
  const auto c = load("[site]\nserves = North Yard, Ostrand Yard\n");
  EXPECT_TRUE(c.store.serves_site("North Yard"));
  EXPECT_TRUE(c.store.serves_site("ostrand yard"));
  EXPECT_FALSE(c.store.serves_site("South"));
}

}  // namespace
