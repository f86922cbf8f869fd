/** Web Worker running the panel's analyses off the page's thread. */
self.onmessage = () => undefined;
