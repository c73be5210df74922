/** Height of the drawing in CSS pixels (shared by the frame and the Konva stage). */
export const CANVAS_HEIGHT = 380;
