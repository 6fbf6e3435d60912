package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/**
 * Table headings carry capitalised words and unit symbols, not column-name suffixes. Symbols as
 * the SI Brochure writes them (BIPM 2019, 9th ed., section 5.4: a middle dot for a product of
 * units, superscript powers; °C for the degree Celsius).
 */
class HeadingTest {
    @Test
    void columnNamesBecomeHeadingsWithUnitSymbols() {
        assertEquals("Peak reduction (°C·km²)", RunReport.heading("peak_reduction_c_km2"));
        assertEquals("Cost (per °C·km²)", RunReport.heading("cost_per_c_km2"));
        assertEquals("Cost (per K·h·m²)", RunReport.heading("cost_per_k_h_m2"));
        assertEquals("Degree hours avoided (K·h·m²)", RunReport.heading("degree_hours_avoided_k_h_m2"));
        assertEquals("Treated area (m²)", RunReport.heading("treated_area_m2"));
        assertEquals("Peak reduction mean (°C)", RunReport.heading("peak_reduction_mean_c"));
        assertEquals("Rank", RunReport.heading("rank"));
        assertEquals("Cost per degree hour (EUR)", RunReport.heading("cost_per_degree_hour_eur"));
        assertEquals("Adoption (%)", RunReport.heading("adoption_pct"));
        assertEquals("Scenario", RunReport.heading("scenario"));
    }
}
