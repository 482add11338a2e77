/** Frequency-domain (fast-convolution) pulse compression: the bit-true FFT path and its degradation figures. */
export * from "./fixed-fft";
export * from "./convolution";
export * from "./degradation";
