package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.errors.UserInputException;

/** {@code --replace} never deletes a folder that is not a thermotile run (issue 18, item 3). */
class ReplaceGuardTest {
    @Test
    void replaceRefusesAFolderWithoutOurManifest(@TempDir Path dir) throws Exception {
        Path out = dir.resolve("holiday photos");
        Files.createDirectories(out);
        Path mine = Files.writeString(out.resolve("beach.jpg"), "not a run");
        UserInputException e = assertThrows(UserInputException.class, () -> CityJob.run(null, List.of(),
                new CityJob.Options(out, null, true, true, 1), new PrintStream(new ByteArrayOutputStream())));
        assertTrue(e.getMessage().contains("not a thermotile run folder"), e.getMessage());
        assertTrue(e.getMessage().contains(out.toString()), e.getMessage());
        assertEquals("not a run", Files.readString(mine));
        assertTrue(Files.notExists(dir.resolve(".holiday photos.partial")));
    }
}
