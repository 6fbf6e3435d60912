package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The diurnal chart of the demo city's 18 materials as small multiples: one panel per kind of
 * surface, each material in exactly one panel, every panel on the same temperature axis.
 */
class MaterialPanelsTest {

    /** The demo city's material labels, in palette order (its manifest's simulation.materials). */
    static final List<String> DEMO = List.of("asphalt_aged", "asphalt_fresh", "concrete", "concrete_pavers", "gravel",
            "roof_membrane_dark", "roof_membrane_white", "roof_membrane_white {albedo=0.65}", "bitumen_shingle",
            "clay_tile", "metal_roof_bare", "green_roof", "bare_soil_dry", "bare_soil_moist", "grass_irrigated",
            "grass_dry", "tree_canopy", "water");

    static List<Curves.Group> groups() {
        List<Curves.Group> out = new ArrayList<>();
        for (int i = 0; i < DEMO.size(); i++) {
            double[] mean = new double[24];
            for (int h = 0; h < 24; h++) {
                mean[h] = 20 + i + 10 * Math.max(0, Math.sin((h - 6) * Math.PI / 12));   // invented shapes
            }
            double[] nan = new double[24];
            Arrays.fill(nan, Double.NaN);
            out.add(new Curves.Group(DEMO.get(i), 100, mean, nan, nan, new TreeMap<>(), 25, 30 + i, "", Double.NaN));
        }
        return out;
    }

    @Test
    void eachKindIsOnePanelAndEachMaterialIsDrawnOnce() throws Exception {
        String html = CurveSection.materialPanels(groups(), k -> "#000000", k -> null);
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        Document doc = f.newDocumentBuilder().parse(new ByteArrayInputStream(html.getBytes(StandardCharsets.UTF_8)));
        NodeList figures = doc.getElementsByTagName("figure");
        Map<String, List<String>> panels = new LinkedHashMap<>();
        List<String> yTicks = null;
        for (int i = 0; i < figures.getLength(); i++) {
            Element fig = (Element) figures.item(i);
            assertEquals("small-chart", fig.getAttribute("class"));
            String caption = fig.getElementsByTagName("figcaption").item(0).getTextContent();
            List<String> drawn = new ArrayList<>();
            NodeList paths = fig.getElementsByTagName("path");
            for (int p = 0; p < paths.getLength(); p++) {
                NodeList t = ((Element) paths.item(p)).getElementsByTagName("title");
                if (t.getLength() > 0) {
                    drawn.add(t.item(0).getTextContent());
                }
            }
            panels.put(caption, drawn);
            // The y-axis tick labels (text-anchor end): the same in every panel, i.e. one shared axis.
            List<String> ticks = new ArrayList<>();
            NodeList texts = fig.getElementsByTagName("text");
            for (int t = 0; t < texts.getLength(); t++) {
                Element e = (Element) texts.item(t);
                if (e.getAttribute("text-anchor").equals("end")) {
                    ticks.add(e.getTextContent());
                }
            }
            // Legible: hour labels every 6 h (they overlap at 3 h on a panel this narrow), and every
            // legend label whole (the longest demo label, "roof_membrane_white {albedo=0.65}", included).
            int hourLabels = 0;
            for (int t = 0; t < texts.getLength(); t++) {
                Element e = (Element) texts.item(t);
                if (e.getAttribute("text-anchor").equals("middle") && e.getTextContent().endsWith(":00")) {
                    hourLabels++;
                }
                assertTrue(!e.getTextContent().contains("…"), caption + ": label cut: " + e.getTextContent());
            }
            assertEquals(4, hourLabels, caption);
            if (yTicks == null) {
                yTicks = ticks;
            }
            assertEquals(yTicks, ticks, caption + " shares the temperature axis");
        }
        assertEquals(List.of("Roofs", "Pavements", "Vegetation", "Bare ground", "Water"), new ArrayList<>(panels.keySet()));
        assertEquals(List.of("roof_membrane_dark", "roof_membrane_white", "roof_membrane_white {albedo=0.65}",
                "bitumen_shingle", "clay_tile", "metal_roof_bare", "green_roof"), panels.get("Roofs"));
        assertEquals(List.of("asphalt_aged", "asphalt_fresh", "concrete", "concrete_pavers", "gravel"), panels.get("Pavements"));
        assertEquals(List.of("grass_irrigated", "grass_dry", "tree_canopy"), panels.get("Vegetation"));
        assertEquals(List.of("bare_soil_dry", "bare_soil_moist"), panels.get("Bare ground"));
        assertEquals(List.of("water"), panels.get("Water"));
        List<String> all = new ArrayList<>();
        panels.values().forEach(all::addAll);
        assertEquals(DEMO.size(), all.size(), "each material drawn once");
        assertEquals(new java.util.TreeSet<>(DEMO), new java.util.TreeSet<>(all));
        assertTrue(yTicks.size() >= 3, "ticks " + yTicks);
        // The shared axis spans every material: the coolest and the warmest curve lie within it.
        double lo = Double.parseDouble(yTicks.get(0)), hi = Double.parseDouble(yTicks.get(yTicks.size() - 1));
        assertTrue(lo <= 20 && hi >= 20 + 17 + 10, "axis " + lo + " … " + hi);
    }

    @Test
    void userMaterialsWithoutAKnownWordGoToOtherSurfaces() {
        assertEquals(MaterialKinds.OTHER, MaterialKinds.of("solar_panel_array"));
        assertEquals(MaterialKinds.PAVEMENTS, MaterialKinds.of("street"));
        assertEquals(MaterialKinds.ROOFS, MaterialKinds.of("green_roof"));
    }
}
