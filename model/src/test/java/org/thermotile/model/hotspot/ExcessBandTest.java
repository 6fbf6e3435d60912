package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class ExcessBandTest {

    /** The coding of ExcessBand's javadoc, edge by edge (our definition). */
    @Test
    void bandsFollowTheExcessAndNeedSignificance() {
        double q0 = 0.05, d0 = 1.0;
        assertEquals(0, ExcessBand.code(0.99, 5, 0.001, q0, d0));     // below Δ₀
        assertEquals(10, ExcessBand.code(1.0, 5, 0.001, q0, d0));
        assertEquals(20, ExcessBand.code(3.9, 5, 0.001, q0, d0));
        assertEquals(40, ExcessBand.code(4.0, 5, 0.001, q0, d0));
        assertEquals(-20, ExcessBand.code(-2.5, -5, 0.001, q0, d0));
        assertEquals(0, ExcessBand.code(6, 5, 0.06, q0, d0));         // fails the FDR
        assertEquals(0, ExcessBand.code(2, -5, 0.001, q0, d0));       // z and excess disagree
        assertEquals(0, ExcessBand.code(Double.NaN, 5, 0.001, q0, d0));
        assertEquals(5, ExcessBand.code(0.7, 5, 0.001, q0, 0.5));
        assertEquals("warmer by >= 2 K", ExcessBand.label(20, 1.0));
        assertEquals("cooler by >= 0.5 K", ExcessBand.label(-5, 0.5));
        assertEquals(7, ExcessBand.table(1.0).size());
    }
}
