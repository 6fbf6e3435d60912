package org.thermotile.jobs.report;

import java.nio.file.Path;
import java.time.LocalDate;
import java.time.OffsetDateTime;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Diurnal curves and daily peak series from the hourly summary tables ({@code material_hours},
 * {@code district_hours}): per group (a material or a district), the mean over the counted days
 * of each local clock hour's value, and per local date the highest hourly value.
 */
final class Curves {
    private Curves() {}

    /**
     * One group's curves.
     *
     * @param meanByHour  mean over days of the hourly mean, per local clock hour 0–23 [°C] (NaN: no sample)
     * @param p10ByHour   same for the 10th percentile (NaN when the table has none) [°C]
     * @param p90ByHour   same for the 90th percentile [°C]
     * @param dailyPeak   per local date, the highest hourly mean [°C]
     * @param periodMean  mean of all hourly means [°C]
     * @param maxHourly   highest hourly mean [°C] and {@code maxTime} its time stamp
     * @param maxP90      highest hourly 90th percentile [°C] (NaN when absent)
     */
    record Group(String key, long cells, double[] meanByHour, double[] p10ByHour, double[] p90ByHour,
            TreeMap<LocalDate, Double> dailyPeak, double periodMean, double maxHourly, String maxTime, double maxP90) {
    }

    /**
     * Groups an hourly table by {@code keyColumn}, in first-seen order.
     *
     * @param source the table's location, for error messages
     * @throws ReportException when a required column is missing or a time does not parse
     */
    static List<Group> of(Table t, String keyColumn, Path source) {
        int k = t.require(keyColumn, source), time = t.require("time", source), hour = t.require("local_hour_h", source);
        int mean = t.require("mean_c", source), cells = t.require("cells", source);
        int p10 = t.indexOf("p10_c"), p90 = t.indexOf("p90_c");
        Map<String, Acc> groups = new LinkedHashMap<>();
        int rowNo = 0;
        for (Object[] r : t.rows()) {
            rowNo++;
            String key = String.valueOf(r[k]);
            Acc a = groups.computeIfAbsent(key, x -> new Acc());
            int h = (int) Table.number(r[hour]);
            if (h < 0 || h > 23) {
                throw new ReportException(source + ", row " + rowNo + ": local_hour_h " + r[hour]
                        + " is outside 0…23. Fix: write the table again with thermotile run");
            }
            LocalDate date;
            try {
                date = OffsetDateTime.parse(String.valueOf(r[time])).toLocalDate();
            } catch (DateTimeParseException e) {
                throw new ReportException(source + ", row " + rowNo + ", column time: '" + r[time]
                        + "' is not an ISO date-time with offset (2026-07-14T13:00+02:00). Fix: write the table again");
            }
            double m = Table.number(r[mean]);
            a.cells = Math.max(a.cells, (long) Table.number(r[cells]));
            add(a.sum, a.n, h, m);
            if (p10 >= 0) {
                add(a.sum10, a.n10, h, Table.number(r[p10]));
            }
            if (p90 >= 0) {
                double v = Table.number(r[p90]);
                add(a.sum90, a.n90, h, v);
                if (Double.isFinite(v)) {
                    a.maxP90 = Math.max(a.maxP90, v);
                }
            }
            if (Double.isFinite(m)) {
                a.total += m;
                a.count++;
                a.daily.merge(date, m, Math::max);
                if (m > a.max) {
                    a.max = m;
                    a.maxTime = String.valueOf(r[time]);
                }
            }
        }
        List<Group> out = new ArrayList<>();
        for (Map.Entry<String, Acc> e : groups.entrySet()) {
            Acc a = e.getValue();
            out.add(new Group(e.getKey(), a.cells, div(a.sum, a.n), p10 >= 0 ? div(a.sum10, a.n10) : nan(),
                    p90 >= 0 ? div(a.sum90, a.n90) : nan(), a.daily, a.count == 0 ? Double.NaN : a.total / a.count,
                    a.count == 0 ? Double.NaN : a.max, a.maxTime, a.maxP90 == Double.NEGATIVE_INFINITY ? Double.NaN
                            : a.maxP90));
        }
        return out;
    }

    /**
     * The cell-weighted mean over all groups per time stamp, then its highest value per local
     * date: {@code T̄(t) = Σ_g n_g·T_g(t) / Σ_g n_g} (groups being materials, which partition the cells).
     */
    static TreeMap<LocalDate, Double> allCellsDailyPeak(Table t, Path source) {
        int time = t.require("time", source), mean = t.require("mean_c", source), cells = t.require("cells", source);
        TreeMap<String, double[]> byTime = new TreeMap<>();
        for (Object[] r : t.rows()) {
            double m = Table.number(r[mean]), n = Table.number(r[cells]);
            if (Double.isFinite(m) && n > 0) {
                double[] s = byTime.computeIfAbsent(String.valueOf(r[time]), x -> new double[2]);
                s[0] += n * m;
                s[1] += n;
            }
        }
        TreeMap<LocalDate, Double> daily = new TreeMap<>();
        for (Map.Entry<String, double[]> e : byTime.entrySet()) {
            LocalDate d = OffsetDateTime.parse(e.getKey()).toLocalDate();
            daily.merge(d, e.getValue()[0] / e.getValue()[1], Math::max);
        }
        return daily;
    }

    /** Every date present in any group, sorted. */
    static List<LocalDate> dates(List<Group> groups) {
        TreeSet<LocalDate> d = new TreeSet<>();
        groups.forEach(g -> d.addAll(g.dailyPeak().keySet()));
        return new ArrayList<>(d);
    }

    private static void add(double[] sum, int[] n, int h, double v) {
        if (Double.isFinite(v)) {
            sum[h] += v;
            n[h]++;
        }
    }

    private static double[] div(double[] sum, int[] n) {
        double[] out = new double[24];
        for (int h = 0; h < 24; h++) {
            out[h] = n[h] == 0 ? Double.NaN : sum[h] / n[h];
        }
        return out;
    }

    private static double[] nan() {
        double[] a = new double[24];
        Arrays.fill(a, Double.NaN);
        return a;
    }

    private static final class Acc {
        final double[] sum = new double[24], sum10 = new double[24], sum90 = new double[24];
        final int[] n = new int[24], n10 = new int[24], n90 = new int[24];
        final TreeMap<LocalDate, Double> daily = new TreeMap<>();
        long cells;
        double total;
        long count;
        double max = Double.NEGATIVE_INFINITY;
        String maxTime = "";
        double maxP90 = Double.NEGATIVE_INFINITY;
    }
}
