package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** Camera geometry: preset orientations, pinhole projection and the fitted distance. */
class ViewStateTest {
    private static final double TOL = 1e-9;

    @Test
    void viewFromPlusXHasPlusYToTheRightAndPlusZUp() {
        ViewState v = new ViewState(ViewPreset.PX, 100);
        double[] r = v.orientation();
        // columns: right, down, forward
        assertEquals(1, r[3], TOL); // right = +y
        assertEquals(-1, r[7], TOL); // down = -z
        assertEquals(-1, r[2], TOL); // forward = -x
        assertEquals(100, v.eye()[0], TOL);
    }

    @Test
    void centreProjectsToTheMiddleAndOffsetsFollowThePinholeModel() {
        ViewState v = new ViewState(ViewPreset.PZ, 50);
        double[] c = v.project(new double[] {0, 0, 0}, 400, 300);
        assertEquals(200, c[0], TOL);
        assertEquals(150, c[1], TOL);
        // +y is screen up in the +z view: a point 1 m along +y at depth 50 m moves up by f/50 pixels
        double f = ViewState.focalPixels(300);
        assertEquals(150 - f / 50, v.project(new double[] {0, 1, 0}, 400, 300)[1], TOL);
        assertEquals(f, 150 / Math.tan(Math.toRadians(15)), TOL);
    }

    @Test
    void fittedSphereSubtendsTheFieldOfViewLessTheMargin() {
        // silhouette of a sphere of radius R seen from distance d: half-angle asin(R/d) (elementary geometry)
        double d = ViewState.fitDistance(10, 800, 600);
        double half = Math.asin(10 / d);
        assertEquals(Math.toRadians(ViewState.FOV_DEG / 2) / ViewState.FIT_MARGIN, half, 1e-12);
        // a portrait viewport is limited by its horizontal field
        double dp = ViewState.fitDistance(10, 300, 600);
        double tanH = Math.tan(Math.toRadians(ViewState.FOV_DEG / 2)) * 0.5;
        assertEquals(Math.atan(tanH) / ViewState.FIT_MARGIN, Math.asin(10 / dp), 1e-12);
    }

    @Test
    void orbitKeepsAnOrthonormalRightHandedFrame() {
        ViewState v = new ViewState(ViewPreset.ISO, 10);
        for (int i = 0; i < 200; i++) {
            v.orbit(0.37, -0.11);
        }
        double[] r = v.orientation();
        double[] x = {r[0], r[3], r[6]};
        double[] y = {r[1], r[4], r[7]};
        double[] z = {r[2], r[5], r[8]};
        assertEquals(1, ViewState.norm(x), 1e-12);
        assertEquals(0, ViewState.dot(x, y), 1e-12);
        double[] xy = ViewState.cross(x, y);
        for (int k = 0; k < 3; k++) {
            assertEquals(z[k], xy[k], 1e-12);
        }
        assertEquals(10, ViewState.norm(v.eye()), 1e-9);
    }
}
