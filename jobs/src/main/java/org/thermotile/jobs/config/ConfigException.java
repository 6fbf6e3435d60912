package org.thermotile.jobs.config;

import java.util.List;

/**
 * Every problem found in one configuration file (a run file or a class table), reported
 * together. Each entry of {@link #problems()} is one complete sentence that names the file, the
 * place (line and column where known, and the key path such as {@code outputs.maps[2]}), the
 * bad value and the fix.
 */
public class ConfigException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    private final String file;
    private final List<String> problems;

    /**
     * @param what     what kind of file, for the headline ("run file", "class table")
     * @param file     the file as the user named it
     * @param problems one or more messages, each naming the file and the place
     */
    public ConfigException(String what, String file, List<String> problems) {
        super(headline(what, file, problems));
        this.file = file;
        this.problems = List.copyOf(problems);
    }

    private static String headline(String what, String file, List<String> problems) {
        StringBuilder sb = new StringBuilder();
        sb.append(what).append(' ').append(file).append(": ")
                .append(problems.size()).append(problems.size() == 1 ? " problem" : " problems");
        for (String p : problems) {
            sb.append(System.lineSeparator()).append("  - ").append(p);
        }
        return sb.toString();
    }

    /** The file the problems are in, as the user named it. */
    public String file() {
        return file;
    }

    /** All problems, in the order they were found (document order, section by section). */
    public List<String> problems() {
        return problems;
    }
}
