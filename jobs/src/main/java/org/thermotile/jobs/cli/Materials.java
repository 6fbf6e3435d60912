package org.thermotile.jobs.cli;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import org.thermotile.jobs.io.MaterialsFile;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/** The material set a command sees: the built-in library, plus a user's materials file. */
final class Materials {
    private Materials() {}

    static Map<String, Material> known(Path materialsFile) {
        if (materialsFile == null) {
            return MaterialLibrary.byId();
        }
        return new LinkedHashMap<>(MaterialsFile.mergeWithLibrary(MaterialsFile.read(materialsFile)));
    }

    static Material lookup(String id, Path materialsFile) {
        return MaterialLibrary.get(id, known(materialsFile));
    }
}
