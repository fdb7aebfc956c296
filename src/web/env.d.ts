/** Types of the Vite-specific imports the page uses (`?raw` text, `?worker&inline` workers). */
/// <reference types="vite/client" />
