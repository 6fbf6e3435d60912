package org.thermotile.jobs.config;

import java.util.List;

/**
 * All problems of one land-cover class table (its file, or codes of a raster that the table does
 * not map); see {@link ConfigException}.
 */
public class ClassTableException extends ConfigException {
    private static final long serialVersionUID = 1L;

    public ClassTableException(String file, List<String> problems) {
        super("class table", file, problems);
    }
}
