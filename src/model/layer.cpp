// Placeholder translation unit; the layer's files land here.
