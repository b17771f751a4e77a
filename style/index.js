import './base.css';
import './landau.css';
import './sliders.css';
