package org.thermotile.jobs.config;

import java.util.List;

/** All problems of one run file, collected in a single pass; see {@link ConfigException}. */
public class RunFileException extends ConfigException {
    private static final long serialVersionUID = 1L;

    public RunFileException(String file, List<String> problems) {
        super("run file", file, problems);
    }
}
