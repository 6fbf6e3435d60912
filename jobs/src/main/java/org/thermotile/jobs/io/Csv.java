package org.thermotile.jobs.io;

import java.util.ArrayList;
import java.util.List;

/** The CSV line splitting shared by thermotile's CSV inputs (class tables, materials files). */
public final class Csv {
    private Csv() {}

    /**
     * The fields of one CSV line with RFC 4180 quoting ({@code "a, b"}, {@code ""} for a quote
     * inside quotes), or null when a quote is left open (a quoted field may not span lines).
     */
    public static List<String> split(String line) {
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < line.length(); i++) {
            char ch = line.charAt(i);
            if (quoted) {
                if (ch == '"') {
                    if (i + 1 < line.length() && line.charAt(i + 1) == '"') {
                        cur.append('"');
                        i++;
                    } else {
                        quoted = false;
                    }
                } else {
                    cur.append(ch);
                }
            } else if (ch == '"') {
                quoted = true;
            } else if (ch == ',') {
                out.add(cur.toString());
                cur.setLength(0);
            } else {
                cur.append(ch);
            }
        }
        if (quoted) {
            return null;
        }
        out.add(cur.toString());
        return out;
    }
}
