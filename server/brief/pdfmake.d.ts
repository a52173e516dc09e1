/** Minimal declarations for pdfmake 0.3's Node entry (the package ships no types). */
declare module 'pdfmake' {
  interface PdfKitDocument extends NodeJS.ReadableStream {
    end(): void
    on(event: 'data', listener: (chunk: Buffer) => void): this
    on(event: 'end', listener: () => void): this
    on(event: 'error', listener: (error: Error) => void): this
    on(event: string, listener: (...args: unknown[]) => void): this
  }
  interface OutputDocument {
    getStream(): Promise<PdfKitDocument>
    getBuffer(): Promise<Buffer>
  }
  interface PdfMake {
    setFonts(fonts: Record<string, Record<string, string>>): void
    setUrlAccessPolicy(callback: (url: string) => boolean): void
    setLocalAccessPolicy(callback: (path: string) => boolean): void
    createPdf(docDefinition: object, options?: object): OutputDocument
  }
  const pdfmake: PdfMake
  export default pdfmake
}
