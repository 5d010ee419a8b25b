"""The daemon's alerts that test_daemon_service does not cover: a computed
hot-spot above the long-time emergency limit, and a worsening gas condition
(IEEE C57.104-2008) or DGA status (C57.104-2019), or a unit's first gas
figures already at condition 3 or 4. Each is raised once, when the unit
crosses, not again while it stays there."""
import os
import time
import unittest

from test_daemon_watch import LOAD_HEADER, DaemonCase

LAB = "unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref\n"


def day(days_ago):
    return time.strftime("%Y-%m-%d", time.gmtime(time.time() - days_ago * 86400))


def load_at(unit, load_pu, ambient_c, hours, days_ago):
    """Hourly rows at a constant load, starting `days_ago` days back."""
    base = int(time.time() // 3600 * 3600) - days_ago * 86400
    return "".join(f"{unit},{time.strftime('%Y-%m-%dT%H:%M:%SZ', time.gmtime(base + 3600 * h))},{load_pu},{ambient_c}\n"
                   for h in range(hours))


class MoreAlerts(DaemonCase):
    def kinds(self, unit):
        return [a["kind"] for a in self.alerts() if a["unit_id"] == unit]

    def drop_and_wait(self, name, content):
        self.drop(name, content)
        self.wait_for(lambda: self.has_receipt(name), timeout=15, what=name)
        self.assertEqual(self.receipt(name)["status"], "accepted", self.receipt(name))

    def test_hot_spot_above_the_long_time_emergency_limit(self):
        self.start_daemon()
        # T1 (ONAF) at 0.9 pu and 20 °C: hot-spot below 98 °C (IEC 60076-7
        # steady state at K = 1 is 98 °C, Table 5 characteristics).
        self.drop_and_wait("load-1.csv", LOAD_HEADER + load_at("T1", 0.9, 20, 24, 3))
        time.sleep(1.5)
        self.assertEqual(self.kinds("T1"), [])
        # 1.6 pu at 30 °C for 12 h: steady hot-spot about 180 °C, well above
        # the long-time emergency limit of 140 °C (IEC 60076-7 Table 4 limits).
        self.drop_and_wait("load-2.csv", LOAD_HEADER + load_at("T1", 1.6, 30, 12, 2))
        self.wait_for(lambda: "hot_spot" in self.kinds("T1"), timeout=15, what="hot-spot alert")
        text = next(a for a in self.alerts() if a["kind"] == "hot_spot")
        self.assertTrue(os.path.exists(self.path("reports", "alerts", text["pdf"])), text)
        # Still above the limit after more data: no second alert.
        self.drop_and_wait("load-3.csv", LOAD_HEADER + load_at("T1", 1.0, 20, 6, 1))
        time.sleep(1.5)
        self.assertEqual(self.kinds("T1").count("hot_spot"), 1)
        self.assertEqual(self.stop_daemon(), 0)

    def test_worsening_gas_condition_and_status(self):
        self.start_daemon()
        # Condition 1: every gas and TDCG (255 ppm) within Table 1's condition 1
        # (IEEE C57.104-2008 Table 1; value from memory, see README sources).
        self.drop_and_wait("lab-1.csv", LAB + f"T2,{day(40)},20,10,5,5,<0.5,200,2000,L-1\n")
        time.sleep(1.5)
        self.assertEqual(self.kinds("T2"), [])
        # No acetylene, but H2 1000, CH4 600, C2H4 150 and TDCG 2350 ppm:
        # condition 3 of the same table.
        self.drop_and_wait("lab-2.csv", LAB + f"T2,{day(5)},1000,600,100,150,<0.5,500,3000,L-2\n")
        # Both from one assessment; each alert's PDF is rendered before its line.
        self.wait_for(lambda: {"gas_condition", "dga_status"} <= set(self.kinds("T2")), timeout=15,
                      what="gas condition and DGA status alerts")
        row = next(a for a in self.alerts() if a["kind"] == "gas_condition")
        self.assertIn("from 1 to 3", row["text"])
        # C57.104-2019: H2 1000 ppm is above the Table 2 limit: status 3 (from
        # status 1); tables from memory, see README sources.
        row = next(a for a in self.alerts() if a["kind"] == "dga_status")
        self.assertIn("from 1 to 3", row["text"])
        self.assertNotIn("acetylene", self.kinds("T2"))
        self.assertEqual(self.stop_daemon(), 0)

    def test_first_gas_figures_already_high(self):
        self.start_daemon()
        # A unit's first sample is its baseline at condition 1 or 2: no alert.
        # Condition 2 by H2 150 ppm (IEEE C57.104-2008 Table 1: 101-700;
        # value from memory, see README sources).
        self.drop_and_wait("lab-1.csv", LAB + f"T2,{day(5)},150,10,5,5,<0.5,200,2000,L-1\n")
        time.sleep(1.5)
        self.assertNotIn("gas_condition", self.kinds("T2"))
        # A first sample already at condition 4 (C2H4 817 ppm, above Table 1's
        # 200 ppm; TDCG 1,857 ppm) is news: it raises an alert although no earlier
        # sample worsened into it.
        self.drop_and_wait("lab-2.csv", LAB + f"T1,{day(5)},30,60,50,817,<0.5,900,4000,L-2\n")
        self.wait_for(lambda: "gas_condition" in self.kinds("T1"), timeout=15, what="gas condition alert")
        row = next(a for a in self.alerts() if a["kind"] == "gas_condition" and a["unit_id"] == "T1")
        self.assertIn("at its first assessment by ferrum (nothing earlier to compare with): 4", row["text"])
        self.assertEqual(self.stop_daemon(), 0)


if __name__ == "__main__":
    unittest.main()
