/** Native builds decode QR codes with the platform's own scanner; nothing to configure. */
export function configureQrDecoder(): void {}
